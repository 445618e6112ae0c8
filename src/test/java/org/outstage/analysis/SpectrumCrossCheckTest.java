package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.transform.DftNormalization;
import org.apache.commons.math3.transform.FastFourierTransformer;
import org.apache.commons.math3.transform.TransformType;
import org.junit.jupiter.api.Test;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;

/** The spectrum path against an independent FFT (Apache Commons Math 3, test scope). */
class SpectrumCrossCheckTest {

    /** Same windowed block through JTransforms (PowerSpectrum) and Commons Math: every bin's power agrees. */
    @Test
    void windowedBlock_powerMatchesCommonsMathFft() {
        int n = 4096;
        double fs = 48000;
        java.util.Random rnd = new java.util.Random(11);
        double[] y = new double[n];
        for (int i = 0; i < n; i++) y[i] = Math.cos(2 * Math.PI * 1234.5 * i / fs + 0.3) + 0.01 * Math.cos(2 * Math.PI * 2469 * i / fs) + 1e-3 * rnd.nextGaussian();
        PowerSpectrum ps = PowerSpectrum.of(Capture.inMemory("t", fs, SampleUnit.VOLTS, y), 0, n, n, Window.BLACKMAN_HARRIS_7, 0);

        double[] w = new double[n];
        double sw2 = 0;
        double[] x = new double[n];
        for (int i = 0; i < n; i++) { w[i] = Window.BLACKMAN_HARRIS_7.value(i, n); sw2 += w[i] * w[i]; x[i] = y[i] * w[i]; }
        Complex[] c = new FastFourierTransformer(DftNormalization.STANDARD).transform(x, TransformType.FORWARD);
        double peak = 0;
        for (int k = 1; k < n / 2; k++) peak = Math.max(peak, ps.power[k]);
        for (int k = 1; k < n / 2; k++) {
            double expected = 2 * (c[k].getReal() * c[k].getReal() + c[k].getImaginary() * c[k].getImaginary()) / (n * sw2);
            assertEquals(expected, ps.power[k], 1e-12 * peak + 1e-9 * expected, "bin " + k);
        }
        // and the phase read-out agrees with the Commons Math bin value corrected for the window's linear phase
        double b = 1234.5 / (fs / n);
        int m = (int) Math.round(b);
        double phase = Math.atan2(c[m].getImaginary(), c[m].getReal()) + Math.PI * (m - b);
        assertEquals(Math.IEEEremainder(phase, 2 * Math.PI), Math.IEEEremainder(ps.linePhase(1234.5), 2 * Math.PI), 1e-9);
        assertEquals(0.3, Math.IEEEremainder(ps.linePhase(1234.5), 2 * Math.PI), 1e-3);
    }

    /** Parseval with the Σw² scaling: the summed power of white noise equals its variance (references.md §11, noise scaling). */
    @Test
    void whiteNoise_summedPowerEqualsVariance() {
        int n = 1 << 16;
        java.util.Random rnd = new java.util.Random(5);
        double[] y = new double[n * 8];
        for (int i = 0; i < y.length; i++) y[i] = 0.1 * rnd.nextGaussian();
        PowerSpectrum ps = PowerSpectrum.of(Capture.inMemory("t", 48000, SampleUnit.VOLTS, y), 0, n, n / 2, Window.BLACKMAN_HARRIS_7, 0);
        double s = 0;
        for (int k = 1; k < n / 2; k++) s += ps.power[k];
        assertEquals(0.01, s, 0.01 * 0.01);
        assertEquals(15, ps.blocks);
    }
}
