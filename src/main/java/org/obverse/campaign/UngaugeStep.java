package org.obverse.campaign;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.obverse.gauge.Gauge;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.npy.NpyReader;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.samples.SampleReader;
import org.obverse.io.samples.SampleWriter;
import org.obverse.io.table.MagnetisationTable;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;
import org.obverse.samples.SpinFlip;
import org.obverse.samples.SpinMoments;

/**
 * Maps raw samples out of their gauges: for each gauge of a manifest, {@code SAMPLES/<stem>.npy}
 * (or {@code .csv}) in the device frame becomes {@code OUT/<stem>.npy} (same layout) in the
 * source frame, s = g ∘ s'. Streams each file in chunks, so files larger than memory work.
 * Refuses a changed source or gauged problem, a wrong width, values other than ±1, and a gauge
 * without its samples unless missing ones are allowed. A reported-energies file
 * {@code <stem>.energies.npy} is copied along unchanged (energies do not change under a gauge).
 * On the way it tallies the device-frame moments that bias diagnostics need and writes them
 * beside the samples: {@code OUT/magnetisation.csv} (qubit, gauge, reads, sum_spin, sign) and
 * {@code OUT/correlations.csv} (qubit_a, qubit_b, gauge, reads, sum_product, sign) over the
 * problem's couplers.
 */
public final class UngaugeStep {
    /** Reads un-gauged per chunk: a multiple of 64. */
    static final int CHUNK_READS = 4096;

    private UngaugeStep() {
    }

    public record Request(Path manifest, Path samples, Path out, boolean allowMissing, boolean force,
                          SampleCoding coding) {
        /** Spin-coded (−1/+1) samples. */
        public Request(Path manifest, Path samples, Path out, boolean allowMissing, boolean force) {
            this(manifest, samples, out, allowMissing, force, SampleCoding.SPIN);
        }
    }

    /** One un-gauged file. */
    public record Done(int gauge, Path input, Path output, long reads) {
    }

    public record Result(List<Done> done, List<Integer> missing) {
    }

    public static Result run(Request r) throws IOException {
        SourceFiles src = new SourceFiles(r.manifest());
        GaugeManifest m = src.manifest;
        Path problemPath = src.resolve(m.problem());
        ProblemFile pf = src.problem();
        SourceFiles.requireHash(problemPath, ProblemCodec.contentHash(pf), m.problem().sha256(), "source problem");
        VariableIndex ids = pf.variables();
        if (!Files.isDirectory(r.samples())) {
            throw BadInputException.at(r.samples(), "", "is not a folder", "give the folder that holds the raw samples");
        }
        List<Path> inputs = new ArrayList<>();
        List<Integer> missing = new ArrayList<>();
        List<Gauge> gauges = new ArrayList<>();
        for (GaugeManifest.Entry e : m.gauges()) {
            Path gp = src.folder.resolve(e.problem());
            ProblemFile gauged = ProblemCodec.read(gp);
            SourceFiles.requireHash(gp, ProblemCodec.contentHash(gauged), e.sha256(), "gauged problem of gauge " + e.index());
            if (!gauged.variables().equals(ids)) {
                throw BadInputException.at(gp, "", "its variables differ from the source problem's",
                        "restore the gauged problem or draw the gauges again");
            }
            gauges.add(toGauge(r.manifest(), e, ids));
            Path found = SourceFiles.gaugeSamples(r.samples(), e);
            if (found == null) {
                if (!r.allowMissing()) {
                    throw BadInputException.at(r.samples(), "", "no samples for gauge " + e.index() + " (expected "
                            + SourceFiles.gaugeSampleNames(e) + ")",
                            "add the file, or pass --allow-missing if the gauge was not run");
                }
                missing.add(e.index());
            }
            inputs.add(found);
        }
        List<Done> done = new ArrayList<>();
        IsingProblem spin = pf.spin();
        List<Path> read = new ArrayList<>(List.of(r.manifest(), r.samples(), problemPath, src.resolve(m.device())));
        if (m.chains() != null) {
            read.add(src.resolve(m.chains()));
        }
        for (GaugeManifest.Entry e : m.gauges()) {
            read.add(src.folder.resolve(e.problem()));
        }
        AtomicOutput.writeDirectory(r.out(), r.force(), read, dir -> {
            MagnetisationTable.QubitRows mag = new MagnetisationTable.QubitRows();
            MagnetisationTable.CouplerRows cor = new MagnetisationTable.CouplerRows();
            for (int i = 0; i < inputs.size(); i++) {
                Path in = inputs.get(i);
                if (in == null) {
                    continue;
                }
                GaugeManifest.Entry e = m.gauges().get(i);
                Path out = SampleFiles.sameLayout(in, dir, e.stem());
                SpinMoments mom = SpinMoments.of(spin);
                long reads = ungaugeFile(in, out, ids, gauges.get(i), r.coding(), mom);
                appendMoments(mag, cor, mom, e.index(), gauges.get(i), ids, spin);
                Path energies = r.samples().resolve(e.stem() + ".energies.npy");
                if (Files.exists(energies)) {
                    NpyReader.open(energies).close(); // a regular NPY file whose length matches its header
                    Files.copy(energies, dir.resolve(energies.getFileName()));
                }
                done.add(new Done(e.index(), in, r.out().resolve(out.getFileName()), reads));
            }
            mag.write(dir.resolve("magnetisation.csv"));
            cor.write(dir.resolve("correlations.csv"));
        });
        return new Result(done, missing);
    }

