/**
 * Reading the output stage from a capture: residual, measured transfer curve (single channel or against a
 * reference channel), crossover and gm-doubling metrics with a bias verdict, clipping, usable-sine checks
 * and the distortion-limited output power of a level series. Entry point {@link org.outstage.analysis.stage.StageAnalyzer};
 * methods and thresholds are derived in {@code docs/diagnosis.md}. Pure and thread-safe.
 */
package org.outstage.analysis.stage;
