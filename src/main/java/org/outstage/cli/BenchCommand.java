package org.outstage.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import java.util.stream.Stream;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.stage.LevelPoint;
import org.outstage.analysis.stage.LevelSeries;
import org.outstage.analysis.stage.LevelSweep;
import org.outstage.analysis.stage.LevelSweepResult;
import org.outstage.capture.BenchManifest;
import org.outstage.capture.Capture;
import org.outstage.capture.CaptureFormatException;
import org.outstage.capture.CaptureReader;
import org.outstage.report.BenchReport;
import org.outstage.report.FigureTable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code outstage bench [FOLDER] [--out DIR]}: analyses every capture of a bench folder with the calibration
 * notes of its {@code bench.txt} ({@link BenchManifest}), prints the figures, works out each level series
 * named there, and writes a self-contained HTML report and its JSON twin. With no folder it takes the bundled
 * sample session ({@code sample-captures/}); this is what {@code tools/outstage} runs without a display.
 */
@Command(name = "bench", mixinStandardHelpOptions = true, sortOptions = false,
        description = "Analyse a folder of captures with its bench.txt calibration notes; print the figures and write an HTML and JSON report.")
public final class BenchCommand implements Callable<Integer> {
    @Spec picocli.CommandLine.Model.CommandSpec spec;

    @Parameters(paramLabel = "FOLDER", arity = "0..1", description = "Folder of captures (default: the bundled sample-captures).")
    Path folder;

    @Option(names = "--out", paramLabel = "DIR", description = "Where to write report.html and report.json (default: target/outstage-report under the project, or ./outstage-report).")
    Path out;

    @Option(names = "--bandwidth", paramLabel = "LOW-HIGH", defaultValue = "20-20k", description = "Measurement band (as for analyze). Default: ${DEFAULT-VALUE}.")
    String bandwidth;

    /** One analysed capture file. */
    public record Item(Path file, Capture capture, List<Measurement> measurements, BenchManifest.Entry entry) {}

    @Override
    public Integer call() throws IOException {
        PrintWriter o = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        Path dir = folder != null ? folder : samplesFolder();
        if (!Files.isDirectory(dir)) throw new BadInputException(dir + ": not a folder");
        BenchManifest manifest;
        try {
            manifest = BenchManifest.forFolder(dir);
        } catch (CaptureFormatException e) {
            throw new BadInputException(dir + java.io.File.separator + e.getMessage());
        }
        List<Path> files;
        try (Stream<Path> s = Files.list(dir)) {
            files = s.filter(p -> {
                String n = p.getFileName().toString().toLowerCase(Locale.ROOT);
                return Files.isRegularFile(p) && (n.endsWith(".wav") || n.endsWith(".csv") || n.endsWith(".rf64") || n.endsWith(".bw64"));
            }).sorted().toList();
        }
        if (files.isEmpty()) throw new BadInputException(dir + ": no captures (.wav, .csv) in the folder");
        AnalyzeOptions defaults = new AnalyzeOptions();
        defaults.bandwidth = bandwidth;
        defaults.weighting = "none";
        defaults.harmonics = AnalysisSettings.DEFAULT_HARMONICS;
        AnalysisSettings base = defaults.settings();

        List<Item> items = new ArrayList<>();
        List<String> failures = new ArrayList<>();
        for (Path f : files) {
            BenchManifest.Entry e = manifest.entryFor(f);
            try {
                Capture c = CaptureReader.open(f, e.captureOptions());
                AnalysisSettings s = e.loadOhms().isPresent() ? base.withLoadOhms(e.loadOhms().getAsDouble()) : base;
                Measuring.SweepChecked checked = Measuring.checked(f, c, Measuring.measure(c, s, e.channel(), e.generatorChannel(), f.toString()),
                        e.generatorChannel(), org.outstage.analysis.StimulusKind.AUTO);
                List<Measurement> ms = checked.measurements();
                List<String> notes = checked.notes();
                if (!notes.isEmpty()) {
                    o.flush();   // the figures so far first: on a terminal both streams share the screen
                    for (String note : notes) err.println("outstage: warning: " + f + ": " + note);
                    err.flush();
                    c = c.withWarnings(notes);
                }
                items.add(new Item(f, c, ms, e));
                for (Measurement m : ms) o.print(FigureTable.text(f.toString(), m));
            } catch (CaptureFormatException ex) {
                failures.add(ex.getMessage());
                err.println("outstage: " + ex.getMessage());
            } catch (BadInputException | IllegalArgumentException ex) {
                failures.add(ex.getMessage());
                err.println("outstage: " + ex.getMessage());
            }
        }
        Map<String, LevelSweepResult> sweeps = sweeps(items, err);
        for (Map.Entry<String, LevelSweepResult> s : sweeps.entrySet()) {
            o.println("level series \"" + s.getKey() + "\"");
            o.print(SweepCommand.text(s.getValue()));
            o.println();
        }
        Path target = out != null ? out : defaultOut();
        Files.createDirectories(target);
        BenchReport.Written w = BenchReport.write(target, dir.toString(), items.stream()
                .map(i -> new BenchReport.Capture(i.file().toString(), i.capture(), i.measurements())).toList(), sweeps, failures);
        o.println("report: " + w.html() + " (and " + w.json().getFileName() + ")");
        o.flush();
        err.flush();
        return failures.isEmpty() ? OutstageCommand.EXIT_OK : OutstageCommand.EXIT_BAD_INPUT;
    }

    /** Level series named in the manifest ({@code series=NAME}), each with its power at 1 % and 10 % THD ({@link LevelSeries}). */
    static Map<String, LevelSweepResult> sweeps(List<Item> items, PrintWriter err) {
        List<LevelSeries.Member> members = new ArrayList<>();
        for (Item i : items)
            for (Measurement m : i.measurements()) members.add(new LevelSeries.Member(i.file(), i.entry(), i.capture().channelCount(), m));
        Map<String, LevelSweepResult> out = new LinkedHashMap<>();
        for (LevelSeries.Named n : LevelSeries.build(members, p -> err.println("outstage: " + p))) out.put(n.name(), n.sweep());
        return out;
    }

    /** The bundled sample-captures folder: under $OUTSTAGE_HOME (set by tools/outstage), else the working directory. */
    static Path samplesFolder() {
        String home = System.getenv("OUTSTAGE_HOME");
        Path base = home != null && !home.isBlank() ? Path.of(home) : Path.of("");
        return base.resolve("sample-captures");
    }

    static Path defaultOut() {
        String home = System.getenv("OUTSTAGE_HOME");
        if (home != null && !home.isBlank()) return Path.of(home, "target", "outstage-report");
        return Path.of("outstage-report");
    }
}
