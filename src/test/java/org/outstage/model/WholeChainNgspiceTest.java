package org.outstage.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Band;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.Weighting;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.capture.Capture;
import org.outstage.capture.CaptureOptions;
import org.outstage.capture.CaptureReader;
import org.outstage.capture.WavWriter;

/**
 * Issue 10 item 8: an outside check of the whole chain. ngspice (external tool, run live) simulates a class-AB
 * emitter-follower pair with charge-storage device parameters (src/test/resources/ngspice-tran/ef-pair-tran.cir and its
 * README) at three bias settings (below, near and above Oliver's optimum) and two levels (about 5 V and 20 V peak);
 * each transient output is written to a WAV with the project's writer, read back with the project's reader and analysed
 * by {@link Analyzer}. Checks: Outstage's THD agrees with ngspice's own Fourier analysis ({@code fourier}, harmonics 2–9,
 * the last period) within 0.5 dB; Outstage's gain at zero agrees with the derivative of ngspice's DC sweep of the same
 * netlist (central difference at 0 over the chord of the outer swing, 50–90 % of the drive peak) within 2 %.
 * Skipped with a reason only when ngspice is absent and CI is not true; on CI a missing ngspice fails.
 */
class WholeChainNgspiceTest {
    static final double[] BIAS = {0.64, 0.67, 0.73};
    static final double[] AMP = {5.2, 20.8};
    static final double FULL_SCALE_VOLTS = 40;

    @TempDir static Path tmp;
    static String log;

