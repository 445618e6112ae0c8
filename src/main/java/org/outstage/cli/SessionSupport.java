package org.outstage.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import org.outstage.json.JsonText;
import org.outstage.logbook.BiasAdvice;
import org.outstage.logbook.BiasAdvisor;
import org.outstage.logbook.BiasReading;
import org.outstage.logbook.BiasStep;
import org.outstage.logbook.CaptureRef;
import org.outstage.logbook.DriftAnalysis;
import org.outstage.logbook.DriftReport;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.MeasurementRecord;
import org.outstage.logbook.SessionData;
import org.outstage.verify.KeyFigures;
import picocli.CommandLine;

/** What the session, watch and verify commands share: measuring a file into a record, and the session views. */
final class SessionSupport {
    private SessionSupport() {}

    static String programVersion() {
        return OutstageCommand.VERSION;
    }

    static void requireReadable(Path capture) {
        if (!Files.isRegularFile(capture)) throw new BadInputException(capture + ": no such file");
        if (!Files.isReadable(capture)) throw new BadInputException(capture + ": not readable");
    }

    /** Measures one channel first (bad input stops here, nothing written), then stores the capture. */
    static MeasurementRecord measureAndStore(Logbook lb, Path capture, AnalyzeOptions opts, CommandLine.ParseResult parsed,
                                             List<String> warningsOut) {
        requireReadable(capture);
        int ch = opts.channel().orElse(1);
        LogbookMeasurer.Measured m = LogbookMeasurers.current().measure(capture, opts, OptionalInt.of(ch)).get(0);
        warningsOut.addAll(m.warnings());
        CaptureRef ref = lb.storeCapture(capture);
        return new MeasurementRecord(m.channel(), Optional.of(ref), Instant.now(), programVersion(), settings(opts, m.channel()),
                defaulted(parsed), m.measurementJson(), m.figures());
    }

    /** Every analysis setting that produced a measurement, as text (the logbook's provenance). */
    static Map<String, String> settings(AnalyzeOptions o, int channel) {
        Map<String, String> m = new TreeMap<>();
        m.put("channel", Integer.toString(channel));
        m.put("bandwidth", o.bandwidth);
        m.put("weighting", o.weighting);
        m.put("harmonics", Integer.toString(o.harmonics));
        if (o.fsVolts != null) m.put("fs-volts", o.fsVolts.toString());
        if (o.probe != null) m.put("probe", o.probe.toString());
        if (o.sampleRate != null) m.put("sample-rate", o.sampleRate.toString());
        if (o.load != null) m.put("load", o.load.toString());
        if (o.fundamental != null) m.put("fundamental", o.fundamental.toString());
        if (o.reference != null) m.put("reference", o.reference.toString());
        return m;
    }

    /** The settings that were not given on the command line and took their default. */
    static Set<String> defaulted(CommandLine.ParseResult parsed) {
        Set<String> d = new TreeSet<>();
        for (String name : List.of("channel", "bandwidth", "weighting", "harmonics")) {
            if (!parsed.hasMatchedOption("--" + name)) d.add(name);
        }
        return d;
    }

    static String readingKey(BiasReading.Unit u) { return u == BiasReading.Unit.MILLIVOLTS ? "bias_mv" : "bias_ma"; }

