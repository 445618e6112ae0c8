package org.outstage.analysis.stage;

import org.outstage.Require;

/**
 * Settings of the output-stage diagnosis. Every threshold is documented (with its derivation) in
 * {@code docs/diagnosis.md} and in {@link StageAnalyzer}.
 *
 * @param binCount               bins of the ideal output over ±peak for the transfer curve (common practice: 200–400)
 * @param smoothingHalfWidthBins half width, in bins, of the local quadratic (Savitzky–Golay type) fit for the gain
 * @param residualHighPassHz     zero-phase high-pass corner for the residual (0 = off), removes hum
 * @param residualLowPassHz      zero-phase low-pass corner for the residual (0 = off), the band edge
 * @param nearZeroFraction       |ideal| below this fraction of peak counts as "near the zero crossing" (0.1)
 * @param notchGainTolerance     normalised gain deviation that marks the notch width (0.01 = 1 %)
 * @param nearOptimalBand        half width of the near-optimal band of gain_at_zero around 1 (0.003 = ±0.3 %)
 * @param verdictSigmas          coverage factor: the band gain_at_zero ± k·σ must not straddle a threshold (2)
 * @param unit                   unit label of the samples for the transfer curve ("V" or "FS")
 */
public record StageSettings(int binCount, int smoothingHalfWidthBins, double residualHighPassHz, double residualLowPassHz,
                            double nearZeroFraction, double notchGainTolerance, double nearOptimalBand, double verdictSigmas,
                            String unit) {
    public StageSettings {
        Require.atLeast("binCount", binCount, 20);
        Require.atLeast("smoothingHalfWidthBins", smoothingHalfWidthBins, 1);
        Require.that(2 * smoothingHalfWidthBins + 1 <= binCount / 4,
                "smoothingHalfWidthBins=" + smoothingHalfWidthBins + " must be <= binCount/8 (binCount=" + binCount + ")");
        Require.nonNegative("residualHighPassHz", residualHighPassHz);
        Require.nonNegative("residualLowPassHz", residualLowPassHz);
        Require.that(residualLowPassHz == 0 || residualHighPassHz < residualLowPassHz,
                "residualHighPassHz=" + residualHighPassHz + " must be below residualLowPassHz=" + residualLowPassHz);
        Require.inRange("nearZeroFraction", nearZeroFraction, 0.01, 0.5);
        Require.inRange("notchGainTolerance", notchGainTolerance, 1e-4, 0.5);
        Require.inRange("nearOptimalBand", nearOptimalBand, 1e-5, 0.1);
        Require.inRange("verdictSigmas", verdictSigmas, 0, 10);
        Require.notNull("unit", unit);
    }

    /** 256 bins, ±4-bin smoothing, residual unfiltered, ±10 % near zero, 1 % notch, ±0.3 % near-optimal band, 2σ, volts. */
    public static StageSettings defaults() {
        return new StageSettings(256, 4, 0, 0, 0.10, 0.01, BiasCriterion.BAND, BiasCriterion.COVERAGE, "V");
    }

    /** Copy with another unit label ("V" or "FS"). */
    public StageSettings withUnit(String unitLabel) {
        return new StageSettings(binCount, smoothingHalfWidthBins, residualHighPassHz, residualLowPassHz, nearZeroFraction,
                notchGainTolerance, nearOptimalBand, verdictSigmas, unitLabel);
    }

    /** Copy with another near-optimal band and coverage factor. */
    public StageSettings withVerdictBand(double band, double sigmas) {
        return new StageSettings(binCount, smoothingHalfWidthBins, residualHighPassHz, residualLowPassHz, nearZeroFraction,
                notchGainTolerance, band, sigmas, unit);
    }

    /** Copy with a residual band (zero-phase high-pass and low-pass corners; 0 switches a side off). */
    public StageSettings withResidualBand(double highPassHz, double lowPassHz) {
        return new StageSettings(binCount, smoothingHalfWidthBins, highPassHz, lowPassHz, nearZeroFraction,
                notchGainTolerance, nearOptimalBand, verdictSigmas, unit);
    }

    /** Copy with another bin count and smoothing half width. */
    public StageSettings withBins(int bins, int halfWidth) {
        return new StageSettings(bins, halfWidth, residualHighPassHz, residualLowPassHz, nearZeroFraction,
                notchGainTolerance, nearOptimalBand, verdictSigmas, unit);
    }
}
