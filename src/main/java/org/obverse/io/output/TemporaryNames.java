package org.obverse.io.output;

import java.io.IOException;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileAttribute;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.concurrent.ThreadLocalRandom;

/**
 * New private temporary files and folders beside an output: {@code prefix + number + suffix},
 * made with exclusive creation (so a name is never shared), mode 0600 / 0700 where the file
 * system has POSIX modes. The JDK's {@code Files.createTempFile} does the same with a
 * {@code SecureRandom}, whose set-up costs a short command more than its whole output; an
 * unpredictable name buys nothing here, where creation is exclusive and the folder is the
 * user's own.
 */
final class TemporaryNames {
    private static final int ATTEMPTS = 100;

    private TemporaryNames() {
    }

    /** A new empty private folder {@code parent/prefix<number>}. */
    static Path folder(Path parent, String prefix) throws IOException {
        FileAttribute<?>[] mode = mode(parent, "rwx------");
        for (int attempt = 0; ; attempt++) {
            Path p = parent.resolve(prefix + Long.toUnsignedString(ThreadLocalRandom.current().nextLong()));
            try {
                return Files.createDirectory(p, mode);
            } catch (FileAlreadyExistsException e) {
                if (attempt == ATTEMPTS) {
                    throw e;
                }
            }
        }
    }

    /** A new empty private file {@code parent/prefix<number>suffix}. */
    static Path file(Path parent, String prefix, String suffix) throws IOException {
        FileAttribute<?>[] mode = mode(parent, "rw-------");
        for (int attempt = 0; ; attempt++) {
            Path p = parent.resolve(prefix + Long.toUnsignedString(ThreadLocalRandom.current().nextLong()) + suffix);
            try {
                return Files.createFile(p, mode);
            } catch (FileAlreadyExistsException e) {
                if (attempt == ATTEMPTS) {
                    throw e;
                }
            }
        }
    }

    private static FileAttribute<?>[] mode(Path parent, String permissions) {
        return parent.getFileSystem().supportedFileAttributeViews().contains("posix")
                ? new FileAttribute<?>[] {PosixFilePermissions.asFileAttribute(PosixFilePermissions.fromString(permissions))}
                : new FileAttribute<?>[0];
    }
}
