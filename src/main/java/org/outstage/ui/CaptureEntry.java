package org.outstage.ui;

import java.nio.file.Path;
import java.util.Optional;
import org.outstage.capture.Capture;

/** One line of the capture list. Touched on the FX thread only. */
final class CaptureEntry {
    final String name;
    final Optional<Path> path;
    Capture capture;            // null until opened, or when opening failed
    String error = "";          // reader's message when opening failed
    Calibration calibration = Calibration.NONE;
    int channel;
    ViewData data;              // last analysis shown, or null

    CaptureEntry(String name, Optional<Path> path) {
        this.name = name;
        this.path = path;
    }

    boolean failed() { return !error.isEmpty(); }

    @Override
    public String toString() {
        return failed() ? name + "  —  " + error : name;
    }
}
