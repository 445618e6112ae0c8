/** Import: WAV and scope-CSV readers, {@link org.outstage.capture.Capture} (channels, rate, unit, calibration), and located format errors. */
package org.outstage.capture;
