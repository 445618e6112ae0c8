package org.outstage.analysis.stage;

import org.outstage.analysis.TransferCurve;

/**
 * A transfer curve measured from a capture by binning: the measured samples are grouped by the value of
 * the ideal output (the fitted fundamental, or the aligned, gain-scaled reference channel) and averaged
 * over all cycles, which removes the noise; the incremental gain is the slope of a weighted local quadratic
 * fit over neighbouring bins (Savitzky &amp; Golay, Anal. Chem. 36 (1964) 1627, generalised to uneven points
 * and weights 1/se²), with its standard error propagated from the bin standard errors.
 *
 * <p>Only bins with at least 3 samples are kept. The per-bin standard error is that of the mean after
 * removing the straight-line trend inside the bin, so the slope across the bin is not mistaken for noise.
 *
 * @param curve               ideal (bin mean) → measured mean, with the smoothed incremental gain
 * @param counts              samples per kept bin
 * @param stdErrorVolts       standard error of each bin mean
 * @param deviationVolts      measured mean minus the best straight line (count-weighted, unclipped range)
 * @param normalisedGain      incremental gain / large-signal gain
 * @param normalisedGainStdError standard error of {@code normalisedGain}
 * @param peakVolts           peak of the ideal output (bins span ±peak)
 * @param lineSlope           slope of the best straight line
 * @param lineOffsetVolts     offset of the best straight line
 * @param largeSignalGain     mean incremental gain over the outer swing (see {@link CrossoverMetrics})
 * @param noiseRmsVolts       median per-bin scatter of single samples about the curve (rising and falling apart)
 * @param hysteresis          rising against falling comparison
 * @param fromReference       true for an X-Y curve against a reference channel
 */
public record MeasuredTransfer(TransferCurve curve, int[] counts, double[] stdErrorVolts, double[] deviationVolts,
                               double[] normalisedGain, double[] normalisedGainStdError, double peakVolts,
                               double lineSlope, double lineOffsetVolts, double largeSignalGain, double noiseRmsVolts,
                               Hysteresis hysteresis, boolean fromReference) {
    public MeasuredTransfer {
        counts = counts.clone();
        stdErrorVolts = stdErrorVolts.clone();
        deviationVolts = deviationVolts.clone();
        normalisedGain = normalisedGain.clone();
        normalisedGainStdError = normalisedGainStdError.clone();
    }

    @Override public int[] counts() { return counts.clone(); }
    @Override public double[] stdErrorVolts() { return stdErrorVolts.clone(); }
    @Override public double[] deviationVolts() { return deviationVolts.clone(); }
    @Override public double[] normalisedGain() { return normalisedGain.clone(); }
    @Override public double[] normalisedGainStdError() { return normalisedGainStdError.clone(); }

    /** Number of kept bins. */
    public int size() { return counts.length; }

    @Override
    public String toString() {
        return "MeasuredTransfer[" + counts.length + " bins, peak " + peakVolts + ", hysteresis " + hysteresis.detected() + "]";
    }
}
