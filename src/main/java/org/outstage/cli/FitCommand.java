package org.outstage.cli;

import static org.outstage.cli.ModelOptions.fmt;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.TreeMap;
import java.util.concurrent.Callable;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.TransferCurve;
import org.outstage.analysis.stage.BiasCriterion;
import org.outstage.analysis.stage.BiasVerdict;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.capture.CaptureReader;
import org.outstage.json.JsonText;
import org.outstage.model.BiasFit;
import org.outstage.model.BiasFitResult;
import org.outstage.model.CaptureBand;
import org.outstage.model.SolverFailureException;
import org.outstage.model.StageParameters;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/**
 * {@code outstage fit FILE}: estimates the bias of a stage from a measured transfer curve and says whether to raise or
 * lower it. FILE is either a capture (WAV or scope CSV of the amplifier's output, read and diagnosed like
 * {@code analyze}, whose measured transfer curve is used) or a transfer-curve CSV whose header names the columns
 * {@code output_v} and {@code gain} (incremental gain against output voltage; any scale: the fit normalises it).
 * Exit codes: 0 ok, 1 solver failure, 2 bad input.
 */
@Command(name = "fit", sortOptions = false, mixinStandardHelpOptions = true,
        description = {"Estimate a stage's bias from a measured transfer curve and advise (raise, lower, leave it).",
                "FILE: a capture (WAV or scope CSV of the output, as for analyze) or a CSV with columns output_v,gain.",
                "Exit codes: 0 ok, 1 solver failure, 2 bad input."})
public final class FitCommand implements Callable<Integer> {
    @Spec CommandSpec spec;
    @Parameters(index = "0", paramLabel = "FILE", description = "Capture (WAV or scope CSV) or transfer-curve CSV (columns output_v,gain).") Path file;
    @Mixin ModelOptions stage;
    @Option(names = "--level-v", paramLabel = "V", converter = Units.Volts.class, description = "Output level of the optimum-bias criterion (default 0.6 x rails).") Double levelV;
    @Option(names = "--tolerance-mv", paramLabel = "MV", converter = Units.MilliVolts.class, description = "No longer used (kept for scripts): 'leave it' now means inside the near-optimal band, crossover ratio 1 within 0.3 percent.") double toleranceMv = 2;
    @Option(names = "--json", description = "Print the result as JSON.") boolean json;
    @Option(names = "--fs-volts", paramLabel = "V", converter = Units.Volts.class, description = "Capture: WAV calibration, peak volts at the output that reach full scale (divider included).") Double fsVolts;
    @Option(names = "--probe", paramLabel = "X", description = "Capture: scope CSV calibration, multiply values by X.") Double probe;
    @Option(names = "--channel", paramLabel = "N", description = "Capture: channel to fit, from 1 (needed when several are measured).") Integer channel;
    @Option(names = "--sample-rate", paramLabel = "HZ", converter = Units.Hertz.class, description = "Capture: sample rate of a scope CSV without time column.") Double sampleRate;
    @Option(names = "--reference", paramLabel = "N", description = "Capture: channel (from 1) carrying the generator signal, for an X-Y transfer curve.") Integer reference;
    @Option(names = "--capture-band", paramLabel = "HZ|none", description = {"Capture: band edge of the capture (where its anti-alias filter passes half the amplitude); the model's curve is kept to the harmonics below it before fitting.",
            "Default: 0.4583 x the sample rate for a WAV (22 kHz at 48 kHz: a soundcard flat to 20 kHz and stopped at 24 kHz, common practice), none for a scope CSV; 'none' fits the unlimited curve."}) String captureBand;

