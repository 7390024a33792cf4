package org.obverse.stats;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * Invented campaigns with known success rates for the tests: instance i under setting s has
 * per-gauge success rates scattered around a chosen rate; successes are drawn read by read.
 */
final class SyntheticCampaigns {
    private SyntheticCampaigns() {
    }

    /** rates[i][s] the mean success rate; gauges and reads per gauge fixed; run time = 1 + s µs. */
    static Campaign of(UniformRandomProvider rng, double[][] rates, int gauges, int reads) {
        Campaign.Builder b = Campaign.builder();
        for (int i = 0; i < rates.length; i++) {
            b.ground("inst" + i, -10.0, true);
            for (int s = 0; s < rates[i].length; s++) {
                for (int g = 0; g < gauges; g++) {
                    double p = Math.min(1, Math.max(0, rates[i][s] * (0.5 + rng.nextDouble())));
                    long succ = 0;
                    for (int r = 0; r < reads; r++) {
                        if (rng.nextDouble() < p) {
                            succ++;
                        }
                    }
                    double run = 1 + s;
                    b.add("inst" + i, "set" + s, g, reads, succ, (reads - succ) * 2.0, run * reads, 0,
                            succ > 0 ? -10.0 : -8.0);
                }
            }
        }
        return b.build();
    }
}
