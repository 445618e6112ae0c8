package org.outstage.analysis.stage;

import java.util.Optional;
import org.outstage.Require;
import org.outstage.analysis.HannSpectrum;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.SineFitter;

/**
 * Diagnosis of a power amplifier's output stage from a capture of its output driven by a sine: residual,
 * measured transfer curve, crossover (notch or gm-doubling, with a bias verdict) and clipping.
 *
 * <p>Method (details, thresholds and their derivation in docs/diagnosis.md):
 * <ol>
 *   <li>{@link SignalCheck}: silence, DC, a square, two tones, less than a cycle give a reason, not figures;</li>
 *   <li>ideal output x(t) = the fitted fundamental without DC (IEEE Std 1057-2017 fit, given by the caller), or,
 *       with a reference channel, the generator signal delayed and scaled onto the output
 *       ({@link ReferenceAlignment}; the period and sign of the delay from the broadband cross-correlation,
 *       {@link BroadbandDelay}, when the capture carries non-periodic content);</li>
 *   <li>residual y − x − DC, optionally band-limited by zero-phase filters ({@link Residual});</li>
 *   <li>transfer curve by binning y against x over all cycles, rising and falling halves apart
 *       ({@link MeasuredTransfer}, {@link Hysteresis});</li>
 *   <li>{@link ClippingMetrics}, then {@link CrossoverMetrics} on the unclipped part of the curve; the gain at zero
 *       and the notch edges from the raw samples by local cubic regression with a Lepski-chosen window
 *       ({@link AdaptiveSlope}), their standard errors including the estimated resolution bias.</li>
 * </ol>
 * Assumptions: a steady single tone whose frequency is not locked to the sample rate (997 Hz rather than
 * 1 kHz at 48 kHz, AES17 practice; otherwise only a few distinct phases fill the bins); the bias verdict needs a
 * level at which the outer swing (50–90 % of peak) is well beyond the class-A region (for Re = 0.22 Ω into
 * 8 Ω, about 8 V peak or more) and not clipped.
 *
 * <p>Worked example (replayed in {@code StageAnalyzerTest}): 2 s at 48 kHz of 10·cos(2π·997t) through a dead
 * zone of ±0.5 V gives gain_at_zero ≈ 0 and verdict {@code underbiased}, notch depth ≈ 0.5·b1/10 V where b1 is
 * the dead-zone output's fundamental (docs/references.md §6.2 with L = 0.5).
 *
 * <p>Pure and thread-safe: no state, no I/O.
 */
public final class StageAnalyzer {
    private static final int ANCHOR = 256;

    private StageAnalyzer() {}

    /**
     * Diagnoses a single-channel capture.
     *
     * @param samples      the amplifier output (capture unit)
     * @param sampleRateHz sample rate
     * @param fit          IEEE 1057 fit of {@code samples} (e.g. {@link SineFitter#fit})
     * @param s            settings
     */
    public static StageDiagnosis diagnose(double[] samples, double sampleRateHz, SineFit fit, StageSettings s) {
        return diagnose(samples, sampleRateHz, fit, s, Optional.empty());
    }

    /**
     * As {@link #diagnose(double[], double, SineFit, StageSettings)}, with the Hann spectrum of the first samples of
     * {@code samples} already made by the coarse peak search (the signal check reads it when it looks at as many).
     */
    public static StageDiagnosis diagnose(double[] samples, double sampleRateHz, SineFit fit, StageSettings s, Optional<HannSpectrum> head) {
        return diagnose(samples, sampleRateHz, fit, s, head, Optional.empty());
    }

    /**
     * As {@link #diagnose(double[], double, SineFit, StageSettings, Optional)}, with the level figures of
     * {@code samples} the caller has already taken ({@link SignalCheck.Level}: the signal check then does not take
     * them again).
     */
    public static StageDiagnosis diagnose(double[] samples, double sampleRateHz, SineFit fit, StageSettings s, Optional<HannSpectrum> head,
                                          Optional<SignalCheck.Level> level) {
        Require.notNull("samples", samples);
        Require.positive("sampleRateHz", sampleRateHz);
        Require.notNull("fit", fit);
        Require.notNull("settings", s);
        Optional<String> why = SignalCheck.check(samples, sampleRateHz, fit, head, level);
        if (why.isPresent()) return new StageDiagnosis.NotMeasured(why.get());
        int n = samples.length;
        double[] x = new double[n];
        boolean[] rising = new boolean[n];
        ideal(fit, sampleRateHz, n, x, rising);
        ResidualFigures rf = residualFigures(samples, x, fit, sampleRateHz, s);
        return engine(x, rising, samples, fit.amplitudePeak(), sampleRateHz, s, rf, false, Optional.empty());
    }

    /**
     * Diagnoses a two-channel capture: the amplifier output against the generator on a reference channel
     * (X-Y transfer curve after delay and gain alignment).
     *
     * @param output       the amplifier output channel
     * @param reference    the generator channel (same length and sample rate)
     * @param sampleRateHz sample rate
     * @param outputFit    IEEE 1057 fit of {@code output}
     * @param s            settings
     */
    public static StageDiagnosis diagnose(double[] output, double[] reference, double sampleRateHz, SineFit outputFit,
                                          StageSettings s) {
        return diagnose(output, reference, sampleRateHz, outputFit, s, Optional.empty());
    }

