package org.obverse.io.output;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.HashSet;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.obverse.testsupport.QuietTest;

/**
 * Temporary names beside an output: private modes (0600 files, 0700 folders, as the JDK's own
 * temporary files; common practice, no source), exclusive creation, the prefix and suffix the
 * stale-output sweep looks for.
 */
class TemporaryNamesTest extends QuietTest {
    @TempDir
    Path dir;

    @Test
    void filesAndFoldersAreNewPrivateAndNamedByPrefix() throws Exception {
        Set<Path> seen = new HashSet<>();
        for (int i = 0; i < 500; i++) {
            Path f = TemporaryNames.file(dir, ".out.npy.", ".part");
            Path d = TemporaryNames.folder(dir, ".out.obverse-tmp-");
            assertThat(seen.add(f)).as("file name %s made twice", f).isTrue();
            assertThat(seen.add(d)).as("folder name %s made twice", d).isTrue();
            assertThat(f.getFileName().toString()).startsWith(".out.npy.").endsWith(".part");
            assertThat(d.getFileName().toString()).startsWith(".out.obverse-tmp-");
            assertThat(Files.isRegularFile(f)).isTrue();
            assertThat(Files.size(f)).isZero();
            assertThat(Files.isDirectory(d)).isTrue();
            if (i == 0 && dir.getFileSystem().supportedFileAttributeViews().contains("posix")) {
                assertThat(PosixFilePermissions.toString(Files.getPosixFilePermissions(f))).isEqualTo("rw-------");
                assertThat(PosixFilePermissions.toString(Files.getPosixFilePermissions(d))).isEqualTo("rwx------");
            }
        }
        try (var s = Files.list(dir)) {
            assertThat(s.count()).isEqualTo(1000);
        }
    }
}
