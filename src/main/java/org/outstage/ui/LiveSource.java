package org.outstage.ui;

import java.util.List;
import java.util.Optional;
import org.outstage.audio.AudioBackend;
import org.outstage.audio.DeviceInfo;
import org.outstage.audio.JavaSoundBackend;
import org.outstage.live.LiveListener;
import org.outstage.live.LiveResult;
import org.outstage.live.LiveSession;
import org.outstage.live.LiveSettings;

/**
 * Where the Live view's blocks come from. In the application this is a {@link LiveSession} on the sound devices
 * ({@link #soundcard()}); tests and the screenshot tool feed the view a recorded or synthetic block series through
 * the same {@link LiveListener}.
 */
interface LiveSource {
    /** The input devices to choose from; empty when there are none. */
    List<String> inputDevices();

    /** Why there is no device, in one plain line (used when {@link #inputDevices} is empty). */
    String noDeviceReason();

    /**
     * Starts capturing (and playing the settings' stimulus); blocks arrive at {@code listener} on another thread.
     *
     * @throws Exception with a one-line message when the device or format is refused
     */
    Running start(LiveSettings settings, LiveListener listener) throws Exception;

    /** A started live measurement. */
    interface Running {
        /** Stops playing and capturing; safe to call twice, from any thread. */
        void stop();

        /** Ramps the generator to a level (dBFS peak). */
        void setLevelDbfs(double levelDbfs);

        /** The last analysed block. */
        Optional<LiveResult> last();
    }

    /** The sound devices through the {@code audio} package's Java Sound backend and a {@link LiveSession}. */
    static LiveSource soundcard() { return soundcard(new JavaSoundBackend()); }

    static LiveSource soundcard(AudioBackend backend) {
        return new LiveSource() {
            @Override public List<String> inputDevices() {
                try {
                    return backend.inputs().stream().map(DeviceInfo::name).toList();
                } catch (RuntimeException e) {
                    return List.of();
                }
            }

            @Override public String noDeviceReason() {
                return "No sound device: " + backend.name() + " lists no input on this machine, so live measurement cannot start. "
                        + "Connect a soundcard (or start a sound server) and reopen the workbench.";
            }

            @Override public Running start(LiveSettings settings, LiveListener listener) throws Exception {
                LiveSession s = new LiveSession(backend, settings, listener);
                s.start();
                return new Running() {
                    @Override public void stop() { s.stop(); }
                    @Override public void setLevelDbfs(double levelDbfs) { s.setLevelDbfs(levelDbfs, true); }
                    @Override public Optional<LiveResult> last() { return s.lastResult(); }
                };
            }
        };
    }
}
