package org.outstage.analysis.stage;

/**
 * Comparison of the rising and falling halves of the measured transfer curve (bins where the ideal
 * output rises against bins where it falls). A static (memoryless) stage gives the same curve both
 * ways; a difference beyond the bin noise means memory (thermal, charge storage, a band limit) and the
 * curve must not be read as static.
 *
 * <p>Test: χ² = Σ (ȳ_rise − ȳ_fall)² / (se_rise² + se_fall²) over the k bins holding both halves; under
 * "no memory" χ² has k degrees of freedom, so z = (χ² − k)/√(2k) is about standard normal (Wilson–Hilferty
 * would be finer; the normal approximation is enough at k ≥ 50). Detected when z &gt; 5 <em>and</em> the RMS
 * difference exceeds 1e-4 of the peak (a practical floor chosen here, so that a statistically visible but
 * negligible difference on a very quiet capture does not block the bias verdict).
 *
 * @param detected            whether memory was found by the rule above
 * @param binsCompared        k, bins holding both halves with at least 3 samples each
 * @param chiSquarePerBin     χ²/k (about 1 without memory)
 * @param rmsDifferenceVolts  RMS over bins of ȳ_rise − ȳ_fall
 * @param maxDifferenceVolts  largest |ȳ_rise − ȳ_fall|
 * @param maxDifferenceAtVolts ideal output where the largest difference occurs
 */
public record Hysteresis(boolean detected, int binsCompared, double chiSquarePerBin, double rmsDifferenceVolts,
                         double maxDifferenceVolts, double maxDifferenceAtVolts) {}
