package org.outstage.logbook;

import java.util.Objects;
import org.outstage.Require;

/** A capture file as the logbook knows it: its SHA-256 (lower-case hex), the name it had, its size. */
public record CaptureRef(String sha256, String fileName, long sizeBytes) {
    public CaptureRef {
        Objects.requireNonNull(sha256, "sha256");
        Require.that(sha256.matches("[0-9a-f]{64}"), "sha256='" + sha256 + "' must be 64 lower-case hex digits");
        Objects.requireNonNull(fileName, "fileName");
        Require.that(sizeBytes >= 0, "sizeBytes=" + sizeBytes + " must be >= 0");
    }
}
