package org.obverse.device;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;

class LimitCheckTest extends QuietTest {

    @Test
    void asymmetricCouplingRangeRefusesOnlyTheSignThatDoesNotFit() {
        // An extended negative range [-2, +1] with fields in [-1, +1] (the device class the
        // project serves; values common practice, no source).
        DeviceLimits limits = DeviceLimits.of(ValueRange.of(-1, 1), ValueRange.of(-2, 1));
        IsingProblem p = IsingProblem.builder().field(1, 0.5).field(2, -1.0)
                .coupling(1, 2, -2.0).coupling(2, 3, 1.5).build();
        List<LimitViolation> v = LimitCheck.violations(p, limits);
        assertThat(v).extracting(LimitViolation::term).containsExactly("coupling (2, 3)");
        assertThat(v.get(0).describe()).isEqualTo("coupling (2, 3) = 1.5: is outside the coupling range [-2.0, 1.0]");
    }

    @Test
    void listsExactlyTheViolationsANaiveCountFinds() {
        // Differential check against a plain recount over the builder's own inputs.
        Seeds.forEachCase(300, 0x11c7_01L, (rng, seed) -> {
            double fieldHi = 0.5 + rng.nextDouble();
            double couplingLo = -1 - rng.nextDouble();
            ValueRange sum = ValueRange.of(-4 * rng.nextDouble() - 1, 3 * rng.nextDouble() + 1);
            DeviceLimits limits = DeviceLimits.builder(ValueRange.of(-fieldHi, fieldHi), ValueRange.of(couplingLo, 1))
                    .couplingSum(sum).build();
            IsingBuilder b = IsingProblem.builder();
            int n = 2 + rng.nextInt(12);
            int expected = 0;
            Map<Integer, Double> sums = new HashMap<>();
            for (int i = 0; i < n; i++) {
                double h = 3 * rng.nextDouble() - 1.5;
                b.field(10 * i, h);
                sums.put(10 * i, 0.0);
                expected += (h < -fieldHi || h > fieldHi) ? 1 : 0;
            }
            for (int i = 0; i < n; i++) {
                for (int j = i + 1; j < n; j++) {
                    if (rng.nextInt(3) == 0) {
                        double jv = 4 * rng.nextDouble() - 2.5;
                        b.coupling(10 * i, 10 * j, jv);
                        expected += (jv < couplingLo || jv > 1) ? 1 : 0;
                        sums.merge(10 * i, jv, Double::sum);
                        sums.merge(10 * j, jv, Double::sum);
                    }
                }
            }
            IsingProblem p = b.build();
            double[] computed = LimitCheck.couplingSums(p);
            for (int k = 0; k < p.size(); k++) {
                assertThat(computed[k]).as("seed %d", seed)
                        .isCloseTo(sums.get(p.variables().id(k)), org.assertj.core.data.Offset.offset(1e-12));
                expected += sum.contains(computed[k]) ? 0 : 1;
            }
            assertThat(LimitCheck.violations(p, limits)).as("seed %d", seed).hasSize(expected);
        });
    }

    @Test
    void qubitsAndCouplersOutsideTheWorkingGraphAreListedFirst() {
        QubitGraph g = QubitGraph.of(new int[] {0, 1, 2}, new int[][] {{0, 1}});
        DeviceLimits limits = DeviceLimits.builder(ValueRange.of(-1, 1), ValueRange.of(-1, 1)).graph(g).build();
        IsingProblem p = IsingProblem.builder().field(0, 2.0).coupling(1, 2, 0.5).coupling(0, 7, 0.1).build();
        assertThat(LimitCheck.violations(p, limits)).extracting(LimitViolation::term)
                .containsExactly("qubit 7", "coupler (0, 7)", "coupler (1, 2)", "field of 0"); // couplers in the problem's sorted order
    }
}
