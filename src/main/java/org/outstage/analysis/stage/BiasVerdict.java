package org.outstage.analysis.stage;

/** Reading of the crossover region; thresholds in {@link CrossoverMetrics} and docs/diagnosis.md. */
public enum BiasVerdict {
    /** Gain dips at zero output (crossover notch): more quiescent current. */
    UNDERBIASED("underbiased"),
    /** Gain at zero within the near-optimal band around the large-signal gain. */
    NEAR_OPTIMAL("near-optimal"),
    /** Gain rises at zero output (gm-doubling): less quiescent current. */
    OVERBIASED("overbiased"),
    /** Noise, hysteresis or clipping blur the curve: no verdict rather than a guess. */
    UNCLEAR("unclear");

    private final String label;

    BiasVerdict(String label) { this.label = label; }

    /** The word used in reports and JSON. */
    public String label() { return label; }
}
