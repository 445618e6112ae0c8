package org.outstage.model;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;
import org.junit.jupiter.api.Test;

/** The FFT helper against a direct O(N²) DFT (the naive reference) and a Fourier series. */
class FftTest {
    @Test
    void amplitudes_matchDirectDft() {
        int n = 256;
        double[] x = new double[n];
        Random r = new Random(11);
        for (int i = 0; i < n; i++) x[i] = r.nextGaussian();
        double[] a = Fft.amplitudes(x);
        for (int h = 1; h < n / 2; h++) {
            double re = 0, im = 0;
            for (int k = 0; k < n; k++) {
                re += x[k] * Math.cos(2 * Math.PI * h * k / n);
                im -= x[k] * Math.sin(2 * Math.PI * h * k / n);
            }
            assertEquals(2 * Math.hypot(re, im) / n, a[h], 1e-12, "harmonic " + h);
        }
    }

    @Test
    void squareWave_oddHarmonicsAre4OverPiK() {
        // Fourier series of a ±1 square wave: 4/(πk) for odd k. With N = 1024 samples (half-sample offset keeps the
        // edges off the grid) the sampled series matches within the aliasing of the high harmonics.
        int n = 1024;
        double[] x = new double[n];
        for (int i = 0; i < n; i++) x[i] = (i + 0.5) < n / 2.0 ? 1 : -1;
        double[] a = Fft.amplitudes(x);
        assertEquals(4 / Math.PI, a[1], 1e-5);
        assertEquals(4 / (3 * Math.PI), a[3], 1e-4);
        assertEquals(0, a[2], 1e-12);
    }
}
