package org.outstage.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;

/**
 * The spec-sheet figures measured from spectral lines of one channel: two-tone intermodulation, output noise
 * with hum, crosstalk. Pure; package-private (the entry point is
 * {@link Analyzer#analyze(Capture, int, AnalysisSettings, SpecConditions)}).
 *
 * <p>Spectrum: Welch-averaged power spectra (P. D. Welch, IEEE Trans. Audio Electroacoust. 15(2), 1967) with the
 * 7-term Blackman-Harris window (−180 dB sidelobes, so a weak product beside a strong tone is not buried in
 * leakage), blocks of up to 2^16 samples at 50 % overlap. A line's mean square is the power over its main lobe
 * less the noise expected in those bins (median density).
 */
final class SpecLines {
    static final int MAX_LEN = 1 << 16;
    static final int MIN_LEN = 1 << 12;
    /** The second tone must be within this power ratio (40 dB) of the first to count as a two-tone stimulus (ours). */
    static final double SECOND_TONE_MIN = 1e-4;
    /** ... and stand this far (power, 40 dB) above the noise in its lobe. */
    static final double TONE_ABOVE_NOISE = 1e4;
    static final double RESOLVED = 10;

    final PowerSpectrum ps;
    final double density;
    final double fs;
    final int hw;

    private SpecLines(PowerSpectrum ps) {
        this.ps = ps;
        this.fs = ps.sampleRateHz;
        this.hw = ps.window.mainLobeHalfWidthBins();
        int half = ps.length / 2;
        double[] b = new double[half - 1];
        System.arraycopy(ps.power, 1, b, 0, half - 1);
        this.density = Stats.median(b, b.length) * Stats.medianToMean(ps.blocks);
    }

    /** The spectrum of a channel, or empty when the record is shorter than 4096 samples. */
    static Optional<SpecLines> of(Capture c, int index) {
        long n = c.frameCount();
        if (n < MIN_LEN) return Optional.empty();
        int len = (int) Math.min(MAX_LEN, Long.highestOneBit(n));
        return Optional.of(new SpecLines(PowerSpectrum.of(c, index, len, len / 2, Window.BLACKMAN_HARRIS_7, 0)));
    }

    double binW() { return ps.binWidthHz(); }

    /** Line rms with the noise under it subtracted; [rms, resolved?1:0]. Outside 0…Nyquist: [0, 0]. */
    double[] line(double f) {
        if (!(f > hw * binW()) || f >= fs / 2 - hw * binW()) return new double[] {0, 0};
        double raw = ps.linePower(f);
        int[] l = ps.lobe(f);
        double under = density * (l[1] - l[0] + 1);
        boolean res = raw >= RESOLVED * under;
        return new double[] {Math.sqrt(res ? raw - under : raw), res ? 1 : 0};
    }

    /** Power-weighted centroid of the main lobe around bin {@code k}: a line's frequency to a small fraction of a bin. */
    double centroidHz(int k) {
        double s = 0, sk = 0;
        for (int j = Math.max(1, k - hw); j <= Math.min(ps.length / 2 - 1, k + hw); j++) { s += ps.power[j]; sk += j * ps.power[j]; }
        return sk / s * binW();
    }

    /** Bin of the largest power in [loHz, hiHz], skipping bins marked in {@code skip}. */
    int peak(double loHz, double hiHz, boolean[] skip) {
        int k0 = Math.max(hw + 1, (int) Math.ceil(loHz / binW()));
        int k1 = Math.min(ps.length / 2 - 1 - hw, (int) Math.floor(hiHz / binW()));
        int best = -1;
        for (int k = k0; k <= k1; k++) if ((skip == null || !skip[k]) && (best < 0 || ps.power[k] > ps.power[best])) best = k;
        return best;
    }

    // ------------------------------------------------------------------ intermodulation