    /** As {@link #diagnose(double[], double[], double, SineFit, StageSettings)}, with the output's head spectrum. */
    public static StageDiagnosis diagnose(double[] output, double[] reference, double sampleRateHz, SineFit outputFit,
                                          StageSettings s, Optional<HannSpectrum> head) {
        Require.notNull("output", output);
        Require.notNull("reference", reference);
        Require.that(output.length == reference.length,
                "reference.length=" + reference.length + " must equal output.length=" + output.length);
        Require.positive("sampleRateHz", sampleRateHz);
        Require.notNull("fit", outputFit);
        Require.notNull("settings", s);
        Optional<String> why = SignalCheck.check(output, sampleRateHz, outputFit, head);
        if (why.isPresent()) return new StageDiagnosis.NotMeasured(why.get());
        Optional<String> refWhy = SignalCheck.check(reference, sampleRateHz, outputFit);
        if (refWhy.isPresent()) return new StageDiagnosis.NotMeasured("reference channel: " + refWhy.get());
        SineFit refFit = SineFitter.threeParameter(reference, sampleRateHz, outputFit.frequencyHz());
        ReferenceAlignment al = alignment(output, reference, outputFit, refFit, sampleRateHz);
        int n = output.length;
        double[] ideal = new double[n];
        boolean[] rising0 = new boolean[n];
        ideal(outputFit, sampleRateHz, n, ideal, rising0);
        ResidualFigures rf = residualFigures(output, ideal, outputFit, sampleRateHz, s);
        ideal = null;

        // aligned, gain-scaled reference: u[k] = gain·(ref(k − D) − dc_ref)
        double[] u = FractionalDelay.delay(reference, refFit.dcOffset(), al.delaySamples());
        int skip = FractionalDelay.HALF_WIDTH + (int) Math.ceil(Math.abs(al.delaySamples())) + 1;
        if (n - 2 * skip < 16) return new StageDiagnosis.NotMeasured("record too short for a reference-channel alignment");
        int len = n - 2 * skip;
        double[] xs = new double[len], ys = new double[len];
        boolean[] rising = new boolean[len];
        double peak = 0;
        for (int i = 0; i < len; i++) {
            int k = i + skip;
            xs[i] = al.gain() * u[k];
            ys[i] = output[k];
            peak = Math.max(peak, Math.abs(xs[i]));
            // the aligned reference has the phase of the output's fitted fundamental (that is how the delay and
            // the sign of the gain were found), so it rises when that fundamental rises
            rising[i] = rising0[k];
        }
        return engine(xs, rising, ys, peak * (1 + 1e-12), sampleRateHz, s, rf, true, Optional.of(al));
    }

    /** The residual waveform (capture minus fitted fundamental and DC, band-limited as set). */
    public static Residual residual(double[] samples, double sampleRateHz, SineFit fit, StageSettings s) {
        Require.notNull("samples", samples);
        Require.positive("sampleRateHz", sampleRateHz);
        Require.notNull("fit", fit);
        Require.notNull("settings", s);
        int n = samples.length;
        double[] x = new double[n];
        ideal(fit, sampleRateHz, n, x, new boolean[n]);
        return residualFrom(samples, x, fit.dcOffset(), sampleRateHz, s);
    }

    /** Delay and gain of {@code output} relative to {@code reference} (see {@link ReferenceAlignment}). */
    public static ReferenceAlignment align(double[] output, double[] reference, double sampleRateHz, SineFit outputFit) {
        Require.notNull("reference", reference);
        Require.that(output.length == reference.length,
                "reference.length=" + reference.length + " must equal output.length=" + output.length);
        SineFit refFit = SineFitter.threeParameter(reference, sampleRateHz, outputFit.frequencyHz());
        return alignment(output, reference, outputFit, refFit, sampleRateHz);
    }

    /**
     * Phase delay of the fundamental, with its ambiguity (whole periods; half a period with inversion) resolved by
     * the broadband cross-correlation when the capture carries non-periodic content ({@link BroadbandDelay});
     * otherwise the phase difference is read within ±90° and a larger one as an inverting amplifier.
     */
    private static ReferenceAlignment alignment(double[] output, double[] reference, SineFit out, SineFit ref, double fs) {
        double omega = 2 * Math.PI * out.frequencyHz();
        double halfPeriodSamples = Math.PI / omega * fs;
        double d0 = wrap(ref.phaseRadians() - out.phaseRadians()) / omega * fs; // non-inverting candidate, samples
        Optional<BroadbandDelay.Peak> peak = BroadbandDelay.find(output, reference, 2 * halfPeriodSamples);
        double delay;
        int sign;
        if (peak.isPresent()) {
            // candidates d0 + j·T/2, inverting for odd j: the one of the correlation's sign nearest its peak
            double lag = peak.get().lagSamples();
            long j = Math.round((lag - d0) / halfPeriodSamples);
            if (Math.floorMod(j, 2) != (peak.get().sign() > 0 ? 0 : 1)) {
                j += (lag - d0) / halfPeriodSamples > j ? 1 : -1;
            }
            delay = d0 + j * halfPeriodSamples;
            sign = Math.floorMod(j, 2) == 0 ? 1 : -1;
        } else {
            delay = d0;
            sign = 1;
            if (Math.abs(d0) > 0.5 * halfPeriodSamples) { delay = d0 - Math.copySign(halfPeriodSamples, d0); sign = -1; }
        }
        double gain = sign * out.amplitudePeak() / ref.amplitudePeak();
        return new ReferenceAlignment(delay / fs, delay, gain, ref.amplitudePeak(), ref.residualRms() / ref.rms(),
                peak.map(BroadbandDelay.Peak::lagSamples).orElse(Double.NaN),
                peak.map(BroadbandDelay.Peak::significance).orElse(0.0));
    }

