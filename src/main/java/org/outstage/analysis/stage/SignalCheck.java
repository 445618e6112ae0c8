package org.outstage.analysis.stage;

import java.util.Arrays;
import java.util.Locale;
import java.util.Optional;
import org.outstage.Require;
import org.outstage.analysis.HannSpectrum;
import org.outstage.analysis.Levels;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.Stats;

/**
 * Is this record a usable single sine? Returns a reason when it is not, so the caller shows a clear sentence
 * instead of figures. The rules, in order (each threshold is our own choice, documented in docs/diagnosis.md):
 * <ol>
 *   <li>fewer than 16 samples, or a sample that is not a finite number;</li>
 *   <li><b>silence</b>: no sample exceeds 1e-7 in magnitude (−140 dB re one unit of the capture);</li>
 *   <li><b>DC only</b>: the AC RMS is below 1e-4 of |DC|;</li>
 *   <li><b>shorter than a cycle</b>: the fitted tone spans less than one period of the record (IEEE Std 1057
 *       notes that sine fitting fails on a fraction of a period), or the fit did not converge;</li>
 *   <li><b>square wave</b>: at least 95 % of the samples lie within 5 % of the peak-to-peak range of the two
 *       plateau levels (medians of the upper and lower halves) and each plateau holds at least 20 %. A sine
 *       spends only 29 % of its time within 5 % of its extremes; a sine clipped so hard that 95 % of it sits on
 *       the rails (clip level below about 9 % of the drive) is treated as a square: no stage figure means
 *       anything there;</li>
 *   <li><b>no dominant tone</b>: the strongest line and its harmonics hold under half of the AC power
 *       (Hann window, ±6 bins per line) — noise, or a tone buried in it;</li>
 *   <li><b>two tones</b>: a line that is not a harmonic of the strongest one reaches −20 dB (10 %) of it.
 *       Twin-tone and SMPTE-type intermodulation tests put their second tone at 0 dB or −12 dB; hum and spurs
 *       on a working bench sit below −40 dB, so −20 dB separates them with margin. The line must also stand
 *       30 dB above the median spectral level, so that noise is not read as a tone; harmonics up to the 50th
 *       are not second tones.</li>
 * </ol>
 * At most the first 2^17 samples are used for the spectral rules and 16 384 evenly spread samples for the
 * plateau rule. Pure and thread-safe.
 */
public final class SignalCheck {
    static final double SILENCE = 1e-7;
    private static final int MAX_FFT = 1 << 17;

    private SignalCheck() {}

    /** All rules, including the cycle-count rule that needs the fit. */
    public static Optional<String> check(double[] samples, double sampleRateHz, SineFit fit) {
        return check(samples, sampleRateHz, fit, Optional.empty());
    }

    /**
     * As {@link #check(double[], double, SineFit)}; {@code head}, when given, is the {@link HannSpectrum} of the first
     * {@code head.length()} samples of {@code samples}, read instead of a new transform when the spectral rules look at
     * as many samples.
     */
    public static Optional<String> check(double[] samples, double sampleRateHz, SineFit fit, Optional<HannSpectrum> head) {
        return check(samples, sampleRateHz, fit, head, Optional.empty());
    }

    /**
     * The level figures of a record, as the silence and DC rules take them: the mean (the samples summed in order),
     * the RMS about it (the squared deviations summed in order) and the largest magnitude. A caller that has taken
     * them this way, and found every sample finite, passes them in so the rules do not make the two passes again.
     */
    public record Level(double mean, double acRms, double maxAbs) {}

    /** As {@link #check(double[], double, SineFit, Optional)}, with the record's {@link Level} when already taken. */
    public static Optional<String> check(double[] samples, double sampleRateHz, SineFit fit, Optional<HannSpectrum> head,
                                         Optional<Level> known) {
        Require.notNull("fit", fit);
        Optional<String> basic = level(samples, sampleRateHz, known);
        if (basic.isPresent()) return basic;
        double cycles = fit.frequencyHz() * samples.length / sampleRateHz;
        if (!(cycles >= 1))
            return Optional.of(String.format(Locale.ROOT, "record too short: it spans %.2f cycles of the fitted %.6g Hz tone; at least one full cycle is needed",
                    cycles, fit.frequencyHz()));
        if (!fit.converged()) return Optional.of("the sine fit did not settle on one frequency: not a steady single tone");
        return shape(samples, sampleRateHz, head);
    }

    /**
     * Whether a reason given by this class says the record holds no single dominant tone (two tones, or a tone
     * buried in noise): then no distortion figure describes the amplifier, not only the stage figures.
     */
    public static boolean isNoSingleTone(String reason) {
        return reason.startsWith(TWO_TONES) || reason.startsWith(NO_DOMINANT_TONE);
    }

    static final String TWO_TONES = "two tones";
    static final String NO_DOMINANT_TONE = "no dominant tone";

    /** The rules that need no fit (use before fitting: a fit of silence or of a square is meaningless). */
    public static Optional<String> check(double[] samples, double sampleRateHz) {
        Optional<String> basic = level(samples, sampleRateHz, Optional.empty());
        return basic.isPresent() ? basic : shape(samples, sampleRateHz, Optional.empty());
    }

