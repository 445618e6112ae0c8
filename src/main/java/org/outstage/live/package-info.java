/**
 * The rolling live measurement, shared by the command line ({@code live}, {@code session add --live}) and the
 * workbench: {@link org.outstage.live.LiveSession} opens the input (and the output when a stimulus is played),
 * cuts the input into blocks, puts every block through the same {@link org.outstage.analysis.Analyzer} as
 * {@code analyze}, and hands each result ({@link org.outstage.live.LiveResult}) to a
 * {@link org.outstage.live.LiveListener}; it changes the generator level with a ramp and keeps the last block for
 * logging a step. {@link org.outstage.live.MeterCalibration} derives full-scale volts from a meter reading;
 * {@link org.outstage.live.UserSettings} remembers it (and the dismissal of {@link org.outstage.live.LiveCautions}) in
 * a small properties file. No JavaFX, no picocli. Imports: audio, stimulus, capture, analysis, JDK.
 */
package org.outstage.live;
