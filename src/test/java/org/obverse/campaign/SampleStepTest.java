package org.obverse.campaign;

import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.anneal.AnnealSchedule;
import org.obverse.anneal.SampledReads;
import org.obverse.anneal.SamplerSettings;
import org.obverse.gauge.GaugeDesign;
import org.obverse.gauge.LockPolicy;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.table.ResultsTable;
import org.obverse.io.samples.SampleCoding;
import org.obverse.io.samples.SampleFiles;
import org.obverse.model.IsingProblem;
import org.obverse.samples.SampleBlock;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;

/** SampleStep called directly: the per-job entry point and the manifest run agree byte for byte. */
class SampleStepTest extends QuietTest {
    @TempDir
    Path dir;

    private static final Path PROBLEM = Path.of("examples/problem.json");

    private static SamplerSettings settings() {
        return SamplerSettings.defaults().withSweepsPerMicrosecond(100).withThreads(2);
    }

    @Test
    void oneGaugeSampledInMemoryEqualsTheManifestRunsFile() throws Exception {
        GaugeStep.Result g = GaugeStep.run(new GaugeStep.Request(PROBLEM, Path.of("examples/device.json"),
                Path.of("examples/chains.json"), LockPolicy.CHAINS, GaugeDesign.ofLabel("random"), 3, 11,
                dir.resolve("g"), false));
        SampleStep.Result all = SampleStep.run(new SampleStep.Request(null, g.manifestFile(), settings(), 70, 9,
                dir.resolve("raw"), SampleCoding.SPIN, null, false, null));
        assertThat(all.done()).hasSize(3);
        for (GaugeManifest.Entry e : g.manifest().gauges()) {
            ProblemFile pf = ProblemCodec.read(dir.resolve("g").resolve(e.problem()));
            Path target = dir.resolve("job-" + e.index() + ".npy");
            SampledReads s = SampleStep.sampleInto(pf, settings().withThreads(1), 70, SampleStep.gaugeSeed(9, e.index()),
                    target, SampleCoding.SPIN, false);
            assertThat(s.reads()).isEqualTo(70);
            assertThat(Files.readAllBytes(target)).isEqualTo(Files.readAllBytes(dir.resolve("raw/" + e.stem() + ".npy")));
            assertThat(Files.readAllBytes(dir.resolve("job-" + e.index() + ".energies.npy")))
                    .isEqualTo(Files.readAllBytes(dir.resolve("raw/" + e.stem() + ".energies.npy")));
            // The energies are the gauged problem's, recomputed here read by read (common practice, no source).
            IsingProblem p = pf.spin();
            SampleBlock b = SampleFiles.readAll(target, p.variables());
            double[] energies = NpyVectors.readFloat64(dir.resolve("job-" + e.index() + ".energies.npy"), 70);
            byte[] row = new byte[p.size()];
            for (int r = 0; r < 70; r++) {
                b.unpackRows(r, 1, row);
                assertThat(energies[r]).isEqualTo(p.energy(row));
            }
        }
        assertThat(all.results()).isNull();
        assertThat(dir.resolve("raw/results.csv")).doesNotExist();
    }

    @Test
    void resultsRowsCountEachDistinctEnergyAndCarryTheScheduleRunTime() throws Exception {
        SamplerSettings s = settings().withSchedule(AnnealSchedule.withPause(2.0, 0.4, 3.0));
        SampleStep.Result r = SampleStep.run(new SampleStep.Request(PROBLEM, null, s, 200, 4, dir.resolve("run.csv"),
                SampleCoding.SPIN, new SampleStep.Labels("ex", "pause"), false, null));
        assertThat(r.results()).isEqualTo(dir.resolve("run.results.csv"));
        double[] energies = NpyVectors.readFloat64(dir.resolve("run.energies.npy"), 200);
        List<String> rows = Files.readAllLines(r.results());
        long total = 0;
        for (String row : rows.subList(1, rows.size())) {
            String[] f = row.split(",");
            double e = Double.parseDouble(f[3]);
            assertThat(java.util.Arrays.stream(energies).filter(x -> x == e).count()).isEqualTo(Long.parseLong(f[4]));
            // anneal 2 us plus a 3 us pause: one read takes 5 us.
            assertThat(Double.parseDouble(f[6])).isEqualTo(5.0);
            total += Long.parseLong(f[4]);
        }
        assertThat(total).isEqualTo(200);
        assertThat(r.done().get(0).runUs()).isEqualTo(5.0);

        // The row function alone gives the same rows.
        StringWriter again = new StringWriter();
        SampleStep.writeRows(ResultsTable.RowWriter.start(again, List.of()), new SampleStep.Labels("ex", "pause"), -1,
                5.0, energies);
        assertThat(again.toString()).isEqualTo(Files.readString(r.results()));
    }
}
