package org.outstage.analysis.stage;

import org.outstage.analysis.SineFit;
import org.outstage.analysis.SineFitter;

/** Exploration runner (not a test): errors over the bias ladder. */
public class GainAtZeroLadderRun {
    public static void main(String[] args) {
        double[] vqs = {0, 0.5e-3, 1e-3, 2e-3, 5e-3, 10e-3, 26e-3, 50e-3, 100e-3, 150e-3};
        double fs0 = 40;
        for (double fs : new double[] {48000, 96000})
            for (double level : new double[] {0.1, 0.9})
                for (double vq : vqs) {
                    long t0 = System.nanoTime();
                    StageFixtures.Pair p = PushPullTruth.biasedAt(vq);
                    double a = level * fs0 * (8.22 / 8);
                    int n = (int) (0.5 * fs);
                    double[] y = PushPullTruth.drive(p, n, fs, 997, a, 0.3);
                    y = StageFixtures.quantise(StageFixtures.noisy(y, fs0 * 1e-6, 5), fs0, 24);
                    long t1 = System.nanoTime();
                    SineFit fit = SineFitter.fit(y, fs);
                    StageDiagnosis d = StageAnalyzer.diagnose(y, fs, fit, StageSettings.defaults());
                    long t2 = System.nanoTime();
                    CrossoverMetrics c = ((StageDiagnosis.Measured) d).crossover();
                    double truth = PushPullTruth.gainAtZero(p, a);
                    double vtruth = Double.isNaN(c.asymptoticGain()) ? truth : PushPullTruth.asymptoticRatio(p, a);
                    double nw = PushPullTruth.notchWidth(p, a, 0.01);
                    System.out.printf("notch width truth %.4f got %.4f ± %.4f (bin %.4f) depth %.4f  ", nw, c.notchWidthVolts(), c.resolution().notchWidthStdErrorVolts(), 2 * a / 256, c.notchDepthVolts());
                    System.out.printf("fs %5.0f lvl %.1f Vq %6.1f mV truth %.5f got %.5f err %+.5f se %.5f (noise %.1e bias %.1e h %.2e) | vr truth %.5f got %.5f err %+.5f se %.5f  %s gen %d ms an %d ms%n",
                            fs, level, vq * 1e3, truth, c.gainAtZero(), c.gainAtZero() - truth, c.gainAtZeroStdError(),
                            c.resolution().noiseStdError(), c.resolution().resolutionBias(), c.resolution().windowHalfWidthVolts(),
                            vtruth, c.verdictRatio(), c.verdictRatio() - vtruth, c.verdictRatioStdError(), c.verdict().label(),
                            (t1 - t0) / 1000000, (t2 - t1) / 1000000);
                }
    }
}