    /**
     * Two-tone intermodulation, or empty when the capture does not hold two strong tones. {@code forced} is the
     * method to use, or null to recognise it: a strong low tone at least 1.5× the amplitude of a tone more than
     * 8× higher in frequency is a modulation (SMPTE-type) test; otherwise two tones closer than an octave are a
     * difference-frequency test (our rules).
     */
    Optional<Intermodulation> intermodulation(StimulusKind forced) {
        int k1 = peak(0, fs / 2, null);
        if (k1 < 0) return Optional.empty();
        boolean[] skip = new boolean[ps.length / 2 + 1];
        // skip the first tone's lobe and its harmonics' lobes up to H10 (a distorted strong tone is still one tone;
        // a second tone may sit on a high harmonic, e.g. 8 kHz = 32 × 250 Hz in the DIN variant)
        double fa = centroidHz(k1);
        for (int h = 1; h <= 10 && h * fa < fs / 2; h++) {
            int c = (int) Math.round(h * fa / binW());
            for (int j = Math.max(0, c - 2 * hw); j <= Math.min(skip.length - 1, c + 2 * hw); j++) skip[j] = true;
        }
        int k2 = peak(0, fs / 2, skip);
        if (k2 < 0) return Optional.empty();
        double fb = centroidHz(k2);
        double[] ua = line(fa), ub = line(fb);
        if (!(ub[0] * ub[0] >= SECOND_TONE_MIN * ua[0] * ua[0])) return Optional.empty();
        int[] lb = ps.lobe(fb);
        if (!(ub[0] * ub[0] >= TONE_ABOVE_NOISE * density * (lb[1] - lb[0] + 1))) return Optional.empty();
        double fLo = Math.min(fa, fb), fHi = Math.max(fa, fb);
        double uLo = fa < fb ? ua[0] : ub[0], uHi = fa < fb ? ub[0] : ua[0];
        Intermodulation.Method m;
        if (forced == StimulusKind.SMPTE) m = Intermodulation.Method.MODULATION;
        else if (forced == StimulusKind.TWIN) m = Intermodulation.Method.DIFFERENCE_FREQUENCY;
        else if (fHi > 8 * fLo && uLo >= 1.5 * uHi) m = Intermodulation.Method.MODULATION;
        else if (fHi < 2 * fLo) m = Intermodulation.Method.DIFFERENCE_FREQUENCY;
        else return Optional.empty();
        boolean auto = forced != StimulusKind.SMPTE && forced != StimulusKind.TWIN;
        List<Intermodulation.Product> products = new ArrayList<>();
        List<Double> d = new ArrayList<>();
        double imd2 = 0;
        if (m == Intermodulation.Method.MODULATION) {
            for (int n = 2; n <= 5; n++) {
                double sum = 0;
                for (int sign = -1; sign <= 1; sign += 2) {
                    double f = fHi + sign * (n - 1) * fLo;
                    double[] u = line(f);
                    if (f <= 0 || f >= fs / 2) continue;
                    sum += u[0];
                    products.add(new Intermodulation.Product(n, f, u[0], u[0] / uHi, u[1] > 0));
                }
                double dn = sum / uHi;
                d.add(dn);
                imd2 += dn * dn;
            }
        } else {
            double ref = uLo + uHi;
            double[] p2 = line(fHi - fLo);
            products.add(new Intermodulation.Product(2, fHi - fLo, p2[0], p2[0] / ref, p2[1] > 0));
            double d2 = p2[0] / ref;
            double s3 = 0;
            for (double f : new double[] {2 * fLo - fHi, 2 * fHi - fLo}) {
                if (f <= 0 || f >= fs / 2) continue;
                double[] u = line(f);
                s3 += u[0];
                products.add(new Intermodulation.Product(3, f, u[0], u[0] / ref, u[1] > 0));
            }
            double d3 = s3 / ref;
            d.add(d2);
            d.add(d3);
            imd2 = d2 * d2 + d3 * d3;
        }
        return Optional.of(new Intermodulation(m, fLo, fHi, uLo, uHi, uLo / uHi, Math.sqrt(imd2), d, products, auto));
    }

