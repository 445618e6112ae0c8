package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.capture.WavWriter;
import org.outstage.json.JsonText;

/** verify through the real reader, analysis and stage diagnosis, on WAVs made here with known figures. */
class VerifyPipelineTest {
    @TempDir Path dir;
    static final int FS = 48_000;
    static final double FS_VOLTS = 40; // 1.0 FS = 40 V peak

    /** peak (V) of a sine giving P watts into 8 ohm: P = (Vpk/sqrt2)^2 / R (docs/references.md §3) */
    static double peakFor(double watts) { return Math.sqrt(2 * 8 * watts); }

    static double[] tone(double hz, double peakVolts, double h3Ratio) {
        double a = peakVolts / FS_VOLTS;
        double[] x = new double[FS];
        for (int i = 0; i < FS; i++) {
            double t = 2 * Math.PI * hz * i / FS;
            x[i] = a * Math.sin(t) + h3Ratio * a * Math.sin(3 * t);
        }
        return x;
    }

    Path wav(String name, double[]... ch) throws Exception {
        Path p = dir.resolve(name);
        WavWriter.write(p, FS, WavWriter.Encoding.FLOAT_32, false, ch);
        return p;
    }

    @SuppressWarnings("unchecked")
    @Test
    void madeCaptures_limitsMatchFourierAndPowerLawOracles() throws Exception {
        List<String> args = new ArrayList<>(List.of("verify", "--spec",
                Path.of(System.getProperty("outstage.project.dir", "."), "sample-captures", "spec", "da-60.spec").toString(),
                "--no-log", "--json", "--fs-volts", Double.toString(FS_VOLTS), "--load", "8", "--allow-unmeasured"));
        // THD of a + r·a·sin3θ is r exactly (Fourier series: one harmonic, relative to the fundamental)
        args.add(wav("1w.wav", tone(1000, peakFor(1), 1e-4)).toString());
        double[] series = {50, 55, 60, 65, 70};
        double[] h3 = {0.0005, 0.001, 0.003, 0.02, 0.05};
        for (int i = 0; i < series.length; i++) args.add(wav(series[i] + "w.wav", tone(1000, peakFor(series[i]), h3[i])).toString());
        // stereo at 1 W: channel 2 is 0.2 dB lower
        double[] left = tone(1000, peakFor(1), 1e-4);
        double[] right = left.clone();
        for (int i = 0; i < right.length; i++) right[i] *= Math.pow(10, -0.2 / 20);
        args.add(wav("stereo.wav", left, right).toString());
        // input shorted: 0.4 mV rms of 50 Hz hum and 150 µV rms of white noise (seeded)
        double[] quiet = new double[FS];
        java.util.Random rnd = new java.util.Random(50);
        for (int i = 0; i < FS; i++) {
            quiet[i] = (150e-6 * rnd.nextGaussian() + 0.4e-3 * Math.sqrt(2) * Math.sin(2 * Math.PI * 50 * i / FS)) / FS_VOLTS;
        }
        args.add(wav("shorted.wav", quiet).toString());
        StringWriter o = new StringWriter();
        StringWriter e = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(o), new PrintWriter(e)).execute(args.toArray(String[]::new));
        assertEquals(1, code, o + "\n" + e); // THD at rated power fails
        Map<String, Object> r = (Map<String, Object>) JsonText.parse(o.toString());
        List<Map<String, Object>> limits = (List<Map<String, Object>>) (List<?>) r.get("limits");
        // line order of da-60.spec: thd@1W, thd@rated, thd+n@rated, power@1%, clip-asymmetry, noise, balance
        assertEquals(0.01, (Double) limits.get(0).get("measured"), 1e-4, "THD at 1 W = 0.01 %");
        assertEquals("pass", limits.get(0).get("verdict"));
        assertEquals(0.3, (Double) limits.get(1).get("measured"), 1e-3, "THD at 60 W = 0.3 %");
        assertEquals("fail", limits.get(1).get("verdict"));
        // power at 1 % THD: log-log interpolation between (60 W, 0.3 %) and (65 W, 2 %)
        double p = Math.exp(Math.log(60) + (Math.log(65) - Math.log(60)) * (Math.log(0.01) - Math.log(0.003)) / (Math.log(0.02) - Math.log(0.003)));
        assertEquals(p, (Double) limits.get(3).get("measured"), 0.05);
        assertEquals("pass", limits.get(3).get("verdict"));
        assertEquals("not-measured", limits.get(4).get("verdict"), "nothing clips");
        assertEquals(0.2, (Double) limits.get(6).get("measured"), 1e-3, "balance 0.2 dB");
        // hum and noise add in power (Parseval): sqrt(0.4^2 + 0.15^2) = 0.4272 mV; the seeded noise's own RMS varies by ~1 %
        assertEquals(Math.hypot(0.4, 0.15), (Double) limits.get(5).get("measured"), 0.005, "noise in mV");
        assertEquals("pass", limits.get(5).get("verdict"));
        assertEquals("fail", r.get("outcome"));
        assertTrue(e.toString().isEmpty() || !e.toString().contains("Exception"), e.toString());
    }
}
