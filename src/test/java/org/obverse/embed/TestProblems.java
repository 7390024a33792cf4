package org.obverse.embed;

import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.IsingBuilder;
import org.obverse.model.IsingProblem;

/** Generated logical problems for the embedding tests. */
final class TestProblems {
    private TestProblems() {
    }

    /** The complete graph on ids 0 … n−1 with couplings 1 (only the graph matters). */
    static IsingProblem complete(int n) {
        IsingBuilder b = IsingProblem.builder();
        for (int i = 0; i < n; i++) {
            b.variable(i);
            for (int j = i + 1; j < n; j++) {
                b.coupling(i, j, 1.0);
            }
        }
        return b.build();
    }

    /**
     * A random problem on n sparse ids (id = 3k + 1) with each pair coupled with probability p,
     * fields and couplings uniform in (−1, 1) and a random offset.
     */
    static IsingProblem random(int n, double p, UniformRandomProvider rng) {
        IsingBuilder b = IsingProblem.builder();
        for (int i = 0; i < n; i++) {
            b.field(3 * i + 1, 2 * rng.nextDouble() - 1);
            for (int j = i + 1; j < n; j++) {
                if (rng.nextDouble() < p) {
                    b.coupling(3 * i + 1, 3 * j + 1, 2 * rng.nextDouble() - 1);
                }
            }
        }
        b.offset(10 * rng.nextDouble() - 5);
        return b.build();
    }
}
