/** Measurement: windows, spectrum, sine fit, harmonics, THD and THD+N, residual, transfer curve, crossover and clipping, level sweep. Pure and thread-safe. */
package org.outstage.analysis;
