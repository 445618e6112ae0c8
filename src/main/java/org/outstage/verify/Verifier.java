package org.outstage.verify;

import java.util.ArrayList;
import org.outstage.analysis.stage.LevelPoint;
import org.outstage.analysis.stage.LevelSweep;
import org.outstage.analysis.stage.RatedPower;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;

/**
 * Checks measured channels against a spec profile. Nothing is measured here: each limit picks the channels
 * whose figures match its conditions and reads the figure.
 *
 * <p>Matching (ours; tolerances set in the spec): frequency within {@code match-frequency} (default 5 %) of
 * the fundamental; power within {@code match-power} (default 10 %, about ±0.4 dB); load within 1 % of the
 * capture's stated load. When a power is stated, the capture closest to it is used; otherwise the worst
 * matching value counts.
 *
 * <p>Rules per quantity:
 * <ul>
 * <li>THD, THD+N: the figure of the matching capture.</li>
 * <li>power: the distortion-limited output power (IEC 60268-3: the power at which THD reaches the stated
 *     value) read from captures at rising level: the first pair of neighbouring powers whose THD brackets the
 *     threshold, interpolated linearly in log THD against log power (common practice: THD rises steeply and
 *     near-exponentially into clipping). Not measured when no pair brackets it.</li>
 * <li>clip-asymmetry: the largest |asymmetry| among captures that clip.</li>
 * <li>noise: captures without a test tone (the fitted line, usually hum, below 10 mV RMS), calibrated in volts;
 *     noise = √(line² + residual²), the output RMS without DC (hum counts as noise); the largest counts.</li>
 * <li>balance: |20·log10(rms1/rms2)| between channels 1 and 2 of one capture; the largest counts.</li>
 * </ul>
 */
public final class Verifier {
    private Verifier() {}

    /** A capture whose strongest line is below this (10 mV RMS) carries no test tone: it is a noise capture (our rule). */
    static final double NOISE_TONE_LIMIT_VOLTS = 0.01;

    public static VerificationResult verify(SpecProfile spec, List<MeasuredChannel> channels) {
        return verify(spec, channels, List.of());
    }

    /** As {@link #verify(SpecProfile, List)}, with the spec-sheet figures (IMD, noise, crosstalk, response, impedance). */
    public static VerificationResult verify(SpecProfile spec, List<MeasuredChannel> channels, List<SpecReading> readings) {
        List<LimitResult> out = new ArrayList<>();
        for (Limit l : spec.limits()) {
            out.add(switch (l.quantity()) {
                case IMD, SNR, CROSSTALK, RESPONSE_DEVIATION, BANDWIDTH_LOW, BANDWIDTH_HIGH, DAMPING_FACTOR -> SpecLimits.check(spec, l, readings);
                default -> check(spec, l, channels);
            });
        }
        return new VerificationResult(spec, out);
    }

    /** Whether a profile has limits that need {@link SpecReading}s. */
    public static boolean needsReadings(SpecProfile spec) {
        for (Limit l : spec.limits())
            switch (l.quantity()) {
                case IMD, SNR, CROSSTALK, RESPONSE_DEVIATION, BANDWIDTH_LOW, BANDWIDTH_HIGH, DAMPING_FACTOR -> { return true; }
                default -> { }
            }
        return false;
    }

    private static boolean matches(SpecProfile spec, Limit l, KeyFigures f) {
        if (l.frequencyHz().isPresent()) {
            double f0 = l.frequencyHz().getAsDouble();
            if (Math.abs(f.fundamentalHz() - f0) > spec.frequencyTolerance() * f0) return false;
        }
        if (l.loadOhms().isPresent()) {
            if (f.loadOhms().isEmpty()) return false;
            double r0 = l.loadOhms().getAsDouble();
            if (Math.abs(f.loadOhms().getAsDouble() - r0) > 0.01 * r0) return false;
        }
        if (l.powerWatts().isPresent()) {
            if (f.powerWatts().isEmpty()) return false;
            double p0 = l.powerWatts().getAsDouble();
            if (Math.abs(f.powerWatts().getAsDouble() - p0) > spec.powerTolerance() * p0) return false;
        }
        return true;
    }

    private static String where(MeasuredChannel c) { return c.captureName() + " ch" + c.channel(); }

    static LimitResult result(Limit l, double measured, String evidence) {
        return new LimitResult(l, l.passes(measured) ? Verdict.PASS : Verdict.FAIL, OptionalDouble.of(measured),
                OptionalDouble.of(l.marginDisplay(measured)), evidence);
    }

    static LimitResult notMeasured(Limit l, String why) {
        return new LimitResult(l, Verdict.NOT_MEASURED, OptionalDouble.empty(), OptionalDouble.empty(), why);
    }

    private static String conditions(Limit l) {
        List<String> c = new ArrayList<>();
        l.frequencyHz().ifPresent(f -> c.add(fmt(f) + " Hz"));
        l.powerWatts().ifPresent(p -> c.add(fmt(p) + " W"));
        l.loadOhms().ifPresent(r -> c.add(fmt(r) + " ohm"));
        return c.isEmpty() ? "any capture" : String.join(", ", c);
    }

    static String fmt(double v) { return String.format(Locale.ROOT, "%.4g", v); }

