package org.outstage.live;

/** Receives a {@link LiveSession}'s events on the session's analysis thread (a UI hands them to its own thread). */
public interface LiveListener {
    /** The figures of one block. */
    void onBlock(LiveResult result);

    /** Devices are open and the first input read returned; the stimulus (if any) starts now. */
    default void onStarted(String inputDevice, String outputDevice, double firstReadSeconds) {}

    /** The session stopped on a failure (device lost, disk full); one line. */
    default void onFailure(String message) {}
}
