package org.outstage.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalInt;
import org.outstage.analysis.stage.LevelSeries;
import org.outstage.capture.BenchManifest;
import org.outstage.capture.CaptureFormatException;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import org.outstage.json.JsonText;
import org.outstage.logbook.CaptureRef;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.MeasurementRecord;
import org.outstage.logbook.Session;
import org.outstage.logbook.SessionKind;
import org.outstage.logbook.UnitUnderTest;
import org.outstage.report.HtmlReport;
import org.outstage.report.ReportCharts;
import org.outstage.report.ReportDocument;
import org.outstage.report.ReportJson;
import org.outstage.verify.LimitResult;
import org.outstage.verify.MeasuredChannel;
import org.outstage.verify.SpecParser;
import org.outstage.verify.SpecProfile;
import org.outstage.verify.SpecReading;
import org.outstage.verify.VerificationResult;
import org.outstage.verify.Verdict;
import org.outstage.verify.Verifier;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * {@code verify --spec FILE CAPTURE...}: every limit of the spec with its measured value, margin and verdict.
 * Exit 0 when every limit passes; 1 when any fails, or when one is not measured (unless
 * {@code --allow-unmeasured}); 2 on bad input (nothing is logged then). The result is logged as a
 * verification session.
 */
@Command(name = "verify", mixinStandardHelpOptions = true, modelTransformer = AnalyzeOptions.Added.class, description = "Check captures against a spec profile; exit 0 all pass, 1 a limit fails or is not measured, 2 bad input.")
public final class VerifyCommand implements Callable<Integer>, AnalyzeOptions.MeasuresCaptures {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;
    final AnalyzeOptions analyze = new AnalyzeOptions();   // mixed in by AnalyzeOptions.Added

    @Override
    public AnalyzeOptions analyzeOptions() { return analyze; }

    @Option(names = "--spec", required = true, paramLabel = "FILE", description = "Spec profile (docs/spec-format.md).")
    Path specFile;

    @Option(names = "--unit", paramLabel = "NAME", description = "Unit under test (default: the spec's name).")
    String unit;

    @Option(names = "--json", description = "Print the result as JSON (the report's content).")
    boolean json;

    @Option(names = "--report", paramLabel = "FILE.html", description = "Write a self-contained HTML report.")
    Path report;

    @Option(names = "--report-json", paramLabel = "FILE.json", description = "Write the report's content as JSON.")
    Path reportJson;

    @Option(names = "--allow-unmeasured", description = "Exit 0 when nothing fails even if some limits were not measured.")
    boolean allowUnmeasured;

    @Option(names = "--no-log", description = "Do not record the verification in the logbook.")
    boolean noLog;

    @Option(names = "--open-circuit", paramLabel = "FILE",
            description = "The test tone captured open-circuit: paired with the loaded captures at its frequency for the damping-factor limits.")
    Path openCircuit;

    @Parameters(paramLabel = "CAPTURE", arity = "1..*", description = "Captures: WAV or scope CSV.")
    List<Path> captures;

    private record Taken(Path file, LogbookMeasurer.Measured measured) {}

    /** Each file analysed once in a run: the limits' figures and the spec-sheet readings come from the same analysis. */
    private final java.util.Map<Path, Measuring.Analysed> analysed = new java.util.HashMap<>();

    private Measuring.Analysed analysed(Path file) {
        return analysed.computeIfAbsent(file, f -> Measuring.analyse(f, analyze, analyze.channel()));
    }

