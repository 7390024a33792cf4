package org.obverse.gauge;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * Every free cluster flipped in exactly ⌊N/2⌋ or ⌈N/2⌉ of the N gauges. Where N is a power of
 * two and there are at most N − 1 free clusters, the signs are distinct non-constant columns
 * of the N × N Sylvester–Hadamard matrix (entry (r, c) = (−1)^popcount(r & c)), chosen,
 * negated and row-permuted at random: then every pair of clusters is balanced too, since the
 * product of columns a and b is column a xor b. Otherwise each cluster's flips are a random
 * subset of the right size, drawn independently.
 */
public final class BalancedGaugeDesign implements GaugeDesign {
    @Override
    public String label() {
        return "balanced";
    }

    /** Whether the pairwise-balanced construction applies. */
    public static boolean pairwiseBalanced(int freeClusters, int count) {
        return count >= 2 && Integer.bitCount(count) == 1 && freeClusters <= count - 1;
    }

    @Override
    public long[][] draw(int freeClusters, int count, UniformRandomProvider rng) {
        long[][] masks = new long[count][(freeClusters + 63) >>> 6];
        if (pairwiseBalanced(freeClusters, count)) {
            int[] columns = new int[count - 1];
            for (int c = 0; c < columns.length; c++) {
                columns[c] = c + 1;
            }
            shuffle(columns, rng);
            int[] rows = new int[count];
            for (int r = 0; r < count; r++) {
                rows[r] = r;
            }
            shuffle(rows, rng);
            for (int f = 0; f < freeClusters; f++) {
                int col = columns[f];
                int negate = rng.nextBoolean() ? 1 : 0;
                for (int g = 0; g < count; g++) {
                    if (((Integer.bitCount(rows[g] & col) & 1) ^ negate) != 0) {
                        masks[g][f >>> 6] |= 1L << f;
                    }
                }
            }
            return masks;
        }
        int[] order = new int[count];
        for (int f = 0; f < freeClusters; f++) {
            for (int g = 0; g < count; g++) {
                order[g] = g;
            }
            int flips = count / 2 + ((count & 1) == 1 && rng.nextBoolean() ? 1 : 0);
            // Partial Fisher–Yates: the first `flips` entries are a uniform random subset.
            for (int i = 0; i < flips; i++) {
                int j = i + rng.nextInt(count - i);
                int t = order[i];
                order[i] = order[j];
                order[j] = t;
                masks[order[i]][f >>> 6] |= 1L << f;
            }
        }
        return masks;
    }

    @Override
    public boolean redrawOne(long[] mask, int freeClusters, UniformRandomProvider rng) {
        return false; // one redrawn gauge would break the balance: the whole set is drawn again
    }

    private static void shuffle(int[] a, UniformRandomProvider rng) {
        for (int i = a.length - 1; i > 0; i--) {
            int j = rng.nextInt(i + 1);
            int t = a[i];
            a[i] = a[j];
            a[j] = t;
        }
    }
}