    @BeforeAll
    static void runNgspice() throws Exception {
        boolean available = NgspiceAgreementTest.ngspiceAvailable();
        if (!available && "true".equalsIgnoreCase(System.getenv("CI")))
            throw new AssertionError("WholeChainNgspiceTest: CI=true but ngspice is not installed: the whole-chain check cannot run");
        Assumptions.assumeTrue(available, "ngspice is not installed (Debian: apt-get install ngspice): whole-chain check skipped");
        Path net = tmp.resolve("ef-pair-tran.cir");
        try (InputStream in = WholeChainNgspiceTest.class.getResourceAsStream("/ngspice-tran/ef-pair-tran.cir")) {
            Files.copy(in, net);
        }
        Process p = new ProcessBuilder("ngspice", "-b", net.toString()).directory(tmp.toFile()).redirectErrorStream(true)
                .redirectOutput(tmp.resolve("ngspice.log").toFile()).start();
        if (!p.waitFor(300, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new AssertionError("ngspice timed out");
        }
        log = Files.readString(tmp.resolve("ngspice.log"));
        assertEquals(0, p.exitValue(), "ngspice exit code: " + log);
        System.out.println("WholeChainNgspiceTest: live ngspice run (" + NgspiceAgreementTest.version() + ")");
    }

    /** THD (fraction) of each case from ngspice's log: the line after "CASE vb=.. amp=..". */
    static Map<String, Double> ngspiceThd() {
        Map<String, Double> m = new LinkedHashMap<>();
        Pattern caseLine = Pattern.compile("CASE vb=([0-9.]+) amp=([0-9.]+)");
        Pattern thdLine = Pattern.compile("THD: ([0-9.eE+-]+) %");
        String current = null;
        for (String line : log.split("\\R")) {
            Matcher c = caseLine.matcher(line);
            if (c.find()) { current = c.group(1) + "/" + c.group(2); continue; }
            Matcher t = thdLine.matcher(line);
            if (current != null && t.find()) { m.put(current, Double.parseDouble(t.group(1)) / 100); current = null; }
        }
        return m;
    }

    static double[][] columns(Path file) throws Exception {
        List<double[]> rows = new ArrayList<>();
        for (String line : Files.readAllLines(file)) {
            String t = line.trim();
            if (t.isEmpty() || Character.isLetter(t.charAt(0))) continue;
            String[] f = t.split("\\s+");
            rows.add(new double[] {Double.parseDouble(f[0]), Double.parseDouble(f[1])});
        }
        double[][] r = new double[2][rows.size()];
        for (int i = 0; i < rows.size(); i++) { r[0][i] = rows.get(i)[0]; r[1][i] = rows.get(i)[1]; }
        return r;
    }

    static String key(double vb, double amp) { return fmt(vb) + "/" + fmt(amp); }

    static String fmt(double v) { return String.format(Locale.ROOT, "%s", v).replaceAll("\\.0$", ""); }

    /** Outstage's measurement of the ngspice transient: written as a 32-bit float WAV, read back, analysed. */
    static Measurement outstage(double vb, double amp) throws Exception {
        double[][] t = columns(tmp.resolve("tran-vb" + fmt(vb) + "-a" + fmt(amp) + ".txt"));
        int n = t[0].length;
        double dt = (t[0][n - 1] - t[0][0]) / (n - 1);
        int rate = (int) Math.round(1 / dt);
        assertEquals(1_000_000, rate, "linearized at the tran step of 1 us");
        double[] fs = new double[n];
        for (int i = 0; i < n; i++) fs[i] = t[1][i] / FULL_SCALE_VOLTS;
        Path wav = tmp.resolve("tran-vb" + fmt(vb) + "-a" + fmt(amp) + ".wav");
        WavWriter.write(wav, rate, WavWriter.Encoding.FLOAT_32, false, fs);
        Capture c = CaptureReader.open(wav, CaptureOptions.none().withFullScaleVolts(FULL_SCALE_VOLTS));
        // harmonics H2..H9, as ngspice's fourier with its default 10 frequencies (DC and 1..9)
        AnalysisSettings s = new AnalysisSettings(Band.AUDIO_20_20K, Weighting.NONE, 9, OptionalDouble.empty(), OptionalDouble.of(8));
        return Analyzer.analyze(c, 0, s);
    }

    /** ngspice's DC sweep: gain at zero (central difference) over the chord of the outer swing, 50–90 % of the drive peak. */
    static double ngspiceGainAtZero(double vb, double amp) throws Exception {
        double[][] d = columns(tmp.resolve("dc-vb" + fmt(vb) + ".txt"));
        double[] x = d[0], y = d[1];
        double g0 = (Interp.at(x, y, 0.002) - Interp.at(x, y, -0.002)) / 0.004;
        double outer = ((Interp.at(x, y, 0.9 * amp) - Interp.at(x, y, 0.5 * amp)) + (Interp.at(x, y, -0.5 * amp) - Interp.at(x, y, -0.9 * amp)))
                / (0.8 * amp);
        return g0 / outer;
    }

    @Test
    void transientThdAndGainAtZero_agreeWithNgspice() throws Exception {
        Map<String, Double> thd = ngspiceThd();
        assertEquals(BIAS.length * AMP.length, thd.size(), "fourier results in the ngspice log: " + thd);
        List<String> failures = new ArrayList<>();
        for (double vb : BIAS) {
            for (double amp : AMP) {
                Measurement m = outstage(vb, amp);
                double ours = m.thd().ratio(), theirs = thd.get(key(vb, amp));
                double dThdDb = 20 * Math.log10(ours / theirs);
                assertTrue(m.stage() instanceof StageDiagnosis.Measured, "stage diagnosis at vb " + vb + " amp " + amp + ": " + m.stage());
                double g = ((StageDiagnosis.Measured) m.stage()).crossover().gainAtZero();
                double gs = ngspiceGainAtZero(vb, amp);
                double dG = g / gs - 1;
                System.out.printf(Locale.ROOT, "whole chain vb=%.2f V x2, drive %.1f V: THD outstage %.5f %% ngspice %.5f %% (%+.3f dB); "
                        + "gain at zero outstage %.5f ngspice DC %.5f (%+.3f %%)%n", vb, amp, ours * 100, theirs * 100, dThdDb, g, gs, dG * 100);
                // ngspice fourier (external tool): within 0.5 dB (issue 10 item 8)
                if (!(Math.abs(dThdDb) <= 0.5)) failures.add(String.format(Locale.ROOT, "THD vb %.2f amp %.1f: %+.3f dB", vb, amp, dThdDb));
                // derivative of ngspice's DC sweep of the same netlist (external tool): within 2 % (issue 10 item 8)
                if (!(Math.abs(dG) <= 0.02)) failures.add(String.format(Locale.ROOT, "gain at zero vb %.2f amp %.1f: %+.3f %%", vb, amp, dG * 100));
            }
        }
        assertTrue(failures.isEmpty(), "disagreements with ngspice: " + failures);
    }
}
