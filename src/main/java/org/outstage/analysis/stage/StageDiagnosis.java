package org.outstage.analysis.stage;

import java.util.Optional;

/** Outcome of {@link StageAnalyzer#diagnose}: either the figures, or the reason they were not measured. */
public sealed interface StageDiagnosis permits StageDiagnosis.Measured, StageDiagnosis.NotMeasured {

    /**
     * The output-stage figures.
     *
     * @param residual  residual figures (no waveform; {@link StageAnalyzer#residual} gives the waveform)
     * @param transfer  measured transfer curve
     * @param crossover crossover / gm-doubling metrics and bias verdict
     * @param clipping  clipping metrics
     * @param reference alignment to the reference channel, when one was given
     */
    record Measured(Residual.Summary residual, MeasuredTransfer transfer, CrossoverMetrics crossover,
                    ClippingMetrics clipping, Optional<ReferenceAlignment> reference) implements StageDiagnosis {}

    /** @param reason one sentence saying why there are no figures */
    record NotMeasured(String reason) implements StageDiagnosis {}
}
