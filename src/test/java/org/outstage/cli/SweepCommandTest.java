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

class SweepCommandTest {
    @TempDir Path dir;

    static final double A3 = 0.02, FS_VOLTS = 40, LOAD = 8;

    /** Chebyshev: x + a3·x³ driven by A·cos gives THD = (a3A²/4)/(1 + 3a3A²/4) (docs/references.md §6.4). */
    static double thd(double a) { return (A3 * a * a / 4) / (1 + 0.75 * A3 * a * a); }

    /** Power V_rms²/R of the output: H1 and H3 (A + ¾a3A³ and a3A³/4 in full-scale units). */
    static double power(double a) {
        double h1 = (a + 0.75 * A3 * a * a * a) * FS_VOLTS, h3 = A3 * a * a * a / 4 * FS_VOLTS;
        return (h1 * h1 + h3 * h3) / 2 / LOAD;
    }

    private List<String> series(double... amplitudes) throws Exception {
        List<String> files = new ArrayList<>();
        double fs = 48000;
        for (int k = 0; k < amplitudes.length; k++) {
            double a = amplitudes[k];
            double[] y = new double[48000];
            for (int i = 0; i < y.length; i++) {
                double x = a * Math.cos(2 * Math.PI * 1000 * i / fs);
                y[i] = (x + A3 * x * x * x) / 1.1;
            }
            // scale back by 1.1 through the calibration: full scale = 44 V
            Path p = dir.resolve(String.format("level-%02d.wav", k));
            WavWriter.write(p, (int) fs, WavWriter.Encoding.FLOAT_64, false, y);
            files.add(p.toString());
        }
        return files;
    }

    @Test
    @SuppressWarnings("unchecked")
    void cubicSeries_powerAtOnePercentWithinTwoPercentOfTruth() throws Exception {
        double[] amps = {0.3, 0.6, 1.0, 1.5, 2.0, 2.6};
        List<String> args = new ArrayList<>(List.of("sweep", "--json", "--load", "8", "--fs-volts", "44"));
        args.addAll(series(amps));
        CliRun r = CliRun.of(args.toArray(String[]::new));
        assertEquals(0, r.exit(), r.err());
        Map<String, Object> root = (Map<String, Object>) JsonText.parse(r.out());
        List<Object> points = (List<Object>) root.get("points");
        assertEquals(amps.length, points.size());
        Map<String, Object> p0 = (Map<String, Object>) points.get(0);
        for (String k : List.of("file", "power_w", "thd_percent", "thd_n_percent")) assertTrue(p0.containsKey(k), k);
        assertEquals(power(0.3), (Double) p0.get("power_w"), 1e-6 * power(0.3));
        assertEquals(100 * thd(0.3), (Double) p0.get("thd_percent"), 1e-6);
        // truth: the amplitude where THD = 1 %, by bisection on the closed form
        double lo = 1.0, hi = 2.6;
        for (int i = 0; i < 200; i++) { double m = (lo + hi) / 2; if (thd(m) < 0.01) lo = m; else hi = m; }
        double truth = power(lo);
        double got = (Double) root.get("power_at_1pct_thd_w");
        assertEquals(truth, got, 0.02 * truth, "IEC 60268-3 distortion-limited power at 1 % THD");
        assertNull(root.get("power_at_10pct_thd_w"), "the series never reaches 10 %");
    }

    @Test
    void sweepWithoutLoad_exits2() throws Exception {
        CliRun r = CliRun.of("sweep", "--fs-volts", "44", series(0.3).get(0));
        assertEquals(2, r.exit());
        assertTrue(r.err().contains("--load"), r.err());
    }

    @Test
    void uncalibratedSeries_exits2ExplainingVolts() throws Exception {
        CliRun r = CliRun.of("sweep", "--load", "8", series(0.3).get(0));
        assertEquals(2, r.exit());
        assertTrue(r.err().contains("needs a capture in volts"), r.err());
    }

    @Test
    void mixedFrequencies_refusedNamingTheFile() throws Exception {
        List<String> files = series(0.3, 0.6);
        double[] y = new double[48000];
        for (int i = 0; i < y.length; i++) y[i] = 0.5 * Math.cos(2 * Math.PI * 440 * i / 48000.0);
        Path odd = dir.resolve("odd-440.wav");
        WavWriter.write(odd, 48000, WavWriter.Encoding.FLOAT_64, false, y);
        CliRun r = CliRun.of("sweep", "--load", "8", "--fs-volts", "44", files.get(0), files.get(1), odd.toString());
        assertEquals(2, r.exit());
        assertTrue(r.err().contains("odd-440.wav") && r.err().contains("frequency"), r.err());
    }
}
