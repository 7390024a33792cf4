package org.obverse.stats;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;

/**
 * Finds qubits (or couplers) whose device-frame average does not cancel across gauges: the
 * signature of a persistent bias of a drifting or badly calibrated device (Perdomo-Ortiz et
 * al., Scientific Reports 6, 18628, 2016). A spin-reversal gauge flips the sign of a qubit's
 * logical magnetisation in the device frame but not a device bias, so over gauges the logical
 * part averages out and the bias stays.
 *
 * <p>Per item i and gauge g the device-frame mean is m_ig = sum_ig / reads_ig. Without gauge
 * signs the bias estimate is b_i = mean over gauges of m_ig (unbiased when the gauges are
 * balanced, each item flipped in half of them). With the signs σ_ig (±1: g_i for a qubit,
 * g_i·g_j for a coupler) it is the intercept of the least-squares fit m_ig = a_i σ_ig + b_i,
 * which separates the logical part a_i from the bias whatever the gauges. b_i = Σ_g c_g m_ig
 * for fixed weights c_g, so its standard error from the reads is √(Σ c_g² (1 − m_ig²) /
 * reads_ig) (a ±1 variable with mean m has variance 1 − m²); from the scatter of the gauges
 * (about the fit with signs, about the mean without) it is √(Σ c_g² · RSS / dof). The z-score
 * divides b_i by the larger of the two, so gauge-to-gauge variation never inflates it. Without
 * signs the scatter also holds the flipping logical part: with random gauges its leftover in
 * the mean, μ_i · mean(σ_ig), has about that spread, so the larger error keeps the
 * false-positive rate; a caller that knows its gauges are balanced (the logical part cancels
 * exactly) may ask for the read-based error alone, which detects much smaller biases.
 *
 * <p>Flags: |z| above Φ⁻¹(1 − α / (2 m)) for m tested items (Bonferroni), so with no bias
 * the chance that any item is flagged is at most about α (normal approximation, many reads).
 */
public final class BiasDiagnostics {
    /** The default family-wise false-positive rate. */
    public static final double DEFAULT_ALPHA = 0.01;

    private BiasDiagnostics() {
    }

    /**
     * One item's diagnosis.
     *
     * @param item      index of the qubit or coupler (column of the input)
     * @param gauges    gauges with reads of this item
     * @param reads     reads over those gauges
     * @param bias      the bias estimate b_i (device frame, in [-1, 1] units of spin)
     * @param stdError  its standard error (the larger of the read-based and gauge-based ones)
     * @param z         bias / stdError (±∞ when the error is zero and the bias is not)
     * @param flagged   whether |z| exceeds the threshold (never for an item that no gauge flipped)
     * @param flipped   false when signs were given and every gauge gave the item the same sign (a
     *                  locked chain coupler, a pinned qubit): its logical part never changes sign,
     *                  so it cannot be told from a device bias, and it is left out of the flags and
     *                  of the Bonferroni count
     */
    public record Item(int item, int gauges, long reads, double bias, double stdError, double z, boolean flagged,
            boolean flipped) {
    }

    /**
     * The diagnosis of all items, ranked by |z| (largest first; ties by index).
     *
     * @param items     every item with reads in at least one gauge
     * @param threshold the |z| threshold used
     * @param alpha     the family-wise false-positive rate it was set for
     */
    public record Result(List<Item> items, double threshold, double alpha) {
        /** Only the flagged items, in rank order. */
        public List<Item> flagged() {
            return items.stream().filter(Item::flagged).toList();
        }
    }

    /**
     * Diagnoses items from per-gauge sums. Input (not modified): {@code sums[g][i]} the sum of
     * device-frame ±1 values (spins, or spin products for couplers) over the reads of gauge g,
     * {@code reads[g][i]} their count (0: item not read in that gauge), optional
     * {@code signs[g][i]} ∈ {−1, +1} the gauge's sign of the item (null: assume balanced).
     */
    public static Result diagnose(double[][] sums, long[][] reads, byte[][] signs, double alpha) {
        return diagnose(sums, reads, signs, alpha, false);
    }

