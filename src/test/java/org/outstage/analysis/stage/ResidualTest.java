package org.outstage.analysis.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.StringWriter;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.SineFitter;

class ResidualTest {
    static final double FS = 48000, F = 997;
    static final int N = 96000;

    /** Worked example: sine + 0.01·cos(3ωt) → residual RMS 0.01/√2, peak 0.01 (a sine of peak A has RMS A/√2). */
    @Test
    void thirdHarmonic_residualRmsIsHarmonicRms() {
        double[] y = new double[N];
        for (int i = 0; i < N; i++) {
            double ph = 2 * Math.PI * F * i / FS;
            y[i] = Math.cos(ph + 0.2) + 0.01 * Math.cos(3 * ph + 1.1) + 0.05;
        }
        SineFit fit = SineFitter.fit(y, FS);
        Residual r = StageAnalyzer.residual(y, FS, fit, StageSettings.defaults());
        assertEquals(0.01 / Math.sqrt(2), r.rmsVolts(), 1e-6);
        assertEquals(0.01, r.peakVolts(), 1e-4);
        assertEquals(N, r.samples().length);
    }

    /**
     * Band-limited residual: 50 Hz hum (0.02) + 3rd harmonic (0.01) + a 20 kHz spur (0.01); a zero-phase 200 Hz
     * high-pass and 10 kHz low-pass keep the harmonic only. Forward–backward squares the Butterworth magnitude:
     * |H|² = 1/(1 + r⁴) with r the bilinear-warped frequency ratio tan(πf/fs)/tan(πfc/fs) (Oppenheim &amp; Schafer,
     * bilinear transform with pre-warping at the corner), giving 0.99554 at 2991 Hz for both sections.
     */
    @Test
    void bandLimitedResidual_removesHumAndSpurKeepsHarmonic() {
        double[] y = new double[N];
        for (int i = 0; i < N; i++) {
            double t = i / FS;
            y[i] = Math.cos(2 * Math.PI * F * t) + 0.02 * Math.cos(2 * Math.PI * 50 * t + 0.4)
                    + 0.01 * Math.cos(2 * Math.PI * 3 * F * t + 1.1) + 0.01 * Math.cos(2 * Math.PI * 20000 * t);
        }
        SineFit fit = SineFitter.fit(y, FS);
        Residual r = StageAnalyzer.residual(y, FS, fit, StageSettings.defaults().withResidualBand(200, 10000));
        double rl = Math.tan(Math.PI * 3 * F / FS) / Math.tan(Math.PI * 10000 / FS);
        double rh = Math.tan(Math.PI * 200 / FS) / Math.tan(Math.PI * 3 * F / FS);
        double lp = 1 / (1 + Math.pow(rl, 4)), hp = 1 / (1 + Math.pow(rh, 4));
        // interior only (the ends carry the filter's start-up); compare RMS over the middle half
        double[] s = r.samples();
        double ss = 0;
        for (int i = N / 4; i < 3 * N / 4; i++) ss += s[i] * s[i];
        assertEquals(lp * hp * 0.01 / Math.sqrt(2), Math.sqrt(ss / (N / 2)), 2e-6);
        // zero phase: the filtered residual lines up with the harmonic (correlation peak at lag 0)
        double c0 = 0, c1 = 0;
        for (int i = N / 4; i < 3 * N / 4; i++) {
            double h = Math.cos(2 * Math.PI * 3 * F * i / FS + 1.1);
            c0 += s[i] * h;
            c1 += s[i + 1] * h;
        }
        assertTrue(c0 > c1, "no lag");
    }

    /** CSV: header, one row per sample, and residual = output − fundamental when unfiltered. */
    @Test
    void csvExport_rowsMatchSamples() throws Exception {
        int n = 4800;
        double[] y = StageFixtures.drive(n, FS, F, 2, 0.1, v -> v + 0.01 * v * v);
        SineFit fit = SineFitter.fit(y, FS);
        Residual r = StageAnalyzer.residual(y, FS, fit, StageSettings.defaults());
        StringWriter w = new StringWriter();
        r.writeCsv(w, y, fit);
        String[] lines = w.toString().split("\n");
        assertEquals("time_s,output,fundamental,residual", lines[0]);
        assertEquals(n + 1, lines.length);
        String[] row = lines[101].split(",");
        assertEquals(100 / FS, Double.parseDouble(row[0]), 1e-15);
        assertEquals(y[100], Double.parseDouble(row[1]), 0);
        assertEquals(Double.parseDouble(row[1]) - Double.parseDouble(row[2]), Double.parseDouble(row[3]), 1e-12);
    }

    /** The diagnosis's residual summary is the residual's own (same figures with and without a band). */
    @Test
    void diagnosisSummary_equalsResidualSummary() {
        double[] y = StageFixtures.noisy(StageFixtures.drive(N, FS, F, 5, 0.1, v -> StageFixtures.deadZone(v, 0.05)), 1e-4, 9);
        SineFit fit = SineFitter.fit(y, FS);
        for (StageSettings s : new StageSettings[] {StageSettings.defaults(), StageSettings.defaults().withResidualBand(100, 20000)}) {
            Residual.Summary want = StageAnalyzer.residual(y, FS, fit, s).summary();
            StageDiagnosis.Measured m = (StageDiagnosis.Measured) StageAnalyzer.diagnose(y, FS, fit, s);
            assertEquals(want.rmsVolts(), m.residual().rmsVolts(), 1e-12 * want.rmsVolts());
            assertEquals(want.peakVolts(), m.residual().peakVolts(), 1e-12 * want.peakVolts());
            assertEquals(want.peakTimeSeconds(), m.residual().peakTimeSeconds(), 0);
        }
    }
}
