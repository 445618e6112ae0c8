package org.outstage.live;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Analyzer;
import org.outstage.audio.AudioBackend;
import org.outstage.audio.AudioUnavailableException;
import org.outstage.audio.DeviceInfo;
import org.outstage.audio.InputLine;
import org.outstage.audio.LineFormat;
import org.outstage.audio.OutputLine;
import org.outstage.audio.SampleFormat;
import org.outstage.capture.WavReader;
import org.outstage.stimulus.Stimulus;

/**
 * {@link LiveSession} on a fake device (no soundcard): the input delivers a 997 Hz tone in real time after a slow
 * first read; the output keeps what it is given. Checks the order of start, the output's ramps and silence at stop,
 * and that a block's figures are the analyzer's figures of the same samples.
 */
class LiveSessionFakeDeviceTest {
    static final int RATE = 48_000;
    @TempDir Path dir;

    static final class Fake implements AudioBackend {
        volatile long firstReadNanos = -1;
        volatile long outputOpenedNanos = -1;
        final List<Double> played = new CopyOnWriteArrayList<>();
        volatile boolean outputClosed;

        @Override public String name() { return "fake"; }
        @Override public List<DeviceInfo> inputs() { return List.of(); }
        @Override public List<DeviceInfo> outputs() { return List.of(); }

        @Override
        public InputLine openInput(Optional<String> device, LineFormat format) throws AudioUnavailableException {
            if (device.isPresent()) throw new AudioUnavailableException("no input device matches \"" + device.get() + "\"");
            return new InputLine() {
                long n;
                volatile boolean open = true;
                final long start = System.nanoTime();
                @Override public LineFormat format() { return format; }
                @Override public String deviceName() { return "fake-in"; }
                @Override public int bufferFrames() { return RATE / 2; }
                @Override public int available() { return 0; }
                @Override public int read(double[][] out, int offset, int frames) {
                    if (!open) return 0;
                    long due = start + 300_000_000L + (long) ((n + frames) * 1e9 / RATE); // first read after 0.3 s, then real time
                    long wait = due - System.nanoTime();
                    if (wait > 0) try { Thread.sleep(wait / 1_000_000, (int) (wait % 1_000_000)); } catch (InterruptedException e) { return 0; }
                    for (int i = 0; i < frames; i++, n++)
                        for (double[] ch : out) ch[offset + i] = 0.1 * Math.sin(2 * Math.PI * 997.0 * n / RATE);
                    if (firstReadNanos < 0) firstReadNanos = System.nanoTime();
                    return frames;
                }
                @Override public void close() { open = false; }
            };
        }

        @Override
        public OutputLine openOutput(Optional<String> device, LineFormat format) {
            outputOpenedNanos = System.nanoTime();
            return new OutputLine() {
                @Override public LineFormat format() { return format; }
                @Override public String deviceName() { return "fake-out"; }
                @Override public int bufferFrames() { return RATE / 10; }
                @Override public int available() { return 0; }
                @Override public int write(double[] mono, int offset, int frames) {
                    if (outputClosed) return 0;
                    for (int i = 0; i < frames; i++) played.add(mono[offset + i]);
                    try { Thread.sleep(frames * 1000L / RATE); } catch (InterruptedException e) { return 0; }
                    return frames;
                }
                @Override public void drain() {}
                @Override public void close() { outputClosed = true; }
            };
        }
    }

    private static LiveSettings settings() {
        return LiveSettings.defaults().withFormat(new LineFormat(RATE, SampleFormat.PCM_24, 1), SampleFormat.PCM_24)
                .withStimulus(Optional.of(new Stimulus.Sine(1000)), -20, false)
                .withAnalysis(AnalysisSettings.defaults(), OptionalInt.empty(), OptionalInt.empty()).withBlocks(0.5, 0.5);
    }

    private static double peak(List<Double> x, int from, int to) {
        double m = 0;
        for (int i = from; i < Math.min(to, x.size()); i++) m = Math.max(m, Math.abs(x.get(i)));
        return m;
    }

