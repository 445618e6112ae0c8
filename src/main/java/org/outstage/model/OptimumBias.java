package org.outstage.model;

/**
 * The bias that makes the incremental gain flattest through crossover: it minimises
 * max |g(Vout)/g_L − 1| over |Vout| ≤ levelVolts, where g_L is the mean of the gains at Vout = ±levelVolts.
 * This is the gain criterion behind Oliver (HP Journal, Feb 1971): for an emitter follower it puts about one
 * thermal voltage across each emitter resistor. It is not a THD minimum.
 *
 * @param vqVolts            drop across each emitter resistor at the optimum
 * @param biasVolts          bias-generator voltage at the optimum
 * @param maxGainDeviation   the minimised max |g/g_L − 1| (fraction)
 * @param levelVolts         the output level of the criterion
 * @param atSearchLimit      true when the best bias is the top of the searched range (Vq = 200 mV): the gain
 *                           only flattens as bias rises, so the stage has no crossover optimum below class A
 */
public record OptimumBias(double vqVolts, double biasVolts, double maxGainDeviation, double levelVolts, boolean atSearchLimit) {}