    private static Optional<String> level(double[] x, double fs, Optional<Level> known) {
        Require.notNull("samples", x);
        Require.positive("sampleRateHz", fs);
        if (x.length < 16) return Optional.of("record too short: " + x.length + " samples; at least 16 and one full cycle are needed");
        double mean, acRms, maxAbs;
        if (known.isPresent()) {
            mean = known.get().mean();
            acRms = known.get().acRms();
            maxAbs = known.get().maxAbs();
        } else {
            double sum = 0;
            maxAbs = 0;
            for (int i = 0; i < x.length; i++) {
                if (!Double.isFinite(x[i])) return Optional.of("sample " + i + " is not a finite number (" + x[i] + ")");
                sum += x[i];
                maxAbs = Math.max(maxAbs, Math.abs(x[i]));
            }
            mean = sum / x.length;
            double ss = 0;
            for (double v : x) ss += (v - mean) * (v - mean);
            acRms = Math.sqrt(ss / x.length);
        }
        if (maxAbs <= SILENCE) return Optional.of("silence: no sample exceeds 1e-7 in magnitude");
        if (acRms < 1e-4 * Math.abs(mean))
            return Optional.of(String.format(Locale.ROOT, "DC only: the record sits at %.6g with an AC RMS of %.3g (below 0.01 %% of the DC)", mean, acRms));
        return Optional.empty();
    }

    private static Optional<String> shape(double[] x, double fs, Optional<HannSpectrum> head) {
        // plateau rule
        int n = x.length;
        int take = Math.min(n, 16384);
        double[] sub = new double[take];
        double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < take; i++) {
            double v = x[(int) ((long) i * n / take)];
            sub[i] = v;
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
        }
        double range = hi - lo;
        double mid = 0.5 * (lo + hi);
        int split = 0;   // values below the middle of the range
        for (double v : sub) if (v < mid) split++;
        if (split > 0 && split < take) {
            // the medians of the lower and the upper part: order statistics by quickselect (no full sort)
            double lowLevel = Stats.select(sub, split / 2), highLevel = Stats.select(sub, split + (take - split) / 2);
            int nearLow = 0, nearHigh = 0;
            for (double v : sub) {
                if (Math.abs(v - lowLevel) <= 0.05 * range) nearLow++;
                else if (Math.abs(v - highLevel) <= 0.05 * range) nearHigh++;
            }
            if (nearLow + nearHigh >= 0.95 * take && nearLow >= 0.2 * take && nearHigh >= 0.2 * take)
                return Optional.of(String.format(Locale.ROOT,
                        "square wave: %.1f %% of the samples sit on two levels (%.6g and %.6g); a sine is needed for stage figures",
                        100.0 * (nearLow + nearHigh) / take, lowLevel, highLevel));
        }
        // spectral rules
        int m = Integer.highestOneBit(Math.min(n, MAX_FFT));
        if (m < 64) return Optional.empty();
        HannSpectrum h = head.filter(s -> s.length() == m).orElseGet(() -> HannSpectrum.of(x, m));
        int half = m / 2;
        double[] p = new double[half];
        for (int k = 1; k < half; k++) p[k] = h.power(k);
        int guard = 6;
        int k0 = guard + 1;
        for (int k = guard + 1; k < half; k++) if (p[k] > p[k0]) k0 = k;
        if (k0 < 3 * guard || k0 + 1 >= half) return Optional.empty(); // too few cycles in the window to separate lines
        // fractional peak (quadratic interpolation of the log power) so high harmonics are placed well
        double k0f = k0;
        if (k0 + 1 < half) {
            double a = Math.log(p[k0 - 1] + 1e-300), b = Math.log(p[k0] + 1e-300), c = Math.log(p[k0 + 1] + 1e-300);
            double den = a - 2 * b + c;
            if (den < 0) k0f = k0 + Math.max(-0.5, Math.min(0.5, 0.5 * (a - c) / den));
        }
        boolean[] line = new boolean[half];
        for (int k = 0; k <= guard; k++) line[k] = true;
        // harmonics 1..50 below half the sample rate (a capture is anti-aliased, so harmonics are not folded:
        // folding would make, e.g., 20 kHz the aliased 4th harmonic of 19 kHz at 48 kHz)
        for (int hN = 1; hN <= 50 && hN * k0f < half; hN++) {
            int c = (int) Math.round(hN * k0f);
            int w = guard + (int) Math.ceil(0.1 * hN);
            for (int k = Math.max(0, c - w); k <= Math.min(half - 1, c + w); k++) line[k] = true;
        }
        double total = 0, inLines = 0;
        int k2 = -1;
        for (int k = guard + 1; k < half; k++) {
            total += p[k];
            if (line[k]) inLines += p[k];
            else if (k2 < 0 || p[k] > p[k2]) k2 = k;
        }
        double f0 = k0f * fs / m;
        if (k2 > 0) {
            double median = Stats.select(Arrays.copyOfRange(p, guard + 1, half), (half - guard - 1) / 2);
            double ratio = Math.sqrt(p[k2] / p[k0]);
            if (ratio >= 0.1 && p[k2] >= 1000 * median)
                return Optional.of(String.format(Locale.ROOT, TWO_TONES + ": a line at %s, %.1f dB relative to the %s tone, is not one of its harmonics",
                        Levels.formatHz((double) k2 * fs / m), 20 * Math.log10(ratio), Levels.formatHz(f0)));
        }
        if (inLines < 0.5 * total)
            return Optional.of(String.format(Locale.ROOT, NO_DOMINANT_TONE + ": the strongest line (%s) and its harmonics hold only %.1f %% of the AC power",
                    Levels.formatHz(f0), 100 * inLines / total));
        return Optional.empty();
    }
}
