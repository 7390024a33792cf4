package org.obverse.spectrum;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.obverse.device.DeviceLimits;
import org.obverse.device.ValueRange;
import org.obverse.gauge.LockPolicy;
import org.obverse.gauge.LockedClusters;
import org.obverse.model.IsingProblem;
import org.obverse.testsupport.QuietTest;

/**
 * The core speaks of the problem, not of command-line flags (DEVELOPERS.md): no string literal in
 * the core packages names a {@code --flag}; the verb that offers the flag adds it to the message.
 */
class CoreMessagesTest extends QuietTest {
    private static final List<String> CORE = List.of("model", "device", "gauge", "samples", "embed", "problems",
            "anneal", "spectrum", "stats");
    // A double-quoted Java string literal (escapes included) that holds "--" followed by a letter.
    private static final Pattern FLAG_IN_LITERAL = Pattern.compile("\"(?:[^\"\\\\\\n]|\\\\.)*--[a-z](?:[^\"\\\\\\n]|\\\\.)*\"");

    @Test
    void noCoreStringLiteralNamesAFlag() throws IOException {
        List<String> found = new ArrayList<>();
        for (String pkg : CORE) {
            Path root = Path.of("src/main/java/org/obverse", pkg);
            assertThat(root).isDirectory();
            try (Stream<Path> files = Files.walk(root)) {
                for (Path f : files.filter(p -> p.toString().endsWith(".java")).toList()) {
                    List<String> lines = Files.readAllLines(f);
                    for (int k = 0; k < lines.size(); k++) {
                        String code = lines.get(k).strip();
                        if (code.startsWith("*") || code.startsWith("/*") || code.startsWith("//")) {
                            continue; // comments may say which verb uses a class
                        }
                        Matcher m = FLAG_IN_LITERAL.matcher(code);
                        if (m.find()) {
                            found.add(f + ":" + (k + 1) + ": " + m.group());
                        }
                    }
                }
            }
        }
        assertThat(found).isEmpty();
    }

    @Test
    void thePatternFindsAFlagInALiteral() {
        // The check above can fail: a literal with a flag is found, one with a dash pair in prose is too.
        assertThat(FLAG_IN_LITERAL.matcher("throw new X(\"use --solver dense\");").find()).isTrue();
        assertThat(FLAG_IN_LITERAL.matcher("throw new X(\"a \\\"q\\\" then --tolerance\");").find()).isTrue();
        assertThat(FLAG_IN_LITERAL.matcher("int k = a - -b; String s = \"no flag\";").find()).isFalse();
    }

    @Test
    void lockPolicyChainsWithoutChainsSaysWhatIsMissing() {
        IsingProblem p = IsingProblem.builder().coupling(0, 1, 0.5).build();
        DeviceLimits d = DeviceLimits.of(ValueRange.of(-2, 2), ValueRange.of(-1, 1));
        assertThatThrownBy(() -> LockedClusters.of(p, d, LockPolicy.CHAINS, null))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("lock policy chains needs the embedding's chains");
    }
}
