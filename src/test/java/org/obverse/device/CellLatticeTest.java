package org.obverse.device;

import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class CellLatticeTest extends QuietTest {

    @Test
    void countsMatchTheClosedForm() {
        // A grid of rows x cols K_{t,t} cells has 2t·rows·cols qubits and
        // t²·rows·cols + t(rows−1)cols + t·rows(cols−1) couplers: closed form counted by hand from the
        // lattice's definition (Boothby, King & Roy, Quantum Inf. Process. 15, 495, 2016, define the
        // lattice); 16 x 16 cells of K4,4 giving 2048 qubits and 6016 couplers is from memory.
        CellLattice big = CellLattice.of(16, 16, 4);
        QubitGraph g = big.graph();
        assertThat(g.qubits().size()).isEqualTo(2048);
        assertThat(g.couplerCount()).isEqualTo(6016);
        Seeds.forEachCase(20, 100, (rng, seed) -> {
            int r = 1 + rng.nextInt(6);
            int c = 1 + rng.nextInt(6);
            int t = 1 + rng.nextInt(5);
            QubitGraph h = CellLattice.of(r, c, t).graph();
            assertThat(h.qubits().size()).isEqualTo(2 * t * r * c);
            assertThat(h.couplerCount()).isEqualTo(t * t * r * c + t * (r - 1) * c + t * r * (c - 1));
        });
    }

    @Test
    void numberingIsTheDocumentedFormulaAndRoundTrips() {
        CellLattice l = CellLattice.of(3, 5, 4);
        // ((row·cols + col)·2 + side)·t + k: row 1, col 2, side 1, k 3 -> ((5 + 2)·2 + 1)·4 + 3 = 63.
        assertThat(l.qubit(1, 2, 1, 3)).isEqualTo(63);
        for (int q = 0; q < l.qubitCount(); q++) {
            assertThat(l.qubit(l.rowOf(q), l.colOf(q), l.sideOf(q), l.indexOf(q))).isEqualTo(q);
        }
        QubitGraph g = l.graph();
        // Side 0 couples down the column, side 1 along the row, inside a cell side 0 to side 1.
        assertThat(g.hasCoupler(l.qubit(0, 2, 0, 1), l.qubit(1, 2, 0, 1))).isTrue();
        assertThat(g.hasCoupler(l.qubit(0, 2, 1, 1), l.qubit(1, 2, 1, 1))).isFalse();
        assertThat(g.hasCoupler(l.qubit(2, 3, 1, 2), l.qubit(2, 4, 1, 2))).isTrue();
        assertThat(g.hasCoupler(l.qubit(2, 3, 0, 2), l.qubit(2, 4, 0, 2))).isFalse();
        assertThat(g.hasCoupler(l.qubit(1, 1, 0, 0), l.qubit(1, 1, 1, 3))).isTrue();
        assertThat(g.hasCoupler(l.qubit(1, 1, 0, 0), l.qubit(1, 1, 0, 3))).isFalse();
    }

    @Test
    void defectsByListAndAtRandom() {
        CellLattice l = CellLattice.of(4, 4, 4);
        QubitGraph g = l.graphWithout(new int[] {0, 17}, new int[][] {{l.qubit(2, 2, 0, 0), l.qubit(2, 2, 1, 0)}});
        assertThat(g.hasQubit(0)).isFalse();
        assertThat(g.hasQubit(17)).isFalse();
        assertThat(g.hasCoupler(l.qubit(2, 2, 0, 0), l.qubit(2, 2, 1, 0))).isFalse();
        assertThat(g.qubits().size()).isEqualTo(126);
        assertThatThrownBy(() -> l.graphWithout(new int[] {999}, new int[0][]))
                .hasMessageContaining("qubit 999").hasMessageContaining("not in the lattice");
        assertThatThrownBy(() -> l.graphWithout(new int[0], new int[][] {{0, 1}}))
                .hasMessageContaining("[0, 1]");

        QubitGraph a = CellLattice.withRandomDefects(l.graph(), 5, 7, Seeds.rng(3));
        QubitGraph b = CellLattice.withRandomDefects(l.graph(), 5, 7, Seeds.rng(3));
        assertThat(a.qubits()).isEqualTo(b.qubits());
        assertThat(a.couplers()).isEqualTo(b.couplers());
        assertThat(a.qubits().size()).isEqualTo(123);
        QubitGraph afterQubits = l.graph().without(
                java.util.Arrays.stream(l.graph().qubits().toArray()).filter(q -> !a.hasQubit(q)).toArray(), new int[0][]);
        assertThat(a.couplerCount()).isEqualTo(afterQubits.couplerCount() - 7);
        assertThatThrownBy(() -> CellLattice.withRandomDefects(l.graph(), 500, 0, Seeds.rng(1)))
                .hasMessageContaining("500");
        assertThatThrownBy(() -> CellLattice.of(0, 2, 4)).hasMessageContaining(">= 1");
    }
}
