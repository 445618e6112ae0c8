package org.outstage.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.TimeUnit;
import org.outstage.audio.AudioUnavailableException;
import org.outstage.live.LiveListener;
import org.outstage.live.LiveResult;
import org.outstage.live.LiveSession;
import org.outstage.live.LiveSettings;
import org.outstage.live.UserSettings;

/** Captures a fixed time from the soundcard into a temporary WAV file for {@code session add --live}. */
final class LiveCapture {
    private LiveCapture() {}

    /**
     * Records {@code seconds} of input (playing the options' stimulus) to a new temporary WAV file and returns it.
     * When no --fs-volts is given, a remembered calibration of the input is put into {@code analyze}.
     */
    static Path capture(LiveOptions live, AnalyzeOptions analyze, double seconds, PrintWriter err) {
        if (!(seconds > 0 && seconds <= 600)) throw new BadInputException("--live: " + seconds + " s must be between 0 and 600");
        UserSettings user = LiveCommand.userSettings.get();
        LiveSettings s = live.settings(analyze, user);
        if (analyze.fsVolts == null && s.fullScaleVolts().isPresent()) analyze.fsVolts = s.fullScaleVolts().getAsDouble();
        Path file;
        try {
            file = Files.createTempFile("outstage-live-", ".wav");
        } catch (IOException e) {
            throw new BadInputException("cannot create a temporary file for the live capture: " + e.getMessage());
        }
        s = s.withBlocks(seconds, seconds).withRecordFile(Optional.of(file)).withFullScaleVolts(OptionalDouble.empty());
        LiveOptions.cautionsOnce(user, err);
        String[] failure = new String[1];
        LiveSession session = new LiveSession(LiveCommand.backend.get(), s, new LiveListener() {
            @Override public void onBlock(LiveResult r) {}
            @Override public void onFailure(String message) { failure[0] = message; }
        });
        session.stopAfter(seconds);
        try {
            session.start();
            if (!session.awaitEnd((long) (seconds * 1000) + 15_000, TimeUnit.MILLISECONDS)) {
                session.stop();
                throw new IllegalStateException("the live capture did not end");
            }
        } catch (AudioUnavailableException e) {
            delete(file);
            throw new BadInputException(e.getMessage());
        } catch (IOException e) {
            delete(file);
            throw new BadInputException("live capture: " + e.getMessage());
        } catch (InterruptedException e) {
            session.stop();
            delete(file);
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted");
        }
        if (failure[0] != null) {
            delete(file);
            throw new IllegalStateException(failure[0]);
        }
        if (session.droppedFrames() > 0)
            err.println("outstage: warning: " + session.droppedFrames() + " input frames were lost during the live capture (zeros stand in for them)");
        return file;
    }

    private static void delete(Path f) {
        try {
            Files.deleteIfExists(f);
        } catch (IOException e) {
            // temporary file; nothing else to do
        }
    }
}
