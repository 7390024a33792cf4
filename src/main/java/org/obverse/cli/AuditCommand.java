package org.obverse.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.obverse.campaign.AuditCheck;
import org.obverse.campaign.ManifestAudit;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/** {@code obverse audit}: re-derives and checks everything a manifest claims. */
@Command(name = "audit", mixinStandardHelpOptions = true,
        description = {"Re-derives every gauged problem from the source and the recorded flips and checks hashes, "
                + "limits, locks and energy invariance (bit for bit) on the raw samples, or on seeded random samples.",
            "Prints one line per check; exit 0 only if every check holds, 1 if any fails."})
public final class AuditCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--manifest", required = true, paramLabel = "M", description = "the gauges' manifest.json")
    Path manifest;

    @Option(names = "--samples", paramLabel = "DIR",
            description = "folder of raw samples (<stem>.npy or .csv, device frame), with optional <stem>.energies.npy")
    Path samples;

    @Option(names = "--spectrum",
            description = "also compare each gauged problem's anneal spectrum with the source's (problems of up to "
                    + "about 20 spins; larger ones are listed as skipped)")
    boolean spectrum;

    @Override
    public Integer call() throws Exception {
        ManifestAudit.Report r = ManifestAudit.run(new ManifestAudit.Request(manifest, samples, spectrum));
        PrintWriter w = spec.commandLine().getOut();
        for (AuditCheck c : r.checks()) {
            w.println(c.line());
        }
        if (r.allPassed()) {
            w.printf("audit: all %d checks hold%s%n", r.checks().size(),
                    r.skipped() > 0 ? " (" + r.skipped() + " skipped)" : "");
        } else {
            w.printf("audit: %d of %d checks FAILED%n", r.failures(), r.checks().size());
        }
        return r.allPassed() ? Main.DONE : Main.CHECK_FAILED;
    }
}
