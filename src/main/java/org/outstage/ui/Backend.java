package org.outstage.ui;

import java.nio.file.Path;
import java.util.function.BooleanSupplier;
import java.util.function.DoubleConsumer;
import org.outstage.capture.Capture;

/**
 * What the workbench asks of the rest of the program: open a file, and analyse one channel into what
 * the views show. Implementations call the capture readers and the analysis pipeline; the workbench
 * calls them off the FX thread.
 */
interface Backend {
    /** Opens a capture file with the given calibration; the exception message is shown beside the file. */
    Capture open(Path file, Calibration calibration) throws Exception;

    /**
     * Analyses channel {@code channel} (0-based).
     *
     * @param progress  receives a fraction 0..1
     * @param cancelled polled between steps; when true the method may return early with anything
     */
    ViewData analyze(Capture capture, int channel, Calibration calibration, UiSettings settings,
                     DoubleConsumer progress, BooleanSupplier cancelled);
}
