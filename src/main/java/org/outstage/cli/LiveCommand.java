package org.outstage.cli;

import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import java.util.concurrent.TimeUnit;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.audio.AudioBackend;
import org.outstage.audio.AudioUnavailableException;
import org.outstage.audio.JavaSoundBackend;
import org.outstage.json.JsonText;
import org.outstage.live.LiveListener;
import org.outstage.live.LiveResult;
import org.outstage.live.LiveSession;
import org.outstage.live.LiveSettings;
import org.outstage.live.MeterCalibration;
import org.outstage.live.UserSettings;
import org.outstage.report.MeasurementJson;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code outstage live}: rolling analysis of a soundcard input, optionally playing a stimulus. Every block goes
 * through the same analysis as {@code analyze} with the same options. One line per block, or JSON Lines with
 * {@code --json}. Exit 0 at the end of {@code --seconds} (or on Ctrl-C), 2 when there is no device or the format is
 * refused, 1 when the input fails during the run.
 */
@Command(name = "live", mixinStandardHelpOptions = true, modelTransformer = AnalyzeOptions.Added.class, sortOptions = false,
        description = "Measure a soundcard input block by block (THD, THD+N, crossover, clipping), optionally playing a test signal.")
public final class LiveCommand implements Callable<Integer>, AnalyzeOptions.MeasuresCaptures {
    @Spec picocli.CommandLine.Model.CommandSpec spec;
    @Mixin LiveOptions live;
    final AnalyzeOptions analyze = new AnalyzeOptions();   // mixed in by AnalyzeOptions.Added

    @Override
    public AnalyzeOptions analyzeOptions() { return analyze; }

    @Override
    public String analyzeOptionsBefore() { return "--block-seconds"; }

    @Option(names = "--block-seconds", paramLabel = "S", defaultValue = "1", description = "Length of each analysed block. Default: ${DEFAULT-VALUE}.")
    double blockSeconds;

    @Option(names = "--hop-seconds", paramLabel = "S", description = "Time between block starts; shorter than the block gives overlapping blocks. Default: the block length.")
    Double hopSeconds;

    @Option(names = "--seconds", paramLabel = "S", description = "Stop after S seconds of input (default: run until Ctrl-C).")
    Double seconds;

    @Option(names = "--record", paramLabel = "FILE.wav", description = "Keep the raw input in a 32-bit float WAV file (finalised on every exit, Ctrl-C included).")
    Path record;

    @Option(names = "--calibrate-volts", paramLabel = "V",
            description = "With a steady tone playing: the rms volts a meter reads at the amplifier output. Derives and remembers full-scale volts for this input and channel.")
    Double calibrateVolts;

    @Option(names = "--json", description = "Print JSON Lines: one object per block (the analyze capture object plus block, time_s, dropped_frames).")
    boolean json;

