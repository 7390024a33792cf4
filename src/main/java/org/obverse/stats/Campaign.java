package org.obverse.stats;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A campaign reduced to counts: for every instance, every setting it was run under, and every
 * gauge of that run, the number of reads, the number of successes, the sums of residual
 * energy, run time and broken chains over those reads, and the least energy seen. That is all
 * scoring and the bootstrap need, so a table of any length is read once and never held row by
 * row: memory is a few numbers per (instance, setting, gauge).
 *
 * <p>Layout (immutable, CSR-like): cell c = instance · settings + setting owns gauges
 * {@code cellStart[c] … cellStart[c+1]-1}; an empty range means the instance was not run under
 * that setting. Gauges of a cell are in ascending gauge index ({@link #NO_GAUGE} first).
 * Instances and settings keep the order in which they were first added.
 */
public final class Campaign {
    /** The gauge index of reads that were not gauged (an empty {@code gauge} field). */
    public static final int NO_GAUGE = -1;

    private final List<String> instances;
    private final List<String> settings;
    private final double[] ground;
    private final boolean[] groundGiven;
    private final int[] cellStart;
    private final int[] gaugeIndex;
    private final long[] reads;
    private final long[] successes;
    private final double[] residualSum;
    private final double[] runTimeSum;
    private final long[] brokenSum;
    private final double[] minEnergy;
    private final long[] answered;

    private Campaign(List<String> instances, List<String> settings, double[] ground, boolean[] groundGiven,
            int[] cellStart, int[] gaugeIndex, long[] reads, long[] successes, double[] residualSum,
            double[] runTimeSum, long[] brokenSum, double[] minEnergy, long[] answered) {
        this.instances = List.copyOf(instances);
        this.settings = List.copyOf(settings);
        this.ground = ground;
        this.groundGiven = groundGiven;
        this.cellStart = cellStart;
        this.gaugeIndex = gaugeIndex;
        this.reads = reads;
        this.successes = successes;
        this.residualSum = residualSum;
        this.runTimeSum = runTimeSum;
        this.brokenSum = brokenSum;
        this.minEnergy = minEnergy;
        this.answered = answered;
    }

    /** A new builder. */
    public static Builder builder() {
        return new Builder();
    }

    public List<String> instances() {
        return instances;
    }

    public List<String> settings() {
        return settings;
    }

    public int instanceCount() {
        return instances.size();
    }

    public int settingCount() {
        return settings.size();
    }

    /** The cell index of (instance, setting). */
    public int cell(int instance, int setting) {
        return instance * settings.size() + setting;
    }

    /** Whether the instance was run under the setting. */
    public boolean has(int instance, int setting) {
        int c = cell(instance, setting);
        return cellStart[c + 1] > cellStart[c];
    }

    /** First gauge slot of a cell. */
    public int gaugeFrom(int cell) {
        return cellStart[cell];
    }

    /** One past the last gauge slot of a cell. */
    public int gaugeTo(int cell) {
        return cellStart[cell + 1];
    }

    /** Total number of gauge slots over all cells. */
    public int gaugeSlots() {
        return gaugeIndex.length;
    }

    public int gaugeIndex(int slot) {
        return gaugeIndex[slot];
    }

    public long reads(int slot) {
        return reads[slot];
    }

    public long successes(int slot) {
        return successes[slot];
    }

    /** Reads of the slot that gave an answer (not discarded for a broken chain); residuals are over these. */
    public long answered(int slot) {
        return answered[slot];
    }

    /** Σ (energy − ground) over the slot's answered reads. */
    public double residualSum(int slot) {
        return residualSum[slot];
    }

    /** Σ run time over the slot's reads. */
    public double runTimeSum(int slot) {
        return runTimeSum[slot];
    }

    /** Σ broken chains over the slot's reads. */
    public long brokenSum(int slot) {
        return brokenSum[slot];
    }

    /** Least energy seen in the slot. */
    public double minEnergy(int slot) {
        return minEnergy[slot];
    }

    /** The ground energy of an instance (given, or the best seen). */
    public double ground(int instance) {
        return ground[instance];
    }

    /** Whether the instance's ground energy was given (false: it is the best energy seen). */
    public boolean groundGiven(int instance) {
        return groundGiven[instance];
    }

    /**
     * Collects counts. Not thread-safe. Adding the same (instance, setting, gauge) again sums
     * into it, so a table can be fed one row at a time or already aggregated.
     */
    public static final class Builder {
        private final Map<String, Integer> instanceIds = new LinkedHashMap<>();
        private final Map<String, Integer> settingIds = new LinkedHashMap<>();
        private final Map<Key, Integer> slotOf = new HashMap<>();
        private final Map<String, Double> groundOf = new HashMap<>();
        private final Map<String, Boolean> groundGivenOf = new HashMap<>();
        private int size;
        private int[] inst = new int[64];
        private int[] sett = new int[64];
        private int[] gauge = new int[64];
        private long[] reads = new long[64];
        private long[] successes = new long[64];
        private double[] residual = new double[64];
        private double[] run = new double[64];
        private long[] broken = new long[64];
        private double[] minEnergy = new double[64];
        private long[] answered = new long[64];
        private String lastInstance;
        private String lastSetting;
        private int lastGauge;
        private int lastSlot = -1;

        private Builder() {
        }

        private record Key(int instance, int setting, int gauge) {
        }

        /** Records an instance's ground energy; given=false marks it as the best energy seen. */
        public Builder ground(String instance, double energy, boolean given) {
            if (!Double.isFinite(energy)) {
                throw new IllegalArgumentException("ground energy of " + instance + " must be finite, got " + energy);
            }
            groundOf.put(instance, energy);
            groundGivenOf.put(instance, given);
            return this;
        }

        /**
         * Adds counts for one (instance, setting, gauge). reads ≥ 1, 0 ≤ successes ≤ reads,
         * the sums over those reads, and the least energy among them.
         */
        public Builder add(String instance, String setting, int gaugeIndex, long readCount, long successCount,
                double residualSum, double runTimeSum, long brokenSum, double leastEnergy) {
            int slot = slot(instance, setting, gaugeIndex, readCount, successCount);
            reads[slot] += readCount;
            answered[slot] += readCount;
            successes[slot] += successCount;
            residual[slot] += residualSum;
            run[slot] += runTimeSum;
            broken[slot] += brokenSum;
            minEnergy[slot] = Math.min(minEnergy[slot], leastEnergy);
            return this;
        }

        /**
         * Adds reads that gave no answer (discarded for a broken chain): they count as reads and
         * as failures, and carry no energy.
         */
        public Builder addUnanswered(String instance, String setting, int gaugeIndex, long readCount,
                double runTimeSum, long brokenSum) {
            int slot = slot(instance, setting, gaugeIndex, readCount, 0);
            reads[slot] += readCount;
            run[slot] += runTimeSum;
            broken[slot] += brokenSum;
            return this;
        }

        private int slot(String instance, String setting, int gaugeIndex, long readCount, long successCount) {
            if (readCount < 1) {
                throw new IllegalArgumentException("reads must be >= 1, got " + readCount);
            }
            if (successCount < 0 || successCount > readCount) {
                throw new IllegalArgumentException("successes must be in [0, " + readCount + "], got " + successCount);
            }
            if (gaugeIndex < NO_GAUGE) {
                throw new IllegalArgumentException("gauge index must be >= 0 (or none), got " + gaugeIndex);
            }
            if (lastSlot >= 0 && gaugeIndex == lastGauge && instance.equals(lastInstance) && setting.equals(lastSetting)) {
                return lastSlot;
            }
            int i = instanceIds.computeIfAbsent(instance, k -> instanceIds.size());
            int s = settingIds.computeIfAbsent(setting, k -> settingIds.size());
            Key key = new Key(i, s, gaugeIndex);
            Integer found = slotOf.get(key);
            int slot = found == null ? newSlot(key, i, s, gaugeIndex) : found;
            lastInstance = instance;
            lastSetting = setting;
            lastGauge = gaugeIndex;
            lastSlot = slot;
            return slot;
        }

        private int newSlot(Key key, int i, int s, int g) {
            if (size == inst.length) {
                int n = size * 2;
                inst = Arrays.copyOf(inst, n);
                sett = Arrays.copyOf(sett, n);
                gauge = Arrays.copyOf(gauge, n);
                reads = Arrays.copyOf(reads, n);
                successes = Arrays.copyOf(successes, n);
                residual = Arrays.copyOf(residual, n);
                run = Arrays.copyOf(run, n);
                broken = Arrays.copyOf(broken, n);
                minEnergy = Arrays.copyOf(minEnergy, n);
                answered = Arrays.copyOf(answered, n);
            }
            inst[size] = i;
            sett[size] = s;
            gauge[size] = g;
            minEnergy[size] = Double.POSITIVE_INFINITY;
            slotOf.put(key, size);
            return size++;
        }

        /** The instances added so far, in order. */
        public List<String> instances() {
            return new ArrayList<>(instanceIds.keySet());
        }

        /**
         * The campaign. Every instance must have a ground energy.
         *
         * @throws IllegalArgumentException naming the first instance without one
         */
        public Campaign build() {
            List<String> is = new ArrayList<>(instanceIds.keySet());
            List<String> ss = new ArrayList<>(settingIds.keySet());
            int nI = is.size();
            int nS = ss.size();
            double[] g = new double[nI];
            boolean[] given = new boolean[nI];
            for (int i = 0; i < nI; i++) {
                Double e = groundOf.get(is.get(i));
                if (e == null) {
                    throw new IllegalArgumentException("instance " + is.get(i) + " has no ground energy");
                }
                g[i] = e;
                given[i] = groundGivenOf.get(is.get(i));
            }
            Integer[] order = new Integer[size];
            for (int k = 0; k < size; k++) {
                order[k] = k;
            }
            Arrays.sort(order, (a, b) -> {
                int ca = inst[a] * nS + sett[a];
                int cb = inst[b] * nS + sett[b];
                return ca != cb ? Integer.compare(ca, cb) : Integer.compare(gauge[a], gauge[b]);
            });
            int[] start = new int[nI * nS + 1];
            int[] gi = new int[size];
            long[] r = new long[size];
            long[] su = new long[size];
            double[] re = new double[size];
            double[] ru = new double[size];
            long[] br = new long[size];
            double[] me = new double[size];
            long[] an = new long[size];
            for (int k = 0; k < size; k++) {
                int o = order[k];
                start[inst[o] * nS + sett[o] + 1]++;
                gi[k] = gauge[o];
                r[k] = reads[o];
                su[k] = successes[o];
                re[k] = residual[o];
                ru[k] = run[o];
                br[k] = broken[o];
                me[k] = minEnergy[o];
                an[k] = answered[o];
            }
            for (int c = 0; c < nI * nS; c++) {
                start[c + 1] += start[c];
            }
            return new Campaign(is, ss, g, given, start, gi, r, su, re, ru, br, me, an);
        }
    }
}
