/**
 * Import: {@link org.outstage.capture.CaptureReader#open} chooses between the WAV reader
 * ({@link org.outstage.capture.WavReader}, file-backed, streaming) and the scope-CSV reader
 * ({@link org.outstage.capture.ScopeCsvReader}, in memory); {@link org.outstage.capture.CaptureOptions} carries the
 * calibration; {@link org.outstage.capture.Capture} holds channels, rate, unit and calibration; a malformed file is a
 * {@link org.outstage.capture.CaptureFormatException} naming file and place. {@link org.outstage.capture.WavWriter}
 * writes small WAV files for tests and generators. Formats and messages: docs/import.md.
 */
package org.outstage.capture;
