package org.obverse.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import org.obverse.anneal.ReferenceSampler;
import org.obverse.anneal.SampledReads;
import org.obverse.anneal.SamplerSettings;
import org.obverse.model.IsingProblem;

/**
 * The whole exact sampler on one thread, as {@code sample} runs it (start spins, local fields,
 * the default 1,000-sweep anneal, spins written out, energies), on the benchmark glass of
 * {@link SamplerBench}: prints spin-update attempts per CPU-nanosecond of the calling thread,
 * set-up and energies included, for a few rounds (the first includes the JIT's warm-up).
 * {@code java -cp target/obverse-bench.jar org.obverse.bench.SamplerRun pm1|gaussian [READS [ROUNDS]]}.
 */
public final class SamplerRun {
    private SamplerRun() {
    }

    public static void main(String[] args) {
        boolean gaussian = args.length > 0 && args[0].equals("gaussian");
        int reads = args.length > 1 ? Integer.parseInt(args[1]) : 64;
        int rounds = args.length > 2 ? Integer.parseInt(args[2]) : 3;
        IsingProblem p = SamplerBench.problem(gaussian);
        ReferenceSampler sampler = ReferenceSampler.of(SamplerSettings.defaults().withThreads(1));
        ThreadMXBean bean = ManagementFactory.getThreadMXBean();
        for (int round = 0; round < rounds; round++) {
            long c0 = bean.getCurrentThreadCpuTime();
            SampledReads out = sampler.sample(p, reads, 5 + round);
            long c1 = bean.getCurrentThreadCpuTime();
            double attempts = (double) reads * p.size() * out.sweeps();
            System.out.println((gaussian ? "gaussian" : "pm1") + " round " + round + ": "
                    + String.format("%.4f", attempts / (c1 - c0)) + " attempts/cpu-ns (" + reads + " reads, "
                    + String.format("%.2f", (c1 - c0) / 1e9) + " s cpu)");
        }
    }
}
