package org.outstage.audio;

/**
 * Closes a sound line without letting the close hang its caller. A Java Sound line on a sound server can block in
 * {@code close()} while another thread is still inside {@code drain()} or {@code read()} (seen on a heavily loaded
 * machine through PulseAudio's ALSA plugin); a Ctrl-C must still finish the recording's header and end the process.
 * The close runs on a daemon thread; the caller waits at most the given time and goes on. If the close never
 * returns, the daemon thread does not keep the JVM alive, and the operating system closes the device at exit.
 */
final class BoundedClose {
    private BoundedClose() {}

    /** Runs {@code close} on a daemon thread and waits for it at most {@code millis}; true if it returned in time. */
    static boolean run(Runnable close, long millis, String what) {
        Thread t = new Thread(close, "outstage-close-" + what);
        t.setDaemon(true);
        t.start();
        try {
            t.join(millis);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        return !t.isAlive();
    }
}
