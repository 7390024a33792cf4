package org.obverse.random;

/**
 * Every purpose number given to {@link RandomStreams#derive} and
 * {@link RandomStreams#generator}, in one list so that no two uses under the same seed share
 * one. The numbers are part of the recorded results: changing one changes every output drawn
 * from it.
 */
public final class StreamPurpose {
    // Under the seed of one sampling run.

    /** Per-read generators of the exact (one read at a time) reference sampler. */
    public static final long READS = 1;
    /** Per-word generators of the multi-spin-coded sampler (one word holds 64 reads). */
    public static final long WORDS = 2;
    /** Static per-qubit field offsets of a simulated device (under the device's seed). */
    public static final long FIELD_OFFSETS = 3;
    /** Static per-coupler offsets of a simulated device (under the device's seed). */
    public static final long COUPLER_OFFSETS = 4;
    /** Per-gauge seeds when one call samples or decodes every gauge of a manifest. */
    public static final long GAUGES = 5;
    /** Per-read generators of the path-integral sampler. */
    public static final long PATH_INTEGRAL_READS = 6;

    // Under a campaign plan's seed.

    /** The chain search of each instance. */
    public static final long PLAN_CHAINS = 101;
    /** The gauge draw of each (instance, chain coupling). */
    public static final long PLAN_GAUGES = 102;
    /** The sampling seed of each job. */
    public static final long PLAN_JOBS = 103;
    /** The tie coin of each job's decoding. */
    public static final long PLAN_DECODE = 104;

    private StreamPurpose() {
    }
}
