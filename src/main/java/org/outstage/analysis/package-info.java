/**
 * Measurement: windows, spectrum, sine fitting, harmonics, THD and THD+N with band and weighting, floor,
 * output power; the pipeline {@link org.outstage.analysis.Analyzer} and its result
 * {@link org.outstage.analysis.Measurement}; and the transfer-curve value type shared with the model.
 * Pure and thread-safe. Methods, sources and conventions: docs/methods.md.
 */
package org.outstage.analysis;