    @Override
    public Integer call() throws IOException {
        analyze.settings(); // validate before anything is read
        SpecProfile profile = SpecParser.read(specFile);
        LogbookMeasurer measurer = LogbookMeasurers.current();
        List<Taken> taken = new ArrayList<>();
        for (Path c : captures) {
            SessionSupport.requireReadable(c);
            List<LogbookMeasurer.Measured> measured;
            try {
                // the pipeline's measurer reads the run's one analysis of the file; a measurer installed by a test measures itself
                measured = measurer instanceof LogbookPipelineMeasurer pipeline ? pipeline.measured(analysed(c), analyze.channel())
                        : measurer.measure(c, analyze, analyze.channel());
            } catch (BadInputException e) {
                // a two-tone, noise or sweep capture has no THD figures: not bad input; its spec-sheet figures are read below
                // when the profile has such limits, and the THD limits it cannot serve stay not-measured
                if (!String.valueOf(e.getMessage()).contains("not measured")) throw e;
                spec.commandLine().getErr().println("outstage: note: " + e.getMessage()
                        + (Verifier.needsReadings(profile) ? " (spec-sheet figures only)" : " (no THD figures for this profile)"));
                continue;
            }
            for (LogbookMeasurer.Measured m : measured) {
                for (String w : m.warnings()) spec.commandLine().getErr().println("outstage: warning: " + c + ": " + w);
                taken.add(new Taken(c, m));
            }
        }
        List<MeasuredChannel> channels = new ArrayList<>();
        for (Taken t : taken) channels.add(new MeasuredChannel(t.file.getFileName().toString(), t.measured.channel(), t.measured.figures()));
        List<SpecReading> readings = Verifier.needsReadings(profile) ? readings() : List.of();
        VerificationResult result = Verifier.verify(profile, channels, readings);

        UnitUnderTest u = new UnitUnderTest(unit != null ? unit : profile.name(), Optional.empty(), Optional.empty(), Optional.empty(),
                profile.ratedPowerWatts(), profile.ratedLoadOhms());
        Optional<Session> session = Optional.empty();
        if (!noLog) {
            try (Logbook lb = logbook.open()) {
                long id = lb.startSession(u, SessionKind.VERIFICATION, Instant.now(), "spec " + specFile);
                for (Taken t : taken) {
                    CaptureRef ref = lb.storeCapture(t.file);
                    lb.addMeasurement(id, new MeasurementRecord(t.measured.channel(), Optional.of(ref), Instant.now(),
                            SessionSupport.programVersion(), SessionSupport.settings(analyze, t.measured.channel()),
                            SessionSupport.defaulted(spec.commandLine().getParseResult()), t.measured.measurementJson(),
                            t.measured.figures()));
                }
                lb.endSession(id, Instant.now());
                session = lb.session(id);
                u = lb.unit(u.name()).orElse(u);
            }
        }
        List<String> charts = new ArrayList<>();
        if (report != null) {
            charts.addAll(ReportCharts.forVerification(result, levelSeries(taken)));
            charts.addAll(ReportCharts.forSpecSheet(readings));
        }
        ReportDocument doc = new ReportDocument(u, session, result, channels, charts, Instant.now(), SessionSupport.programVersion());
        if (report != null) org.outstage.report.AtomicFile.write(report, HtmlReport.render(doc));
        if (reportJson != null) org.outstage.report.AtomicFile.write(reportJson, JsonText.pretty(ReportJson.of(doc)) + "\n");

        PrintWriter out = spec.commandLine().getOut();
        if (json) {
            out.println(JsonText.pretty(ReportJson.of(doc)));
        } else {
            out.println(profile.name() + ": " + doc.outcome().toUpperCase(Locale.ROOT) + " (" + result.summary() + ")"
                    + session.map(s -> ", logged as session " + s.id()).orElse(""));
            for (LimitResult r : result.results()) out.println("  " + line(r));
        }
        out.flush();
        if (result.anyFailed()) return OutstageCommand.EXIT_FAULT;
        if (result.count(Verdict.NOT_MEASURED) > 0 && !allowUnmeasured) return OutstageCommand.EXIT_FAULT;
        return OutstageCommand.EXIT_OK;
    }

    /**
     * The named level series among the measured captures ({@code series=} in the bench.txt beside each capture;
     * {@link LevelSeries}): only those are drawn as THD-against-power lines, each its own.
     */
    private List<LevelSeries.Named> levelSeries(List<Taken> taken) {
        List<LevelSeries.Member> members = new ArrayList<>();
        for (Taken t : taken) {
            if (t.measured.measurement().isEmpty()) continue;
            Path folder = t.file.toAbsolutePath().getParent();
            BenchManifest.Entry e;
            try {
                e = folder == null ? BenchManifest.empty().entryFor(t.file) : BenchManifest.forFolder(folder).entryFor(t.file);
            } catch (CaptureFormatException ex) {
                throw new BadInputException(folder.resolve(ex.getMessage()).toString());
            }
            // the options' roles (when given) decide the generator; the notes give the series
            OptionalInt gen = analyze.generatorChannelFor(t.file);
            e = new BenchManifest.Entry(e.captureOptions(), e.loadOhms(), gen, e.channel(), e.series(), Optional.empty());
            members.add(new LevelSeries.Member(t.file, e, t.measured.channelCount(), t.measured.measurement().get()));
        }
        return LevelSeries.build(members, p -> spec.commandLine().getErr().println("outstage: warning: " + p));
    }

