package org.obverse.problems;

import java.util.concurrent.atomic.AtomicInteger;
import org.obverse.model.BinaryProblem;
import org.obverse.model.IsingProblem;

/**
 * The exact ground state of a small spin problem by visiting every state in Gray-code order:
 * one spin flips per step and the energy moves by ΔE = −2 s_k f_k with maintained local
 * fields, so a step costs O(degree). Up to {@link #MAX_VARIABLES} variables (2³² states); the
 * high spins are fixed per task so that both cores share the work, and the result does not
 * depend on the thread count.
 *
 * <p>Rounding: the running energy is a sum of increments. The best state's energy is
 * recomputed exactly with the problem's own energy; states within {@link #tolerance} of the
 * lowest running energy count as ground states. Ties go to the state with the smaller index
 * (bit k set = spin k up).
 */
public final class GrayCodeSearch {
    /** Largest problem searched. */
    public static final int MAX_VARIABLES = 32;
    private static final int SPLIT_BITS = 4;

    private GrayCodeSearch() {
    }

    /**
     * The result.
     *
     * @param energy       exact energy of the ground state (the problem's own energy)
     * @param state        the ground state, bit k = spin k up (position order)
     * @param groundStates states within the tolerance of the lowest energy
     */
    public record Result(double energy, long state, long groundStates) {
        /** The ground state as ±1 spins by position. */
        public byte[] spins(int n) {
            byte[] s = new byte[n];
            for (int k = 0; k < n; k++) {
                s[k] = (byte) (((state >>> k) & 1L) == 1L ? 1 : -1);
            }
            return s;
        }

        /** The ground state as 0/1 values by position. */
        public byte[] binary(int n) {
            byte[] x = new byte[n];
            for (int k = 0; k < n; k++) {
                x[k] = (byte) ((state >>> k) & 1L);
            }
            return x;
        }
    }

    /** Energies closer than this (relative to the problem's scale) count as equal. */
    public static double tolerance(IsingProblem p) {
        double scale = Math.abs(p.offset());
        for (int k = 0; k < p.size(); k++) {
            scale += Math.abs(p.field(k));
        }
        for (int e = 0; e < p.edgeCount(); e++) {
            scale += Math.abs(p.coupling(e));
        }
        return 1e-9 * Math.max(1.0, scale);
    }

    /** The ground state of a binary problem (through its spin form; energy is the binary one). */
    public static Result solve(BinaryProblem p) {
        Result r = solve(p.toIsing(), 2);
        return new Result(p.energy(r.binary(p.size())), r.state(), r.groundStates());
    }

    /** The ground state, on up to two threads. */
    public static Result solve(IsingProblem p) {
        return solve(p, 2);
    }

    /**
     * The ground state on the given number of threads (≥ 1).
     *
     * @throws IllegalArgumentException for more than {@link #MAX_VARIABLES} variables
     */
    public static Result solve(IsingProblem p, int threads) {
        int n = p.size();
        if (n > MAX_VARIABLES) {
            throw new IllegalArgumentException(n + " variables are too many to enumerate; the limit is " + MAX_VARIABLES);
        }
        if (threads < 1) {
            throw new IllegalArgumentException("threads " + threads + " must be at least 1");
        }
        int split = n > 20 ? SPLIT_BITS : 0;
        int tasks = 1 << split;
        double tol = tolerance(p);
        double[] bestEnergy = new double[tasks];
        long[] bestState = new long[tasks];
        long[] counts = new long[tasks];
        AtomicInteger next = new AtomicInteger();
        Runnable worker = () -> {
            Walker w = new Walker(p, n - split);
            for (int t = next.getAndIncrement(); t < tasks; t = next.getAndIncrement()) {
                w.run((long) t << (n - split), tol);
                bestEnergy[t] = w.best;
                bestState[t] = w.bestState;
                counts[t] = w.count;
            }
        };
        int workers = Math.min(threads, tasks);
        Thread[] pool = new Thread[workers - 1];
        for (int i = 0; i < pool.length; i++) {
            pool[i] = new Thread(worker, "obverse-gray-" + i);
            pool[i].setDaemon(true);
            pool[i].start();
        }
        worker.run();
        for (Thread t : pool) {
            try {
                t.join();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("search was interrupted", e);
            }
        }
        double min = Double.POSITIVE_INFINITY;
        for (double e : bestEnergy) {
            min = Math.min(min, e);
        }
        long state = -1;
        long count = 0;
        for (int t = 0; t < tasks; t++) {
            if (bestEnergy[t] <= min + tol) {
                count += counts[t];
                if (state == -1 || Long.compareUnsigned(bestState[t], state) < 0) {
                    state = bestState[t];
                }
            }
        }
        Result r = new Result(0.0, state, count);
        return new Result(p.energy(r.spins(n)), state, count);
    }

    /** One Gray-code walk over the low spins with the high spins fixed. */
    private static final class Walker {
        private final IsingProblem p;
        private final int n;
        private final int low;
        private final int[] start;
        private final int[] neighbour;
        private final double[] csr;
        private final byte[] spins;
        private final double[] field;
        double best;
        long bestState;
        long count;

        Walker(IsingProblem p, int low) {
            this.p = p;
            this.n = p.size();
            this.low = low;
            start = p.adjacencyStarts();
            neighbour = p.adjacencyVariables();
            int[] edge = p.adjacencyEdges();
            csr = new double[neighbour.length];
            for (int q = 0; q < csr.length; q++) {
                csr[q] = p.coupling(edge[q]);
            }
            spins = new byte[n];
            field = new double[n];
        }

        void run(long prefix, double tol) {
            long state = prefix;
            for (int k = 0; k < n; k++) {
                spins[k] = (byte) (((state >>> k) & 1L) == 1L ? 1 : -1);
            }
            for (int k = 0; k < n; k++) {
                double f = p.field(k);
                for (int q = start[k]; q < start[k + 1]; q++) {
                    f += csr[q] * spins[neighbour[q]];
                }
                field[k] = f;
            }
            double energy = p.energy(spins);
            best = energy;
            bestState = state;
            count = 1;
            long steps = 1L << low;
            for (long t = 1; t < steps; t++) {
                int k = Long.numberOfTrailingZeros(t);
                energy += -2.0 * spins[k] * field[k];
                byte s = (byte) -spins[k];
                spins[k] = s;
                state ^= 1L << k;
                double twice = 2.0 * s;
                for (int q = start[k]; q < start[k + 1]; q++) {
                    field[neighbour[q]] += twice * csr[q];
                }
                if (energy < best - tol) {
                    best = energy;
                    bestState = state;
                    count = 1;
                } else if (energy <= best + tol) {
                    count++;
                    if (energy < best) {
                        best = energy;
                    }
                    if (Long.compareUnsigned(state, bestState) < 0) {
                        bestState = state;
                    }
                }
            }
        }
    }
}