    private static double wrap(double a) {
        double r = Math.IEEEremainder(a, 2 * Math.PI);
        return r <= -Math.PI ? r + 2 * Math.PI : r;
    }

    /** Residual summary plus the share of its energy (and of the time) where |ideal| &lt; nearZeroFraction·peak. */
    private record ResidualFigures(Residual.Summary summary, double nearShare, double nearTime) {}

    private static ResidualFigures residualFigures(double[] y, double[] x, SineFit fit, double fs, StageSettings s) {
        int n = y.length;
        double lim = s.nearZeroFraction() * fit.amplitudePeak();
        double ss = 0, pk = 0, eNear = 0;
        int at = 0, cNear = 0;
        if (s.residualHighPassHz() > 0 || s.residualLowPassHz() > 0) {
            Residual full = residualFrom(y, x, fit.dcOffset(), fs, s);
            double[] r = full.view();
            for (int i = 0; i < n; i++) {
                double r2 = r[i] * r[i];
                ss += r2;
                if (Math.abs(x[i]) < lim) { eNear += r2; cNear++; }
            }
            return new ResidualFigures(full.summary(), ss > 0 ? eNear / ss : 0, (double) cNear / n);
        }
        // unfiltered: the residual's figures in one pass, without materialising it
        double dc = fit.dcOffset();
        for (int i = 0; i < n; i++) {
            double r = y[i] - x[i] - dc, r2 = r * r;
            ss += r2;
            if (Math.abs(r) > pk) { pk = Math.abs(r); at = i; }
            if (Math.abs(x[i]) < lim) { eNear += r2; cNear++; }
        }
        return new ResidualFigures(new Residual.Summary(Math.sqrt(ss / n), pk, at / fs, 0, 0), ss > 0 ? eNear / ss : 0,
                (double) cNear / n);
    }

    private static StageDiagnosis engine(double[] x, boolean[] rising, double[] y, double peak, double fs, StageSettings s,
                                         ResidualFigures rf, boolean fromRef, Optional<ReferenceAlignment> al) {
        try {
            TransferEngine.Result t = TransferEngine.analyze(x, rising, y, peak, fs, s, fromRef, rf.nearShare(), rf.nearTime(), s.unit());
            return new StageDiagnosis.Measured(rf.summary(), t.transfer(), t.crossover(), t.clipping(), al);
        } catch (IllegalArgumentException e) {
            return new StageDiagnosis.NotMeasured(e.getMessage());
        }
    }

    /** x = A·cos(ωt + φ) without DC, and whether it is rising, by a rotation re-anchored every 256 samples. */
    static void ideal(SineFit fit, double fs, int n, double[] x, boolean[] rising) {
        double a = fit.amplitudePeak(), dphi = 2 * Math.PI * fit.frequencyHz() / fs, ph0 = fit.phaseRadians();
        double cd = Math.cos(dphi), sd = Math.sin(dphi);
        for (int start = 0; start < n; start += ANCHOR) {
            int end = Math.min(n, start + ANCHOR);
            double ph = dphi * start + ph0;
            double c = Math.cos(ph), sn = Math.sin(ph);
            for (int i = start; i < end; i++) {
                x[i] = a * c;
                rising[i] = sn < 0;
                double c2 = c * cd - sn * sd;
                sn = sn * cd + c * sd;
                c = c2;
            }
        }
    }

    private static Residual residualFrom(double[] y, double[] x, double dc, double fs, StageSettings s) {
        int n = y.length;
        double[] r = new double[n];
        for (int i = 0; i < n; i++) r[i] = y[i] - x[i] - dc;
        if (s.residualHighPassHz() > 0 || s.residualLowPassHz() > 0)
            r = ZeroPhaseFilter.apply(r, fs, s.residualHighPassHz(), s.residualLowPassHz());
        double ss = 0, pk = 0;
        int at = 0;
        for (int i = 0; i < n; i++) {
            ss += r[i] * r[i];
            if (Math.abs(r[i]) > pk) { pk = Math.abs(r[i]); at = i; }
        }
        return new Residual(r, fs, Math.sqrt(ss / n), pk, at / fs, s.residualHighPassHz(), s.residualLowPassHz());
    }
}
