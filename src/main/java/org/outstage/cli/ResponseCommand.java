package org.outstage.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Band;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.SteppedResponse;
import org.outstage.analysis.SweepResponse;
import org.outstage.capture.Capture;
import org.outstage.json.JsonText;
import org.outstage.stimulus.Stimulus;
import org.outstage.stimulus.SweepParameters;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code outstage response FILE [--reference N] [--channel N] [--json]}: gain and phase against frequency,
 * the −3 dB points, the deviation over a band and THD against frequency, from an exponential sine sweep
 * (Farina 2000; docs/methods.md). With {@code --reference} the response is the channel over the reference
 * channel; without, the known sweep ({@code --sweep sweep:F1-F2,T}, as {@code tone} renders it) is aligned
 * to the capture by cross-correlation.
 */
@Command(name = "response", mixinStandardHelpOptions = true, sortOptions = false,
        description = "Frequency response (gain, phase, -3 dB points, deviation) and THD vs frequency from an exponential sweep capture.")
public final class ResponseCommand implements Callable<Integer> {
    @Spec picocli.CommandLine.Model.CommandSpec spec;

    @Parameters(paramLabel = "FILE", arity = "1..*",
            description = "The sweep capture (WAV or scope CSV); or several captures, one tone each: a stepped-tone series.")
    List<Path> files;

    @Option(names = "--reference", paramLabel = "N", description = "Channel (from 1) carrying the generator's sweep, captured beside the output.")
    Integer reference;

    @Option(names = "--channel", paramLabel = "N", description = "Output channel (from 1). Default: the first channel that is not the reference.")
    Integer channel;

    @Option(names = "--sweep", paramLabel = "sweep:F1-F2,T",
            description = "The sweep that was played, when no reference channel was captured (e.g. sweep:20-20k,10).")
    String sweep;

    @Option(names = "--deviation-band", paramLabel = "LOW-HIGH", defaultValue = "20-20k",
            description = "Band of the deviation figure. Default: ${DEFAULT-VALUE}.")
    String deviationBand;

    @Option(names = "--fs-volts", paramLabel = "V", description = "WAV calibration: peak volts at full scale.")
    Double fsVolts;

    @Option(names = "--probe", paramLabel = "X", description = "Scope CSV calibration factor.")
    Double probe;

    @Option(names = "--json", description = "Print JSON (keys documented in docs/cli.md).")
    boolean json;

    @Override
    public Integer call() {
        Band band;
        try {
            band = Band.parse(deviationBand);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--deviation-band: " + e.getMessage());
        }
        AnalyzeOptions opts = new AnalyzeOptions();
        opts.fsVolts = fsVolts;
        opts.probe = probe;
        opts.bandwidth = "20-20k";
        opts.weighting = "none";
        opts.harmonics = 10;
        if (files.size() > 1) return stepped(opts, band);
        Path file = files.get(0);
        Capture c = Measuring.open(file, opts);
        int ch = outputChannel(file, c);
        double[] y = c.readChannel(ch - 1);
        FrequencyResponse r;
        try {
            if (reference != null) {
                r = SweepResponse.measure(y, c.readChannel(reference - 1), c.sampleRateHz(), true, band);
            } else {
                if (sweep == null) throw new BadInputException(file + ": give --reference N (the generator's channel) or --sweep sweep:F1-F2,T (the sweep that was played)");
                r = SweepResponse.measure(y, render(sweep, c.sampleRateHz()), c.sampleRateHz(), false, band, true);
            }
        } catch (IllegalArgumentException e) {
            throw new BadInputException(file + ": " + e.getMessage());
        }
        PrintWriter out = spec.commandLine().getOut();
        if (json) out.println(JsonText.pretty(toJson(file.toString(), ch, c.unit().symbol(), r)));
        else out.print(text(file.toString(), ch, r));
        out.flush();
        return OutstageCommand.EXIT_OK;
    }

