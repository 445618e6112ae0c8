package org.outstage.ui;

import java.nio.file.Path;
import java.util.Optional;
import java.util.OptionalInt;
import org.outstage.capture.Capture;

/** One line of the capture list. Touched on the FX thread only. */
final class CaptureEntry {
    final String name;
    final Optional<Path> path;
    Capture capture;            // null until opened, or when opening failed
    String error = "";          // reader's message when opening failed
    Calibration calibration = Calibration.NONE;
    int channel;               // 0-based channel analysed (the output)
    OptionalInt reference = OptionalInt.empty();   // 0-based channel carrying the generator, from the notes or the box
    Optional<String> series = Optional.empty();    // level series named in the calibration notes
    String notes = "";          // where the calibration came from (the notes' file and rule), shown under the calibration
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