    /** The band the capture kept (set while reading a capture); empty for a transfer-curve CSV, a scope CSV or 'none'. */
    private Optional<CaptureBand> band = Optional.empty();

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        StageParameters p = stage.parameters();
        double level = levelV != null ? levelV : 0.6 * p.railVolts();
        if (!(level > 0)) throw new BadInputException("level-v=" + level + " must be > 0");
        if (!(toleranceMv > 0)) throw new BadInputException("tolerance-mv=" + toleranceMv + " must be > 0");
        Double bandHz = parseBand(captureBand);
        boolean curveCsv = isCurveCsv(file);
        if (curveCsv && bandHz != null)
            throw new BadInputException("capture-band=" + captureBand + " applies to a capture, not to a transfer-curve CSV (" + file + ")");
        TransferCurve curve = curveCsv ? readCurve(file) : measuredCurve(bandHz);
        BiasFitResult r;
        try {
            r = BiasFit.fit(curve, p, level, toleranceMv / 1e3, stage.solver(), band);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(file + ": no bias fit: " + e.getMessage());
        } catch (SolverFailureException e) {
            PrintWriter err = spec.commandLine().getErr();
            err.println("outstage: fit: solver failure: " + e.getMessage());
            err.flush();
            return OutstageCommand.EXIT_FAULT;
        }
        if (json) {
            out.println(JsonText.pretty(JsonText.obj("file", file.toString(), "topology", p.topology().name(), "vq_mv", r.vqVolts() * 1e3,
                    "bias_v", r.biasVolts(), "optimum_vq_mv", nullIfNaN(r.optimumVqVolts() * 1e3), "optimum_at_search_limit", r.optimumAtSearchLimit(),
                    "optimum_level_v", r.levelVolts(), "fit_rms_residual", r.rmsResidual(), "gain_noise", r.gainNoise(),
                    "residual_limit", r.residualLimit(), "advice_given", r.adviceGiven(), "advice", r.advice(), "points", r.points(),
                    "optimum_criterion", BiasCriterion.DEFINITION,
                    "optimum_band_low_vq_mv", nullIfNaN(r.bandLowVqVolts() * 1e3), "optimum_band_high_vq_mv", nullIfNaN(r.bandHighVqVolts() * 1e3),
                    "crossover_ratio", nullIfNaN(r.crossoverRatio()),
                    "flattest_gain_vq_mv", r.flattestGainVqVolts() * 1e3, "flattest_gain_at_search_limit", r.flattestGainAtSearchLimit(),
                    "capture_band_hz", band.isPresent() ? band.get().bandHz() : null,
                    "fundamental_hz", band.isPresent() ? band.get().fundamentalHz() : null,
                    "band_harmonics", r.bandHarmonics() > 0 ? r.bandHarmonics() : null,
                    "crossover_ratio_in_band", nullIfNaN(r.crossoverRatioInBand()))));
        } else {
            out.println("Bias fit: " + file + " as a " + p.topology().name() + " stage (" + ModelCommand.describe(p) + ")");
            out.println(fmt("  estimated Vq   %8.2f mV per emitter resistor (bias generator %.4f V)", r.vqVolts() * 1e3, r.biasVolts()));
            if (r.bandHarmonics() > 0)
                out.println(fmt("  capture band   %.0f Hz: the model's curve kept to harmonics 0..%d of %.2f Hz, as the capture kept it (--capture-band)", band.get().bandHz(),
                        r.bandHarmonics(), band.get().fundamentalHz()));
            else if (band.isPresent())
                out.println(fmt("  capture band   %.0f Hz: %d harmonics of %.2f Hz, too many to matter; the model's curve is not band-limited", band.get().bandHz(),
                        band.get().harmonics(), band.get().fundamentalHz()));
            out.println(fmt("  model's crossover ratio at the estimate %.4f (gain at zero / large-current gain, as the verdict reads it)", r.crossoverRatio()));
            if (r.bandHarmonics() > 0)
                out.println(fmt("  the same through the capture's band %.4f (what analyze reads on the capture)", r.crossoverRatioInBand()));
            if (r.optimumAtSearchLimit()) out.println("  optimum Vq     none: the model's crossover ratio does not reach 1 between Vq 0.1 and 200 mV");
            else out.println(fmt("  optimum Vq     %8.2f mV, near-optimal %.2f to %.2f mV (crossover ratio 1 +/- %.1f %%, Oliver 1971)", r.optimumVqVolts() * 1e3,
                    r.bandLowVqVolts() * 1e3, r.bandHighVqVolts() * 1e3, BiasCriterion.BAND * 100));
            out.println(fmt("  other criterion, not advice: flattest gain over |Vout| <= %.3g V at Vq %s", r.levelVolts(),
                    r.flattestGainAtSearchLimit() ? "above 200 mV (none below class A)" : fmt("%.2f mV", r.flattestGainVqVolts() * 1e3)));
            out.println(fmt("  fit residual   %8.3f %% RMS over %d points (measurement noise %.3f %%, limit %.3f %%)", r.rmsResidual() * 100,
                    r.points(), r.gainNoise() * 100, r.residualLimit() * 100));
            out.println("Advice: " + r.advice());
        }
        out.flush();
        return 0;
    }

    private static Object nullIfNaN(double v) { return Double.isFinite(v) ? v : null; }

    /** True when the file's first non-comment line names the columns output_v (or vout, as {@code model --csv} writes) and gain. */
    static boolean isCurveCsv(Path file) {
        if (!Files.isRegularFile(file)) throw new BadInputException(file + ": no such file");
        if (!file.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".csv")) return false;
        try (var lines = Files.lines(file, StandardCharsets.UTF_8)) {
            String first = lines.map(String::strip).filter(l -> !l.isEmpty() && !l.startsWith("#")).findFirst().orElse("");
            List<String> cols = java.util.Arrays.stream(first.toLowerCase(Locale.ROOT).split(",")).map(String::strip).toList();
            return (cols.contains("output_v") || cols.contains("vout")) && cols.contains("gain");
        } catch (IOException | java.io.UncheckedIOException e) {
            return false; // not text: let the capture readers say what is wrong
        }
    }

    /** The --capture-band value in hertz; null when not given; NaN for 'none'. */
    private static Double parseBand(String v) {
        if (v == null) return null;
        if (v.strip().equalsIgnoreCase("none")) return Double.NaN;
        double hz;
        try {
            hz = new Units.Hertz().convert(v);
        } catch (RuntimeException e) {
            throw new BadInputException("capture-band=" + v + " must be a frequency in hertz (20000, 20kHz) or 'none'");
        }
        if (!(hz > 0) || !Double.isFinite(hz)) throw new BadInputException("capture-band=" + v + " must be > 0 Hz");
        return hz;
    }

    /**
     * Reads the capture and returns the measured transfer curve of the chosen channel; sets {@link #band}: the given
     * band edge (NaN: none), else for a WAV the soundcard default {@link CaptureBand#SOUNDCARD_BAND_FRACTION} × the
     * sample rate (common practice, from memory), else (scope CSV) none; with the measured tone's frequency.
     */
    private TransferCurve measuredCurve(Double bandHz) {
        List<String> args = new ArrayList<>();
        if (fsVolts != null) { args.add("--fs-volts"); args.add(Double.toString(fsVolts)); }
        if (probe != null) { args.add("--probe"); args.add(Double.toString(probe)); }
        if (channel != null) { args.add("--channel"); args.add(Integer.toString(channel)); }
        if (sampleRate != null) { args.add("--sample-rate"); args.add(Double.toString(sampleRate)); }
        if (reference != null) { args.add("--reference"); args.add(Integer.toString(reference)); }
        AnalyzeOptions options = AnalyzeOptions.parse(args.toArray(String[]::new));
        Measuring.FileResult fr = Measuring.measure(file, options);
        List<Measurement> ms = fr.measurements();
        if (ms.isEmpty()) throw new BadInputException(file + ": no channel to fit");
        if (ms.size() > 1) throw new BadInputException(file + ": " + ms.size() + " channels measured; choose one with --channel");
        Measurement m = ms.get(0);
        if (m.stage() instanceof StageDiagnosis.Measured d) {
            // A bias in millivolts can only be read from a curve in volts: refuse an uncalibrated capture.
            if (!"V".equals(d.transfer().curve().unit()))
                throw new BadInputException(file + ": the capture is not calibrated in volts (unit " + d.transfer().curve().unit()
                        + "): a bias in mV cannot be read from it; give --fs-volts V (WAV: peak volts at full scale, divider included) or --probe X");
            // The fit assumes a static curve with a clean outer swing, as the crossover verdict does: refuse where the verdict
            // refuses for a reason other than noise (memory, clipping in the outer swing, coarse resolution, level too low).
            if (d.crossover().verdict() == BiasVerdict.UNCLEAR && d.crossover().confidence() == 0)
                throw new BadInputException(file + " channel " + m.channel() + ": no bias fit: " + d.crossover().explanation());
            boolean wav;
            try {
                wav = CaptureReader.isWav(file);
            } catch (org.outstage.capture.CaptureFormatException e) {
                throw new BadInputException(e.getMessage());
            }
            double bandEdge = bandHz != null ? bandHz : wav ? CaptureBand.SOUNDCARD_BAND_FRACTION * m.sampleRateHz() : Double.NaN;
            double f0 = m.fundamental().frequencyHz();
            if (Double.isFinite(bandEdge)) {
                if (!(f0 > 0) || bandEdge < f0)
                    throw new BadInputException(file + ": capture band " + fmt("%.0f", bandEdge) + " Hz does not reach the tone at " + fmt("%.2f", f0)
                            + " Hz: give --capture-band HZ or none");
                band = Optional.of(new CaptureBand(bandEdge, f0));
            }
            return d.transfer().curve();
        }
        throw new BadInputException(file + " channel " + m.channel() + ": no transfer curve: " + ((StageDiagnosis.NotMeasured) m.stage()).reason());
    }

    /** Reads output_v,gain columns (header required, comma separated, '#' comment lines allowed). */
    static TransferCurve readCurve(Path file) {
        List<String> lines;
        try {
            lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new BadInputException(file + ": cannot read (" + e.getMessage() + ")");
        }
        int header = -1, cx = -1, cg = -1;
        TreeMap<Double, Double> pts = new TreeMap<>();
        for (int i = 0; i < lines.size(); i++) {
            String t = lines.get(i).strip();
            if (t.isEmpty() || t.startsWith("#")) continue;
            String[] f = t.split(",");
            if (header < 0) {
                for (int k = 0; k < f.length; k++) {
                    String name = f[k].strip().toLowerCase(Locale.ROOT);
                    if (name.equals("output_v") || (name.equals("vout") && cx < 0)) cx = k;
                    if (name.equals("gain")) cg = k;
                }
                if (cx < 0 || cg < 0) throw new BadInputException(file + " line " + (i + 1) + ": header must name the columns output_v (or vout) and gain");
                header = i;
                continue;
            }
            if (f.length <= Math.max(cx, cg)) throw new BadInputException(file + " line " + (i + 1) + ": expected " + (Math.max(cx, cg) + 1) + " columns");
            double x, g;
            try {
                x = Double.parseDouble(f[cx].strip());
                g = Double.parseDouble(f[cg].strip());
            } catch (NumberFormatException e) {
                throw new BadInputException(file + " line " + (i + 1) + ": not a number");
            }
            if (!Double.isFinite(x) || !Double.isFinite(g)) throw new BadInputException(file + " line " + (i + 1) + ": value is not finite");
            if (pts.put(x, g) != null) throw new BadInputException(file + " line " + (i + 1) + ": output_v " + x + " appears twice");
        }
        if (header < 0) throw new BadInputException(file + ": empty (expected a header output_v,gain and rows)");
        if (pts.size() < 10) throw new BadInputException(file + ": needs at least 10 rows, has " + pts.size());
        double[] x = new double[pts.size()], g = new double[pts.size()];
        int k = 0;
        for (var e : pts.entrySet()) { x[k] = e.getKey(); g[k] = e.getValue(); k++; }
        return new TransferCurve(x, x.clone(), g, "V");
    }

}
