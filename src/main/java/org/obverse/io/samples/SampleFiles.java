package org.obverse.io.samples;

import org.obverse.io.BadInputException;
import java.io.IOException;
import java.nio.file.Path;
import org.obverse.model.VariableIndex;
import org.obverse.samples.SampleBlock;

/**
 * Reads and writes "a samples file" whatever its layout, told by the extension: NPY
 * ({@code int8}, shape {@code [reads, n]}, C order) or CSV (a header of variable ids, one line
 * per read). Column k belongs to the k-th smallest variable id of the problem the samples
 * answer; a CSV header may list the ids in any order and is matched by id. Values are −1/+1,
 * or 0/1 with {@link SampleCoding#BINARY}. See spec/samples.md.
 *
 * <pre>{@code
 * try (SampleReader in = SampleFiles.open(raw, problem.variables());
 *      SampleWriter out = SampleFiles.create(SampleFiles.sameLayout(raw, dir, "g0007"), problem.variables(), force)) {
 *     for (SampleBlock b = in.nextBlock(4096, null); b != null; b = in.nextBlock(4096, b)) {
 *         ...                         // un-gauge, energies, ...
 *         out.writeBlock(b);
 *     }
 *     out.commit();
 * }
 * }</pre>
 */
public final class SampleFiles {
    /** The most reads a samples file may hold. */
    public static final long MAX_READS = Integer.MAX_VALUE - 8;
    /** The most reads of a file without columns (its size does not bound them). */
    public static final long MAX_READS_WITHOUT_COLUMNS = 1L << 24;

    private SampleFiles() {
    }

    /**
     * Opens a samples file of −1/+1 values for streaming.
     *
     * @param expected the problem's variables: the width (NPY) or header ids (CSV) must match;
     *                 null accepts any width (CSV columns then go in ascending id order)
     * @throws BadInputException where the name, header or shape is wrong
     */
    public static SampleReader open(Path file, VariableIndex expected) throws IOException {
        return open(file, expected, SampleCoding.SPIN);
    }

    /** Opens a samples file whose values are in the given coding. */
    public static SampleReader open(Path file, VariableIndex expected, SampleCoding coding) throws IOException {
        switch (SampleFormat.of(file)) {
            case NPY:
                return NpySampleReader.open(file, expected, coding);
            default:
                return CsvSampleReader.open(file, expected, coding);
        }
    }

    /** Reads a whole file into one block (for files that fit memory). */
    public static SampleBlock readAll(Path file, VariableIndex expected) throws IOException {
        try (SampleReader in = open(file, expected)) {
            return in.readRemaining();
        }
    }

    /**
     * Starts a samples file of −1/+1 values in the layout its extension names.
     *
     * @throws BadInputException where the target exists and force is false, or the extension is neither
     */
    public static SampleWriter create(Path target, VariableIndex variables, boolean force) throws IOException {
        return create(target, variables, force, SampleCoding.SPIN);
    }

    /** Starts a samples file in the given coding. */
    public static SampleWriter create(Path target, VariableIndex variables, boolean force, SampleCoding coding)
            throws IOException {
        switch (SampleFormat.of(target)) {
            case NPY:
                return NpySampleWriter.create(target, variables.size(), force, coding);
            default:
                return CsvSampleWriter.create(target, variables, force, coding);
        }
    }

    /** Writes a whole block as one file. */
    public static void writeAll(Path target, VariableIndex variables, boolean force, SampleBlock block)
            throws IOException {
        if (block.variables() != variables.size()) {
            throw new IllegalArgumentException("block has " + block.variables() + " spins per read for "
                    + variables.size() + " variables");
        }
        try (SampleWriter out = create(target, variables, force)) {
            out.writeBlock(block);
            out.commit();
        }
    }

    /** A path in dir named stem with the layout (extension) of an input: {@code raw/g0007.csv} → {@code dir/g0007.csv}. */
    public static Path sameLayout(Path input, Path dir, String stem) {
        return dir.resolve(SampleFormat.of(input).fileName(stem));
    }
}
