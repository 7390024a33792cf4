package org.obverse.stats;

/**
 * Accumulates, per gauge, the device-frame sums a bias diagnosis needs: Σ s_i per qubit and
 * Σ s_i s_j per listed coupler, with read counts. Fed from bit-sliced words laid out as the
 * samples package's blocks (word b·n + k holds qubit k of reads 64b … 64b + 63, a set bit is
 * s = +1), so a sum is 2·popcount − reads per word; or from plain ±1 rows. Mutable, not
 * thread-safe; cost (gauges) × (qubits + couplers) longs.
 */
public final class SpinMoments {
    private final int qubits;
    private final int[] couplerA;
    private final int[] couplerB;
    private final long[][] spinSum;
    private final long[][] productSum;
    private final long[] reads;

    private SpinMoments(int gauges, int qubits, int[] couplerA, int[] couplerB) {
        this.qubits = qubits;
        this.couplerA = couplerA;
        this.couplerB = couplerB;
        this.spinSum = new long[gauges][qubits];
        this.productSum = new long[gauges][couplerA.length];
        this.reads = new long[gauges];
    }

    /** Sums for gauges × qubits, and for couplers given as pairs of qubit columns (may be empty). */
    public static SpinMoments of(int gauges, int qubits, int[][] couplers) {
        if (gauges < 1 || qubits < 1) {
            throw new IllegalArgumentException("need >= 1 gauge and qubit, got " + gauges + " and " + qubits);
        }
        int[] a = new int[couplers.length];
        int[] b = new int[couplers.length];
        for (int k = 0; k < couplers.length; k++) {
            if (couplers[k].length != 2 || couplers[k][0] == couplers[k][1] || couplers[k][0] < 0
                    || couplers[k][1] < 0 || couplers[k][0] >= qubits || couplers[k][1] >= qubits) {
                throw new IllegalArgumentException("coupler " + k + " must name two distinct qubit columns in [0, "
                        + qubits + ")");
            }
            a[k] = couplers[k][0];
            b[k] = couplers[k][1];
        }
        return new SpinMoments(gauges, qubits, a, b);
    }

    /** Adds bit-sliced reads of one gauge (words: ⌈readCount/64⌉ · qubits, not modified). */
    public void addBitSliced(int gauge, long[] words, int readCount) {
        int blocks = (readCount + 63) >>> 6;
        if (words.length != (long) blocks * qubits) {
            throw new IllegalArgumentException(words.length + " words do not hold " + readCount + " reads of "
                    + qubits + " qubits");
        }
        long[] spins = spinSum[gauge];
        long[] products = productSum[gauge];
        for (int b = 0; b < blocks; b++) {
            int live = Math.min(64, readCount - 64 * b);
            long mask = live == 64 ? -1L : (1L << live) - 1;
            int base = b * qubits;
            for (int k = 0; k < qubits; k++) {
                spins[k] += 2L * Long.bitCount(words[base + k] & mask) - live;
            }
            for (int c = 0; c < couplerA.length; c++) {
                long same = ~(words[base + couplerA[c]] ^ words[base + couplerB[c]]) & mask;
                products[c] += 2L * Long.bitCount(same) - live;
            }
        }
        reads[gauge] += readCount;
    }

    /** Adds one read of ±1 spins (one per qubit) to a gauge. */
    public void addRead(int gauge, byte[] spins) {
        if (spins.length != qubits) {
            throw new IllegalArgumentException("a read has " + qubits + " spins, got " + spins.length);
        }
        for (int k = 0; k < qubits; k++) {
            spinSum[gauge][k] += spins[k];
        }
        for (int c = 0; c < couplerA.length; c++) {
            productSum[gauge][c] += spins[couplerA[c]] * spins[couplerB[c]];
        }
        reads[gauge]++;
    }

    /** Σ s_i per gauge and qubit, as the diagnosis takes it. */
    public double[][] qubitSums() {
        return toDouble(spinSum);
    }

    /** Σ s_i s_j per gauge and coupler. */
    public double[][] couplerSums() {
        return toDouble(productSum);
    }

    /** Reads per gauge, repeated for each of {@code columns} columns. */
    public long[][] readCounts(int columns) {
        long[][] out = new long[reads.length][columns];
        for (int g = 0; g < reads.length; g++) {
            java.util.Arrays.fill(out[g], reads[g]);
        }
        return out;
    }

    /** Number of couplers tracked. */
    public int couplers() {
        return couplerA.length;
    }

    private static double[][] toDouble(long[][] v) {
        double[][] out = new double[v.length][];
        for (int g = 0; g < v.length; g++) {
            out[g] = new double[v[g].length];
            for (int k = 0; k < v[g].length; k++) {
                out[g][k] = v[g][k];
            }
        }
        return out;
    }
}