    /** Un-gauges one file, streaming. */
    static long ungaugeFile(Path in, Path out, VariableIndex ids, Gauge g, SampleCoding coding, SpinMoments mom)
            throws IOException {
        SpinFlip flip = SpinFlip.of(ids.size(), g.flippedPositions());
        try (SampleReader reader = SampleFiles.open(in, ids, coding);
             SampleWriter writer = SampleFiles.create(out, ids, false, coding)) {
            SampleBlock b = null;
            while ((b = reader.nextBlock(CHUNK_READS, b)) != null) {
                mom.add(b);
                flip.applyInPlace(b);
                writer.writeBlock(b);
            }
            writer.commit();
            return writer.readsWritten();
        }
    }

    /** Appends one gauge's device-frame sums (its raw reads) to the magnetisation and correlation tables. */
    static void appendMoments(MagnetisationTable.QubitRows mag, MagnetisationTable.CouplerRows cor, SpinMoments mom,
                              int gauge, Gauge g, VariableIndex ids, IsingProblem p) {
        long reads = mom.reads();
        if (reads == 0) {
            return; // an empty file has no moments; the tables require reads >= 1
        }
        for (int k = 0; k < p.size(); k++) {
            mag.add(ids.id(k), gauge, reads, mom.spinSum(k), g.sign(k));
        }
        for (int e = 0; e < p.edgeCount(); e++) {
            cor.add(ids.id(p.edgeU(e)), ids.id(p.edgeV(e)), gauge, reads, mom.productSum(e),
                    g.sign(p.edgeU(e)) * g.sign(p.edgeV(e)));
        }
    }

    /** The gauge of a manifest entry, by position of the source's variables. */
    static Gauge toGauge(Path manifest, GaugeManifest.Entry e, VariableIndex ids) {
        int[] ids2 = e.flipped();
        int[] pos = new int[ids2.length];
        for (int k = 0; k < ids2.length; k++) {
            pos[k] = ids.indexOf(ids2[k]);
            if (pos[k] < 0) {
                throw BadInputException.at(manifest, "gauges[" + e.index() + "].flipped", "names qubit " + ids2[k]
                        + ", which the source problem does not use", "restore the manifest or draw the gauges again");
            }
        }
        return Gauge.flipping(ids.size(), pos);
    }
}
