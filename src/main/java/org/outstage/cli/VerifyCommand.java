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
import org.outstage.json.Json;
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
@Command(name = "verify", mixinStandardHelpOptions = true, description = "Check captures against a spec profile; exit 0 all pass, 1 a limit fails or is not measured, 2 bad input.")
public final class VerifyCommand implements Callable<Integer> {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;
    @Mixin AnalyzeOptions analyze;

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

    @Parameters(paramLabel = "CAPTURE", arity = "1..*", description = "Captures: WAV or scope CSV.")
    List<Path> captures;

    private record Taken(Path file, LogbookMeasurer.Measured measured) {}

    @Override
    public Integer call() throws IOException {
        analyze.settings(); // validate before anything is read
        SpecProfile profile = SpecParser.read(specFile);
        LogbookMeasurer measurer = LogbookMeasurers.current();
        List<Taken> taken = new ArrayList<>();
        for (Path c : captures) {
            SessionSupport.requireReadable(c);
            for (LogbookMeasurer.Measured m : measurer.measure(c, analyze, analyze.channel())) {
                for (String w : m.warnings()) spec.commandLine().getErr().println("outstage: warning: " + c + ": " + w);
                taken.add(new Taken(c, m));
            }
        }
        List<MeasuredChannel> channels = new ArrayList<>();
        for (Taken t : taken) channels.add(new MeasuredChannel(t.file.getFileName().toString(), t.measured.channel(), t.measured.figures()));
        VerificationResult result = Verifier.verify(profile, channels);

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
        List<String> charts = report != null ? ReportCharts.forVerification(result, levelSeries(taken)) : List.of();
        ReportDocument doc = new ReportDocument(u, session, result, channels, charts, Instant.now(), SessionSupport.programVersion());
        if (report != null) org.outstage.report.AtomicFile.write(report, HtmlReport.render(doc));
        if (reportJson != null) org.outstage.report.AtomicFile.write(reportJson, Json.pretty(ReportJson.of(doc)) + "\n");

        PrintWriter out = spec.commandLine().getOut();
        if (json) {
            out.println(Json.pretty(ReportJson.of(doc)));
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
