package org.obverse.io.table;

import org.obverse.io.BadInputException;
import org.obverse.io.table.ResultsTable;
import java.io.IOException;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.stats.Campaign;
import org.obverse.stats.SuccessRule;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class ResultsTableTest extends QuietTest {
    @TempDir
    Path dir;

    private Path write(String name, String text) throws IOException {
        Path p = dir.resolve(name);
        Files.writeString(p, text);
        return p;
    }

    @Test
    void rowsAndCountsAggregateTheSame() throws IOException {
        // One row per read and one row per distinct outcome with a count give the same counts.
        Path perRead = write("a.csv", "instance,setting,gauge,energy,count,broken,run_us\n"
                + "x,s,0,-3,1,0,10\nx,s,0,-3,1,0,10\nx,s,0,-2,1,1,10\nx,s,1,-2,1,0,10\n"
                + "\"y, quoted\",s,,-5.5,1,0,10\n");
        Path counted = write("b.csv", "instance,setting,gauge,energy,count,broken,run_us,extra\n"
                + "x,s,0,-3,2,0,10,a\nx,s,0,-2,1,1,10,a\nx,s,1,-2,1,0,10,a\n\"y, quoted\",s,,-5.5,1,0,10,a\n");
        GroundTable.Energies ground = GroundTable.Energies.logical(Map.of("x", -3.0, "y, quoted", -6.0));
        for (Path p : List.of(perRead, counted)) {
            Campaign c = ResultsTable.read(p, ground, SuccessRule.DEFAULT).campaign();
            assertThat(c.instances()).containsExactly("x", "y, quoted");
            int cx = c.cell(0, 0);
            assertThat(c.gaugeTo(cx) - c.gaugeFrom(cx)).isEqualTo(2);
            int g0 = c.gaugeFrom(cx);
            assertThat(c.reads(g0)).isEqualTo(3);
            assertThat(c.successes(g0)).isEqualTo(2);
            assertThat(c.brokenSum(g0)).isEqualTo(1);
            assertThat(c.residualSum(g0)).isEqualTo(1.0);
            int gy = c.gaugeFrom(c.cell(1, 0));
            assertThat(c.gaugeIndex(gy)).isEqualTo(Campaign.NO_GAUGE);
            assertThat(c.successes(gy)).isZero();
        }
        ResultsTable.Loaded l = ResultsTable.read(counted, ground, SuccessRule.DEFAULT);
        assertThat(l.extraColumns()).containsExactly("extra");
        assertThat(l.settingValues().get("extra")).containsEntry("s", "a");
    }

    @Test
    void bestSeenWhenNoGroundFile() throws IOException {
        Path p = write("a.csv", "instance,setting,gauge,energy,count,broken,run_us\nx,s,0,-3,1,0,10\nx,t,0,-4,2,0,10\n");
        Campaign c = ResultsTable.read(p, null, SuccessRule.DEFAULT).campaign();
        assertThat(c.ground(0)).isEqualTo(-4.0);
        assertThat(c.groundGiven(0)).isFalse();
        assertThat(c.successes(c.gaugeFrom(c.cell(0, 1)))).isEqualTo(2);
    }

    @Test
    void toleranceCountsNearMisses() throws IOException {
        // ground -10: -10 + 1e-9 + 1e-8 = tolerance edge; a read 5e-9 above counts, 1e-6 above does not.
        Path p = write("a.csv", "instance,setting,gauge,energy,count,broken,run_us\n"
                + "x,s,0,-9.999999995,1,0,1\nx,s,0,-9.999999,1,0,1\n");
        Campaign c = ResultsTable.read(p, GroundTable.Energies.logical(Map.of("x", -10.0)), SuccessRule.DEFAULT).campaign();
        assertThat(c.successes(0)).isEqualTo(1);
    }

    @Test
    void badInputNamesFileLineAndColumn() throws IOException {
        String h = "instance,setting,gauge,energy,count,broken,run_us\n";
        GroundTable.Energies g = GroundTable.Energies.logical(Map.of("x", -1.0));
        assertThatThrownBy(() -> ResultsTable.read(write("m.csv", "instance,setting,energy\nx,s,1\n"), g,
                SuccessRule.DEFAULT)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("m.csv").hasMessageContaining("missing columns gauge, count, broken, run_us");
        assertThatThrownBy(() -> ResultsTable.read(write("n.csv", h + "x,s,0,abc,1,0,1\n"), g, SuccessRule.DEFAULT))
                .hasMessageContaining("line 2, column energy").hasMessageContaining("'abc' is not a finite decimal number");
        assertThatThrownBy(() -> ResultsTable.read(write("c.csv", h + "x,s,0,1,-3,0,1\n"), g, SuccessRule.DEFAULT))
                .hasMessageContaining("line 2, column count").hasMessageContaining("not a count >= 1");
        assertThatThrownBy(() -> ResultsTable.read(write("w.csv", h + "x,s,0,1,1,0\n"), g, SuccessRule.DEFAULT))
                .hasMessageContaining("line 2").hasMessageContaining("6 fields but the header has 7");
        assertThatThrownBy(() -> ResultsTable.read(write("f.csv", h + "x,s,0,NaN,1,0,1\n"), g, SuccessRule.DEFAULT))
                .hasMessageContaining("column energy");
        Path gf = write("ground.csv", "instance,ground_energy\nx,-1\n");
        assertThatThrownBy(() -> ResultsTable.read(write("y.csv", h + "x,s,0,1,1,0,1\ny,s,0,1,1,0,1\n"),
                GroundTable.readEnergies(gf), SuccessRule.DEFAULT))
                .hasMessageContaining("ground.csv").hasMessageContaining("no ground energy for instance 'y'")
                .hasMessageContaining("y.csv, line 3");
        assertThatThrownBy(() -> GroundTable.readEnergies(write("g2.csv", "instance,ground_energy\nx,1\nx,2\n")))
                .hasMessageContaining("appears twice");
    }

    @Test
    void writerRoundTrips() throws IOException {
        StringWriter w = new StringWriter();
        ResultsTable.RowWriter rw = ResultsTable.RowWriter.start(w, List.of("pause_us"));
        rw.row("inst,1", "a", 3, -2.25, 4, 1, 20, "5");
        rw.row("inst,1", "a", -1, -2.0, 1, 0, 20, "5");
        Path p = write("r.csv", w.toString());
        ResultsTable.Loaded l = ResultsTable.read(p, GroundTable.Energies.logical(Map.of("inst,1", -2.25)), SuccessRule.DEFAULT);
        Campaign c = l.campaign();
        assertThat(c.instances()).containsExactly("inst,1");
        assertThat(c.gaugeSlots()).isEqualTo(2);
        assertThat(c.successes(c.gaugeFrom(0) + 1)).isEqualTo(4);
        assertThat(l.settingValues().get("pause_us")).containsEntry("a", "5");
    }
}
