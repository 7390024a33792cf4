package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.IntConsumer;
import org.obverse.anneal.AnnealSchedule;
import org.obverse.device.DeviceLimits;
import org.obverse.device.QubitGraph;
import org.obverse.device.ValueRange;
import org.obverse.embed.ChainStrength;
import org.obverse.embed.Chains;
import org.obverse.gauge.GaugeDesign;
import org.obverse.gauge.LockPolicy;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.CampaignPlan;
import org.obverse.io.codec.CampaignPlanCodec;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.json.ContentHash;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.codec.PreparedCodec;
import org.obverse.io.table.GroundTable;
import org.obverse.io.table.JobTable;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.codec.ScheduleCodec;
import org.obverse.model.IsingProblem;
import org.obverse.problems.GrayCodeSearch;
import org.obverse.random.RandomStreams;
import org.obverse.random.StreamPurpose;

/**
 * Prepares a campaign folder from a plan (spec/campaign.md): copies the inputs in, finds chains
 * once per problem structure where the plan gives none, embeds every instance at every chain
 * coupling, gauges every embedded problem, writes every schedule as (t_us, s) points, works
 * out exact ground energies where an instance is small enough, and lists one job per
 * (instance, chain coupling, schedule, gauge) in {@code jobs.csv}, bound by content hashes.
 * All or nothing: the folder is built under a temporary name and renamed into place.
 *
 * <p>Every random choice derives from the plan's seed by a fixed purpose and index, so the
 * same plan gives the same folder, byte for byte.
 */
public final class CampaignPrepareStep {
    /** Largest logical problem whose ground energy is worked out exactly (every assignment). */
    public static final int EXACT_GROUND_LIMIT = GrayCodeSearch.MAX_VARIABLES;

    /** Chain finding: independent searches, rounds each; no time limit, so the result never depends on speed. */
    static final int FINDER_TRIES = 4;
    static final int FINDER_ROUNDS = 2000;

    private CampaignPrepareStep() {
    }

    /** Prepare the plan into a new folder out (replace an existing one only with force). */
    public record Request(Path plan, Path out, boolean force, int threads) {
    }

    /**
     * What was prepared.
     *
     * @param folder    the campaign folder
     * @param jobs      the jobs
     * @param notes     lines for a person: chains, ground energies, locks
     */
    public record Result(Path folder, List<JobTable.Job> jobs, List<String> notes) {
    }

    /** The plan and every file it names: the output may be none of them, nor hold nor lie inside one. */
    static List<Path> planInputs(CampaignPlan plan) {
        List<Path> l = AtomicOutput.inputs(plan.file(), plan.device(), plan.chains(), plan.sampler().errors(),
                plan.sampler().energyScales());
        for (CampaignPlan.Instance i : plan.instances()) {
            l.add(i.problem());
        }
        for (CampaignPlan.Schedule s : plan.schedules()) {
            if (s.file() != null) {
                l.add(s.file());
            }
        }
        return l;
    }