    /**
     * The spec-sheet figures of every capture (the same analysis of each file as the limits read, {@link #analysed}):
     * IMD, noise, crosstalk from the measurement; the swept response of sweep captures with a reference
     * channel ({@code --stimulus sweep}, or a capture with no single tone); the output impedance of each loaded
     * capture paired with {@code --open-circuit}.
     */
    private List<SpecReading> readings() {
        List<SpecReading> out = new ArrayList<>();
        var conditions = analyze.specConditions();
        Optional<org.outstage.analysis.Measurement> open = Optional.empty();
        if (openCircuit != null) {
            var ms = Measuring.result(analysed(openCircuit), analyze).measurements();
            open = ms.stream().filter(org.outstage.analysis.Measurement::measured).findFirst();
            if (open.isEmpty()) throw new BadInputException(openCircuit + ": the open-circuit capture has no tone to measure");
        }
        for (Path c : captures) {
            Measuring.FileResult fr;
            try {
                fr = Measuring.result(analysed(c), analyze);
            } catch (BadInputException e) {
                spec.commandLine().getErr().println("outstage: warning: no spec-sheet figures: " + e.getMessage());
                continue;
            }
            String name = c.getFileName().toString();
            for (var m : fr.measurements()) {
                SpecReading r = SpecReading.of(name, m.channel(), m.unit(), m.settings().loadOhms())
                        .withImd(m.imd()).withNoise(m.noise()).withCrosstalk(m.crosstalk());
                boolean sweepLike = org.outstage.analysis.SweepResponse.sweepCandidate(m, conditions.stimulus());
                if (sweepLike && fr.generatorChannel().isPresent()) {
                    try {
                        r = r.withResponse(Optional.of(org.outstage.analysis.SweepResponse.measure(fr.capture().readChannel(m.channel() - 1),
                                fr.capture().readChannel(fr.generatorChannel().getAsInt() - 1), fr.capture().sampleRateHz(), true,
                                org.outstage.analysis.Band.AUDIO_20_20K)));
                        // a sweep, not a noise or two-tone capture (SweepResponse.sweepCandidate)
                        r = r.withNoise(Optional.empty()).withImd(Optional.empty());
                    } catch (IllegalArgumentException e) {
                        if (conditions.stimulus() == org.outstage.analysis.StimulusKind.SWEEP || m.imd().isEmpty())
                            spec.commandLine().getErr().println("outstage: warning: " + c + ": no response: " + e.getMessage());
                    }
                }
                if (open.isPresent() && m.measured() && m.settings().loadOhms().isPresent() && open.get().channel() == m.channel()
                        && !c.equals(openCircuit)) {
                    try {
                        r = r.withImpedance(Optional.of(org.outstage.analysis.OutputImpedance.of(m.settings().loadOhms().getAsDouble(), open.get(), m)));
                    } catch (IllegalArgumentException e) {
                        // not the same tone: no pair
                    }
                }
                out.add(r);
            }
        }
        return out;
    }

    static String line(LimitResult r) {
        String unit = r.limit().displayUnit();
        String verdict = switch (r.verdict()) {
            case PASS -> "pass";
            case FAIL -> "FAIL";
            case NOT_MEASURED -> "not measured";
        };
        StringBuilder sb = new StringBuilder(String.format(Locale.ROOT, "%-13s %-40s", verdict, r.limit().text().replaceAll("\\s+", " ")));
        if (r.measured().isPresent()) {
            sb.append(String.format(Locale.ROOT, " measured %s %s, margin %s %s", fmt(r.limit().toDisplay(r.measured().getAsDouble())), unit,
                    signed(r.margin()), unit));
        }
        sb.append("  [").append(r.evidence()).append(']');
        return sb.toString();
    }

    /** Four significant digits without trailing zeros. */
    static String fmt(double v) {
        String s = String.format(Locale.ROOT, "%.4g", v);
        if (s.contains(".") && !s.contains("e")) s = s.replaceAll("0+$", "").replaceAll("\\.$", "");
        return s;
    }

    private static String signed(OptionalDouble v) { return (v.getAsDouble() > 0 ? "+" : "") + fmt(v.getAsDouble()); }
}
