package org.outstage.analysis;

import java.util.Arrays;
import org.outstage.Require;

/**
 * A static transfer curve: output against input on a common grid, with the incremental gain
 * {@code dOutput/dInput} at each point. The value type shared by the capture analysis (measured curve)
 * and the stage model (predicted curve), so a fit can compare the two.
 *
 * <p>For a curve measured from one channel, {@code inputVolts} is the ideal output (the fitted
 * fundamental, in the capture's unit) and the gain is therefore near 1; with a reference channel it is
 * the aligned generator signal. For a model curve it is the stage's input drive voltage.
 *
 * @param inputVolts      strictly increasing input values
 * @param outputVolts     output at each input
 * @param incrementalGain dOutput/dInput at each input (same length)
 * @param unit            unit of both axes ("V" or "FS")
 */
public record TransferCurve(double[] inputVolts, double[] outputVolts, double[] incrementalGain, String unit) {
    public TransferCurve {
        Require.notNull("inputVolts", inputVolts);
        Require.that(inputVolts.length == outputVolts.length && inputVolts.length == incrementalGain.length,
                "transfer curve arrays differ in length: " + inputVolts.length + ", " + outputVolts.length + ", " + incrementalGain.length);
        Require.that(inputVolts.length >= 2, "a transfer curve needs at least 2 points, got " + inputVolts.length);
        for (int i = 1; i < inputVolts.length; i++)
            Require.that(inputVolts[i] > inputVolts[i - 1], "inputVolts must increase strictly (index " + i + ")");
        inputVolts = inputVolts.clone();
        outputVolts = outputVolts.clone();
        incrementalGain = incrementalGain.clone();
    }

    /** Builds a curve from input and output only, with the gain by central differences. */
    public static TransferCurve fromPoints(double[] inputVolts, double[] outputVolts, String unit) {
        int n = inputVolts.length;
        double[] g = new double[n];
        for (int i = 0; i < n; i++) {
            int lo = Math.max(0, i - 1), hi = Math.min(n - 1, i + 1);
            g[i] = (outputVolts[hi] - outputVolts[lo]) / (inputVolts[hi] - inputVolts[lo]);
        }
        return new TransferCurve(inputVolts, outputVolts, g, unit);
    }

    public int size() { return inputVolts.length; }

    @Override public double[] inputVolts() { return inputVolts.clone(); }
    @Override public double[] outputVolts() { return outputVolts.clone(); }
    @Override public double[] incrementalGain() { return incrementalGain.clone(); }

    @Override
    public boolean equals(Object o) {
        return o instanceof TransferCurve t && Arrays.equals(inputVolts, t.inputVolts) && Arrays.equals(outputVolts, t.outputVolts)
                && Arrays.equals(incrementalGain, t.incrementalGain) && unit.equals(t.unit);
    }

    @Override
    public int hashCode() { return Arrays.hashCode(inputVolts) * 31 + Arrays.hashCode(outputVolts); }

    @Override
    public String toString() { return "TransferCurve[" + inputVolts.length + " points, " + unit + "]"; }
}
