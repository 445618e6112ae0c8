package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.capture.WavWriter;
import org.outstage.json.JsonText;

/** session add and show through the real capture reader and analysis, on WAVs made here. */
class SessionPipelineTest {
    @TempDir Path dir;
    String out;
    String err;

    int run(String... args) {
        StringWriter o = new StringWriter();
        StringWriter e = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(o), new PrintWriter(e)).execute(args);
        out = o.toString();
        err = e.toString();
        return code;
    }

    /**
     * 1 s at 48 kHz of a 997 Hz sine of 0.5 FS peak through y = x + c·w·tanh(x/w): incremental gain 1 + c·sech²(x/w),
     * so the gain at zero is 1 + c and, with w = 5 % of the peak, the outer-swing gain is 1 to within 1e-7
     * (sech²(10) ≈ 8e-9). Plus a third harmonic of 1e-3 of the fundamental (THD 0.1 % by the Fourier series).
     */
    Path wav(String name, double c) throws Exception {
        int fs = 48_000;
        double a = 0.5;
        double w = 0.05 * a;
        double[] x = new double[fs];
        for (int i = 0; i < fs; i++) {
            double t = i / (double) fs;
            double s = a * Math.sin(2 * Math.PI * 997 * t);
            x[i] = s + c * w * Math.tanh(s / w) + 1e-3 * a * Math.sin(3 * 2 * Math.PI * 997 * t);
        }
        Path p = dir.resolve(name);
        WavWriter.write(p, fs, WavWriter.Encoding.FLOAT_32, false, x);
        return p;
    }

    @SuppressWarnings("unchecked")
    @Test
    void realWavs_stepsCarryMeasuredFigures_gainAtZeroMatchesChebyshevOracle_andAdviceBracketsTheFlatStep() throws Exception {
        String db = dir.resolve("lb.db").toString();
        assertEquals(0, run("session", "start", "--unit", "DA-60 #11", "--logbook", db), err);
        String id = out.trim();
        double[][] steps = {{10, -0.02}, {20, -0.006}, {25, 0.0}, {30, 0.004}, {40, 0.012}};
        for (double[] s : steps) {
            Path p = wav("take_bias-" + s[0] + "mV.wav", s[1]);
            assertEquals(0, run("session", "add", id, "--bias-mv", Double.toString(s[0]), "--fs-volts", "40", "--load", "8",
                    "--logbook", db, p.toString()), err);
        }
        assertEquals(0, run("session", "show", id, "--logbook", db, "--json"), err);
        Map<String, Object> show = (Map<String, Object>) JsonText.parse(out);
        List<Object> st = (List<Object>) show.get("steps");
        assertEquals(5, st.size());
        // Expected gain at zero: with s = a·sinθ, the 3rd harmonic is 1e-3·a·sin3θ = 1e-3·(3s − 4s³/a²) (Chebyshev identity
        // sin3θ = 3sinθ − 4sin³θ, docs/references.md §6.4). Its incremental gain is 1 + 0.003 at zero; its chord over the outer
        // swing (0.5a..0.9a, the stage's definition) is 1 + 1e-3·((3·0.9 − 4·0.729) − (3·0.5 − 4·0.125))/0.4 = 1 − 0.00304.
        // The tanh bump adds c at zero and nothing over the outer swing (sech²(10) ≈ 8e-9). So g0 = (1.003 + c)/0.99696.
        double previous = 0;
        for (int i = 0; i < st.size(); i++) {
            Map<String, Object> step = (Map<String, Object>) st.get(i);
            double g0 = (Double) step.get("gain_at_zero");
            assertTrue(g0 > previous, "gain at zero rises with c: " + st);
            assertEquals((1.003 + steps[i][1]) / 0.99696, g0, 1e-3, "step " + i);
            previous = g0;
            assertEquals(997.0, (Double) step.get("fundamental_hz"), 0.01);
            // 0.5 FS peak with --fs-volts 40 is 20 V peak = 14.14 V rms; into 8 ohm 25 W (P = V^2/R), less what the bump takes
            assertEquals(25.0, (Double) step.get("power_watts"), 0.5);
        }
        // the verdict words are the stage diagnosis's own (its rules and tests); here they only have to arrive
        for (Object o : st) assertTrue(((Map<String, Object>) o).get("crossover_verdict") instanceof String);
        // the middle step has no crossover bump: only the 3rd harmonic, THD = 0.1 % (Fourier series)
        assertEquals(0.1, (Double) ((Map<String, Object>) st.get(2)).get("thd_percent"), 0.002);
        Map<String, Object> rec = (Map<String, Object>) show.get("recommendation");
        double lo = (Double) rec.get("bias_mv_low");
        double hi = (Double) rec.get("bias_mv_high");
        // g0 by the formula above: 0.98600 at 10 mV, 1.00004 at 20 mV, 1.00606 at 25 mV; interpolated linearly in
        // ln(reading) (docs/logbook.md), the ±0.3 % band crosses 0.997 at 10·2^(0.011/0.01404) = 17.2 mV and 1.003 at
        // 20·1.25^(0.00296/0.00602) = 22.3 mV
        assertEquals(10 * Math.pow(2, 0.011 / 0.01404), lo, 0.3, rec.toString());
        assertEquals(20 * Math.pow(1.25, 0.00296 / 0.00602), hi, 0.3, rec.toString());
    }
}
