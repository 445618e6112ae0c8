package org.outstage.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import org.outstage.json.JsonText;
import org.outstage.logbook.BiasAdvice;
import org.outstage.logbook.BiasAdvisor;
import org.outstage.logbook.BiasReading;
import org.outstage.logbook.BiasStep;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.MeasurementRecord;
import picocli.CommandLine;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * {@code session add ID --bias-mv MV CAPTURE}: measures the capture and commits one bias step; exit 0 only once committed.
 * {@code session add ID --bias-mv MV --live SECONDS [--play SIGNAL --level-dbfs L]} captures from the soundcard instead:
 * the raw input is kept in a temporary WAV file, which then goes through exactly the file path (measured, stored in the
 * logbook's content-addressed store, step committed) and is deleted.
 */
@Command(name = "add", mixinStandardHelpOptions = true, modelTransformer = AnalyzeOptions.Added.class, description = "Measure a capture (or --live SECONDS from the soundcard) and add it as a bias step; exits 0 only after the step is committed.")
public final class SessionAddCommand implements Callable<Integer>, AnalyzeOptions.MeasuresCaptures {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;
    final AnalyzeOptions analyze = new AnalyzeOptions();   // mixed in by AnalyzeOptions.Added

    @Override
    public AnalyzeOptions analyzeOptions() { return analyze; }

    @Parameters(index = "0", paramLabel = "ID", converter = Units.SessionId.class, description = "Session id.")
    long sessionId;

    @Parameters(index = "1", paramLabel = "CAPTURE", arity = "0..1", description = "WAV or scope CSV taken at this bias setting (or use --live).")
    Path capture;

    @Option(names = "--live", paramLabel = "SECONDS", description = "Capture SECONDS from the soundcard instead of reading a file (see 'live').")
    Double liveSeconds;

    @Mixin LiveOptions live;

    static final class Reading {
        @Option(names = "--bias-mv", paramLabel = "MV", converter = Units.MilliVolts.class, required = true, description = "Bias reading across the emitter resistor(s), mV.")
        Double mv;
        @Option(names = "--bias-ma", paramLabel = "MA", converter = Units.MilliAmps.class, required = true, description = "Bias reading as quiescent current, mA.")
        Double ma;
    }

    @ArgGroup(exclusive = true, multiplicity = "1")
    Reading reading;

    @Option(names = "--heatsink-c", paramLabel = "C", description = "Heatsink temperature, °C.")
    Double heatsinkC;

    @Option(names = "--ambient-c", paramLabel = "C", description = "Ambient temperature, °C.")
    Double ambientC;

    @Option(names = "--json", description = "Print the step and the updated recommendation as JSON.")
    boolean json;

    @Override
    public Integer call() {
        analyze.settings(); // validate before anything is read or written
        if ((capture == null) == (liveSeconds == null)) throw new BadInputException("give either a CAPTURE file or --live SECONDS");
        if (liveSeconds == null && live.play != null) throw new BadInputException("--play needs --live");
        Path liveFile = null;
        if (liveSeconds != null) {
            liveFile = LiveCapture.capture(live, analyze, liveSeconds, spec.commandLine().getErr());
            capture = liveFile;
        }
        try {
            return addStep();
        } finally {
            if (liveFile != null) {
                try {
                    java.nio.file.Files.deleteIfExists(liveFile);
                } catch (java.io.IOException e) {
                    spec.commandLine().getErr().println("outstage: warning: could not delete the temporary capture " + liveFile);
                }
            }
        }
    }

    private Integer addStep() {
        BiasReading r = reading.mv != null ? BiasReading.millivolts(reading.mv) : BiasReading.milliamps(reading.ma);
        BiasStep step;
        BiasAdvice advice;
        List<String> warnings = new ArrayList<>();
        try (Logbook lb = logbook.open()) {
            lb.session(sessionId).orElseThrow(() -> new BadInputException("no session " + sessionId + " in logbook " + lb.display()));
            MeasurementRecord m = SessionSupport.measureAndStore(lb, capture, analyze, spec.commandLine().getParseResult(), warnings);
            step = lb.addBiasStep(sessionId, BiasStep.draft(Instant.now(), r, opt(heatsinkC), opt(ambientC), m.channel(), Optional.of(m)));
            advice = BiasAdvisor.recommendFromSeries(lb.stepSeries(sessionId));
        }
        PrintWriter out = spec.commandLine().getOut();
        for (String w : warnings) spec.commandLine().getErr().println("outstage: warning: " + capture.getFileName() + ": " + w);
        if (json) {
            out.println(JsonText.pretty(JsonText.obj("step", SessionSupport.stepJson(step), "recommendation", SessionSupport.adviceJson(advice))));
        } else {
            out.println(SessionSupport.stepLine(step));
            out.println("advice: " + advice.text());
            for (String w : advice.warnings()) out.println("warning: " + w);
        }
        out.flush();
        spec.commandLine().getErr().flush();
        return 0;
    }

    static OptionalDouble opt(Double v) { return v == null ? OptionalDouble.empty() : OptionalDouble.of(v); }
}
