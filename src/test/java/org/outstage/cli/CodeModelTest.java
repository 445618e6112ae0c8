package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/**
 * The root and {@code analyze} have their picocli model built in code, and the measurement options are mixed into
 * the annotated commands by a model transformer (issue 13, startup). Checked: no annotation is read on the analyze
 * path, every subcommand is built under its name, and every command that measures captures parses the shared
 * options into its own {@link AnalyzeOptions} with the documented defaults.
 */
class CodeModelTest {
    @TempDir Path dir;

    /** Classes the JVM generated for annotation instances (the proxies picocli's annotation reading makes). */
    private List<String> proxiesLoaded(String... args) throws Exception {
        return ChildJvm.classLoadLog(dir, args).stream().filter(l -> l.contains("__dynamic_proxy__")).toList();
    }

    @Test
    void analyzeJson_readsNoAnnotation() throws Exception {
        Path project = Path.of(System.getProperty("outstage.project.dir", "."));
        assertEquals(List.of(), proxiesLoaded("analyze", "--json", "--fs-volts", "40", "--load", "8",
                project.resolve("sample-captures/da60-level-005W.wav").toString()));
        assertEquals(List.of(), proxiesLoaded("--version"));
    }

    /** The detector's own check: an annotated command makes annotation proxies, and the log shows them. */
    @Test
    void anAnnotatedCommand_isSeenReadingAnnotations() throws Exception {
        assertTrue(!proxiesLoaded("sweep", "--help").isEmpty());
    }

    @Test
    void everySubcommand_isBuiltUnderItsName() {
        for (String name : OutstageCommand.SUBCOMMANDS) assertEquals(name, OutstageCommand.subcommand(name).getCommandName());
    }

    @Test
    void analyze_bindsItsOptionsAndTheSharedOnes() {
        CommandLine cl = OutstageCommand.subcommand("analyze");
        cl.parseArgs("--json", "--harmonics", "7", "--fs-volts", "40V", "--load", "8ohm", "--residual-band", "20-80k", "a.wav", "b.csv");
        AnalyzeCommand c = cl.getCommand();
        assertTrue(c.json);
        assertTrue(!c.csv);
        assertEquals("20-80k", c.residualBand);
        assertEquals(List.of(Path.of("a.wav"), Path.of("b.csv")), c.files);
        assertEquals(7, c.options.harmonics);
        assertEquals(40.0, c.options.fsVolts);
        assertEquals(8.0, c.options.load);
        assertEquals("20-20k", c.options.bandwidth);
        assertEquals("none", c.options.weighting);
    }

    @Test
    void everyMeasuringCommand_parsesTheSharedOptionsIntoItsOwn() {
        for (String path : List.of("sweep", "impedance", "verify", "watch", "live", "session add")) {
            String[] words = path.split(" ");
            CommandLine top = OutstageCommand.subcommand(words[0]);
            CommandLine cl = words.length == 1 ? top : top.getSubcommands().get(words[1]);
            String name = path;
            AnalyzeOptions.MeasuresCaptures c = cl.getCommand();
            AnalyzeOptions o = c.analyzeOptions();
            List<String> args = new ArrayList<>(List.of(words).subList(1, words.length));
            args.addAll(List.of("--bandwidth", "22-22k", "--channel", "2", "--fs-volts", "40V"));
            try {
                top.parseArgs(args.toArray(String[]::new));
            } catch (CommandLine.MissingParameterException e) {
                // the command's own required parameters: picocli has set the options before it checks them
            }
            assertEquals("22-22k", o.bandwidth, name);
            assertEquals(2, o.channel, name);
            assertEquals(40.0, o.fsVolts, name);
            assertEquals(10, o.harmonics, name);
            assertTrue(cl.getCommandSpec().mixins().containsKey(AnalyzeOptions.MIXIN), name);
            // help and version stay the last options
            List<CommandLine.Model.OptionSpec> opts = cl.getCommandSpec().options();
            assertTrue(opts.get(opts.size() - 1).versionHelp() && opts.get(opts.size() - 2).usageHelp(), name);
        }
    }

    @Test
    void optionsParsedAlone_takeTheDocumentedDefaults() {
        AnalyzeOptions o = AnalyzeOptions.parse();
        assertEquals("20-20k", o.bandwidth);
        assertEquals("none", o.weighting);
        assertEquals(10, o.harmonics);
        assertNull(o.channel);
        assertNull(o.fsVolts);
        AnalyzeOptions p = AnalyzeOptions.parse("--probe", "10", "--sample-rate", "1MHz");
        assertEquals(10.0, p.probe);
        assertEquals(1e6, p.sampleRate);
    }
}
