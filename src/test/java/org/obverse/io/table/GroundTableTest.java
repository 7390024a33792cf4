package org.obverse.io.table;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.BadInputException;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

/**
 * The ground-energy file: a campaign's ground.csv (the bytes spec/campaign.md shows) and the file
 * scoring takes (spec/results.md), read by one reader; rows read back the same, bad rows refused
 * in one line naming file, line and column.
 */
class GroundTableTest extends QuietTest {
    @TempDir
    Path dir;

    @Test
    void writesThePinnedBytes() {
        // Expected text written by hand from spec/campaign.md's ground.csv line (common practice, no source):
        // an unknown energy is an empty cell, a name with a comma is quoted (RFC 4180).
        String text = GroundTable.text(List.of(new GroundTable.Row("layout-a", 3.267994, "given"),
                new GroundTable.Row("tri", -1.5, "exact"), new GroundTable.Row("big, one", Double.NaN, "best_seen")));
        assertThat(text).isEqualTo("""
                instance,ground_energy,ground_source
                layout-a,3.267994,given
                tri,-1.5,exact
                "big, one",,best_seen
                """);
    }

    @Test
    void readsBackTheRowsWritten() {
        Seeds.forEachCase(200, 0x9f31L, (rng, seed) -> {
            List<GroundTable.Row> rows = new ArrayList<>();
            int n = 1 + rng.nextInt(6);
            for (int k = 0; k < n; k++) {
                String source = GroundTable.SOURCES.get(rng.nextInt(3));
                double e = source.equals("best_seen") && rng.nextBoolean() ? Double.NaN
                        : (rng.nextDouble() - 0.5) * Math.pow(10, rng.nextInt(12) - 4);
                rows.add(new GroundTable.Row("i" + k + (rng.nextBoolean() ? ", x" : ""), e, source));
            }
            Path f = dir.resolve("g" + seed + ".csv");
            Files.writeString(f, GroundTable.text(rows));
            List<GroundTable.Row> back = GroundTable.read(f);
            assertThat(back).hasSize(n);
            for (int k = 0; k < n; k++) {
                assertThat(back.get(k).instance()).isEqualTo(rows.get(k).instance());
                assertThat(back.get(k).source()).isEqualTo(rows.get(k).source());
                // The shortest round-trip decimal gives the same double, bit for bit.
                assertThat(Double.doubleToRawLongBits(back.get(k).energy()))
                        .isEqualTo(Double.doubleToRawLongBits(rows.get(k).energy()));
            }
            assertThat(GroundTable.text(back)).isEqualTo(Files.readString(f));
        });
    }

    @Test
    void refusesBadRowsNamingTheLine() throws IOException {
        String head = "instance,ground_energy,ground_source\n";
        for (String[] bad : new String[][] {
            {"a,,exact\n", "only a best_seen row"},
            {"a,1.0,guessed\n", "not a ground source"},
            {"a,1.0,exact\na,2.0,given\n", "appears twice"},
            {"a,NaN,exact\n", "not a finite decimal number"},
            {",1.0,exact\n", "is empty"}}) {
            Path f = dir.resolve("bad.csv");
            Files.writeString(f, head + bad[0]);
            assertThatThrownBy(() -> GroundTable.read(f)).as(bad[0]).isInstanceOf(BadInputException.class)
                    .hasMessageContaining(f.toString()).hasMessageContaining("line").hasMessageContaining(bad[1]);
        }
    }

    @Test
    void writesTheFrameColumnOnlyWhereARowIsPhysical() {
        // Expected text written by hand from spec/results.md's ground-energy columns (common practice, no source).
        String text = GroundTable.text(List.of(new GroundTable.Row("a", -2, "given", EnergyFrame.LOGICAL),
                new GroundTable.Row("b", -7.25, "exact", EnergyFrame.PHYSICAL)));
        assertThat(text).isEqualTo("""
                instance,ground_energy,ground_source,energy_frame
                a,-2.0,given,logical
                b,-7.25,exact,physical
                """);
    }

    @Test
    void aScoringFileWithoutSourceOrFrameGivesLogicalEnergies() throws IOException {
        // The --ground file of spec/results.md, written by hand (common practice, no source); an extra column is ignored.
        Path f = dir.resolve("ground.csv");
        Files.writeString(f, "note,instance,ground_energy\nx,\"p, q\",-3.5\n,r,1e2\n");
        assertThat(GroundTable.read(f)).containsExactly(new GroundTable.Row("p, q", -3.5, "given"),
                new GroundTable.Row("r", 100, "given"));
        GroundTable.Energies e = GroundTable.readEnergies(f);
        assertThat(e.file()).isEqualTo(f);
        assertThat(e.energy("p, q")).isEqualTo(-3.5);
        assertThat(e.energy("s")).isNull();
        assertThat(e.frame("r")).isEqualTo(EnergyFrame.LOGICAL);
    }