    /** The backend; tests may replace it. */
    static java.util.function.Supplier<AudioBackend> backend = JavaSoundBackend::new;
    /** The user settings; tests point it elsewhere through OUTSTAGE_CONFIG. */
    static java.util.function.Supplier<UserSettings> userSettings = UserSettings::standard;

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        UserSettings user = userSettings.get();
        if (seconds != null && !(seconds > 0)) throw new BadInputException("--seconds: " + seconds + " must be positive");
        if (calibrateVolts != null && !(calibrateVolts > 0 && Double.isFinite(calibrateVolts)))
            throw new BadInputException("--calibrate-volts: " + calibrateVolts + " must be a positive number of volts rms");
        if (calibrateVolts != null && analyze.fsVolts != null) throw new BadInputException("--calibrate-volts and --fs-volts exclude each other");
        if (record != null) {
            Path dir = record.toAbsolutePath().getParent();
            if (dir == null || !Files.isDirectory(dir)) throw new BadInputException("--record " + record + ": the folder does not exist");
        }
        LiveSettings s = live.settings(analyze, user);
        if (calibrateVolts != null) s = s.withFullScaleVolts(OptionalDouble.empty());
        double hop = hopSeconds == null ? blockSeconds : hopSeconds;
        try {
            s = s.withBlocks(blockSeconds, hop).withRecordFile(Optional.ofNullable(record));
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--block-seconds/--hop-seconds: " + e.getMessage());
        }
        LiveOptions.cautionsOnce(user, err);
        double runSeconds = seconds != null ? seconds : calibrateVolts != null ? CALIBRATION_CAP_SECONDS : Double.POSITIVE_INFINITY;
        boolean inPlace = !json && System.console() != null;
        List<Measurement> calibration = new ArrayList<>();
        int calChannel = analyze.channel().orElse(1);
        // with our own stimulus, calibration blocks start after it has reached the input (set once started, under out's lock)
        double[] calibrateFrom = {s.stimulus().isPresent() ? Double.POSITIVE_INFINITY : 0};
        final double calBlockSeconds = blockSeconds;
        java.util.concurrent.CountDownLatch calibrated = new java.util.concurrent.CountDownLatch(1);
        String label = "live:" + live.deviceKey();
        LiveListener listener = new LiveListener() {
            @Override
            public void onBlock(LiveResult r) {
                synchronized (out) {
                    for (Measurement m : r.measurements()) {
                        if (calibrateVolts != null && m.channel() == calChannel && r.timeSeconds() - calBlockSeconds >= calibrateFrom[0] - 1e-9) {
                            calibration.add(m);
                            if (steadyTone(calibration).isPresent() && (seconds == null || r.timeSeconds() >= seconds - 1e-9)) calibrated.countDown();
                        }
                        if (json) out.println(JsonText.write(jsonLine(label, r, m)));
                        else if (inPlace) out.print("\r" + textLine(r, m) + "   ");
                        else out.println(textLine(r, m));
                    }
                    out.flush();
                }
            }

            @Override
            public void onFailure(String message) {
                err.println("outstage: " + message);
                err.flush();
            }
        };
        LiveSession session = new LiveSession(backend.get(), s, listener);
        if (Double.isFinite(runSeconds)) session.stopAfter(runSeconds);
        try {
            session.start();
        } catch (AudioUnavailableException e) {
            throw new BadInputException(e.getMessage());
        } catch (java.io.IOException e) {
            throw new BadInputException("--record " + record + ": " + e.getMessage());
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage());
        }
        if (calibrateVolts != null && session.stimulusArrivalSeconds().isPresent()) {
            // the output's lead-in (opening, buffer, fade-in) is not part of the calibration: three whole blocks after it
            double from = session.stimulusArrivalSeconds().get() + LiveCapture.LEAD_MARGIN_SECONDS;
            synchronized (out) { calibrateFrom[0] = from; }
            // stops once three blocks agree (see steadyTone); a tone that never settles ends the run at this cap
            double cap = from + CALIBRATION_CAP_SECONDS;
            session.stopAfter(seconds == null ? cap : Math.max(seconds, cap));
        } else if (calibrateVolts != null) {
            synchronized (out) { calibrateFrom[0] = 0; }
        }
        final LiveSettings started = s;
        if (!json) {
            err.printf(Locale.ROOT, "outstage: live from %s%s, %s; first samples after %.2f s%s%n", session.inputDeviceName(),
                    started.stimulus().map(st -> " playing " + st.spec() + " at " + started.levelDbfs() + " dBFS on " + session.outputDeviceName()).orElse(""),
                    started.inputFormat(), session.firstReadSeconds().orElse(0.0),
                    started.fullScaleVolts().isPresent() ? String.format(Locale.ROOT, ", full scale %.4g V", started.fullScaleVolts().getAsDouble()) : ", full-scale units");
            err.flush();
        }
        while (!session.awaitEnd(100, TimeUnit.MILLISECONDS)) {
            // Ctrl-C: the shutdown hook stops the session; this thread simply ends with the JVM
            if (calibrated.getCount() == 0) session.stop();
        }
        if (inPlace) out.println();
        out.flush();
        if (session.failure().isPresent()) return OutstageCommand.EXIT_FAULT;
        if (session.droppedFrames() > 0 || session.skippedBlocks() > 0 || session.outputUnderruns() > 0)
            err.printf(Locale.ROOT, "outstage: warning: %d input frames lost, %d blocks not analysed (analysis busy), output buffer found empty %d times%n",
                    session.droppedFrames(), session.skippedBlocks(), session.outputUnderruns());
        if (calibrateVolts != null) {
            MeterCalibration.Result c;
            try {
                List<Measurement> steady;
                synchronized (out) { steady = steadyTone(calibration).orElse(null); }
                if (steady == null) throw new IllegalArgumentException(calibration.isEmpty() ? "no block was analysed after the tone's arrival"
                        : "the tone at the input did not hold steady over " + CALIBRATION_BLOCKS + " blocks in a row (within "
                        + Math.round(CALIBRATION_SPREAD * 100) + " %); levels seen: " + levels(calibration));
                c = MeterCalibration.fromMeasurements(steady, calibrateVolts);
            } catch (IllegalArgumentException e) {
                throw new BadInputException("--calibrate-volts: " + e.getMessage());
            }
            user.setFullScaleVolts(live.deviceKey(), calChannel, c.fullScaleVolts());
            out.printf(Locale.ROOT, "full scale: %.5g V peak for input %s channel %d (tone %.5g FS rms over %d blocks, meter %.5g V rms); remembered in %s%n",
                    c.fullScaleVolts(), live.deviceKey(), calChannel, c.toneRmsFullScale(), c.blocks(), c.meterRmsVolts(), user.file());
            out.flush();
        }
        err.flush();
        return OutstageCommand.EXIT_OK;
    }

    /** Blocks that must agree before a meter calibration is taken. */
    static final int CALIBRATION_BLOCKS = 3;
    /** Largest spread (max/min − 1) of the tone's rms over those blocks. */
    static final double CALIBRATION_SPREAD = 0.01;
    /** How long after the stimulus's expected arrival a calibration waits for a steady tone. */
    static final double CALIBRATION_CAP_SECONDS = 12;

    /**
     * The last {@link #CALIBRATION_BLOCKS} blocks, when all are measured and their tone rms agree within
     * {@link #CALIBRATION_SPREAD}. A block that holds silence, or the tone's late start (an output that opens slower than
     * its stated latency on a loaded machine), is not part of such a run, so it never enters the calibration.
     */
    static Optional<List<Measurement>> steadyTone(List<Measurement> blocks) {
        int n = blocks.size();
        if (n < CALIBRATION_BLOCKS) return Optional.empty();
        List<Measurement> last = blocks.subList(n - CALIBRATION_BLOCKS, n);
        List<Double> rms = last.stream().map(m -> m.measured() ? m.fundamental().rms() : Double.NaN).toList();
        return LiveCapture.steadyTail(rms, CALIBRATION_BLOCKS, CALIBRATION_SPREAD) ? Optional.of(List.copyOf(last)) : Optional.empty();
    }

    private static String levels(List<Measurement> blocks) {
        StringBuilder b = new StringBuilder();
        for (Measurement m : blocks.subList(Math.max(0, blocks.size() - 6), blocks.size())) {
            if (b.length() > 0) b.append(", ");
            b.append(m.measured() ? String.format(Locale.ROOT, "%.4g FS rms", m.fundamental().rms()) : "none");
        }
        return b.toString();
    }

    /** One JSON Lines object: block, time_s, dropped_frames first, then the analyze capture object. */
    static Map<String, Object> jsonLine(String label, LiveResult r, Measurement m) {
        Map<String, Object> o = new LinkedHashMap<>();
        o.put("block", r.block());
        o.put("time_s", r.timeSeconds());
        o.put("dropped_frames", r.droppedFrames());
        o.put("dropped_frames_total", r.droppedFramesTotal());
        o.put("skipped_blocks", r.skippedBlocks());
        o.put("analysis_s", r.analysisSeconds());
        o.put("analysis_cpu_s", Double.isFinite(r.analysisCpuSeconds()) ? r.analysisCpuSeconds() : null);
        o.putAll(MeasurementJson.capture(label, m, r.capture().warnings()));
        return o;
    }

    /** One readable line: level (or rms volts and power), THD, THD+N, gain at zero and verdict, clipping, drops. */
    static String textLine(LiveResult r, Measurement m) {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "block %d  %.2f s  ch %d  ", r.block(), r.timeSeconds(), m.channel()));
        if (!m.measured()) return sb.append("not measured: ").append(m.notMeasuredReason().orElse("")).append(drops(r)).toString();
        double rms = m.fundamental().rms();
        if (m.unit().equals("FS")) sb.append(String.format(Locale.ROOT, "%.2f dBFS", 20 * Math.log10(rms * Math.sqrt(2))));
        else sb.append(String.format(Locale.ROOT, "%.4g %s rms", rms, m.unit()));
        m.powerWatts().ifPresent(p -> sb.append(String.format(Locale.ROOT, " %.4g W", p.fundamentalWatts())));
        sb.append(String.format(Locale.ROOT, "  %.2f Hz  THD %.4f %%  THD+N %.4f %%%s", m.fundamental().frequencyHz(), m.thd().percent(), m.thdN().percent(),
                m.thdN().atFloor() ? " (floor)" : ""));
        if (m.stage() instanceof StageDiagnosis.Measured d) {
            if (org.outstage.analysis.Plausibility.crossoverGiven(m))
                sb.append(String.format(Locale.ROOT, "  gain@0 %.4f ± %.2g %s", d.crossover().gainAtZero(), d.crossover().gainAtZeroStdError(),
                        d.crossover().verdict().label()));
            else sb.append("  crossover not given");
            sb.append(d.clipping().detected() ? "  CLIPPING" : "  no clip");
        } else {
            sb.append("  crossover n/a");
        }
        return sb.append(drops(r)).toString();
    }

    private static String drops(LiveResult r) {
        return r.droppedFrames() > 0 ? String.format(Locale.ROOT, "  LOST %d frames", r.droppedFrames()) : "";
    }
}
