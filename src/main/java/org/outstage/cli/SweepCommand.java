package org.outstage.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.stage.LevelPoint;
import org.outstage.analysis.stage.LevelSeries;
import org.outstage.analysis.stage.LevelSweep;
import org.outstage.analysis.stage.LevelSweepResult;
import org.outstage.analysis.stage.RatedPower;
import org.outstage.json.JsonText;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code outstage sweep --load OHMS [options] FILE...}: a level series (captures at rising drive) → THD and
 * THD+N against output power, and the distortion-limited output power at 1 % and 10 % THD (IEC 60268-3
 * notion), interpolated between points. Output power is {@code V_rms²/R} of the whole record without DC.
 */
@Command(name = "sweep", mixinStandardHelpOptions = true, modelTransformer = AnalyzeOptions.Added.class, sortOptions = false,
        description = "THD and THD+N against output power over a level series, and the power at 1 %% and 10 %% THD.")
public final class SweepCommand implements Callable<Integer>, AnalyzeOptions.MeasuresCaptures {
    @Spec picocli.CommandLine.Model.CommandSpec spec;

    final AnalyzeOptions options = new AnalyzeOptions();   // mixed in by AnalyzeOptions.Added

    @Override
    public AnalyzeOptions analyzeOptions() { return options; }

    @Override
    public String analyzeOptionsBefore() { return "--json"; }

    @Option(names = "--json", description = "Print JSON (keys documented in docs/cli.md).")
    boolean json;

    @Parameters(paramLabel = "FILE", arity = "1..*", description = "Captures of one level series (same frequency, load and calibration).")
    List<Path> files;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        if (options.load == null) throw new BadInputException("sweep needs --load OHMS (the dummy load the series was captured into)");
        options.settings();
        List<AnalyzeCommand.Outcome> outcomes = AnalyzeCommand.analyseAll(files, options, spec.commandLine().getErr());
        List<LevelPoint> points = new ArrayList<>();
        for (AnalyzeCommand.Outcome o : outcomes) {
            if (o.error() != null) throw new BadInputException(o.error());
            Measuring.FileResult r = o.result();
            if (r.measurements().size() != 1)
                throw new BadInputException(r.file() + ": has " + r.measurements().size() + " channels to analyse; pick one with --channel");
            Measurement m = r.measurements().get(0);
            if (!m.measured()) throw new BadInputException(r.file() + ": not measured: " + m.notMeasuredReason().get());
            if (m.powerWatts().isEmpty())
                throw new BadInputException(r.file() + ": output power needs a capture in volts (give --fs-volts for a WAV, the CSV is in volts)");
            double fsVolts = options.fsVolts == null ? 0 : options.fsVolts;
            points.add(LevelSeries.point(r.file(), m, options.calibrationLabel(), fsVolts).orElseThrow());
        }
        LevelSweepResult result = LevelSweep.analyze(points);
        if (json) out.println(JsonText.pretty(toJson(result)));
        else out.print(text(result));
        out.flush();
        return OutstageCommand.EXIT_OK;
    }

    static Map<String, Object> toJson(LevelSweepResult r) {
        return org.outstage.report.SweepJson.of(r);
    }

    static String text(LevelSweepResult r) {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "%-40s %12s %12s %12s%n", "capture", "power W", "THD %", "THD+N %"));
        for (LevelPoint p : r.points())
            sb.append(String.format(Locale.ROOT, "%-40s %12.4g %12.4g %12.4g%n", p.fileName(), p.powerWatts(), 100 * p.thdRatio(), 100 * p.thdNRatio()));
        sb.append(line("power at 1 % THD ", r.atOnePercent()));
        sb.append(line("power at 10 % THD", r.atTenPercent()));
        return sb.toString();
    }

    private static String line(String label, RatedPower p) {
        return label + ": " + (p.powerWatts().isPresent() ? String.format(Locale.ROOT, "%.2f W", p.powerWatts().getAsDouble()) : "not reached")
                + " - " + p.message() + System.lineSeparator();
    }
}
