package org.obverse.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.io.npy.NpyVectors;

import static org.assertj.core.api.Assertions.assertThat;

/** sample --instance writes the results table of its reads; a missing input is bad input. */
class SampleResultsCommandTest extends CommandTestSupport {
    @TempDir
    Path dir;

    @Test
    void resultsRowsCountEveryReadOnce() throws Exception {
        String out = dir.resolve("run.npy").toString();
        Run r = obverse("sample", "--problem", "examples/problem.json", "--reads", "300", "--seed", "4", "--out", out,
                "--instance", "example", "--setting", "plain");
        assertThat(r.code()).as(r.err()).isZero();
        double[] energies = NpyVectors.readFloat64(dir.resolve("run.energies.npy"), 300);
        List<String> rows = Files.readAllLines(dir.resolve("run.results.csv"));
        assertThat(rows.get(0)).isEqualTo("instance,setting,gauge,energy,count,broken,run_us,energy_frame");
        long total = 0;
        for (String row : rows.subList(1, rows.size())) {
            String[] f = row.split(",");
            assertThat(f[0]).isEqualTo("example");
            assertThat(f[2]).isEmpty();
            double e = Double.parseDouble(f[3]);
            long count = Long.parseLong(f[4]);
            assertThat(java.util.Arrays.stream(energies).filter(x -> x == e).count()).isEqualTo(count);
            assertThat(f[6]).isEqualTo("1");
            // examples/problem.json records no embedding: sampled directly, it is its own logical problem.
            assertThat(f[7]).isEqualTo("logical");
            total += count;
        }
        assertThat(total).isEqualTo(300);
    }

    @Test
    void aMissingInputIsBadInputNotAnIoFailure() {
        Run r = obverse("energy", "--problem", "examples/problem.json", "--samples", dir.resolve("none.npy").toString());
        assertThat(r.code()).isEqualTo(2);
        assertThat(r.err()).contains("none.npy").contains("no such file");
    }
}
