package org.outstage.analysis.stage;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Graphics2D;
import java.awt.RenderingHints;
import java.awt.geom.Ellipse2D;
import java.awt.geom.Line2D;
import java.awt.image.BufferedImage;
import java.io.File;
import java.io.IOException;
import java.util.Locale;
import javax.imageio.ImageIO;

/**
 * Runner (not a test; surefire skips *Tool): the bias ladder of {@link MeasurementTruthTest} at −120 dBFS noise,
 * printed as a table and drawn as docs/crossover-truth.png: |error| of gain_at_zero against the truth (implicit
 * differentiation, {@link PushPullTruth}) and the stated 3σ, per rate and level, against the quiescent voltage.
 *
 * <p>Run: {@code mvn -B -q -o test-compile} then
 * {@code java -cp target/classes:target/test-classes:$(cat cp.txt) org.outstage.analysis.stage.CrossoverTruthPlotTool docs/crossover-truth.png}
 * (cp.txt from {@code mvn dependency:build-classpath -Dmdep.outputFile=cp.txt}). Deterministic (seeded noise).
 */
public final class CrossoverTruthPlotTool {
    private CrossoverTruthPlotTool() {}

    public static void main(String[] args) throws IOException {
        double[] vq = MeasurementTruthTest.VQ;
        double[] rates = MeasurementTruthTest.RATES, levels = MeasurementTruthTest.LEVELS;
        int series = rates.length * levels.length;
        double[][] err = new double[series][vq.length], se = new double[series][vq.length];
        String[] names = new String[series];
        long seed = 5000;
        double worst = 0;
        System.out.println("| rate | output peak | Vq (mV) | truth | gain_at_zero | error | stated σ | noise σ | resolution bias | window (V) |");
        System.out.println("| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |");
        for (int r = 0; r < rates.length; r++)
            for (int l = 0; l < levels.length; l++) {
                int s = r * levels.length + l;
                names[s] = String.format(Locale.ROOT, "%.0f kHz, %.0f %% of full scale", rates[r] / 1000, 100 * levels[l]);
                for (int k = 0; k < vq.length; k++) {
                    StageFixtures.Pair p = PushPullTruth.biasedAt(vq[k]);
                    double a = MeasurementTruthTest.drive(levels[l]);
                    double[] y = StageFixtures.quantise(StageFixtures.noisy(MeasurementTruthTest.clean(rates[r], levels[l], vq[k]),
                            MeasurementTruthTest.FULL_SCALE * 1e-6, seed++), MeasurementTruthTest.FULL_SCALE, 24);
                    CrossoverMetrics c = MeasurementTruthTest.crossover(y, rates[r]);
                    double truth = PushPullTruth.gainAtZero(p, a);
                    err[s][k] = Math.abs(c.gainAtZero() - truth);
                    se[s][k] = c.gainAtZeroStdError();
                    worst = Math.max(worst, err[s][k]);
                    System.out.printf(Locale.ROOT, "| %.0f kHz | %.0f %% | %s | %.5f | %.5f | %+.1e | %.1e | %.1e | %.1e | %.3f |%n",
                            rates[r] / 1000, 100 * levels[l], fmt(vq[k] * 1e3), truth, c.gainAtZero(), c.gainAtZero() - truth,
                            se[s][k], c.resolution().noiseStdError(), c.resolution().resolutionBias(),
                            c.resolution().windowHalfWidthVolts());
                }
            }
        System.out.printf(Locale.ROOT, "worst |error| %.2e over %d captures%n", worst, series * vq.length);
        if (args.length > 0) draw(new File(args[0]), vq, names, err, se);
    }

    private static String fmt(double v) { return v == Math.rint(v) ? String.valueOf((long) v) : String.valueOf(v); }