    // ------------------------------------------------------------------ noise and hum

    /**
     * Output noise in the band (every bin whose centre lies in it, hum included) and the hum lines: the mains
     * fundamental near 50 or 60 Hz (whichever family of lines up to 1 kHz carries more power above the noise),
     * each harmonic up to 1 kHz that stands 10 dB above the noise in its bins.
     */
    NoiseFigures noise(double lowHz, double highHz, SampleUnit unit, OptionalDouble loadOhms, OptionalDouble ratedPowerWatts) {
        int kLo = Math.max(1, (int) Math.ceil(lowHz / binW()));
        int kHi = Math.min(ps.length / 2 - 1, (int) Math.floor(highHz / binW()));
        double u = 0, a = 0;
        for (int k = kLo; k <= kHi; k++) {
            double g = Weighting.A.gainAt(k * binW());
            u += ps.power[k];
            a += ps.power[k] * g * g;
        }
        double rms = Math.sqrt(u), rmsA = Math.sqrt(a);
        OptionalDouble mains = OptionalDouble.empty();
        List<NoiseFigures.HumLine> hum = new ArrayList<>();
        double best = 0;
        for (double nominal : new double[] {50, 60}) {
            int k = peak(nominal - 1.5, nominal + 1.5, null);
            if (k < 0) continue;
            double fm = centroidHz(k);
            if (Math.abs(fm - nominal) > 2) fm = nominal;
            List<NoiseFigures.HumLine> lines = new ArrayList<>();
            double sum = 0;
            for (int h = 1; h * fm <= 1000 + 1e-9; h++) {
                double[] l = line(h * fm);
                if (l[1] > 0) { lines.add(new NoiseFigures.HumLine(h, h * fm, l[0])); sum += l[0] * l[0]; }
            }
            if (sum > best && !lines.isEmpty() && lines.get(0).harmonic() <= 2) {
                best = sum;
                mains = OptionalDouble.of(fm);
                hum = lines;
            }
        }
        OptionalDouble s1 = OptionalDouble.empty(), s1a = OptionalDouble.empty(), sr = OptionalDouble.empty(), sra = OptionalDouble.empty();
        if (unit == SampleUnit.VOLTS && loadOhms.isPresent() && rms > 0) {
            double v1 = Math.sqrt(loadOhms.getAsDouble());
            s1 = OptionalDouble.of(Levels.ratioToDb(v1 / rms));
            s1a = OptionalDouble.of(Levels.ratioToDb(v1 / rmsA));
            if (ratedPowerWatts.isPresent()) {
                double vr = Math.sqrt(ratedPowerWatts.getAsDouble() * loadOhms.getAsDouble());
                sr = OptionalDouble.of(Levels.ratioToDb(vr / rms));
                sra = OptionalDouble.of(Levels.ratioToDb(vr / rmsA));
            }
        }
        return new NoiseFigures(rms, rmsA, lowHz, Math.min(highHz, fs / 2), mains, hum, s1, s1a, sr, sra);
    }

    // ------------------------------------------------------------------ crosstalk

    /** The strongest line of the driven channel ({@code driven}) measured in this channel ({@code this}). */
    static Optional<Crosstalk> crosstalk(SpecLines undriven, SpecLines driven, int drivenChannel, OptionalDouble hintHz) {
        int k = hintHz.isPresent()
                ? driven.peak(0.9 * hintHz.getAsDouble(), 1.1 * hintHz.getAsDouble(), null)
                : driven.peak(0, driven.fs / 2, null);
        if (k < 0) return Optional.empty();
        double f = driven.centroidHz(k);
        double[] ud = driven.line(f);
        if (!(ud[0] > 0)) return Optional.empty();
        double[] uu = undriven.line(f);
        return Optional.of(new Crosstalk(drivenChannel, f, uu[0] / ud[0], uu[1] > 0));
    }
}
