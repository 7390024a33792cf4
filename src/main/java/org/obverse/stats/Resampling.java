package org.obverse.stats;

import java.util.Arrays;
import java.util.List;

/**
 * Which levels of a campaign (instances → gauges → reads) a bootstrap replicate redraws.
 *
 * <p>Davison and Hinkley (Bootstrap Methods and their Application, Cambridge 1997, §3.8,
 * two-stage sampling; cited from memory) show that resampling the top stage with replacement
 * and then the second stage with replacement again counts the within-cluster variance twice
 * (about σ²_between / a + 2 σ²_within / (ab) instead of σ²_between / a + σ²_within / (ab)), while
 * resampling only the top stage and keeping each drawn cluster's data as observed reproduces
 * both components, because a cluster's mean already carries its own within-cluster noise. For
 * a campaign the clusters are instances: {@link #INSTANCES} is the default. The other schemes
 * answer narrower questions and say so in their names.
 */
public enum Resampling {
    /** Instances with replacement; each drawn instance keeps its gauges and reads as observed. */
    INSTANCES("instances", true, false, false,
            "instances drawn with replacement; each drawn instance keeps its gauges and reads as observed"),
    /** Instances, then each drawn instance's gauges, both with replacement (counts gauge scatter twice). */
    INSTANCES_THEN_GAUGES("instances-then-gauges", true, true, false,
            "instances drawn with replacement, then each drawn instance's gauges with replacement "
                    + "(counts the gauge-to-gauge scatter twice: wider bands)"),
    /** The campaign's instances held fixed; each instance's gauges with replacement. */
    GAUGES_ONLY("gauges-only", false, true, false,
            "the campaign's instances held fixed; each instance's gauges drawn with replacement "
                    + "(a run with one gauge has its reads redrawn as binomial draws instead)"),
    /** Instances and gauges held fixed; each gauge's successes redrawn as Binomial(reads, observed rate). */
    READS_ONLY("reads-only", false, false, true,
            "the campaign's instances and gauges held fixed; each gauge's successes redrawn as "
                    + "Binomial(reads, observed rate)");

    private final String label;
    private final boolean instances;
    private final boolean gauges;
    private final boolean reads;
    private final String description;

    Resampling(String label, boolean instances, boolean gauges, boolean reads, String description) {
        this.label = label;
        this.instances = instances;
        this.gauges = gauges;
        this.reads = reads;
        this.description = description;
    }

    /** The name as written on the command line and in the scores. */
    public String label() {
        return label;
    }

    /** One sentence saying what a replicate redraws. */
    public String description() {
        return description;
    }

    /** Whether a replicate draws instances with replacement (else every instance once, as observed). */
    public boolean drawsInstances() {
        return instances;
    }

    /** Whether a replicate draws each instance's gauges with replacement. */
    public boolean drawsGauges() {
        return gauges;
    }

    /** Whether a replicate redraws every gauge's successes as a binomial draw. */
    public boolean drawsReads() {
        return reads;
    }

    /** The scheme with this label. */
    public static Resampling of(String label) {
        for (Resampling r : values()) {
            if (r.label.equals(label)) {
                return r;
            }
        }
        throw new IllegalArgumentException("no resampling scheme '" + label + "'; use one of " + labels());
    }

    /** All labels, comma separated. */
    public static String labels() {
        return String.join(", ", Arrays.stream(values()).map(Resampling::label).toList());
    }

    /** All labels. */
    public static List<String> labelList() {
        return Arrays.stream(values()).map(Resampling::label).toList();
    }
}
