package org.outstage.model;

/**
 * The output levels where the stage clips (the output no longer follows the input).
 *
 * @param positiveVolts  highest output, volts
 * @param negativeVolts  lowest output, volts (negative)
 */
public record ClipLevels(double positiveVolts, double negativeVolts) {}
