package org.outstage.model;

/**
 * The bias estimated from a measured transfer curve, and what to do about it.
 *
 * @param vqVolts              estimated drop across each emitter resistor
 * @param biasVolts            the bias-generator voltage of the best-fitting model
 * @param optimumVqVolts       the optimum: the Vq at which the model's crossover ratio is 1 (gain at zero equal to the
 *                             large-current gain, Oliver 1971; {@link org.outstage.analysis.stage.BiasCriterion}); NaN
 *                             when the ratio never reaches 1 in the searched range
 * @param optimumAtSearchLimit true when there is no such optimum between Vq 0.1 mV and 200 mV
 * @param levelVolts           output level of the flattest-gain criterion
 * @param rmsResidual          RMS of (measured − model) normalised gain over the fitted points (fraction)
 * @param gainNoise            the measured normalised gain's own noise, estimated from second differences (fraction)
 * @param residualLimit        the largest residual for which advice is given: min(0.5 %, 3 × gainNoise + 0.05 %)
 * @param adviceGiven          false when the fit is too poor to advise (or there is no optimum)
 * @param advice               one sentence for the bench
 * @param points               measured points used
 * @param bandLowVqVolts       low end of the near-optimal band (crossover ratio 1 − 0.3 %), as Vq; NaN without an optimum
 * @param bandHighVqVolts      high end of the near-optimal band (crossover ratio 1 + 0.3 %), as Vq; NaN without an optimum
 * @param crossoverRatio       the fitted model's crossover ratio at the measured peak (what the verdict reads)
 * @param flattestGainVqVolts  another criterion, not the advice: the model's flattest gain over |Vout| ≤ levelVolts
 *                             ({@link OptimumBias})
 * @param flattestGainAtSearchLimit the flattest-gain search ended at its top
 * @param bandHarmonics        harmonics of the fundamental the model's curve was limited to, as the capture was
 *                             (docs/model.md §6); 0 when it was not band-limited (no band, or a band too wide to matter)
 * @param crossoverRatioInBand the fitted model's crossover ratio read from its band-limited curve (what the analysis reads
 *                             on the capture); NaN when the curve was not band-limited
 */
public record BiasFitResult(double vqVolts, double biasVolts, double optimumVqVolts, boolean optimumAtSearchLimit, double levelVolts,
                            double rmsResidual, double gainNoise, double residualLimit, boolean adviceGiven, String advice, int points,
                            double bandLowVqVolts, double bandHighVqVolts, double crossoverRatio, double flattestGainVqVolts,
                            boolean flattestGainAtSearchLimit, int bandHarmonics, double crossoverRatioInBand) {}
