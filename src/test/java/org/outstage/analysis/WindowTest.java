package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.jtransforms.fft.DoubleFFT_1D;
import org.junit.jupiter.api.Test;

/** Window properties computed from the coefficients, against docs/references.md §5.2 (Harris 1978, Heinzel 2002, Solomon 1994). */
class WindowTest {
    static final int N = 4096;

    /** Highest sidelobe in dB relative to the main-lobe peak, from a 32× zero-padded FFT; the main lobe ends at its first null. */
    static double peakSidelobeDb(Window w) {
        int pad = 32;
        double[] x = new double[N * pad];
        for (int i = 0; i < N; i++) x[i] = w.value(i, N);
        new DoubleFFT_1D(x.length).realForward(x);
        int half = x.length / 2;
        double[] mag = new double[half];
        mag[0] = Math.abs(x[0]);
        for (int k = 1; k < half; k++) mag[k] = Math.hypot(x[2 * k], x[2 * k + 1]);
        int k = pad;   // one bin out: flat-tops ripple inside ±1 bin, every main lobe falls monotonically after it
        while (k < half - 1 && mag[k + 1] < mag[k]) k++;   // walk down the main lobe to its first minimum
        double side = 0;
        for (int j = k; j < half; j++) side = Math.max(side, mag[j]);
        return 20 * Math.log10(side / mag[0]);
    }

    @Test
    void cosineSumWindows_sidelobesAndEnbwMatchPublished() {
        // {PSLL computed in docs/references.md §5.2, ENBW bins}
        check(Window.HANN, -31.47, 1.5000);
        check(Window.BLACKMAN_HARRIS_4, -92.01, 2.0044);
        check(Window.BLACKMAN_HARRIS_7, -180.04, 2.6319);
        check(Window.HFT90D, -90.22, 3.8832);
        check(Window.HFT248D, -248.39, 5.6512);
    }

    private static void check(Window w, double psllDb, double enbw) {
        assertEquals(psllDb, peakSidelobeDb(w), 0.1, w + " peak sidelobe");
        assertEquals(enbw, w.enbwBins(N), 5e-4, w + " ENBW");
    }

    /**
     * Normalisation: the Blackman-Harris sets sum to 1 (peak 1 at the centre, docs/references.md §12 item 1 rule);
     * the flat-tops use a0 = 1 (Heinzel 2002), so their coherent gain Σw/N is 1.
     */
    @Test
    void coefficients_haveTheirPublishedNormalisation() {
        for (Window w : new Window[] {Window.HANN, Window.BLACKMAN_HARRIS_4, Window.BLACKMAN_HARRIS_7}) {
            double s = 0;
            for (double a : w.coefficients()) s += a;
            assertEquals(1.0, s, 2e-6, w + " Σa_k");
            assertEquals(1.0, w.value(N / 2, N), 2e-6);
        }
        assertEquals(1.0, Window.HFT90D.coherentGain(N), 1e-12);
        assertEquals(1.0, Window.HFT248D.coherentGain(N), 1e-12);
        assertEquals(0.271051400693424, Window.BLACKMAN_HARRIS_7.coherentGain(N), 1e-12);
    }

    /** The cached recurrence-built samples agree with the direct cosine sum. */
    @Test
    void cachedSamples_matchDirectEvaluation() {
        for (Window w : Window.values()) {
            double[] s = w.samples(1000);
            for (int i = 0; i < 1000; i += 37) assertEquals(w.value(i, 1000), s[i], 1e-13);
        }
    }

    /** A line's mean square is the power summed over the main lobe, at any fractional bin offset (no scalloping). */
    @Test
    void linePower_isFreeOfScallopingLoss() {
        int n = 1 << 14;
        double fs = n;   // 1 Hz bins
        for (double offset : new double[] {0, 0.25, 0.5, 0.77}) {
            double f = 1000 + offset;
            double[] y = new double[n];
            for (int i = 0; i < n; i++) y[i] = Math.cos(2 * Math.PI * f * i / fs);
            PowerSpectrum ps = PowerSpectrum.of(org.outstage.capture.Capture.inMemory("t", fs, org.outstage.capture.SampleUnit.VOLTS, y),
                    0, n, n, Window.BLACKMAN_HARRIS_7, 0);
            assertEquals(0.5, ps.linePower(f), 1e-9, "offset " + offset);
        }
    }
}
