package org.outstage.analysis.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.SineFitter;

class SignalCheckTest {
    static final double FS = 48000, F = 997;
    static final int N = 48000;

    static String reason(double[] y) {
        Optional<String> r = SignalCheck.check(y, FS);
        if (r.isPresent()) return r.get();
        return SignalCheck.check(y, FS, SineFitter.fit(y, FS)).orElse("");
    }

    @Test
    void cleanSine_noReason() {
        assertEquals("", reason(StageFixtures.drive(N, FS, F, 1, 0.3, v -> v)));
    }

    /** A clipped sine (IEC-style overload, L = 0.5A) is still a sine to be diagnosed, not a square. */
    @Test
    void clippedSine_noReason() {
        assertEquals("", reason(StageFixtures.drive(N, FS, F, 1, 0.3, v -> StageFixtures.clip(v, -0.5, 0.5))));
    }

    @Test
    void silence_reasonSilence() {
        assertTrue(reason(new double[N]).startsWith("silence"));
    }

    @Test
    void dcOnly_reasonDc() {
        double[] y = new double[N];
        java.util.Arrays.fill(y, 0.25);
        assertTrue(reason(y).startsWith("DC only"), reason(y));
    }

    /** Noise alone has no dominant line (white noise spreads its power over all bins). */
    @Test
    void noiseOnly_reasonNoDominantTone() {
        assertTrue(reason(StageFixtures.noisy(new double[N], 1e-3, 5)).startsWith("no dominant tone"));
    }

    /** Square wave ±1 (Fourier series: 4/(nπ) odd harmonics, docs/references.md §6.1): two levels, refused. */
    @Test
    void squareWave_reasonSquare() {
        double[] y = StageFixtures.drive(N, FS, F, 1, 0.3, v -> Math.signum(v));
        assertTrue(reason(y).startsWith("square wave"), reason(y));
    }

    /** Twin tone 19 kHz + 20 kHz at equal level (IEC 60268-3 difference-frequency test): refused. */
    @Test
    void twoTones_reasonTwoTones() {
        double[] y = new double[N];
        for (int i = 0; i < N; i++) y[i] = Math.cos(2 * Math.PI * 19000 * i / FS) + Math.cos(2 * Math.PI * 20000 * i / FS + 1);
        String r = reason(y);
        assertTrue(r.startsWith("two tones"), r);
        // frequencies read as a bench user writes them, not in exponent form ("2.000e+04 Hz")
        assertTrue(r.contains(" kHz") && !r.contains("e+0"), r);
    }

    /** SMPTE-type 60 Hz + 7 kHz at 4:1 (−12 dB): refused. */
    @Test
    void smpteTones_reasonTwoTones() {
        double[] y = new double[N];
        for (int i = 0; i < N; i++) y[i] = Math.cos(2 * Math.PI * 60 * i / FS) + 0.25 * Math.cos(2 * Math.PI * 7000 * i / FS);
        assertTrue(reason(y).startsWith("two tones"), reason(y));
    }

    /** Hum at −46 dB beside the tone is not a second tone. */
    @Test
    void toneWithHum_noReason() {
        double[] y = new double[N];
        for (int i = 0; i < N; i++) y[i] = Math.cos(2 * Math.PI * F * i / FS) + 0.005 * Math.cos(2 * Math.PI * 50 * i / FS);
        assertEquals("", reason(y));
    }

    /** Half a cycle: fewer than one period (IEEE 1057 notes the fit fails below about one period). */
    @Test
    void halfCycle_reasonTooShort() {
        int n = (int) Math.round(FS / F / 2);
        double[] y = StageFixtures.drive(n + 40, FS, F, 1, 0, v -> v);
        double[] half = java.util.Arrays.copyOf(y, n);
        SineFit fit = SineFitter.fit(half, FS);
        String r = SignalCheck.check(half, FS, fit).orElse("");
        assertTrue(r.startsWith("record too short") || r.startsWith("the sine fit did not settle"), r + " (fit " + fit + ")");
    }
}
