package org.obverse.spectrum;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;

/**
 * The grid rule for dips on hand-made sequences, each worked out by hand beside it: the depth
 * is the topographic prominence of the minimum (the lower of the highest points passed walking
 * left and right until the sequence falls below the minimum again, or to an end; common
 * definition in topography, no single source).
 */
class DipSearchTest extends QuietTest {
    @Test
    void twoDipsWithTheirProminence() {
        // Minima at rows 2 (value 1) and 6 (value 2). Row 2: left crest 5 (row 0), right walk
        // passes 4, 2, 3, 1.5 ... it stops at row 8 (0.5 < 1), crest 4: depth min(5, 4) - 1 = 3.
        // Row 6: left walk stops at row 2 (1 < 2) with crest 4; right walk stops at row 8 with
        // crest 3: depth min(4, 3) - 2 = 1. Row 8 (0.5) runs into the end rising by 0.5 only:
        // with a floor of 0.6 it is the end dip, depth 4.5 (the left crest 5 minus 0.5).
        double[] g = {5, 3, 1, 4, 2.5, 2.2, 2, 3, 0.5, 1.0};
        List<DipSearch.Candidate> c = DipSearch.candidates(g, 0.6);
        assertThat(c).extracting(DipSearch.Candidate::row).containsExactly(2, 6, 8);
        assertThat(c.get(0).depthBelow(g[2])).isCloseTo(3, within(0.0));
        assertThat(c.get(1).depthBelow(g[6])).isCloseTo(1, within(0.0));
        assertThat(c.get(2).atEnd()).isTrue();
        assertThat(c.get(2).depthBelow(g[8])).isCloseTo(4.5, within(0.0));
        assertThat(c.get(0).atEnd()).isFalse();
        // A floor above 1 drops row 6; above 3 also row 2; the end dip stays while its left rise counts.
        assertThat(DipSearch.candidates(g, 1.5)).extracting(DipSearch.Candidate::row).containsExactly(2, 8);
        assertThat(DipSearch.candidates(g, 3.5)).extracting(DipSearch.Candidate::row).containsExactly(8);
        // With a floor of 0.4 the rise of 0.5 after row 8 counts: row 8 is then an interior dip.
        List<DipSearch.Candidate> fine = DipSearch.candidates(g, 0.4);
        assertThat(fine.get(2).atEnd()).isFalse();
        assertThat(fine.get(2).depthBelow(g[8])).isCloseTo(0.5, within(0.0));
    }

    @Test
    void monotoneSequencesGiveOneEndDipOrNone() {
        assertThat(DipSearch.candidates(new double[] {4, 3, 2, 1}, 0.1)).singleElement()
                .satisfies(d -> assertThat(d.atEnd()).isTrue()).satisfies(d -> assertThat(d.row()).isEqualTo(3));
        assertThat(DipSearch.candidates(new double[] {1, 2, 3, 4}, 0.1)).isEmpty();
        assertThat(DipSearch.candidates(new double[] {1, 2, 3, 4}, 0.0)).isEmpty();
        assertThat(DipSearch.candidates(new double[] {4, 3, 2, 1}, 0.0)).singleElement()
                .satisfies(d -> assertThat(d.atEnd()).isTrue());
        // A constant sequence has no dip at all.
        assertThat(DipSearch.candidates(new double[] {2, 2, 2, 2}, 0.0)).isEmpty();
    }

    @Test
    void aFlatBottomCountsOnceAtItsFirstRowAndWigglesBelowTheFloorDoNot() {
        List<DipSearch.Candidate> c = DipSearch.candidates(new double[] {3, 1, 1, 1, 3}, 0.5);
        assertThat(c).singleElement().satisfies(d -> assertThat(d.row()).isEqualTo(1));
        // A wiggle of 1e-6 on a falling slope is not a dip under a floor of 1e-3.
        double[] g = {3, 2, 1.5, 1.500001, 1.4, 1.0, 2, 3};
        assertThat(DipSearch.candidates(g, 1e-3)).extracting(DipSearch.Candidate::row).containsExactly(5);
    }
}
