package org.outstage.logbook;

/**
 * What {@link Logbook#pushTo} copied: sessions new to the target, sessions already there that gained rows (or
 * their end), steps, measurements outside steps, captures stored, and captures the source did not have (their
 * rows were still copied; the bytes were missing from the local folder).
 */
public record PushResult(int sessions, int sessionsAdded, int sessionsUpdated, int stepsAdded, int measurementsAdded,
                         int capturesAdded, int capturesMissing) {}
