package org.obverse.cli;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * A run builds only the verb it names (Main.commandLine(first)); what it prints must not
 * depend on that: the same usage, the same refusal of a bad option, the same registered name
 * as the verb's own annotation. Common practice, no source.
 */
class VerbTreeTest extends CommandTestSupport {
    @Test
    void everyVerbAloneIsNamedAndPrintsAsInTheWholeTree() {
        CommandLine all = Main.commandLine();
        Map<String, CommandLine> subs = all.getSubcommands();
        assertThat(subs).hasSizeGreaterThan(10);
        for (Map.Entry<String, CommandLine> v : subs.entrySet()) {
            String verb = v.getKey();
            assertThat(v.getValue().getCommandSpec().name()).as(verb).isEqualTo(verb);
            CommandLine one = Main.commandLine(verb);
            if (!verb.equals("help")) {
                assertThat(one.getSubcommands().keySet()).as(verb).containsExactly(verb);
            }
            for (List<String> args : List.of(List.of(verb, "--help"), List.of(verb, "--no-such-option"))) {
                assertThat(runWith(one, args)).as(String.join(" ", args)).isEqualTo(runWith(Main.commandLine(), args));
            }
            assertThat(obverse(verb, "--no-such-option").code()).as(verb).isEqualTo(verb.equals("help") ? 0 : 2);
        }
    }

    @Test
    void withoutAVerbEveryVerbIsListed() {
        assertThat(Main.commandLine("--help").getSubcommands().keySet())
                .isEqualTo(Main.commandLine().getSubcommands().keySet());
        assertThat(Main.commandLine("nosuchverb").getSubcommands()).hasSameSizeAs(Main.commandLine().getSubcommands());
        Run help = obverse("--help");
        assertThat(help.code()).isZero();
        assertThat(help.out()).contains("decode", "score", "ungauge", "campaign");
    }

    private static String runWith(CommandLine cl, List<String> args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int code = cl.execute(args.toArray(new String[0]));
        return code + "\n" + out + "\n" + err;
    }
}