    @Test
    void everyOptionalColumnReadsBackWhatWasWritten() {
        Seeds.forEachCase(200, 0x6d21L, (rng, seed) -> {
            List<GroundTable.Row> rows = new ArrayList<>();
            int n = 1 + rng.nextInt(6);
            for (int k = 0; k < n; k++) {
                String source = GroundTable.SOURCES.get(rng.nextInt(3));
                double e = source.equals("best_seen") && rng.nextInt(4) == 0 ? Double.NaN
                        : (rng.nextDouble() - 0.5) * Math.pow(10, rng.nextInt(12) - 4);
                EnergyFrame frame = rng.nextInt(3) == 0 ? EnergyFrame.PHYSICAL : EnergyFrame.LOGICAL;
                rows.add(new GroundTable.Row("i" + k + (rng.nextBoolean() ? " \"q\"" : ""), e, source, frame));
            }
            Path f = dir.resolve("f" + seed + ".csv");
            Files.writeString(f, GroundTable.text(rows));
            List<GroundTable.Row> back = GroundTable.read(f);
            assertThat(back).hasSize(n);
            for (int k = 0; k < n; k++) {
                GroundTable.Row a = rows.get(k);
                GroundTable.Row b = back.get(k);
                assertThat(List.of(b.instance(), b.source(), b.frame())).isEqualTo(List.of(a.instance(), a.source(), a.frame()));
                assertThat(Double.doubleToRawLongBits(b.energy())).isEqualTo(Double.doubleToRawLongBits(a.energy()));
            }
            assertThat(GroundTable.text(back)).isEqualTo(Files.readString(f));
            boolean unknown = rows.stream().anyMatch(r -> Double.isNaN(r.energy()));
            if (unknown) {
                // Scoring needs every energy: the first unknown one is refused at its line.
                int line = 2 + rows.indexOf(rows.stream().filter(r -> Double.isNaN(r.energy())).findFirst().get());
                assertThatThrownBy(() -> GroundTable.readEnergies(f)).isInstanceOf(BadInputException.class)
                        .hasMessageContaining("line " + line + ", column ground_energy")
                        .hasMessageContaining("collect the campaign first");
            } else {
                GroundTable.Energies e = GroundTable.readEnergies(f);
                for (GroundTable.Row r : rows) {
                    assertThat(e.energy(r.instance())).isEqualTo(r.energy());
                    assertThat(e.frame(r.instance())).isEqualTo(r.frame());
                }
            }
        });
    }

    @Test
    void everyRefusalIsOneLineNamingFileLineAndColumn() throws IOException {
        String[][] cases = {
            // file text, the column named, what the message says
            {"instance,ground_energy\na,\n", "ground_energy", "is empty; write the instance's ground energy"},
            {"instance,ground_energy\na,abc\n", "ground_energy", "not a finite decimal number"},
            {"instance,ground_energy\na,1e400\n", "ground_energy", "out of range"},
            {"instance,ground_energy\n,1\n", "instance", "is empty"},
            {"instance,ground_energy,energy_frame\na,1,logical\na,2,logical\n", "instance", "appears twice"},
            {"instance,ground_energy,energy_frame\na,1,raw\n", "energy_frame", "logical or physical"},
            {"instance,ground_energy,energy_frame\na,1,\n", "energy_frame", "logical or physical"},
            {"instance,ground_energy,ground_source\na,1,file\n", "ground_source", "not a ground source"},
            {"instance,ground_energy,ground_source\na,,given\n", "ground_energy", "only a best_seen row"}};
        for (String[] c : cases) {
            Path f = dir.resolve("bad.csv");
            Files.writeString(f, c[0]);
            for (Reader r : new Reader[] {GroundTable::read, GroundTable::readEnergies}) {
                BadInputException e = catchThrowableOfType(() -> r.read(f), BadInputException.class);
                assertThat(e).as(c[0]).isNotNull();
                assertThat(e.getMessage()).as(c[0]).startsWith(f.toString()).contains("line ")
                        .contains("column " + c[1]).contains(c[2]).doesNotContain("\n");
            }
        }
        Path noEnergy = dir.resolve("noenergy.csv");
        Files.writeString(noEnergy, "instance,energy\na,1\n");
        assertThatThrownBy(() -> GroundTable.readEnergies(noEnergy)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("noenergy.csv").hasMessageContaining("ground_energy");
    }

    interface Reader {
        Object read(Path f) throws IOException;
    }
}