    private static LimitResult check(SpecProfile spec, Limit l, List<MeasuredChannel> all) {
        List<MeasuredChannel> m = new ArrayList<>();
        for (MeasuredChannel c : all) if (matches(spec, l, c.figures())) m.add(c);
        switch (l.quantity()) {
            case THD, THD_N -> {
                if (m.isEmpty()) return notMeasured(l, "no capture at " + conditions(l));
                MeasuredChannel pick;
                if (l.powerWatts().isPresent()) {
                    double p0 = l.powerWatts().getAsDouble();
                    pick = m.stream().min(Comparator.comparingDouble(c -> Math.abs(c.figures().powerWatts().getAsDouble() - p0))).get();
                } else {
                    pick = m.stream().max(Comparator.comparingDouble(c -> value(l.quantity(), c.figures()))).get();
                }
                return result(l, value(l.quantity(), pick.figures()), where(pick));
            }
            case POWER -> {
                return power(l, m);
            }
            case CLIP_ASYMMETRY -> {
                MeasuredChannel worst = null;
                for (MeasuredChannel c : m) {
                    if (c.figures().clipAsymmetryRatio().isEmpty()) continue;
                    if (worst == null || Math.abs(c.figures().clipAsymmetryRatio().getAsDouble())
                            > Math.abs(worst.figures().clipAsymmetryRatio().getAsDouble())) worst = c;
                }
                if (worst == null) return notMeasured(l, "no capture that clips" + (conditions(l).equals("any capture") ? "" : " at " + conditions(l)));
                return result(l, Math.abs(worst.figures().clipAsymmetryRatio().getAsDouble()), where(worst));
            }
            case NOISE -> {
                MeasuredChannel worst = null;
                double worstV = -1;
                String uncal = null;
                for (MeasuredChannel c : m) {
                    KeyFigures f = c.figures();
                    if (f.residualRms().isEmpty() || f.fundamentalRms() >= NOISE_TONE_LIMIT_VOLTS) continue;
                    if (!f.unit().equals("V")) {
                        uncal = where(c);
                        continue;
                    }
                    double v = Math.hypot(f.fundamentalRms(), f.residualRms().getAsDouble());
                    if (v > worstV) {
                        worstV = v;
                        worst = c;
                    }
                }
                if (worst == null) {
                    return notMeasured(l, uncal != null ? "the noise capture " + uncal + " is not calibrated in volts (give --fs-volts)"
                            : "no capture without a test tone (input shorted, strongest line below 10 mV)");
                }
                return result(l, worstV, where(worst));
            }
            case BALANCE -> {
                Map<String, double[]> byCapture = new LinkedHashMap<>();
                for (MeasuredChannel c : m) {
                    if (c.channel() > 2) continue;
                    byCapture.computeIfAbsent(c.captureName(), k -> new double[] {Double.NaN, Double.NaN})[c.channel() - 1] = c.figures().fundamentalRms();
                }
                double worst = -1;
                String name = null;
                for (Map.Entry<String, double[]> e : byCapture.entrySet()) {
                    double[] v = e.getValue();
                    if (Double.isNaN(v[0]) || Double.isNaN(v[1]) || v[0] <= 0 || v[1] <= 0) continue;
                    double db = Math.abs(20 * Math.log10(v[0] / v[1]));
                    if (db > worst) {
                        worst = db;
                        name = e.getKey();
                    }
                }
                if (name == null) return notMeasured(l, "no two-channel capture at " + conditions(l));
                return result(l, worst, name + " ch1/ch2");
            }
            default -> throw new IllegalStateException(l.quantity().toString());
        }
    }

    private static double value(Quantity q, KeyFigures f) {
        return q == Quantity.THD ? f.thdRatio() : f.thdNRatio();
    }

    private static LimitResult power(Limit l, List<MeasuredChannel> m) {
        double thr = l.thdThreshold().getAsDouble();
        List<MeasuredChannel> withPower = new ArrayList<>();
        for (MeasuredChannel c : m) {
            KeyFigures f = c.figures();
            if (f.powerWatts().isPresent() && f.powerWatts().getAsDouble() > 0 && f.loadOhms().isPresent() && f.thdRatio() > 0
                    && f.thdNRatio() > 0 && f.fundamentalHz() > 0) withPower.add(c);
        }
        if (withPower.size() < 2) {
            return notMeasured(l, "needs captures at rising level with a known load and calibration at " + conditions(l) + " (found "
                    + withPower.size() + ")");
        }
        withPower.sort(Comparator.comparingDouble(c -> c.figures().powerWatts().getAsDouble()));
        // the same distortion-limited power as `sweep` and the bench report (LevelSweep, IEC 60268-3 notion)
        List<LevelPoint> points = new ArrayList<>();
        for (MeasuredChannel c : withPower) {
            KeyFigures f = c.figures();
            points.add(new LevelPoint(where(c), f.fundamentalHz(), f.loadOhms().getAsDouble(), "verify", 0,
                    f.powerWatts().getAsDouble(), f.thdRatio(), f.thdNRatio()));
        }
        RatedPower rated = LevelSweep.ratedPower(points, thr);
        if (rated.powerWatts().isPresent()) return result(l, rated.powerWatts().getAsDouble(), rated.message());
        boolean neverReached = points.get(points.size() - 1).thdRatio() < thr;
        return notMeasured(l, rated.message() + (neverReached ? ": raise the level" : ": add captures at lower levels"));
    }
}
