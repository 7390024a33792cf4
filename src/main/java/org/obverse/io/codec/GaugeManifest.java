package org.obverse.io.codec;

import java.util.List;

/**
 * The content of an {@code obverse.gauges/1} manifest: what was gauged (each source file by a
 * path relative to the manifest's folder and its canonical content hash), how (lock policy,
 * design, seed, generator), what came of it (cluster counts, redraws, distinct gauges) and the
 * gauges themselves, each by the qubit ids it flips and its gauged problem file.
 *
 * @param problem   the source problem
 * @param device    the device file
 * @param chains    the chains file, or null
 * @param lock      lock policy label
 * @param design    design label
 * @param seed      the seed
 * @param generator the generator's algorithm name
 * @param seedExpansion how the seed became the generator's native seed
 * @param clusters  cluster counts
 * @param redraws   gauges redrawn for a coupling-sum range
 * @param distinct  gauges giving distinct gauged problems
 * @param gauges    the gauges, by index
 */
public record GaugeManifest(SourceFile problem, SourceFile device, SourceFile chains, String lock, String design,
                            long seed, String generator, String seedExpansion, ClusterCounts clusters, int redraws,
                            int distinct, List<Entry> gauges) {
    public GaugeManifest {
        gauges = List.copyOf(gauges);
    }

    /** A source file: path relative to the manifest's folder, and its canonical content hash. */
    public record SourceFile(String path, String sha256) {
    }

    /** Cluster counts of the lock analysis. */
    public record ClusterCounts(int qubits, int clusters, int free, int pinned, int lockedCouplers, int pinnedQubits) {
    }

    /**
     * One gauge.
     *
     * @param index   its index, 0 …
     * @param flipped qubit ids with g = −1, ascending
     * @param problem its gauged problem's file name, in the manifest's folder
     * @param sha256  the gauged problem's canonical content hash
     */
    public record Entry(int index, int[] flipped, String problem, String sha256) {
        public Entry {
            flipped = flipped.clone();
        }

        @Override
        public int[] flipped() {
            return flipped.clone();
        }

        /** The file stem ("g0007" for "g0007.json"): raw samples for this gauge carry it. */
        public String stem() {
            return problem.endsWith(".json") ? problem.substring(0, problem.length() - 5) : problem;
        }
    }
}