    public static Result run(Request r, StepProgress progress) throws IOException {
        CampaignPlan plan = CampaignPlanCodec.read(r.plan());
        List<Path> read = planInputs(plan);
        AtomicOutput.checkTarget(r.out(), r.force(), read);
        DeviceLimits device = DeviceCodec.read(plan.device());
        checkCouplings(plan, device);
        List<String> notes = new ArrayList<>();
        List<IsingProblem> logical = new ArrayList<>();
        for (CampaignPlan.Instance i : plan.instances()) {
            logical.add(ProblemCodec.read(i.problem()).spin());
        }
        List<Chains> chains = chains(plan, device, logical, notes);
        double[] ground = new double[logical.size()];
        String[] groundSource = new String[logical.size()];
        for (int k = 0; k < ground.length; k++) {
            CampaignPlan.Instance i = plan.instances().get(k);
            if (i.groundEnergy() != null) {
                ground[k] = i.groundEnergy();
                groundSource[k] = "given";
            } else if (logical.get(k).size() <= EXACT_GROUND_LIMIT) {
                ground[k] = GrayCodeSearch.solve(logical.get(k), Math.max(1, r.threads())).energy();
                groundSource[k] = "exact";
            } else {
                ground[k] = Double.NaN;
                groundSource[k] = "best_seen";
            }
            notes.add(String.format("%s: %d variables, ground energy %s", i.name(), logical.get(k).size(),
                    Double.isNaN(ground[k]) ? "not known (the best energy seen will be used)"
                            : ground[k] + " (" + groundSource[k] + ")"));
        }
        String inputsHash = inputsHash(plan);
        List<JobTable.Job> jobs = new ArrayList<>();
        AtomicOutput.writeDirectory(r.out(), r.force(), read, dir -> {
            CampaignPlanCodec.FileNames inputNames = copyInputs(plan, dir);
            for (int k = 0; k < logical.size(); k++) {
                String name = plan.instances().get(k).name();
                Chains c = chains.get(k);
                ChainsCodec.write(dir.resolve(CampaignFolder.chainsFile(name)), false,
                        new ChainList(c.logicalIds().toArray(), c.qubitGroups()));
            }
            Map<String, AnnealSchedule> schedules = writeSchedules(plan, dir);
            IntConsumer tick = progress.start("preparing", plan.instances().size() * plan.chainCouplings().length, 0);
            int done = 0;
            for (int k = 0; k < logical.size(); k++) {
                CampaignPlan.Instance inst = plan.instances().get(k);
                double[] couplings = plan.chainCouplings();
                for (int v = 0; v < couplings.length; v++) {
                    String embedded = CampaignFolder.embeddedFile(inst.name(), couplings[v]);
                    ProblemFile physical = embed(logical.get(k), chains.get(k), device, couplings[v],
                            plan.chainCouplingMode(), dir.resolve(CampaignFolder.chainsFile(inst.name())));
                    Files.createDirectories(dir.resolve(embedded).getParent());
                    ProblemCodec.write(dir.resolve(embedded), false, physical);
                    String gaugeDir = CampaignFolder.gaugeFolder(inst.name(), couplings[v]);
                    Files.createDirectories(dir.resolve(gaugeDir).getParent());
                    long gaugeSeed = RandomStreams.derive(plan.seed(), StreamPurpose.PLAN_GAUGES, (long) k * couplings.length + v);
                    GaugeStep.Result g = GaugeStep.run(new GaugeStep.Request(dir.resolve(embedded),
                            dir.resolve("inputs/device.json"),
                            dir.resolve(CampaignFolder.chainsFile(inst.name())), LockPolicy.ofLabel(plan.gauges().lock()),
                            GaugeDesign.ofLabel(plan.gauges().design()), plan.gauges().count(), gaugeSeed,
                            dir.resolve(gaugeDir), false));
                    if (k == 0 && v == 0) {
                        GaugeManifest.ClusterCounts cc = g.manifest().clusters();
                        notes.add(String.format("locks (%s): %d qubits in %d clusters: %d free, %d pinned; %d locked "
                                + "couplers", g.manifest().lock(), cc.qubits(), cc.clusters(), cc.free(), cc.pinned(),
                                cc.lockedCouplers()));
                    }
                    String physicalHash = ProblemCodec.contentHash(physical);
                    for (CampaignPlan.Schedule s : plan.schedules()) {
                        String schedFile = "schedules/" + s.name() + ".csv";
                        String schedHash = ContentHash.sha256(Files.readAllBytes(dir.resolve(schedFile)));
                        double run = schedules.get(s.name()).runTimeMicros();
                        for (GaugeManifest.Entry e : g.manifest().gauges()) {
                            jobs.add(job(plan, jobs.size(), inst.name(), couplings[v], s, run, true, e.index(),
                                    plan.reads(), gaugeDir + "/" + e.problem(), e.sha256(),
                                    gaugeDir + "/" + GaugeStep.MANIFEST, schedFile, schedHash));
                        }
                        if (plan.gauges().ungaugedReference()) {
                            jobs.add(job(plan, jobs.size(), inst.name(), couplings[v], s, run, false, -1,
                                    plan.gauges().count() * plan.reads(), embedded, physicalHash, "", schedFile,
                                    schedHash));
                        }
                    }
                    if (tick != null) {
                        tick.accept(++done);
                    }
                }
            }
            List<GroundTable.Row> g = new ArrayList<>();
            for (int k = 0; k < ground.length; k++) {
                g.add(new GroundTable.Row(plan.instances().get(k).name(), ground[k], groundSource[k]));
            }
            Files.writeString(dir.resolve(CampaignFolder.GROUND), GroundTable.text(g));
            Files.writeString(dir.resolve(CampaignFolder.JOBS), JobTable.text(jobs));
            Files.writeString(dir.resolve(CampaignFolder.PLAN), CampaignPlanCodec.relocatedText(plan, inputNames));
            Files.writeString(dir.resolve(CampaignFolder.PREPARED), PreparedCodec.text(inputsHash, jobs.size()));
            Files.createDirectories(dir.resolve(CampaignFolder.RAW));
        });
        notes.add(String.format("%d jobs: %d instances x %d chain couplings x %d schedules x %d gauges%s, %d reads each",
                jobs.size(), plan.instances().size(), plan.chainCouplings().length, plan.schedules().size(),
                plan.gauges().count(), plan.gauges().ungaugedReference() ? " (+ 1 ungauged reference)" : "",
                plan.reads()));
        return new Result(r.out(), jobs, notes);
    }