    @Test
    void outputStartsAfterFirstRead_rampsIn_rampsOnLevelChange_andEndsSilent() throws Exception {
        Fake fake = new Fake();
        List<LiveResult> results = new CopyOnWriteArrayList<>();
        LiveSession s = new LiveSession(fake, settings(), results::add);
        s.start();
        // toolchain notes: start the capture, wait for its first read, then play
        assertTrue(fake.outputOpenedNanos >= fake.firstReadNanos && fake.firstReadNanos > 0, "output opened after the first read");
        Thread.sleep(400);
        int before = fake.played.size();
        s.setLevelDbfs(-40, false);
        assertThrows(IllegalArgumentException.class, () -> s.setLevelDbfs(-6, false), "no jump above -20 dBFS without allow-loud");
        Thread.sleep(400);
        s.stop();
        List<Double> p = new ArrayList<>(fake.played);
        int ramp = (int) (0.05 * RATE);
        // Fade-in: the first 10 ms stay well under the level; the level (0.1 peak) is reached only after 50 ms.
        assertTrue(peak(p, 0, RATE / 100) < 0.1 * 0.25, "first 10 ms " + peak(p, 0, RATE / 100));
        assertEquals(0.1, peak(p, ramp + 10, ramp + RATE / 10), 0.1 * 1e-3);
        // Level change: ramp of at least 50 ms (issue 9); somewhere within the 50 ms after the change the peak lies between the levels.
        double mid = peak(p, before + ramp / 2 - RATE / 1000, before + ramp / 2 + RATE / 1000);
        assertTrue(mid > 0.01 * 1.05 && mid < 0.1, "mid-ramp peak " + mid);
        // Stop: the tone has faded out, the last samples are silent and the line is closed (never a stuck tone).
        assertEquals(0.0, peak(p, p.size() - RATE / 100, p.size()), 0.0);
        assertTrue(fake.outputClosed);
    }

    @Test
    void blockFigures_areTheAnalyzersFiguresOfTheSameSamples_andSaveLastBlockWritesThem() throws Exception {
        Fake fake = new Fake();
        List<LiveResult> results = new CopyOnWriteArrayList<>();
        LiveSession s = new LiveSession(fake, settings().withStimulus(Optional.empty(), -20, false), results::add).stopAfter(1.5);
        s.start();
        assertTrue(s.awaitEnd(20, TimeUnit.SECONDS));
        assertEquals(3, results.size(), "three 0.5 s blocks in 1.5 s");
        for (int i = 0; i < 3; i++) {
            LiveResult r = results.get(i);
            assertEquals(i, r.block());
            assertEquals(0.5 * (i + 1), r.timeSeconds(), 1e-9);
            assertEquals(0, r.droppedFrames());
            var again = Analyzer.analyze(r.capture(), 0, AnalysisSettings.defaults());
            assertEquals(again.thdN().ratio(), r.measurements().get(0).thdN().ratio(), 0.0);
            // The fake's tone: 997 Hz at 0.1 peak (the input is exact, so the fit is too: IEEE 1057)
            assertEquals(997.0, r.measurements().get(0).fundamental().frequencyHz(), 1e-6);
        }
        Path wav = dir.resolve("last.wav");
        s.saveLastBlock(wav);
        assertEquals(RATE / 2, WavReader.read(wav).frameCount());
    }

    @Test
    void missingDevice_isOneLine_andNothingStaysOpen() {
        Fake fake = new Fake();
        Path rec = dir.resolve("never.wav");
        LiveSession s = new LiveSession(fake, settings().withDevices(Optional.of("usb-card"), Optional.empty()).withRecordFile(Optional.of(rec)), r -> {});
        AudioUnavailableException e = assertThrows(AudioUnavailableException.class, s::start);
        assertTrue(e.getMessage().contains("usb-card") && !e.getMessage().contains("\n"), e.getMessage());
        assertTrue(!java.nio.file.Files.exists(rec), "no half-written recording after a failed start");
    }
}
