package org.obverse.io.samples;

import org.obverse.io.BadInputException;
import java.nio.file.Path;
import java.util.Locale;

/** The two layouts of a samples file, told apart by the file name's extension. */
public enum SampleFormat {
    /** NPY {@code int8}, shape {@code [reads, n]}, C order. */
    NPY(".npy"),
    /** CSV: a header of variable ids, one row of values per read. */
    CSV(".csv");

    private final String extension;

    SampleFormat(String extension) {
        this.extension = extension;
    }

    /** The extension with its dot: {@code .npy} or {@code .csv}. */
    public String extension() {
        return extension;
    }

    /** A file name of this layout for a stem: {@code g0007} → {@code g0007.npy}. */
    public String fileName(String stem) {
        return stem + extension;
    }

    /**
     * The layout of a file by its extension (case ignored).
     *
     * @throws BadInputException where the name ends in neither .npy nor .csv
     */
    public static SampleFormat of(Path file) {
        String name = file.getFileName() == null ? "" : file.getFileName().toString().toLowerCase(Locale.ROOT);
        for (SampleFormat f : values()) {
            if (name.endsWith(f.extension)) {
                return f;
            }
        }
        throw BadInputException.at(file, "", "a samples file must end in .npy or .csv",
                "rename it or write it in one of those layouts");
    }

    /** Whether the name ends in .npy or .csv. */
    public static boolean recognises(Path file) {
        String name = file.getFileName() == null ? "" : file.getFileName().toString().toLowerCase(Locale.ROOT);
        return name.endsWith(NPY.extension) || name.endsWith(CSV.extension);
    }
}
