package org.obverse.cli;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.ControlErrorsCodec;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.table.MagnetisationTable;
import org.obverse.io.codec.ManifestCodec;
import org.obverse.io.Messages;
import org.obverse.io.npy.NpyVectors;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.table.GroundTable;
import org.obverse.io.table.ResultsTable;
import org.obverse.io.samples.SampleFiles;
import org.obverse.io.codec.ScheduleCodec;
import org.obverse.model.VariableIndex;
import org.obverse.stats.SuccessRule;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;

/**
 * The in-process half of the attack harness (issue 13): seeded mutations of a valid file of
 * every format go through its reader. A clean outcome is a value, or a bad-input refusal
 * ({@link Main#isBadInput}) whose message is one line of at most {@link Messages#MAX_MESSAGE}
 * characters; anything else (a null pointer, an index error, an I/O failure, running out of
 * memory or stack) is a finding, reported with the seed that replays it. No case may take
 * more than 5 s. The counts of each outcome go to {@code target/fuzz-readers.txt}.
 */
class ReaderFuzzTest extends QuietTest {
    /** Cases in {@code mvn verify}; {@code -Pfuzz} multiplies them (obverse.fuzz.scale). */
    static final int CASES = 2000;
    static final Duration PER_CASE = Duration.ofSeconds(5);

    @TempDir
    Path dir;

    interface Reader {
        Object read(Path file) throws Exception;
    }

    static Map<String, Reader> readers() {
        VariableIndex six = VariableIndex.of(0, 1, 2, 3, 4, 5);
        Map<String, Reader> r = new LinkedHashMap<>();
        r.put("problem.json", f -> ProblemCodec.read(f).spin());
        r.put("logical.json", f -> ProblemCodec.read(f).spin());
        r.put("g0000.json", f -> ProblemCodec.read(f).spin());
        r.put("device.json", DeviceCodec::read);
        r.put("chains.json", ChainsCodec::read);
        r.put("errors.json", ControlErrorsCodec::read);
        r.put("schedule-pause.json", ScheduleCodec::read);
        r.put("manifest.json", ManifestCodec::read);
        r.put("results.csv", f -> ResultsTable.read(f, null, SuccessRule.DEFAULT));
        r.put("ground.csv", GroundTable::readEnergies);
        r.put("samples.csv", f -> SampleFiles.readAll(f, six));
        r.put("samples.npy", f -> SampleFiles.readAll(f, null));
        r.put("energies.npy", f -> NpyVectors.readFloat64(f, NpyVectors.ANY_LENGTH));
        r.put("magnetisation.csv", MagnetisationTable::read);
        r.put("correlations.csv", MagnetisationTable::readCouplers);
        r.put("schedule-table.csv", f -> SpectrumCommand.readSchedule(f, "units"));
        return r;
    }

    /** Whether a refusal is clean: bad input, one bounded line. */
    static boolean clean(Throwable t) {
        if (!Main.isBadInput(t)) {
            return false;
        }
        String m = t.getMessage();
        return m != null && !m.isEmpty() && m.length() <= Messages.MAX_MESSAGE && m.chars().noneMatch(c -> c < 0x20);
    }

    @Test
    void mutatedFilesAreReadOrRefusedCleanly() throws Exception {
        Map<String, byte[]> seeds = FuzzCorpus.seeds(dir);
        Map<String, Reader> readers = readers();
        List<String> names = new ArrayList<>(readers.keySet());
        // The seeds themselves are valid.
        for (String n : names) {
            Path f = Files.write(dir.resolve(n), seeds.get(n));
            readers.get(n).read(f);
        }
        int cases = CASES * FuzzCorpus.SCALE;
        long base = 13_000_000L;
        Map<String, int[]> tally = new TreeMap<>();
        List<String> findings = new ArrayList<>();
        long[] current = {0};
        assertTimeoutPreemptively(PER_CASE.multipliedBy(Math.max(6, cases / 200)), () -> {
            for (int c = 0; c < cases; c++) {
                long seed = base + c;
                current[0] = seed;
                UniformRandomProvider rng = Seeds.rng(seed);
                String name = names.get(rng.nextInt(names.size()));
                Path f = Files.write(dir.resolve("case-" + name), FuzzCorpus.mutate(seeds.get(name), rng));
                int[] t = tally.computeIfAbsent(name, k -> new int[3]);
                long start = System.nanoTime();
                try {
                    readers.get(name).read(f);
                    t[0]++;
                } catch (Throwable e) {
                    if (clean(e)) {
                        t[1]++;
                    } else {
                        t[2]++;
                        if (findings.size() < 20) {
                            findings.add("seed " + seed + " (" + name + "): " + e);
                        }
                    }
                }
                long ms = (System.nanoTime() - start) / 1_000_000;
                if (ms > PER_CASE.toMillis()) {
                    findings.add("seed " + seed + " (" + name + ") took " + ms + " ms");
                }
            }
        }, () -> "the reader fuzz did not finish; the case running was seed " + current[0]);
        writeTally(Path.of("target", "fuzz-readers.txt"), cases, tally);
        assertThat(findings).as("unclean outcomes; replay a seed with Seeds.rng(seed)").isEmpty();
    }

    static void writeTally(Path file, int cases, Map<String, int[]> tally) throws IOException {
        StringBuilder s = new StringBuilder("cases " + cases + "\nfile accepted refused unclean\n");
        for (Map.Entry<String, int[]> e : tally.entrySet()) {
            s.append(e.getKey()).append(' ').append(e.getValue()[0]).append(' ').append(e.getValue()[1]).append(' ')
                    .append(e.getValue()[2]).append('\n');
        }
        Files.createDirectories(file.getParent());
        Files.writeString(file, s);
    }
}