    /**
     * A hash of the plan's bytes and of every file it names, so that running a plan into a
     * folder prepared from other inputs is refused rather than silently mixed.
     */
    public static String inputsHash(CampaignPlan plan) throws IOException {
        MessageDigest md;
        try {
            md = MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
        for (Path p : namedFiles(plan)) {
            md.update(Files.readAllBytes(p));
            md.update((byte) 0);
        }
        return HexFormat.of().formatHex(md.digest());
    }

    private static List<Path> namedFiles(CampaignPlan plan) {
        List<Path> files = new ArrayList<>();
        files.add(plan.file());
        for (CampaignPlan.Instance i : plan.instances()) {
            files.add(i.problem());
        }
        files.add(plan.device());
        if (plan.chains() != null) {
            files.add(plan.chains());
        }
        for (CampaignPlan.Schedule s : plan.schedules()) {
            if (s.file() != null) {
                files.add(s.file());
            }
        }
        if (plan.sampler().errors() != null) {
            files.add(plan.sampler().errors());
        }
        if (plan.sampler().energyScales() != null) {
            files.add(plan.sampler().energyScales());
        }
        return files;
    }

    private static void checkCouplings(CampaignPlan plan, DeviceLimits device) {
        ValueRange range = device.couplingRange();
        double[] v = plan.chainCouplings();
        for (int k = 0; k < v.length; k++) {
            if (!range.contains(v[k])) {
                throw BadInputException.at(plan.file(), "chain_couplings[" + k + "]", v[k]
                        + " is outside the device's coupling range " + range, "give chain couplings the device "
                        + plan.device().getFileName() + " allows");
            }
        }
        if (device.graph().isEmpty()) {
            throw BadInputException.at(plan.file(), "device", plan.device() + " lists no working graph",
                    "give a device file with \"qubits\" and \"couplers\" (obverse device lattice makes one)");
        }
    }

    /** Chains per instance: the plan's, or found once per distinct problem structure. */
    private static List<Chains> chains(CampaignPlan plan, DeviceLimits device, List<IsingProblem> logical,
                                       List<String> notes) {
        List<Chains> out = new ArrayList<>();
        if (plan.chains() != null) {
            ChainList list = ChainsCodec.read(plan.chains());
            Chains c = Chains.of(list.logicalIds(), list.qubitGroups());
            for (int k = 0; k < logical.size(); k++) {
                out.add(c);
            }
            notes.add("chains: given (" + plan.chains().getFileName() + "), longest " + c.maxLength());
            return out;
        }
        QubitGraph graph = device.graph().orElseThrow();
        Map<String, Chains> byStructure = new LinkedHashMap<>();
        for (int k = 0; k < logical.size(); k++) {
            IsingProblem q = logical.get(k);
            String key = structure(q);
            Chains c = byStructure.get(key);
            if (c == null) {
                int index = byStructure.size();
                c = EmbedStep.findChains(q, graph, null, plan.device(), plan.instances().get(k).problem(),
                        new EmbedStep.Search(EmbedStep.Finder.REROUTE, RandomStreams.derive(plan.seed(), StreamPurpose.PLAN_CHAINS, index),
                                FINDER_ROUNDS, FINDER_TRIES, 0)).chains();
                byStructure.put(key, c);
                notes.add(String.format("chains for %s%s: found on %d qubits, longest chain %d", plan.instances().get(k)
                        .name(), byStructure.size() == 1 && logical.size() > 1 ? " (and every instance of the same "
                        + "structure)" : "", c.qubitCount(), c.maxLength()));
            }
            out.add(c);
        }
        return out;
    }

    /** The variables and coupled pairs of a problem, without values: instances alike in this share chains. */
    static String structure(IsingProblem q) {
        StringBuilder s = new StringBuilder();
        for (int k = 0; k < q.size(); k++) {
            s.append(q.variables().id(k)).append(',');
        }
        s.append('|');
        for (int e = 0; e < q.edgeCount(); e++) {
            s.append(q.variables().id(q.edgeU(e))).append('-').append(q.variables().id(q.edgeV(e))).append(',');
        }
        return s.toString();
    }

    private static ProblemFile embed(IsingProblem logical, Chains chains, DeviceLimits device, double coupling,
                                     String mode, Path chainsFile) {
        ChainStrength strength = new ChainStrength(coupling, ChainStrength.Mode.named(mode));
        return EmbedStep.physicalFile(logical, EmbedStep.embed(logical, chains, device, strength, Double.NaN, chainsFile,
                null));
    }

    /** Copies every named input into inputs/ and returns the plan with its paths pointing there. */
    /** Copies every input into {@code inputs/}; returns their names there, relative to the folder. */
    private static CampaignPlanCodec.FileNames copyInputs(CampaignPlan plan, Path dir) throws IOException {
        Path inputs = Files.createDirectories(dir.resolve("inputs"));
        List<String> problems = new ArrayList<>();
        for (CampaignPlan.Instance i : plan.instances()) {
            String name = i.name() + extension(i.problem());
            Files.copy(i.problem(), inputs.resolve(name));
            problems.add("inputs/" + name);
        }
        Files.copy(plan.device(), inputs.resolve("device.json"));
        String chains = null;
        if (plan.chains() != null) {
            Files.copy(plan.chains(), inputs.resolve("chains.json"));
            chains = "inputs/chains.json";
        }
        List<String> schedules = new ArrayList<>();
        for (CampaignPlan.Schedule s : plan.schedules()) {
            if (s.file() != null) {
                String name = "schedule-" + s.name() + ".json";
                Files.copy(s.file(), inputs.resolve(name));
                schedules.add("inputs/" + name);
            }
        }
        String errors = null;
        if (plan.sampler().errors() != null) {
            Files.copy(plan.sampler().errors(), inputs.resolve("errors.json"));
            errors = "inputs/errors.json";
        }
        String scales = null;
        if (plan.sampler().energyScales() != null) {
            Files.copy(plan.sampler().energyScales(), inputs.resolve("energy-scales.csv"));
            scales = "inputs/energy-scales.csv";
        }
        return new CampaignPlanCodec.FileNames(problems, "inputs/device.json", chains, schedules, errors, scales);
    }

    private static String extension(Path file) {
        String n = file.getFileName().toString();
        int dot = n.lastIndexOf('.');
        return dot > 0 ? n.substring(dot) : "";
    }

    /** Writes every schedule as a (t_us, s) table; returns them by name. */
    private static Map<String, AnnealSchedule> writeSchedules(CampaignPlan plan, Path dir) throws IOException {
        Files.createDirectories(dir.resolve("schedules"));
        Map<String, AnnealSchedule> out = new LinkedHashMap<>();
        for (CampaignPlan.Schedule s : plan.schedules()) {
            AnnealSchedule a = schedule(s);
            out.put(s.name(), a);
            Files.writeString(dir.resolve("schedules/" + s.name() + ".csv"), ScheduleCodec.tableText(a));
        }
        return out;
    }

    /** The anneal schedule of a plan entry. */
    static AnnealSchedule schedule(CampaignPlan.Schedule s) {
        if (s.file() != null) {
            return ScheduleCodec.read(s.file());
        }
        return s.baseline() ? AnnealSchedule.linear(s.annealUs()) : AnnealSchedule.withPause(s.annealUs(), s.pauseS(),
                s.pauseUs());
    }

    private static JobTable.Job job(CampaignPlan plan, int index, String instance, double coupling,
                                    CampaignPlan.Schedule s, double runUs, boolean gauged, int gauge, int reads,
                                    String problem, String problemHash, String manifest, String scheduleFile,
                                    String scheduleHash) {
        String id = String.format("j%05d", index);
        return new JobTable.Job(id, instance, coupling, s.name(), s.annealUs(), s.pauseS(), s.pauseUs(), runUs, gauged,
                gauge, reads, RandomStreams.derive(plan.seed(), StreamPurpose.PLAN_JOBS, index), problem, problemHash, manifest,
                scheduleFile, scheduleHash, CampaignFolder.RAW + "/" + id + ".npy");
    }

}
