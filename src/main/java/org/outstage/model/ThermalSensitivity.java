package org.outstage.model;

/**
 * Thermal sensitivity of the quiescent current (common practice: a base-emitter junction's voltage at constant
 * current falls about 2 mV/°C). Heating every junction of the bias loop by ΔT acts like raising the bias
 * voltage by 2 mV/°C per junction; a bias generator that tracks k of those junctions (its sensor at their
 * temperature) takes 2 mV/°C per tracked junction back:
 * dIq/dT = (dIq/dVbias) · 2 mV/°C · (junctionsInLoop − trackedJunctions).
 *
 * @param junctionsInLoop          base-emitter junctions the bias voltage spans
 * @param trackedJunctions         junctions the bias generator tracks
 * @param quiescentAmps            quiescent current through each emitter resistor
 * @param ampsPerBiasVolt          dIq/dVbias at the quiescent point (from the Jacobian)
 * @param untrackedAmpsPerKelvin   dIq/dT with a fixed bias voltage
 * @param trackedAmpsPerKelvin     dIq/dT with the tracking bias generator
 */
public record ThermalSensitivity(int junctionsInLoop, int trackedJunctions, double quiescentAmps, double ampsPerBiasVolt,
                                 double untrackedAmpsPerKelvin, double trackedAmpsPerKelvin) {
    /** Junction tempco used, volts per kelvin (common practice, about −2 mV/°C). */
    public static final double JUNCTION_TEMPCO_VOLTS_PER_KELVIN = -2e-3;
}