    private static void draw(File file, double[] vq, String[] names, double[][] err, double[][] se) throws IOException {
        int w = 960, h = 560, left = 90, right = 260, top = 50, bottom = 70;
        BufferedImage img = new BufferedImage(w, h, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = img.createGraphics();
        g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
        g.setRenderingHint(RenderingHints.KEY_TEXT_ANTIALIASING, RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
        g.setColor(Color.WHITE);
        g.fillRect(0, 0, w, h);
        double yMin = -7, yMax = -1; // log10
        int pw = w - left - right, ph = h - top - bottom;
        java.util.function.IntToDoubleFunction px = k -> left + pw * (k + 0.5) / vq.length;
        java.util.function.DoubleUnaryOperator py = v -> {
            double lv = Math.log10(Math.max(v, Math.pow(10, yMin)));
            return top + ph * (yMax - lv) / (yMax - yMin);
        };
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 13));
        g.setColor(new Color(225, 225, 225));
        for (int d = (int) yMin; d <= yMax; d++) {
            double y = py.applyAsDouble(Math.pow(10, d));
            g.draw(new Line2D.Double(left, y, left + pw, y));
        }
        g.setColor(Color.DARK_GRAY);
        g.drawRect(left, top, pw, ph);
        for (int d = (int) yMin; d <= yMax; d++) {
            double y = py.applyAsDouble(Math.pow(10, d));
            g.drawString("1e" + d, left - 40, (float) y + 5);
        }
        for (int k = 0; k < vq.length; k++) {
            String t = fmt(vq[k] * 1e3);
            g.drawString(t, (float) px.applyAsDouble(k) - g.getFontMetrics().stringWidth(t) / 2f, top + ph + 20);
        }
        g.drawString("quiescent voltage per emitter resistor Vq = Iq·Re (mV); 0 = class B, 26 = Oliver's condition",
                left, top + ph + 45);
        g.setFont(new Font(Font.SANS_SERIF, Font.BOLD, 15));
        g.drawString("gain_at_zero against the exact pair: |error| (dots) and stated 3σ (lines)", left, 30);
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 13));
        // target
        g.setColor(new Color(180, 0, 0));
        g.setStroke(new BasicStroke(1.2f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 10, new float[] {6, 4}, 0));
        double yt = py.applyAsDouble(0.02);
        g.draw(new Line2D.Double(left, yt, left + pw, yt));
        g.drawString("target: error 0.02", left + 8, (float) yt - 6);
        Color[] col = {new Color(0, 90, 181), new Color(220, 120, 0), new Color(0, 150, 110), new Color(150, 60, 170)};
        for (int s = 0; s < names.length; s++) {
            g.setColor(col[s % col.length]);
            double dx = (s - (names.length - 1) / 2.0) * 7;
            g.setStroke(new BasicStroke(2f));
            for (int k = 0; k < vq.length; k++) {
                double x = px.applyAsDouble(k) + dx;
                g.draw(new Line2D.Double(x, py.applyAsDouble(3 * se[s][k]), x, py.applyAsDouble(Math.pow(10, yMin))));
                double y = py.applyAsDouble(err[s][k]);
                g.fill(new Ellipse2D.Double(x - 3.5, y - 3.5, 7, 7));
            }
            int ly = top + 40 + 22 * s;
            g.fill(new Ellipse2D.Double(left + pw + 12, ly - 8, 8, 8));
            g.drawString(names[s], left + pw + 26, ly);
        }
        g.setColor(Color.DARK_GRAY);
        int ly = top + 40 + 22 * names.length + 10;
        g.drawString("0.5 s of 997 Hz, 24 bits over ±40 V,", left + pw + 12, ly);
        g.drawString("noise 120 dB below full scale;", left + pw + 12, ly + 18);
        g.drawString("a dot below its line is covered", left + pw + 12, ly + 36);
        g.drawString("(dots below 1e-7 drawn at 1e-7)", left + pw + 12, ly + 54);
        g.dispose();
        ImageIO.write(img, "png", file);
    }
}