    /** The output channel (1-based) of a capture, checked with the reference: --channel, else the first that is not the reference. */
    private int outputChannel(Path file, Capture c) {
        int count = c.channelCount();
        if (reference != null && (reference < 1 || reference > count))
            throw new BadInputException(file + ": --reference " + reference + " does not exist (the capture has " + count + ")");
        int ch = channel != null ? channel : (reference != null && reference == 1 && count > 1 ? 2 : 1);
        if (ch < 1 || ch > count) throw new BadInputException(file + ": --channel " + ch + " does not exist (the capture has " + count + ")");
        if (reference != null && reference == ch) throw new BadInputException(file + ": --reference and --channel name the same channel " + ch);
        return ch;
    }

    /**
     * A stepped-tone series: each file one tone, measured as {@code analyze} measures it; with {@code --reference} the
     * output over the generator captured beside it ({@link SteppedResponse}).
     */
    private Integer stepped(AnalyzeOptions opts, Band band) {
        if (sweep != null) throw new BadInputException("--sweep is for one sweep capture; a stepped-tone series is several tone captures");
        List<SteppedResponse.Tone> tones = new ArrayList<>();
        int ch = 0;
        String unit = null;
        for (Path f : files) {
            Capture c = Measuring.open(f, opts);
            ch = outputChannel(f, c);
            AnalysisSettings s = opts.settings();
            try {
                Measurement out = Analyzer.analyze(c, ch - 1, s);
                java.util.Optional<Measurement> gen = reference == null ? java.util.Optional.empty()
                        : java.util.Optional.of(Analyzer.analyze(c, reference - 1, s));
                tones.add(SteppedResponse.tone(out, gen));
            } catch (IllegalArgumentException e) {
                throw new BadInputException(f + ": " + e.getMessage());
            }
            if (unit != null && !unit.equals(c.unit().symbol()))
                throw new BadInputException(f + ": in " + c.unit().symbol() + " while the series so far is in " + unit + "; calibrate them alike");
            unit = c.unit().symbol();
        }
        FrequencyResponse r;
        try {
            r = SteppedResponse.of(tones, reference != null, band);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage());
        }
        PrintWriter out = spec.commandLine().getOut();
        String label = files.size() + " tone captures";
        if (json) {
            Map<String, Object> o = toJson(label, ch, unit, r);
            o.put("sweep", null);
            o.put("tones", tones.size());
            out.println(JsonText.pretty(o));
        } else {
            out.print(text(label, ch, r));
        }
        out.flush();
        return OutstageCommand.EXIT_OK;
    }

    /** The exponential sweep as played: {@code env(t)·sin(2π·f1·L·(e^{t/L} − 1))} (org.outstage.stimulus.SweepParameters). */
    static double[] render(String text, double fs) {
        Stimulus s;
        try {
            s = Stimulus.parse(text);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--sweep: " + e.getMessage());
        }
        if (!(s instanceof Stimulus.Sweep sw) || sw.lengthSeconds().isEmpty())
            throw new BadInputException("--sweep: \"" + text + "\" must be an exponential sweep with its length, e.g. sweep:20-20k,10");
        SweepParameters p = SweepParameters.of(fs, sw.startHz(), sw.endHz(), sw.lengthSeconds().getAsDouble(), 1.0);
        int n = (int) Math.round(p.lengthSeconds() * fs);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            double t = i / fs;
            x[i] = p.envelope(t) * Math.sin(2 * Math.PI * p.phaseCycles(t));
        }
        return x;
    }

    /** The JSON contract of {@code response --json} (docs/cli.md). */
    static Map<String, Object> toJson(String file, int channel, String unit, FrequencyResponse r) {
        List<Object> pts = new ArrayList<>();
        for (FrequencyResponse.Point p : r.points())
            pts.add(JsonText.obj("frequency_hz", p.frequencyHz(), "gain_db", p.gainDb(), "gain_re_1khz_db", p.gainRe1kHzDb(), "phase_deg", p.phaseDeg()));
        List<Object> thd = new ArrayList<>();
        for (FrequencyResponse.ThdPoint t : r.thdVsFrequency()) thd.add(JsonText.obj("frequency_hz", t.frequencyHz(), "thd_percent", t.percent()));
        return JsonText.obj("file", file, "channel", channel, "unit", unit, "from_reference", r.fromReference(),
                "sweep", JsonText.obj("low_hz", r.sweepLowHz(), "high_hz", r.sweepHighHz(), "seconds", r.sweepSeconds()),
                "gain_at_1khz_db", r.gainAt1kHzDb(),
                "points", pts,
                "minus_3db_hz", JsonText.obj("low", r.minus3dbLowHz().isPresent() ? r.minus3dbLowHz().getAsDouble() : null,
                        "high", r.minus3dbHighHz().isPresent() ? r.minus3dbHighHz().getAsDouble() : null),
                "deviation_db", JsonText.obj("band_hz", new double[] {r.deviationLowHz(), r.deviationHighHz()}, "min", r.deviationMinDb(),
                        "max", r.deviationMaxDb()),
                "thd_vs_frequency", thd);
    }

    static String text(String file, int channel, FrequencyResponse r) {
        StringBuilder sb = new StringBuilder();
        boolean stepped = Double.isNaN(r.sweepSeconds());
        sb.append(file).append(", channel ").append(channel)
                .append(r.fromReference() ? " over the reference" : stepped ? " (output level)" : " against the played sweep").append('\n');
        if (stepped) {
            sb.append(String.format(Locale.ROOT, "  stepped tones   %d from %.1f Hz to %.1f kHz%n", r.points().size(), r.sweepLowHz(), r.sweepHighHz() / 1000));
            for (int i = 0; i < r.points().size(); i++) {
                FrequencyResponse.Point p = r.points().get(i);
                sb.append(String.format(Locale.ROOT, "    %10.2f Hz  %9.3f dB  %+8.3f dB re 1 kHz  %s  THD %.4f %%%n", p.frequencyHz(), p.gainDb(), p.gainRe1kHzDb(),
                        Double.isNaN(p.phaseDeg()) ? "         " : String.format(Locale.ROOT, "%+7.2f°", p.phaseDeg()),
                        100 * r.thdVsFrequency().get(i).thdRatio()));
            }
        } else {
            sb.append(String.format(Locale.ROOT, "  swept           %.1f Hz - %.1f kHz in %.2f s%n", r.sweepLowHz(), r.sweepHighHz() / 1000, r.sweepSeconds()));
        }
        sb.append(String.format(Locale.ROOT, "  gain at 1 kHz   %.3f dB%n", r.gainAt1kHzDb()));
        sb.append("  -3 dB points    ").append(r.minus3dbLowHz().isPresent() ? String.format(Locale.ROOT, "%.2f Hz", r.minus3dbLowHz().getAsDouble())
                : stepped ? "below the lowest tone" : "below the sweep")
                .append(", ").append(r.minus3dbHighHz().isPresent() ? String.format(Locale.ROOT, "%.0f Hz", r.minus3dbHighHz().getAsDouble())
                        : stepped ? "above the highest tone" : "above the sweep").append('\n');
        sb.append(String.format(Locale.ROOT, "  deviation       %+.3f / %+.3f dB re 1 kHz over %.0f Hz - %.0f Hz%n", r.deviationMinDb(), r.deviationMaxDb(),
                r.deviationLowHz(), r.deviationHighHz()));
        if (!r.thdVsFrequency().isEmpty() && !stepped) {
            double worst = 0, at = 0;
            for (FrequencyResponse.ThdPoint t : r.thdVsFrequency()) if (t.thdRatio() > worst) { worst = t.thdRatio(); at = t.frequencyHz(); }
            sb.append(String.format(Locale.ROOT, "  THD (H2-H5)     highest %.4f %% at %.0f Hz%n", 100 * worst, at));
        }
        return sb.toString();
    }
}
