/**
 * Test signals, described and generated: pure code (JDK only; no audio, no files, no UI).
 * {@link org.outstage.stimulus.Stimulus} is the closed family of signals ({@code sine:F}, {@code twin:F1,F2},
 * {@code smpte:F1,F2}, {@code sweep:F1-F2}, {@code burst:F,ON,OFF}, {@code silence}) with its parser;
 * {@link org.outstage.stimulus.Generator} streams the samples of one signal at a level in dBFS peak, with level
 * ramps; {@link org.outstage.stimulus.Dither} adds TPDF dither at an output word length;
 * {@link org.outstage.stimulus.SweepParameters} carries what an analysis needs to build the inverse filter of an
 * exponential sweep. The same code feeds live playback ({@code audio}), stimulus files ({@code tone}) and analyses
 * that need to know the stimulus. See docs/live.md.
 */
package org.outstage.stimulus;
