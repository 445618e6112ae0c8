package org.outstage.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Optional;
import java.util.Random;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.outstage.analysis.TransferCurve;

/**
 * The band-aware bias fit (docs/model.md §6) against an independent oracle: the complementary emitter-follower pair
 * with the exponential law (Ic = Is·exp(Vbe/VT), Sedra &amp; Smith; docs/references.md §7), solved here, not by the model,
 * driven at 40 W into 8 Ω and band-limited here by its own direct DFT, as a soundcard capture of a 997 Hz tone through
 * a 22 kHz band keeps it (harmonics 0…22; SampleCapturesTest does the same for the sample captures).
 */
class BandLimitedFitTest {
    static final SolverSettings S = SolverSettings.defaults();
    /** Thermal voltage at the model's default 25 °C, from the exact 2019 SI k and q (docs/references.md §7). */
    static final double VT = 1.380649e-23 * 298.15 / 1.602176634e-19;
    static final double RE = 0.22, RL = 8, IS = 1e-13, F0 = 997, BAND_HZ = 22_000;
    static final int H = 22;

    /** Emitter current for a branch drive u: Re·I + VT·ln(I/Is) = u (Newton on ln I). Base current neglected. */
    static double device(double u) {
        double lnIs = Math.log(IS);
        double w = Math.min(lnIs + u / VT, u > 0 ? Math.log(u / RE) : Double.POSITIVE_INFINITY);
        for (int k = 0; k < 200; k++) {
            double e = Math.exp(w), f = RE * e + VT * (w - lnIs) - u, dw = f / (RE * e + VT);
            w -= dw;
            if (Math.abs(dw) < 1e-14) break;
        }
        return Math.exp(w);
    }

    /** The pair's output for drive vin, each device idling at iq (KCL at the output by safeguarded Newton). */
    static double pairOut(double vin, double iq) {
        double vh = VT * Math.log(iq / IS) + iq * RE;
        double lo = -Math.abs(vin) - 2, hi = Math.abs(vin) + 2, v = vin * RL / (RL + RE);
        for (int k = 0; k < 200; k++) {
            double in = device(vin + vh - v), ip = device(v - vin + vh);
            double g = in - ip - v / RL;
            if (g > 0) lo = v; else hi = v;
            double dg = -1 / (RE + VT / in) - 1 / (RE + VT / ip) - 1 / RL;
            double nv = v - g / dg;
            if (!(nv > lo && nv < hi)) nv = 0.5 * (lo + hi);
            if (Math.abs(nv - v) < 1e-15 * Math.max(1, Math.abs(v))) return nv;
            v = nv;
        }
        return v;
    }

    /**
     * The "measured" curve: the pair driven by A·cos θ (A so that the output peak is 40 W into 8 Ω), its output over one
     * cycle of 4096 points reduced to harmonics 0…H by a direct DFT, read at 256 bin-like drive values (centres of 256
     * equal cells over ±A, as the analysis bins a capture): output and incremental gain (central difference of the
     * rebuilt curve), plus seeded gain noise of 1e-4.
     */
    static TransferCurve bandLimitedPair(double vqVolts, long seed) { return bandLimitedPair(vqVolts, seed, 1e-4); }

    /** {@link #bandLimitedPair(double, long)} with gain noise of standard deviation {@code noise} (0: none). */
    static TransferCurve bandLimitedPair(double vqVolts, long seed, double noise) {
        double iq = vqVolts / RE, peak = Math.sqrt(2 * 40 * RL), a = peak;
        for (int k = 0; k < 8; k++) a *= peak / pairOut(a, iq);
        int n = 4096;
        double[] y = new double[n];
        for (int i = 0; i < n; i++) y[i] = pairOut(a * Math.cos(2 * Math.PI * i / n), iq);
        double[] c = new double[H + 1];
        for (int k = 0; k <= H; k++) {
            double sum = 0;
            for (int i = 0; i < n; i++) sum += y[i] * Math.cos(2 * Math.PI * k * i / n);
            c[k] = (k == 0 ? 1.0 : 2.0) * sum / n; // y even in θ: the sine terms vanish
        }
        final double amp = a;
        java.util.function.DoubleUnaryOperator curve = x -> {
            double th = Math.acos(Math.max(-1, Math.min(1, x / amp))), s = 0;
            for (int k = 0; k <= H; k++) s += c[k] * Math.cos(k * th);
            return s;
        };
        int m = 256;
        double[] in = new double[m], out = new double[m], gain = new double[m];
        Random r = new Random(seed);
        double d = 1e-4 * a;
        for (int i = 0; i < m; i++) {
            double x = a * (-1 + (2 * i + 1.0) / m);
            in[i] = x;
            out[i] = curve.applyAsDouble(x);
            double x1 = Math.max(-a, x - d), x2 = Math.min(a, x + d);
            gain[i] = (curve.applyAsDouble(x2) - curve.applyAsDouble(x1)) / (x2 - x1) + noise * r.nextGaussian();
        }
        return new TransferCurve(in, out, gain, "V");
    }

