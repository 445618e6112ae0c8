package org.outstage.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.TimeUnit;
import org.outstage.analysis.Measurement;
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
        int channel = analyze.channel().orElse(1);
        int keepBlocks = (int) Math.round(seconds / block);
        List<Double> tone = new ArrayList<>(); // the channel's tone rms per block, NaN where not measured
        java.util.concurrent.CountDownLatch steady = new java.util.concurrent.CountDownLatch(1);
        double[] minimumEnd = {Double.POSITIVE_INFINITY};
        LiveSession session = new LiveSession(LiveCommand.backend.get(), s, new LiveListener() {
            @Override public void onBlock(LiveResult r) {
                double rms = Double.NaN;
                for (Measurement m : r.measurements())
                    if (m.channel() == channel && m.measured()) rms = m.fundamental().rms();
                synchronized (tone) {
                    tone.add(rms);
                    if (r.timeSeconds() >= minimumEnd[0] - 1e-9 && steadyTail(tone, keepBlocks)) steady.countDown();
                }
            }
            @Override public void onFailure(String message) { failure[0] = message; }
        });
        session.stopAfter(s.stimulus().isPresent() ? Double.POSITIVE_INFINITY : seconds);
        double recordSeconds = seconds;
        try {
            session.start();
            // With a stimulus, the record must hold SECONDS of it: the output line opens and fills its buffer before the
            // tone reaches the input (a second or more on a loaded machine), so the record is extended by that lead-in
            // (whole blocks) and only its last SECONDS are kept (trim below).
            // An output can start later than its stated latency (a loaded machine): the record then runs on until the
            // last SECONDS hold the tone at one level, at most LATE_START_SECONDS longer.
            if (session.stimulusArrivalSeconds().isPresent()) {
                double lead = session.stimulusArrivalSeconds().get() + LEAD_MARGIN_SECONDS;
                recordSeconds = Math.ceil((lead + seconds) / block - 1e-9) * block;
                synchronized (tone) {
                    minimumEnd[0] = recordSeconds;
                    if (tone.size() * block >= recordSeconds - 1e-9 && steadyTail(tone, keepBlocks)) steady.countDown();
                }
                session.stopAfter(recordSeconds + LATE_START_SECONDS);
            } else {
                session.stopAfter(seconds);
            }
            long deadline = System.nanoTime() + (long) ((recordSeconds + LATE_START_SECONDS + 15) * 1e9);
            while (!session.awaitEnd(50, TimeUnit.MILLISECONDS)) {
                if (steady.getCount() == 0) session.stop();
                if (System.nanoTime() > deadline) {
                    session.stop();
                    throw new IllegalStateException("the live capture did not end");
                }
            }
            recordSeconds = Math.max(recordSeconds, tone.size() * block);
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
        if (s.stimulus().isPresent() && steady.getCount() != 0)
            err.println("outstage: warning: the tone did not hold one level on input channel " + channel + " over the last " + seconds
                    + " s of the record (silence, or a level that moved by more than " + Math.round(STEADY_SPREAD * 100) + " %); the step keeps what was recorded");
        if (session.droppedFrames() > 0)
            err.println("outstage: warning: " + session.droppedFrames() + " input frames were lost during the live capture (zeros stand in for them)");
        return file;
    }

    /** How much longer than planned a record with a stimulus may run while it waits for the tone to hold steady, seconds. */
    static final double LATE_START_SECONDS = 10;
    /** Largest spread (max/min − 1) of the tone's block rms within the kept part of a record. */
    static final double STEADY_SPREAD = 0.02;

    /**
     * Whether the last {@code blocks} entries of {@code toneRms} (per-block tone rms, NaN where not measured) are all
     * measured and within {@link #STEADY_SPREAD} of each other: the kept part of the record then holds no silence and no
     * tone onset.
     */
    static boolean steadyTail(List<Double> toneRms, int blocks) {
        return steadyTail(toneRms, blocks, STEADY_SPREAD);
    }

    /** The same test with a given largest spread (max/min − 1); also used by {@code live --calibrate-volts}. */
    static boolean steadyTail(List<Double> toneRms, int blocks, double spread) {
        int n = toneRms.size();
        if (blocks < 1 || n < blocks) return false;
        double lo = Double.POSITIVE_INFINITY, hi = 0;
        for (double v : toneRms.subList(n - blocks, n)) {
            if (!(v > 0)) return false;
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
        }
        return hi / lo - 1 <= spread;
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
