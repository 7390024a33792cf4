package org.obverse.connectivity;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The bottom packages (random, bits, connectivity) import nothing of the project, so that every
 * layer may use them without a cycle (common practice, no source): read from the sources.
 */
class BottomPackagesTest extends QuietTest {
    @Test
    void importNothingOfTheProject() throws IOException {
        for (String pkg : List.of("random", "bits", "connectivity")) {
            Path dir = Path.of("src/main/java/org/obverse", pkg);
            assertThat(dir).isDirectory();
            try (Stream<Path> files = Files.list(dir)) {
                for (Path f : files.filter(p -> p.toString().endsWith(".java")).toList()) {
                    assertThat(Files.readAllLines(f)).as("%s", f)
                            .noneMatch(line -> line.startsWith("import org.obverse."));
                }
            }
        }
    }
}
