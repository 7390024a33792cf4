package org.obverse.io;

import org.obverse.io.npy.NpyReader;
import org.obverse.io.table.GroundTable;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.obverse.testsupport.QuietTest;
import org.obverse.testsupport.Seeds;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

/** Error messages are one line of bounded length with control characters escaped (issue 13, class 9). */
class MessagesTest extends QuietTest {
    @TempDir
    Path dir;

    @Test
    void controlCharactersAreEscapedAndTheLineIsBounded() {
        assertThat(Messages.oneLine("a\nb\r\tc\u001b[31md\u0000", 100)).isEqualTo("a\\nb\\r\\tc\\x1b[31md\\x00");
        assertThat(Messages.oneLine("x".repeat(1000), 50)).hasSize(50).endsWith("…");
        assertThat(Messages.excerpt("y".repeat(1000))).hasSize(Messages.MAX_EXCERPT + 1);
        assertThat(Messages.oneLine("bidi\u202eoverride\u2028sep", 100)).isEqualTo("bidi\\u202eoverride\\u2028sep");
    }

    @Test
    void anyTextBecomesOnePrintableBoundedLine() {
        Seeds.forEachCase(500, 1300, (rng, seed) -> {
            StringBuilder s = new StringBuilder();
            int n = rng.nextInt(2000);
            for (int i = 0; i < n; i++) {
                s.appendCodePoint(rng.nextInt(4) == 0 ? rng.nextInt(0x40) : rng.nextInt(0x3000));
            }
            String m = new BadInputException(s.toString()).getMessage();
            assertThat(m.length()).isLessThanOrEqualTo(Messages.MAX_MESSAGE);
            assertThat(m.codePoints().noneMatch(c -> c < 0x20 || c == 0x7f || Character.getType(c) == Character.CONTROL
                    || Character.getType(c) == Character.LINE_SEPARATOR)).isTrue();
        });
    }

    /** Issue 13: a CSV value's terminal escape sequence was echoed raw. */
    @Test
    void aCsvValueIsQuotedEscapedAndShort() throws Exception {
        Path t = dir.resolve("ground.csv");
        Files.writeString(t, "instance,ground_energy\n"
                + "a,\u001b]0;owned\u0007" + "9".repeat(500) + "\n", StandardCharsets.UTF_8);
        BadInputException e = catchThrowableOfType(() -> GroundTable.readEnergies(t), BadInputException.class);
        assertThat(e).isNotNull();
        assertThat(e.getMessage()).contains("ground.csv").contains("line 2").contains("\\x1b]0;owned\\x07")
                .doesNotContain("\u001b").doesNotContain("9".repeat(60));
    }

    /** Issue 13: a 30 MB CSV header came back as a 30 MB error line. */
    @Test
    void aHugeHeaderGivesAShortMessage() throws Exception {
        Path t = dir.resolve("ground.csv");
        String column = "x".repeat(400_000);
        Files.writeString(t, column + "," + column + "\n");
        BadInputException e = catchThrowableOfType(() -> GroundTable.readEnergies(t), BadInputException.class);
        assertThat(e).isNotNull();
        assertThat(e.getMessage().length()).isLessThanOrEqualTo(Messages.MAX_MESSAGE);
        assertThat(e.getMessage()).contains("ground.csv");
    }

    /** Issue 13: NPY header errors quoted the raw header across several lines. */
    @Test
    void anNpyHeaderErrorIsOneLine() throws Exception {
        String dict = "{'descr': '|i1',\n 'fortran_order': False,\n 'bogus\u001b[2J': 1, 'shape': (1, 1), }";
        byte[] head = new byte[128];
        java.util.Arrays.fill(head, (byte) ' ');
        byte[] magic = {(byte) 0x93, 'N', 'U', 'M', 'P', 'Y', 1, 0, 118, 0};
        System.arraycopy(magic, 0, head, 0, 10);
        byte[] d = dict.getBytes(StandardCharsets.ISO_8859_1);
        System.arraycopy(d, 0, head, 10, d.length);
        head[127] = '\n';
        Path f = dir.resolve("h.npy");
        byte[] all = java.util.Arrays.copyOf(head, 129);
        Files.write(f, all);
        BadInputException e = catchThrowableOfType(() -> NpyReader.open(f).close(), BadInputException.class);
        assertThat(e).isNotNull();
        assertThat(e.getMessage()).doesNotContain("\n").doesNotContain("\u001b").contains("h.npy");
    }
}
