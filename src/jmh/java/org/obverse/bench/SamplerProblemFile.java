package org.obverse.bench;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.obverse.anneal.BetaRange;
import org.obverse.anneal.SamplerSettings;
import org.obverse.model.IsingProblem;

/**
 * Writes the benchmark's spin glasses for the C yardstick bench/metropolis.c: "n terms sweeps",
 * the n + 1 row starts, one "neighbour coupling" line per term, then β of every sweep of the
 * default anneal, doubles as hex floats so C reads exactly the values Java uses.
 * {@code java -cp target/obverse-bench.jar org.obverse.bench.SamplerProblemFile DIR} writes
 * {@code DIR/pm1.txt} and {@code DIR/gaussian.txt}.
 */
public final class SamplerProblemFile {
    private SamplerProblemFile() {
    }

    public static void main(String[] args) throws IOException {
        Path dir = Path.of(args[0]);
        write(SamplerBench.problem(false), dir.resolve("pm1.txt"));
        write(SamplerBench.problem(true), dir.resolve("gaussian.txt"));
    }

    static void write(IsingProblem p, Path out) throws IOException {
        int n = p.size();
        int[] start = p.adjacencyStarts();
        int[] neighbour = p.adjacencyVariables();
        int[] edge = p.adjacencyEdges();
        double[] range = BetaRange.automatic(p);
        double[] betas = BetaRange.perSweep(SamplerSettings.defaults(), range[0], range[1]);
        try (PrintWriter w = new PrintWriter(Files.newBufferedWriter(out, StandardCharsets.US_ASCII))) {
            w.println(n + " " + neighbour.length + " " + betas.length);
            for (int k = 0; k <= n; k++) {
                w.println(start[k]);
            }
            for (int q = 0; q < neighbour.length; q++) {
                w.println(neighbour[q] + " " + Double.toHexString(p.coupling(edge[q])));
            }
            for (double b : betas) {
                w.println(Double.toHexString(b));
            }
        }
    }
}
