package org.obverse.io;

import java.io.IOException;
import java.io.InputStream;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.nio.file.attribute.BasicFileAttributes;

/**
 * The one door through which every reader opens an input file. It refuses anything but a
 * regular file (a folder, a pipe, a device such as {@code /dev/zero}, a socket), because such
 * a file may never end or never answer, and names the file in one line. Symbolic links are
 * followed. Text files are then decoded strictly by {@link TextInput}.
 */
public final class InputFiles {
    private InputFiles() {
    }

    /**
     * Checks that a path names a regular file (after following links).
     *
     * @return its size in bytes
     * @throws BadInputException for a missing file or anything but a regular file
     */
    public static long requireRegular(Path file) {
        BasicFileAttributes a;
        try {
            a = Files.readAttributes(file, BasicFileAttributes.class);
        } catch (java.nio.file.NoSuchFileException e) {
            throw BadInputException.at(file, "", "no such file", "check the path");
        } catch (IOException e) {
            throw BadInputException.at(file, "", "cannot be read (" + e.getClass().getSimpleName()
                    + (e.getMessage() == null ? "" : ": " + e.getMessage()) + ")", "check the path and permissions");
        }
        if (a.isDirectory()) {
            throw BadInputException.at(file, "", "is a folder, not a file", "give the path of a file");
        }
        if (!a.isRegularFile()) {
            throw BadInputException.at(file, "", "is not a regular file (a pipe, device or socket)",
                    "give a file on disk");
        }
        return a.size();
    }

    /** Opens a regular file as a byte stream (unbuffered). */
    public static InputStream openStream(Path file) throws IOException {
        requireRegular(file);
        return Files.newInputStream(file);
    }

    /** Opens a regular file as a read-only channel. */
    public static FileChannel openChannel(Path file) throws IOException {
        requireRegular(file);
        return FileChannel.open(file, StandardOpenOption.READ);
    }
}