    @ParameterizedTest(name = "Vq {0} mV")
    @ValueSource(doubles = {1, 3, 10, 26, 60})
    void bandLimitedPair_fitsBackToItsVq_unlimitedFitIsWorse(double vqMv) {
        StageParameters stage = StageParameters.builder().topology("pair").build();
        TransferCurve measured = bandLimitedPair(vqMv / 1e3, 11 + (long) vqMv);
        BiasFitResult band = BiasFit.fit(measured, stage, 21, 0.002, S, Optional.of(new CaptureBand(BAND_HZ, F0)));
        BiasFitResult unlimited = BiasFit.fit(measured, stage, 21, 0.002, S);
        System.out.printf(java.util.Locale.ROOT, "Vq %5.1f mV: band fit %.3f mV (residual %.4f %%, limit %.4f %%), unlimited fit %.3f mV (residual %.4f %%)%n",
                vqMv, band.vqVolts() * 1e3, band.rmsResidual() * 100, band.residualLimit() * 100, unlimited.vqVolts() * 1e3, unlimited.rmsResidual() * 100);
        assertEquals(H, band.bandHarmonics());
        assertEquals(0, unlimited.bandHarmonics());
        assertEquals(vqMv, band.vqVolts() * 1e3, 0.05 * vqMv, "band-aware fit");
        assertTrue(band.adviceGiven(), band.advice());
        // The unlimited model does not describe a band-limited capture: its residual is at least twice the band-aware one
        // (measured: 28x at 1 mV, 2.6x at 60 mV), and where the notch is narrower than the band resolves (Vq up to
        // 10 mV at 40 W) it misses the bias by more than the 5 % the band-aware fit meets (measured: 4.2 mV for 1 mV,
        // 5.9 mV for 3 mV, 10.8 mV for 10 mV).
        assertTrue(unlimited.rmsResidual() > 2 * band.rmsResidual(), "unlimited " + unlimited.rmsResidual() + " vs band " + band.rmsResidual());
        if (vqMv <= 10)
            assertTrue(Math.abs(unlimited.vqVolts() * 1e3 - vqMv) > 0.05 * vqMv, "unlimited fit " + unlimited.vqVolts() * 1e3 + " mV");
    }

    /**
     * The workbench's overlay ({@link StageModel#curveThroughBand}, the public face of the fit's band path) against the
     * oracle: the pair at 40 W, its curve through the 22 kHz band of a 997 Hz tone, read as the analysis reads the
     * crossover (gain at zero output over the mean gain between 50 % and 90 % of the peak). The model's curve through the
     * band reads the oracle's notch within 0.1 % of the gain at every bias (measured: 2e-4 at most); its own (unlimited)
     * curve misses it by more than 3 % at 1 and 3 mV (0.20 and 0.055), so the check can fail.
     */
    @ParameterizedTest(name = "Vq {0} mV")
    @ValueSource(doubles = {1, 3, 10, 26})
    void curveThroughBand_readsTheNotchTheBandLimitedCaptureShows(double vqMv) {
        StageModel m = StageModel.of(StageParameters.builder().topology("pair").bias(new Bias.EmitterDropVolts(vqMv / 1e3)).build(), S);
        double p = Math.sqrt(2 * 40 * RL);
        TransferCurve through = m.curveThroughBand(p, new CaptureBand(BAND_HZ, F0));
        TransferCurve own = m.transferCurve(-p * (RL + RE) / RL * 1.05, p * (RL + RE) / RL * 1.05, 2001).curve();
        TransferCurve oracle = bandLimitedPair(vqMv / 1e3, 1, 0);
        double rThrough = BiasFit.modelRatio(new double[][] {through.outputVolts(), through.incrementalGain()}, p);
        double rOwn = BiasFit.modelRatio(new double[][] {own.outputVolts(), own.incrementalGain()}, p);
        double rOracle = BiasFit.modelRatio(new double[][] {oracle.outputVolts(), oracle.incrementalGain()}, p);
        System.out.printf(java.util.Locale.ROOT, "Vq %4.1f mV: gain at zero / outer gain: through the band %.4f, oracle %.4f, own curve %.4f%n",
                vqMv, rThrough, rOracle, rOwn);
        assertEquals(rOracle, rThrough, 0.001);
        if (vqMv <= 3) assertTrue(Math.abs(rOwn - rOracle) > 0.03, "own curve " + rOwn + " vs oracle " + rOracle);
        // the curve covers the drive that gives the peak, ascending, with the peak output at one end
        double[] out = through.outputVolts();
        assertEquals(p, Math.max(out[out.length - 1], -out[0]), 0.02 * p);
    }

    /**
     * Physical invariant: a band wide enough passes the whole curve. At {@link BiasFit#MAX_BAND_HARMONICS} harmonics the
     * model's band-limited crossover ratio (pair, Vq 3 mV, 40 W) is the unlimited one within 1e-4, and the band of the
     * sample captures (22 harmonics) is not (so this check can fail): it reads the shallower notch the capture shows.
     */
    @org.junit.jupiter.api.Test
    void widestBand_isTheUnlimitedCurve_soundcardBandIsNot() {
        StageParameters stage = StageParameters.builder().topology("pair").build();
        StageModel base = StageModel.of(stage.withBias(new Bias.EmitterDropVolts(0.02)), S);
        double p = Math.sqrt(2 * 40 * RL), vb = base.biasFor(0.003);
        double unlimited = BiasFit.modelRatio(base.curveAtBias(vb, StageModel.denseGrid(p * (RL + RE) / RL * 1.05)), p);
        double wide = BiasFit.modelRatio(BiasFit.bandLimitedCurve(base, vb, p, BiasFit.MAX_BAND_HARMONICS), p);
        double soundcard = BiasFit.modelRatio(BiasFit.bandLimitedCurve(base, vb, p, H), p);
        assertEquals(unlimited, wide, 1e-4);
        assertTrue(soundcard - unlimited > 0.03, "soundcard band " + soundcard + " vs unlimited " + unlimited);
    }
}
