package org.obverse.io;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Comparator;
import java.util.stream.Stream;

/**
 * Writes outputs so that nothing is ever half-written: a file goes to a temporary name beside
 * its target and is renamed into place; a directory is filled under a temporary name and
 * renamed whole. An existing target is refused unless {@code force} is set.
 */
public final class AtomicOutput {
    private AtomicOutput() {
    }

    /** Writes one file. */
    @FunctionalInterface
    public interface Writer {
        void write(OutputStream out) throws IOException;
    }

    /** Fills a directory. */
    @FunctionalInterface
    public interface DirectoryFiller {
        void fill(Path dir) throws IOException;
    }

    /** Refuses an existing target unless forced. */
    public static void checkTarget(Path target, boolean force) {
        if (Files.exists(target) && !force) {
            throw BadInputException.at(target, "", "already exists", "choose another output or pass --force to replace it");
        }
    }

    /** Writes a file atomically. */
    public static void writeFile(Path target, boolean force, Writer writer) throws IOException {
        checkTarget(target, force);
        Path abs = target.toAbsolutePath();
        Path parent = abs.getParent();
        Files.createDirectories(parent);
        Path tmp = Files.createTempFile(parent, "." + abs.getFileName() + ".", ".part");
        try {
            try (OutputStream out = new java.io.BufferedOutputStream(Files.newOutputStream(tmp), 1 << 16)) {
                writer.write(out);
            }
            publish(tmp, abs);
        } finally {
            Files.deleteIfExists(tmp);
        }
    }

    /** Writes a UTF-8 text file atomically. */
    public static void writeText(Path target, boolean force, String text) throws IOException {
        writeFile(target, force, out -> out.write(text.getBytes(java.nio.charset.StandardCharsets.UTF_8)));
    }

    /**
     * Fills a fresh directory under a temporary name, then renames it to target. With force, an
     * existing target is replaced only after the new one is complete.
     */
    public static void writeDirectory(Path target, boolean force, DirectoryFiller filler) throws IOException {
        checkTarget(target, force);
        Path abs = target.toAbsolutePath();
        Files.createDirectories(abs.getParent());
        Path tmp = Files.createTempDirectory(abs.getParent(), "." + abs.getFileName() + ".");
        try {
            filler.fill(tmp);
            ordinaryPermissions(tmp, DIRECTORY_PERMISSIONS);
            if (Files.exists(abs)) {
                Path old = Files.createTempDirectory(abs.getParent(), "." + abs.getFileName() + ".old.");
                Files.delete(old);
                move(abs, old);
                move(tmp, abs);
                deleteTree(old);
            } else {
                move(tmp, abs);
            }
        } finally {
            if (Files.exists(tmp)) {
                deleteTree(tmp);
            }
        }
    }

    // Temporary names are created private (0600, 0700); the finished output gets the usual modes.
    private static final String FILE_PERMISSIONS = "rw-r--r--";
    private static final String DIRECTORY_PERMISSIONS = "rwxr-xr-x";

    /** Gives a finished temporary file the usual mode and renames it onto its target. */
    static void publish(Path tmp, Path target) throws IOException {
        ordinaryPermissions(tmp, FILE_PERMISSIONS);
        move(tmp, target);
    }

    private static void ordinaryPermissions(Path p, String mode) throws IOException {
        if (Files.getFileStore(p).supportsFileAttributeView(java.nio.file.attribute.PosixFileAttributeView.class)) {
            Files.setPosixFilePermissions(p, java.nio.file.attribute.PosixFilePermissions.fromString(mode));
        }
    }

    private static void move(Path from, Path to) throws IOException {
        try {
            Files.move(from, to, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
        } catch (AtomicMoveNotSupportedException e) {
            Files.move(from, to, StandardCopyOption.REPLACE_EXISTING);
        }
    }

    /** Deletes a directory tree (or a file). */
    public static void deleteTree(Path p) throws IOException {
        if (!Files.exists(p)) {
            return;
        }
        try (Stream<Path> walk = Files.walk(p)) {
            for (Path q : (Iterable<Path>) walk.sorted(Comparator.reverseOrder())::iterator) {
                Files.deleteIfExists(q);
            }
        }
    }

    /** Whether a directory has no entries. */
    public static boolean isEmptyDirectory(Path dir) throws IOException {
        try (DirectoryStream<Path> s = Files.newDirectoryStream(dir)) {
            return !s.iterator().hasNext();
        }
    }
}
