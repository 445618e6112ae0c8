package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.analysis.TransferCurve;
import org.outstage.json.JsonText;
import org.outstage.model.Bias;
import org.outstage.model.SolverSettings;
import org.outstage.model.StageModel;
import org.outstage.model.StageParameters;

/** {@code outstage fit}: a transfer-curve CSV synthesised from the model at a known bias. */
class FitCommandTest {
    @TempDir Path dir;

    static String[] run(String... args) {
        StringWriter o = new StringWriter(), e = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(o), new PrintWriter(e)).execute(args);
        return new String[] {Integer.toString(code), o.toString(), e.toString()};
    }

    Path curveFile(double vqVolts) throws Exception {
        StageParameters p = StageParameters.builder().topology("darlington").bias(new Bias.EmitterDropVolts(vqVolts)).build();
        TransferCurve c = StageModel.of(p, SolverSettings.defaults()).transferCurve(-8, 8, 801).curve();
        StringBuilder sb = new StringBuilder("# synthesised: darlington at a known bias\noutput_v,gain\n");
        double[] x = c.outputVolts(), g = c.incrementalGain();
        for (int i = 0; i < x.length; i++) sb.append(String.format(Locale.ROOT, "%.9g,%.9g%n", x[i], g[i]));
        Path f = dir.resolve("curve.csv");
        Files.writeString(f, sb.toString());
        return f;
    }

    @Test
    void fitJson_estimatesKnownBiasAndAdvises() throws Exception {
        String[] r = run("fit", curveFile(0.008).toString(), "--topology", "darlington", "--json");
        assertEquals("0", r[0], r[2]);
        @SuppressWarnings("unchecked")
        Map<String, Object> j = (Map<String, Object>) JsonText.parse(r[1]);
        assertEquals(8.0, (Double) j.get("vq_mv"), 0.2);
        // the optimum (crossover ratio 1) lies inside its near-optimal band, and the 8 mV estimate below it
        assertTrue((Double) j.get("optimum_band_low_vq_mv") < (Double) j.get("optimum_vq_mv")
                && (Double) j.get("optimum_vq_mv") < (Double) j.get("optimum_band_high_vq_mv") && 8 < (Double) j.get("optimum_band_low_vq_mv"), j.toString());
        assertTrue((Double) j.get("fit_rms_residual") < 1e-3);
        assertTrue(((String) j.get("advice")).startsWith("raise the drop across each emitter resistor by about"), (String) j.get("advice"));
    }

    @Test
    void fitSummary_printsAdvice() throws Exception {
        String[] r = run("fit", curveFile(0.008).toString(), "--topology", "darlington");
        assertEquals("0", r[0], r[2]);
        assertTrue(r[1].contains("Advice: raise the drop"), r[1]);
    }

    @Test
    void modelCsvOutput_fitsBackToItsOwnBias() throws Exception {
        StringWriter o = new StringWriter(), e = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(o), new PrintWriter(e))
                .execute("model", "--topology", "pair", "--vq-mv", "12", "--csv", "--vin-max", "10", "--points", "1001");
        assertEquals(0, code, e.toString());
        Path f = dir.resolve("model.csv");
        Files.writeString(f, o.toString());
        String[] r = run("fit", f.toString(), "--json");
        assertEquals("0", r[0], r[2]);
        @SuppressWarnings("unchecked")
        Map<String, Object> j = (Map<String, Object>) JsonText.parse(r[1]);
        assertEquals(12.0, (Double) j.get("vq_mv"), 0.05);
    }

    @Test
    void csvWithoutCurveColumns_isReadAsCapture_badInputExit2() throws Exception {
        Path f = dir.resolve("bad.csv");
        Files.writeString(f, "x,y\n1,2\n");
        String[] r = run("fit", f.toString());
        assertEquals("2", r[0]);
        assertTrue(r[2].startsWith("outstage: " + f), r[2]);
        assertEquals(1, r[2].strip().split("\n").length);
    }

    @Test
    void curveCsvWithBadRow_exit2NamingFileAndLine() throws Exception {
        Path f = dir.resolve("curve-bad.csv");
        Files.writeString(f, "output_v,gain\n0.0,0.97\nabc,0.97\n");
        String[] r = run("fit", f.toString());
        assertEquals("2", r[0]);
        assertEquals("outstage: " + f + " line 3: not a number", r[2].strip());
    }

    /** A 1 s, 48 kHz WAV of a 997 Hz sine (not commensurate with the sample rate, so the phases cover the cycle) through the model's static curve (darlington at vqVolts), 10 V peak, noise 20 µV rms. */
    Path captureFile(double vqVolts) throws Exception {
        StageParameters p = StageParameters.builder().topology("darlington").bias(new Bias.EmitterDropVolts(vqVolts)).build();
        TransferCurve c = StageModel.of(p, SolverSettings.defaults()).transferCurve(-12, 12, 24001).curve();
        double[] vin = c.inputVolts(), vout = c.outputVolts();
        int fs = 48000, n = 48000;
        double amp = 10 / 0.97, fsVolts = 20;
        double[] x = new double[n];
        java.util.Random r = new java.util.Random(17);
        for (int i = 0; i < n; i++) {
            double v = amp * Math.sin(2 * Math.PI * 997 * i / fs);
            int k = (int) Math.floor((v + 12) / 24 * 24000);
            double t = (v - vin[k]) / (vin[k + 1] - vin[k]);
            x[i] = (vout[k] + t * (vout[k + 1] - vout[k]) + 2e-5 * r.nextGaussian()) / fsVolts;
        }
        Path f = dir.resolve("stage-out.wav");
        org.outstage.capture.WavWriter.write(f, fs, org.outstage.capture.WavWriter.Encoding.FLOAT_32, false, x);
        return f;
    }

    @Test
    void captureFile_fitsTheMeasuredTransferCurve() throws Exception {
        String[] r = run("fit", captureFile(0.009).toString(), "--fs-volts", "20", "--topology", "darlington", "--json");
        assertEquals("0", r[0], r[2]);
        @SuppressWarnings("unchecked")
        Map<String, Object> j = (Map<String, Object>) JsonText.parse(r[1]);
        System.out.println("capture fit: " + r[1]);
        assertEquals(9.0, (Double) j.get("vq_mv"), 0.5);
        assertTrue(((String) j.get("advice")).startsWith("raise"), (String) j.get("advice"));
    }
}
