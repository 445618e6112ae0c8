package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.capture.WavWriter;
import org.outstage.json.JsonText;

/**
 * {@code response FILE...}: the frequency response from a stepped-tone series (issue 12, item 3), checked against a
 * first-order low-pass whose response the test computes in closed form: H(f) = 1/(1 + j·f/fc), so
 * |H| = 1/√(1 + (f/fc)²) and arg H = −atan(f/fc) (textbook RC network; the −3 dB point is fc).
 */
class SteppedResponseCommandTest {
    @TempDir Path dir;

    static final double FS = 96_000, FC = 10_000;
    static final double[] TONES = {20, 100, 1000, 5000, 8000, 10_000, 12_000, 15_000, 20_000};

    /** One 1 s capture: channel 1 the generator (0.3 FS peak), channel 2 the low-pass output plus a small 3rd harmonic. */
    Path capture(double f) throws Exception {
        int n = (int) FS;
        double mag = 1 / Math.sqrt(1 + (f / FC) * (f / FC)), ph = -Math.atan(f / FC);
        double[] gen = new double[n], out = new double[n];
        for (int i = 0; i < n; i++) {
            double t = i / FS;
            gen[i] = 0.3 * Math.sin(2 * Math.PI * f * t);
            out[i] = 0.3 * mag * Math.sin(2 * Math.PI * f * t + ph) + 0.3e-3 * Math.sin(3 * 2 * Math.PI * f * t);
        }
        Path p = dir.resolve(String.format(java.util.Locale.ROOT, "tone-%05.0fHz.wav", f));
        WavWriter.write(p, (int) FS, WavWriter.Encoding.FLOAT_32, false, gen, out);
        return p;
    }

    @Test
    @SuppressWarnings("unchecked")
    void steppedSeries_givesTheLowPassGainPhaseAndCorner() throws Exception {
        List<String> args = new ArrayList<>(List.of("response", "--reference", "1", "--json"));
        for (double f : TONES) args.add(capture(f).toString());
        CliRun r = CliRun.of(args.toArray(String[]::new));
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> o = (Map<String, Object>) JsonText.parse(r.out());
        assertNull(o.get("sweep"));
        assertEquals(TONES.length, ((Number) o.get("tones")).intValue());
        List<Object> pts = (List<Object>) o.get("points");
        assertEquals(TONES.length, pts.size());
        for (int i = 0; i < TONES.length; i++) {
            Map<String, Object> p = (Map<String, Object>) pts.get(i);
            double f = TONES[i];
            assertEquals(f, ((Number) p.get("frequency_hz")).doubleValue(), 1e-3 * f);
            double gain = -10 * Math.log10(1 + (f / FC) * (f / FC)), phase = -Math.toDegrees(Math.atan(f / FC));
            assertEquals(gain, ((Number) p.get("gain_db")).doubleValue(), 0.01, "gain at " + f + " Hz");
            assertEquals(phase, ((Number) p.get("phase_deg")).doubleValue(), 0.1, "phase at " + f + " Hz");
        }
        // −3 dB: the interpolation in log f between 8, 10 and 12 kHz lands within 1 % of fc (10 log10(2) = 3.0103 dB at fc)
        double high = ((Number) ((Map<String, Object>) o.get("minus_3db_hz")).get("high")).doubleValue();
        assertEquals(FC, high, 0.01 * FC);
        assertNull(((Map<String, Object>) o.get("minus_3db_hz")).get("low"));
        // THD of each tone: the 3rd harmonic at 0.3e-3 against 0.3·|H| (below Nyquist up to 15 kHz)
        List<Object> thd = (List<Object>) o.get("thd_vs_frequency");
        Map<String, Object> at1k = (Map<String, Object>) thd.get(2);
        double expect = 100 * 1e-3 * Math.sqrt(1 + 0.01);
        assertEquals(expect, ((Number) at1k.get("thd_percent")).doubleValue(), 0.01 * expect);
    }

    @Test
    void oneToneOnly_isNotASeries() throws Exception {
        CliRun r = CliRun.of("response", "--reference", "1", capture(1000).toString(), capture(1000.0000001).toString());
        assertEquals(2, r.exit());
        assertTrue(r.err().contains("one capture per frequency"), r.err());
    }
}
