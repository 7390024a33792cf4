package org.obverse.io.codec;

import java.nio.file.Path;
import java.util.List;

/**
 * A campaign plan ({@code obverse.campaign/1}, spec/campaign.md): the whole experiment declared
 * once — logical instances, the device, chains, a sweep of chain couplings, a grid of anneal
 * schedules, gauges, reads, the chain-break rule, the sampler and a seed. Paths are resolved
 * against the plan's folder. Immutable; made only by {@link CampaignPlanCodec}, which checks
 * every key.
 *
 * @param file            the plan file, for messages and relative paths
 * @param instances       the logical problems, in plan order, names unique
 * @param device          the device file
 * @param chains          the chains file, or null to have them found once per problem structure
 * @param chainCouplings  the chain couplings swept, in plan order, distinct
 * @param chainCouplingMode how a chain coupling is spread over chains: uniform, length or degree
 * @param schedules       the anneal schedules, names unique
 * @param gauges          how many gauges and how they are drawn
 * @param reads           reads per job (per instance, setting and gauge)
 * @param decode          the chain-break rule by name (discard, majority, descend)
 * @param sampler         what produces the raw samples
 * @param seed            the seed every random choice of the campaign derives from
 */
public record CampaignPlan(Path file, List<Instance> instances, Path device, Path chains, double[] chainCouplings,
                           String chainCouplingMode, List<Schedule> schedules, Gauges gauges, int reads, String decode,
                           Sampler sampler, long seed) {
    public CampaignPlan {
        instances = List.copyOf(instances);
        schedules = List.copyOf(schedules);
        chainCouplings = chainCouplings.clone();
    }

    @Override
    public double[] chainCouplings() {
        return chainCouplings.clone();
    }

    /**
     * One logical problem of the campaign.
     *
     * @param name         a label for results rows
     * @param problem      its file
     * @param groundEnergy its ground energy when the plan gives it, else null
     */
    public record Instance(String name, Path problem, Double groundEnergy) {
    }

    /**
     * One anneal schedule. A grid entry has {@code file == null}: a linear anneal of
     * {@code annealUs}, with a pause of {@code pauseUs} at {@code pauseS} unless both are NaN
     * (the no-pause baseline). A listed entry names a schedule file; its anneal and pause
     * columns are NaN (unknown) unless the file's shape shows them.
     */
    public record Schedule(String name, double annealUs, double pauseS, double pauseUs, Path file) {
        /** Whether this is a pause-free anneal (the baseline of a grid). */
        public boolean baseline() {
            return file == null && Double.isNaN(pauseS);
        }
    }

    /**
     * Gauges per (instance, chain coupling): {@code count} drawn by {@code design} under
     * {@code lock}; {@code ungaugedReference} adds, per setting, the same number of reads
     * (count × reads) on the problem as embedded, without a gauge.
     */
    public record Gauges(int count, String design, String lock, boolean ungaugedReference) {
    }

    /**
     * What makes the raw samples: {@code kind} "sa" (the reference sampler), "sqa" (the
     * path-integral sampler) or "external" (a device; the raw files are placed by hand).
     *
     * @param sweepsPerUs  sweeps per microsecond of schedule (sa, sqa)
     * @param kernel       the Metropolis kernel of sa: exact or multi-spin
     * @param errors       a control-error model file, or null
     * @param energyScales an s,A,B table for sqa, or null for the illustrative pair
     * @param energyUnits  the units of that table as the user states them, or null
     * @param temperature  k_B·T for sqa, in the table's energy units (NaN when not sqa)
     * @param slices       imaginary-time slices for sqa (0 when not sqa)
     */
    public record Sampler(String kind, double sweepsPerUs, String kernel, Path errors, Path energyScales,
                          String energyUnits, double temperature, int slices) {
        /** Whether samples come from outside (a device). */
        public boolean external() {
            return kind.equals("external");
        }
    }
}
