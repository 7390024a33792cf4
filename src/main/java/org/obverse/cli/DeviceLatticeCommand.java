package org.obverse.cli;

import java.util.List;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.concurrent.Callable;
import org.obverse.io.BadInputException;
import org.obverse.device.CellLattice;
import org.obverse.device.DeviceLimits;
import org.obverse.device.QubitGraph;
import org.obverse.device.ValueRange;
import org.obverse.io.output.AtomicOutput;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.random.LegacyStreams;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code obverse device lattice}: a grid of K_{t,t} cells with defects, as a device file. */
@Command(name = "lattice", mixinStandardHelpOptions = true,
        description = {"Writes a device file for a ROWS x COLS grid of K_{t,t} cells (t = --shore), without the "
                + "qubits and couplers removed by list or at random.",
            "Qubit (row, col, side, k) = ((row*COLS + col)*2 + side)*t + k; side 0 couples down to the next row, "
                + "side 1 right to the next column, and inside a cell every side-0 qubit couples to every side-1 qubit.",
            "The lattice's shape is kept under \"meta\".\"lattice\" (embed --finder clique reads it)."})
public final class DeviceLatticeCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--rows", required = true, paramLabel = "M", description = "rows of cells")
    int rows;

    @Option(names = "--cols", required = true, paramLabel = "N", description = "columns of cells")
    int cols;

    @Option(names = "--shore", defaultValue = "4", paramLabel = "T", description = "qubits on each side of a cell (default ${DEFAULT-VALUE})")
    int shore;

    @Option(names = "--remove-qubits", split = ",", paramLabel = "Q,Q,...", description = "qubit ids to remove")
    int[] removeQubits = new int[0];

    @Option(names = "--remove-couplers", split = ",", paramLabel = "A-B,...", description = "couplers to remove, as A-B")
    String[] removeCouplers = new String[0];

    @Option(names = "--random-qubits", defaultValue = "0", paramLabel = "K", description = "remove K more qubits at random")
    int randomQubits;

    @Option(names = "--random-couplers", defaultValue = "0", paramLabel = "K",
            description = "then remove K more of the remaining couplers at random")
    int randomCouplers;

    @Mixin
    DrawnSeedOption seed;

    @Option(names = "--field", split = ",", defaultValue = "-2,2", paramLabel = "LO,HI",
            description = "field range (default ${DEFAULT-VALUE})")
    double[] field;

    @Option(names = "--coupling", split = ",", defaultValue = "-2,1", paramLabel = "LO,HI",
            description = "coupling range (default ${DEFAULT-VALUE})")
    double[] coupling;

    @Option(names = "--coupling-sum", split = ",", paramLabel = "LO,HI", description = "range of the sum of couplings at a qubit")
    double[] couplingSum;

    @Option(names = "--out", required = true, paramLabel = "D", description = "the device file to write")
    Path out;

    @Mixin
    ForceOption force;

    @Override
    public Integer call() throws Exception {
        AtomicOutput.checkTarget(out, force.on(), List.of());
        CellLattice lattice;
        try {
            lattice = CellLattice.of(rows, cols, shore);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--rows, --cols, --shore: " + e.getMessage());
        }
        int[][] couplers = new int[removeCouplers.length][];
        for (int i = 0; i < couplers.length; i++) {
            String[] ab = removeCouplers[i].split("-");
            try {
                if (ab.length != 2) {
                    throw new NumberFormatException();
                }
                couplers[i] = new int[] {Integer.parseInt(ab[0].trim()), Integer.parseInt(ab[1].trim())};
            } catch (NumberFormatException e) {
                throw new BadInputException("--remove-couplers: '" + removeCouplers[i]
                        + "' is not a coupler; write it as A-B, e.g. 0-4");
            }
        }
        QubitGraph g;
        try {
            g = lattice.graphWithout(removeQubits, couplers);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--remove-qubits, --remove-couplers: " + e.getMessage()
                    + "; list only qubits and couplers of the lattice");
        }
        long s = seed.orDrawn();
        boolean random = randomQubits > 0 || randomCouplers > 0;
        if (random) {
            try {
                g = CellLattice.withRandomDefects(g, randomQubits, randomCouplers, LegacyStreams.ofSeed(s));
            } catch (IllegalArgumentException e) {
                throw new BadInputException("--random-qubits, --random-couplers: " + e.getMessage());
            }
        }
        DeviceLimits.Builder b = DeviceLimits.builder(range(field, "--field"), range(coupling, "--coupling")).graph(g);
        if (couplingSum != null) {
            b.couplingSum(range(couplingSum, "--coupling-sum"));
        }
        DeviceLimits d = b.build();
        DeviceCodec.write(out, force.on(), d, new DeviceCodec.LatticeMeta(lattice, random ? s : null));
        QubitGraph full = lattice.graph();
        PrintWriter w = spec.commandLine().getOut();
        w.printf("%s: %d of %d qubits, %d of %d couplers%s%n", lattice, g.qubits().size(), full.qubits().size(),
                g.couplerCount(), full.couplerCount(), random ? " (random defects, seed " + s + ")" : "");
        w.printf("wrote %s%n", out);
        return Main.DONE;
    }

    private static ValueRange range(double[] v, String option) {
        if (v.length != 2 || !(v[0] <= v[1]) || Arrays.stream(v).anyMatch(x -> !Double.isFinite(x))) {
            throw new BadInputException(option + " " + Arrays.toString(v) + " is not a range; give LO,HI with LO <= HI");
        }
        return ValueRange.of(v[0], v[1]);
    }
}