    /**
     * As {@link #diagnose(double[][], long[][], byte[][], double)}; with {@code balancedGauges}
     * and no signs, the standard error is the read-based one alone (valid only when every
     * item is flipped in exactly half of the gauges).
     */
    public static Result diagnose(double[][] sums, long[][] reads, byte[][] signs, double alpha,
            boolean balancedGauges) {
        if (!(alpha > 0) || !(alpha < 1)) {
            throw new IllegalArgumentException("alpha must be in (0, 1), got " + alpha);
        }
        int gauges = sums.length;
        if (reads.length != gauges || (signs != null && signs.length != gauges)) {
            throw new IllegalArgumentException("sums, reads and signs need one row per gauge");
        }
        int items = gauges == 0 ? 0 : sums[0].length;
        for (int g = 0; g < gauges; g++) {
            if (sums[g].length != items || reads[g].length != items || (signs != null && signs[g].length != items)) {
                throw new IllegalArgumentException("gauge " + g + " does not have " + items + " items");
            }
        }
        List<Item> found = new ArrayList<>();
        double[] m = new double[gauges];
        double[] var = new double[gauges];
        double[] x = new double[gauges];
        for (int i = 0; i < items; i++) {
            int n = 0;
            long total = 0;
            for (int g = 0; g < gauges; g++) {
                long r = reads[g][i];
                if (r <= 0) {
                    continue;
                }
                double mean = sums[g][i] / r;
                if (!(Math.abs(mean) <= 1 + 1e-12)) {
                    throw new IllegalArgumentException("item " + i + ", gauge " + g + ": |sum| " + sums[g][i]
                            + " exceeds reads " + r);
                }
                m[n] = mean;
                var[n] = Math.max(0, 1 - mean * mean) / r;
                x[n] = signs == null ? 0 : signs[g][i];
                total += r;
                n++;
            }
            if (n == 0) {
                continue;
            }
            boolean flipped = true;
            if (signs != null) {
                flipped = false;
                for (int k = 1; k < n; k++) {
                    flipped |= x[k] != x[0];
                }
            }
            Item it = item(i, n, total, m, var, x, signs != null, balancedGauges && signs == null);
            found.add(new Item(it.item(), it.gauges(), it.reads(), it.bias(), it.stdError(), it.z(), false, flipped));
        }
        int tested = Math.max(1, (int) found.stream().filter(Item::flipped).count());
        double threshold = SpecialFunctions.normalQuantile(1 - alpha / (2.0 * tested));
        List<Item> ranked = new ArrayList<>(found.size());
        for (Item it : found) {
            ranked.add(new Item(it.item(), it.gauges(), it.reads(), it.bias(), it.stdError(), it.z(),
                    it.flipped() && Math.abs(it.z()) > threshold, it.flipped()));
        }
        // Tested items first by |z|, then the never-flipped ones.
        ranked.sort(Comparator.comparing((Item it) -> !it.flipped()).thenComparingDouble((Item it) -> -Math.abs(it.z()))
                .thenComparingInt(Item::item));
        return new Result(List.copyOf(ranked), threshold, alpha);
    }

    private static Item item(int index, int n, long total, double[] m, double[] var, double[] x, boolean withSigns,
            boolean readsOnly) {
        double xMean = 0;
        for (int g = 0; g < n; g++) {
            xMean += x[g];
        }
        xMean /= n;
        double sxx = 0;
        for (int g = 0; g < n; g++) {
            sxx += (x[g] - xMean) * (x[g] - xMean);
        }
        boolean fit = withSigns && sxx > 0 && n >= 3;
        // Weights c_g of b = Σ c_g m_g: 1/n for the plain mean; the intercept of the fit otherwise.
        double bias = 0;
        double slope = 0;
        if (fit) {
            double sxm = 0;
            double mMean = 0;
            for (int g = 0; g < n; g++) {
                mMean += m[g];
            }
            mMean /= n;
            for (int g = 0; g < n; g++) {
                sxm += (x[g] - xMean) * (m[g] - mMean);
            }
            slope = sxm / sxx;
            bias = mMean - slope * xMean;
        } else {
            for (int g = 0; g < n; g++) {
                bias += m[g];
            }
            bias /= n;
        }
        double readVar = 0;
        double sumC2 = 0;
        double rss = 0;
        for (int g = 0; g < n; g++) {
            double c = fit ? 1.0 / n - xMean * (x[g] - xMean) / sxx : 1.0 / n;
            readVar += c * c * var[g];
            sumC2 += c * c;
            double resid = m[g] - bias - slope * (fit ? x[g] : 0);
            rss += resid * resid;
        }
        int dof = n - (fit ? 2 : 1);
        double gaugeVar = !readsOnly && dof > 0 ? sumC2 * rss / dof : 0;
        double se = Math.sqrt(Math.max(readVar, gaugeVar));
        double z = se > 0 ? bias / se : (bias == 0 ? 0 : Math.copySign(Double.POSITIVE_INFINITY, bias));
        return new Item(index, n, total, bias, se, z, false, true);
    }
}
