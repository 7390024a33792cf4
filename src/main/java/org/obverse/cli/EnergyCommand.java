package org.obverse.cli;

import java.util.List;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.concurrent.Callable;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.BadInputException;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.samples.SampleReader;
import org.obverse.model.IsingProblem;
import org.obverse.samples.SampleBlock;
import org.obverse.samples.EnergyKernel;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/** {@code obverse energy}: the energy of every read of a samples file under a problem. */
@Command(name = "energy", mixinStandardHelpOptions = true,
        description = "Computes the energy of each read (exact, fixed summation order). With --out writes them as "
                + "NPY float64, one per read; without, prints count, min, mean and max.")
public final class EnergyCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--problem", required = true, paramLabel = "P", description = "the problem (obverse.problem/1)")
    Path problem;

    @Option(names = "--samples", required = true, paramLabel = "S",
            description = "samples (.npy int8 or .csv, -1/+1, columns = ascending variable ids)")
    Path samples;

    @Option(names = "--out", paramLabel = "E.npy", description = "write the energies here (NPY float64)")
    Path out;

    @Mixin
    ForceOption force;

    @Option(names = "--binary", description = "samples are stored as 0/1 (x = (1 + s) / 2) instead of -1/+1")
    boolean binary;

    @Option(names = "--kernel", paramLabel = "K", defaultValue = "exact",
            description = "exact (default: the fixed summation order's bits) or fast (bit counters and tables, "
                    + "within a stated bound of exact; the bound is printed)")
    String kernel;

    @Override
    public Integer call() throws Exception {
        IsingProblem p = ProblemCodec.read(problem).spin();
        EnergyKernel k = chosenKernel(p);
        double[] energies = new double[1024];
        long reads = 0;
        try (SampleReader in = SampleFiles.open(samples, p.variables(), binary ? SampleCoding.BINARY : SampleCoding.SPIN)) {
            SampleBlock b = null;
            double[] chunk = new double[4096];
            while ((b = in.nextBlock(4096, b)) != null) {
                if (reads + b.reads() > SampleFiles.MAX_READS) {
                    throw BadInputException.at(samples, "", "holds more than " + SampleFiles.MAX_READS + " reads",
                            "split the samples over several files");
                }
                k.energies(b, chunk, 0);
                if (reads + b.reads() > energies.length) {
                    energies = Arrays.copyOf(energies, (int) Math.max(energies.length * 2L, reads + b.reads()));
                }
                System.arraycopy(chunk, 0, energies, (int) reads, b.reads());
                reads += b.reads();
            }
        }
        energies = Arrays.copyOf(energies, (int) reads);
        PrintWriter w = spec.commandLine().getOut();
        if (kernel.equals("fast")) {
            w.printf("fast kernel: each energy within %s of the exact one%n", EnergyKernel.of(p).tolerance());
        }
        if (out != null) {
            double[] all = energies;
            AtomicOutput.writeFiles(List.of(out), force.on(), AtomicOutput.inputs(problem, samples),
                    files -> NpyVectors.writeFloat64(files.get(0), false, all));
            w.printf("wrote %d energies to %s%n", reads, out);
            return Main.DONE;
        }
        double min = Double.POSITIVE_INFINITY;
        double max = Double.NEGATIVE_INFINITY;
        double sum = 0;
        for (double e : energies) {
            min = Math.min(min, e);
            max = Math.max(max, e);
            sum += e;
        }
        if (reads == 0) {
            w.println("count 0");
        } else {
            w.printf("count %d  min %s  mean %s  max %s%n", reads, min, sum / reads, max);
        }
        return Main.DONE;
    }

    private EnergyKernel chosenKernel(IsingProblem p) {
        switch (kernel) {
            case "exact":
                return EnergyKernel.exact(p);
            case "fast":
                return EnergyKernel.of(p);
            default:
                throw new picocli.CommandLine.ParameterException(spec.commandLine(),
                        "--kernel " + kernel + " is not a kernel: give exact or fast");
        }
    }
}