    static Map<String, Object> stepJson(BiasStep s) {
        Map<String, Object> o = JsonText.obj("seq", s.seq(), "taken_at", s.takenAt().toString(), readingKey(s.reading().unit()), s.reading().value(),
                "heatsink_c", s.heatsinkCelsius(), "ambient_c", s.ambientCelsius(), "channel", s.channel());
        Optional<KeyFigures> f = s.measurement().map(MeasurementRecord::figures);
        o.put("gain_at_zero", f.isPresent() ? f.get().gainAtZero() : OptionalDouble.empty());
        o.put("crossover_ratio", f.isPresent() ? f.get().crossoverReading() : OptionalDouble.empty());
        o.put("crossover_verdict", f.flatMap(KeyFigures::crossoverVerdict));
        o.put("thd_percent", f.map(k -> k.thdRatio() * 100));
        o.put("thdn_percent", f.map(k -> k.thdNRatio() * 100));
        o.put("fundamental_hz", f.map(KeyFigures::fundamentalHz));
        o.put("fundamental_rms", f.map(KeyFigures::fundamentalRms));
        o.put("unit", f.map(KeyFigures::unit));
        o.put("power_watts", f.isPresent() ? f.get().powerWatts() : OptionalDouble.empty());
        o.put("capture", s.measurement().flatMap(MeasurementRecord::capture).map(c -> JsonText.obj("sha256", c.sha256(), "file_name", c.fileName())));
        return o;
    }

    static Map<String, Object> adviceJson(BiasAdvice a) {
        String k = a.unit() == BiasReading.Unit.MILLIVOLTS ? "bias_mv" : "bias_ma";
        return JsonText.obj(k + "_low", a.low(), k + "_high", a.high(), k + "_best", a.best(),
                "direction", a.direction().name().toLowerCase(Locale.ROOT), "advice", a.text(), "warnings", a.warnings());
    }

    static Map<String, Object> driftJson(DriftReport d) {
        return JsonText.obj("settled", d.settled(), "change_percent", d.changeRatio().isPresent() ? OptionalDouble.of(d.changeRatio().getAsDouble() * 100)
                : OptionalDouble.empty(), "slope_per_celsius", d.slopePerCelsius(), "runaway_risk", d.runawayRisk(), "text", d.text());
    }

    static Map<String, Object> sessionJson(SessionData d) {
        List<Object> steps = new ArrayList<>();
        for (BiasStep s : d.steps()) steps.add(stepJson(s));
        BiasAdvice advice = BiasAdvisor.recommend(d.steps());
        DriftReport drift = DriftAnalysis.analyze(d.steps(), DriftAnalysis.Quantity.READING);
        DriftReport driftGain = DriftAnalysis.analyze(d.steps(), DriftAnalysis.Quantity.GAIN_AT_ZERO);
        return JsonText.obj("session_id", d.session().id(), "unit", d.unit().name(), "kind", d.session().kind().label(),
                "started_at", d.session().startedAt().toString(), "ended_at", d.session().endedAt().map(Instant::toString),
                "notes", d.session().notes(), "steps", steps, "measurements", d.measurements().size(),
                "recommendation", adviceJson(advice), "drift", driftJson(drift), "drift_gain_at_zero", driftJson(driftGain));
    }

    static String stepLine(BiasStep s) {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "step %d  %s", s.seq(), s.reading()));
        s.heatsinkCelsius().ifPresent(t -> sb.append(String.format(Locale.ROOT, "  heatsink %.1f °C", t)));
        if (s.measurement().isPresent()) {
            KeyFigures f = s.measurement().get().figures();
            // the ratio the verdict and the advice read, named; gain_at_zero (against the outer-swing gain) beside it when it differs
            if (f.crossoverReading().isPresent()) sb.append(String.format(Locale.ROOT, "  crossover ratio %.4f", f.crossoverReading().getAsDouble()));
            if (f.gainAtZero().isPresent() && f.crossoverReading().isPresent() && f.gainAtZero().getAsDouble() != f.crossoverReading().getAsDouble())
                sb.append(String.format(Locale.ROOT, " (gain at zero %.4f of the outer-swing gain)", f.gainAtZero().getAsDouble()));
            f.crossoverVerdict().ifPresent(v -> sb.append(" (").append(v).append(')'));
            sb.append(String.format(Locale.ROOT, "  THD %.4f %%  THD+N %.4f %%", f.thdRatio() * 100, f.thdNRatio() * 100));
        }
        return sb.toString();
    }
}
