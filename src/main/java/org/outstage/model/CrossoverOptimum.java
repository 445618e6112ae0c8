package org.outstage.model;

/**
 * The project's one optimum bias (crossover ratio 1: gain at zero equal to the large-current gain, Oliver 1971;
 * {@link org.outstage.analysis.stage.BiasCriterion}) and its near-optimal band (ratio 1 ± 0.3 %), as Vq, for a stage
 * whose output swings to ±{@code peakVolts} (the ratio is read there as the analysis reads a capture).
 *
 * @param vqVolts         Vq at which the ratio is 1
 * @param bandLowVqVolts  Vq at which the ratio is 1 − 0.3 %
 * @param bandHighVqVolts Vq at which the ratio is 1 + 0.3 %
 * @param peakVolts       output peak of the reading
 */
public record CrossoverOptimum(double vqVolts, double bandLowVqVolts, double bandHighVqVolts, double peakVolts) {}
