package org.outstage.model;

import java.util.Map;

/**
 * The solver could not find an operating point after all its fallbacks. Carries the input value it was
 * aiming at and the last operating point it did find (node voltages by node name; empty if none).
 */
public final class SolverFailureException extends RuntimeException {
    private final double inputVolts;
    private final double lastGoodInputVolts;
    private final Map<String, Double> lastGoodNodeVolts;

    public SolverFailureException(String message, double inputVolts, double lastGoodInputVolts, Map<String, Double> lastGoodNodeVolts) {
        super(message);
        this.inputVolts = inputVolts;
        this.lastGoodInputVolts = lastGoodInputVolts;
        this.lastGoodNodeVolts = Map.copyOf(lastGoodNodeVolts);
    }

    public double inputVolts() { return inputVolts; }
    public double lastGoodInputVolts() { return lastGoodInputVolts; }
    public Map<String, Double> lastGoodNodeVolts() { return lastGoodNodeVolts; }
}
