package org.obverse.io.table;

import org.obverse.io.BadInputException;
import org.obverse.io.table.EnergyFrame;
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

/** The energy_frame column: read as logical where absent, refused where it disagrees with the ground energy's. */
class EnergyFrameTableTest extends QuietTest {
    @TempDir
    Path dir;

    private static final String HEAD = "instance,setting,gauge,energy,count,broken,run_us";

    private Path write(String name, String text) throws IOException {
        Path p = dir.resolve(name);
        Files.writeString(p, text);
        return p;
    }

    private Campaign read(Path results, Path ground) throws IOException {
        return ResultsTable.read(results, ground == null ? null : GroundTable.readEnergies(ground),
                SuccessRule.DEFAULT).campaign();
    }

    @Test
    void aTableWithoutTheColumnIsLogicalAndTheColumnIsNoExtra() throws IOException {
        Path g = write("g.csv", "instance,ground_energy\nx,-2\n");
        assertThat(read(write("old.csv", HEAD + "\nx,s,0,-2,3,0,1\n"), g).successes(0)).isEqualTo(3);
        Path withFrame = write("new.csv", HEAD + ",energy_frame,chain_coupling\nx,s,0,-2,3,0,1,logical,-1\n");
        ResultsTable.Loaded l = ResultsTable.read(withFrame, GroundTable.readEnergies(g), SuccessRule.DEFAULT);
        assertThat(l.campaign().successes(0)).isEqualTo(3);
        assertThat(l.extraColumns()).containsExactly("chain_coupling");
    }

    @Test
    void physicalRowsAgainstLogicalGroundEnergiesAreRefused() throws IOException {
        // The trap: physical energies (scale 2, chain energy -3.2) read far below the logical ground -2.
        Path results = write("r.csv", HEAD + ",energy_frame\nx,s,0,-7.2,5,0,1,physical\n");
        Path logicalGround = write("g.csv", "instance,ground_energy\nx,-2\n");
        assertThatThrownBy(() -> read(results, logicalGround)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("r.csv").hasMessageContaining("line 2").hasMessageContaining("physical")
                .hasMessageContaining("logical").hasMessageContaining("g.csv").hasMessageContaining("decode");
        // The same frame on both sides is fine; a ground file's frame column defaults per file to logical.
        Path physicalGround = write("gp.csv", "instance,ground_energy,energy_frame\nx,-7.2,physical\n");
        assertThat(read(results, physicalGround).successes(0)).isEqualTo(5);
        Path logicalRows = write("l.csv", HEAD + "\nx,s,0,-2,5,0,1\n");
        assertThatThrownBy(() -> read(logicalRows, physicalGround)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("logical energies").hasMessageContaining("is physical");
        // Ground energies given in memory, without a file, are logical.
        assertThatThrownBy(() -> ResultsTable.read(results, GroundTable.Energies.logical(Map.of("x", -7.2)), SuccessRule.DEFAULT))
                .isInstanceOf(BadInputException.class).hasMessageContaining("physical");
    }

    @Test
    void withoutGroundEnergiesOneFrameAnInstanceIsFineAndAMixIsRefused() throws IOException {
        Path physical = write("p.csv", HEAD + ",energy_frame\nx,s,0,-7.2,5,0,1,physical\ny,s,0,-2,1,0,1,logical\n");
        Campaign c = read(physical, null);
        assertThat(c.instances()).containsExactly("x", "y");
        Path mixed = write("m.csv", HEAD + ",energy_frame\nx,s,0,-7.2,5,0,1,physical\nx,t,0,-2,1,0,1,logical\n");
        assertThatThrownBy(() -> read(mixed, null)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("m.csv").hasMessageContaining("line 3").hasMessageContaining("mixes");
        Path bad = write("b.csv", HEAD + ",energy_frame\nx,s,0,-7.2,5,0,1,device\n");
        assertThatThrownBy(() -> read(bad, null)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("'device'").hasMessageContaining("logical or physical");
        Path badGround = write("bg.csv", "instance,ground_energy,energy_frame\nx,-2,raw\n");
        assertThatThrownBy(() -> read(physical, badGround)).isInstanceOf(BadInputException.class)
                .hasMessageContaining("bg.csv").hasMessageContaining("'raw'");
    }

    @Test
    void theWriterStatesItsFrameOnEveryRowAndRefusesTheColumnAsAnExtra() throws IOException {
        StringWriter w = new StringWriter();
        ResultsTable.RowWriter rows = ResultsTable.RowWriter.start(w, EnergyFrame.PHYSICAL, List.of("v"));
        rows.row("x", "s", 0, -1.5, 2, 0, 3, "a");
        assertThat(w.toString()).isEqualTo(HEAD + ",energy_frame,v\nx,s,0,-1.5,2,0,3,physical,a\n");
        assertThatThrownBy(() -> ResultsTable.RowWriter.start(new StringWriter(), List.of("energy_frame")))
                .isInstanceOf(IllegalArgumentException.class);
    }
}
