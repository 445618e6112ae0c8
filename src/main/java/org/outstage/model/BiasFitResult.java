package org.outstage.model;

/**
 * The bias estimated from a measured transfer curve, and what to do about it.
 *
 * @param vqVolts              estimated drop across each emitter resistor
 * @param biasVolts            the bias-generator voltage of the best-fitting model
 * @param optimumVqVolts       the model's optimum drop (see {@link OptimumBias}) at {@code levelVolts}
 * @param optimumAtSearchLimit the optimum search ended at its top (no crossover optimum below class A)
 * @param levelVolts           output level of the optimum criterion
 * @param rmsResidual          RMS of (measured − model) normalised gain over the fitted points (fraction)
 * @param gainNoise            the measured normalised gain's own noise, estimated from second differences (fraction)
 * @param residualLimit        the largest residual for which advice is given: min(0.5 %, 3 × gainNoise + 0.05 %)
 * @param adviceGiven          false when the fit is too poor to advise (or there is no optimum)
 * @param advice               one sentence for the bench
 * @param points               measured points used
 */
public record BiasFitResult(double vqVolts, double biasVolts, double optimumVqVolts, boolean optimumAtSearchLimit, double levelVolts,
                            double rmsResidual, double gainNoise, double residualLimit, boolean adviceGiven, String advice, int points) {}
