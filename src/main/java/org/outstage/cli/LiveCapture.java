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
        // SECONDS in whole blocks of at most 1 s: the record ends on SECONDS exactly, and rounding a lead-in up adds less than a block
        double block = seconds / Math.ceil(seconds);
        s = s.withBlocks(block, block).withRecordFile(Optional.of(file)).withFullScaleVolts(OptionalDouble.empty());
        LiveOptions.cautionsOnce(user, err);
        String[] failure = new String[1];
        LiveSession session = new LiveSession(LiveCommand.backend.get(), s, new LiveListener() {
            @Override public void onBlock(LiveResult r) {}
            @Override public void onFailure(String message) { failure[0] = message; }
        });
        session.stopAfter(s.stimulus().isPresent() ? Double.POSITIVE_INFINITY : seconds);
        double recordSeconds = seconds;
        try {
            session.start();
            // With a stimulus, the record must hold SECONDS of it: the output line opens and fills its buffer before the
            // tone reaches the input (a second or more on a loaded machine), so the record is extended by that lead-in
            // (whole blocks) and only its last SECONDS are kept (trim below).
            if (session.stimulusArrivalSeconds().isPresent()) {
                double lead = session.stimulusArrivalSeconds().get() + LEAD_MARGIN_SECONDS;
                recordSeconds = Math.ceil((lead + seconds) / block - 1e-9) * block;
                session.stopAfter(recordSeconds);
            } else {
                session.stopAfter(seconds);
            }
            if (!session.awaitEnd((long) (recordSeconds * 1000) + 15_000, TimeUnit.MILLISECONDS)) {
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
        if (recordSeconds > seconds) {
            try {
                keepLast(file, seconds);
            } catch (IOException | org.outstage.capture.CaptureFormatException e) {
                delete(file);
                throw new BadInputException("live capture: cannot trim the lead-in of " + file + ": " + e.getMessage());
            }
        }
        if (session.droppedFrames() > 0)
            err.println("outstage: warning: " + session.droppedFrames() + " input frames were lost during the live capture (zeros stand in for them)");
        return file;
    }

    /** Margin after the stimulus' computed arrival before the kept part of the record starts, seconds (scheduling slack). */
    static final double LEAD_MARGIN_SECONDS = 0.25;

    /** Rewrites the recorded WAV with only its last {@code seconds} (the part after the stimulus' lead-in), 32-bit float. */
    static void keepLast(Path file, double seconds) throws IOException, org.outstage.capture.CaptureFormatException {
        org.outstage.capture.Capture c = org.outstage.capture.WavReader.read(file);
        int rate = (int) Math.round(c.sampleRateHz());
        int keep = (int) Math.min(c.frameCount(), Math.round(seconds * rate));
        int from = (int) (c.frameCount() - keep);
        double[][] ch = new double[c.channelCount()][];
        for (int i = 0; i < ch.length; i++) ch[i] = java.util.Arrays.copyOfRange(c.readChannel(i), from, from + keep);
        Path tmp = file.resolveSibling(file.getFileName() + ".part");
        org.outstage.capture.WavWriter.write(tmp, rate, org.outstage.capture.WavWriter.Encoding.FLOAT_32, false, ch);
        Files.move(tmp, file, java.nio.file.StandardCopyOption.REPLACE_EXISTING, java.nio.file.StandardCopyOption.ATOMIC_MOVE);
    }

    private static void delete(Path f) {
        try {
            Files.deleteIfExists(f);
        } catch (IOException e) {
            // temporary file; nothing else to do
        }
    }
}
