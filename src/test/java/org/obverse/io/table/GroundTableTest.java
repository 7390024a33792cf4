package org.obverse.io.table;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

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

/** A campaign's ground.csv: the bytes spec/campaign.md shows, read back to the same rows, bad rows refused. */
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
        Path noSource = dir.resolve("nosource.csv");
        Files.writeString(noSource, "instance,ground_energy\na,1.0\n");
        assertThatThrownBy(() -> GroundTable.read(noSource)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("ground_source");
    }
}
