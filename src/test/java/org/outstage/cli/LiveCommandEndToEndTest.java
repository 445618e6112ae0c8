package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.capture.Capture;
import org.outstage.capture.WavReader;
import org.outstage.json.JsonText;
import org.outstage.live.Soundcard;
import org.outstage.live.UserSettings;

/** The live commands end to end through the virtual soundcard (tools/virtual-soundcard). */
class LiveCommandEndToEndTest {
    @TempDir Path dir;
    private java.util.function.Supplier<UserSettings> saved;

    @BeforeEach
    void setUp() {
        Soundcard.require();
        saved = LiveCommand.userSettings;
        LiveCommand.userSettings = () -> new UserSettings(dir.resolve("config/settings.properties"));
    }

    @AfterEach
    void tearDown() { if (saved != null) LiveCommand.userSettings = saved; }

    @SuppressWarnings("unchecked")
    @Test
    void liveJson_oneObjectPerBlock_withTheAnalyzeKeysAndBlockTiming() {
        CliRun r = CliRun.of("live", "--play", "sine:997", "--level-dbfs", "-20", "--seconds", "3", "--channel", "1", "--json");
        assertEquals(0, r.exit(), r.err());
        List<String> lines = r.out().lines().filter(l -> !l.isBlank()).toList();
        assertTrue(lines.size() >= 2, r.out());
        long expected = 0;
        for (String l : lines) {
            Map<String, Object> o = (Map<String, Object>) JsonText.parse(l);
            // Contract of docs/cli.md: the analyze capture object plus block (from 0), time_s, dropped_frames.
            assertEquals((double) expected++, (Double) o.get("block"), 0.0, "blocks numbered from 0 without gaps: " + l);
            assertTrue(o.containsKey("time_s") && o.containsKey("dropped_frames") && o.containsKey("thd_n") && o.containsKey("crossover"), l);
            assertEquals(1.0, (Double) o.get("channel"), 0.0);
        }
        assertTrue(r.err().contains("attenuator"), "cautions before the first live start: " + r.err());
        CliRun again = CliRun.of("live", "--seconds", "1", "--channel", "1", "--json");
        assertEquals(0, again.exit(), again.err());
        assertFalse(again.err().contains("attenuator"), "cautions are shown once: " + again.err());
    }

    @Test
    void calibrateVolts_remembersFullScale_andLaterRunsUseIt() {
        // A −20 dBFS peak sine has rms 0.1/√2 = 0.070711 FS (docs/references.md §2); a meter reading 12.65 V rms then
        // means full scale = 12.65 / 0.070711 = 178.90 V peak.
        CliRun c = CliRun.of("live", "--play", "sine:997", "--level-dbfs", "-20", "--seconds", "4", "--channel", "1", "--calibrate-volts", "12.65");
        assertEquals(0, c.exit(), c.err());
        double fs = 12.65 / (0.1 / Math.sqrt(2));
        java.util.regex.Matcher m = java.util.regex.Pattern.compile("full scale: ([0-9.]+) V peak").matcher(c.out());
        assertTrue(m.find(), c.out());
        assertEquals(fs, Double.parseDouble(m.group(1)), fs * 1e-3);
        UserSettings u = LiveCommand.userSettings.get();
        assertEquals(fs, u.fullScaleVolts("default", 1).orElseThrow(), fs * 1e-3);
        CliRun after = CliRun.of("live", "--play", "sine:997", "--level-dbfs", "-20", "--seconds", "2", "--channel", "1", "--json");
        assertEquals(0, after.exit(), after.err());
        @SuppressWarnings("unchecked")
        Map<String, Object> last = (Map<String, Object>) JsonText.parse(after.out().lines().reduce((a, b) -> b).orElseThrow());
        assertEquals("V", last.get("unit"), "the remembered calibration is the default --fs-volts");
    }

    @Test
    void sessionAddLive_logsAStepThatSessionShowLists() {
        String db = dir.resolve("lb.db").toString();
        CliRun s = CliRun.of("session", "start", "--unit", "bench amp", "--logbook", db, "--json");
        assertEquals(0, s.exit(), s.err());
        @SuppressWarnings("unchecked")
        long id = ((Double) ((Map<String, Object>) JsonText.parse(s.out())).get("session_id")).longValue();
        CliRun add = CliRun.of("session", "add", Long.toString(id), "--bias-mv", "12", "--live", "2", "--play", "sine:997", "--level-dbfs", "-20",
                "--channel", "1", "--logbook", db);
        assertEquals(0, add.exit(), add.err());
        assertTrue(add.out().startsWith("step "), add.out());
        CliRun show = CliRun.of("session", "show", Long.toString(id), "--logbook", db, "--json");
        assertEquals(0, show.exit(), show.err());
        assertTrue(show.out().contains("\"bias_mv\": 12"), show.out());
    }

    @Test
    void noSuchInputDevice_exits2WithOneLine() {
        CliRun r = CliRun.of("live", "--input", "no-such-card-xyz", "--seconds", "1");
        assertEquals(2, r.exit());
        assertTrue(r.err().trim().endsWith(")") && r.err().contains("no-such-card-xyz"), r.err());
    }

    @Test
    void ctrlC_duringRecord_leavesAValidWav_andKill9_isSalvaged() throws Exception {
        Path wav = dir.resolve("sigint.wav");
        // under coreutils' timeout, which forwards SIGINT to the child and gives it the default disposition even when this
        // JVM was started with SIGINT ignored (a background job of a non-interactive shell inherits it ignored)
        Process p = child(List.of("timeout", "600"), "live", "--play", "sine:997", "--record", wav.toString(), "--channel", "1");
        try {
            waitForBytes(wav, 96_000 * 8 * 2, p);
            // SIGINT, as Ctrl-C sends it (the JVM runs its shutdown hooks: JLS 12.8, Runtime.addShutdownHook).
            new ProcessBuilder("kill", "-INT", Long.toString(p.pid())).inheritIO().start().waitFor();
            // the hook fades out (50 ms), closes the lines (each bounded to 2 s) and finalises the header; 60 s leaves room
            // for a heavily loaded machine
            assertTrue(p.waitFor(60, TimeUnit.SECONDS), "child ended after SIGINT");
        } finally {
            // never leave a tone playing into the next test
            p.descendants().forEach(ProcessHandle::destroyForcibly);
            p.destroyForcibly();
        }
        Capture c = WavReader.read(wav);
        assertTrue(c.warnings().isEmpty(), "the header was finalised: " + c.warnings());
        assertEquals((Files.size(wav) - 46) / 8, c.frameCount(), "the data size covers every frame");
        assertTrue(c.frameCount() >= 96_000 * 2);

        Path killed = dir.resolve("kill9.wav");
        Process q = child("live", "--record", killed.toString(), "--channel", "1");
        try {
            waitForBytes(killed, 96_000 * 8, q);
        } finally {
            q.destroyForcibly(); // SIGKILL: no hook runs
        }
        q.waitFor(20, TimeUnit.SECONDS);
        Capture k = WavReader.read(killed);
        assertFalse(k.warnings().isEmpty(), "a salvaged file says so");
        assertEquals((Files.size(killed) - 46) / 8, k.frameCount(), "every whole frame is read back");
    }

    private Process child(String... args) throws Exception { return child(List.of(), args); }

    private Process child(List<String> prefix, String... args) throws Exception {
        List<String> cmd = new java.util.ArrayList<>(prefix);
        cmd.addAll(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-cp", System.getProperty("java.class.path"), "org.outstage.Launcher"));
        cmd.addAll(List.of(args));
        ProcessBuilder pb = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(dir.resolve("child-" + System.nanoTime() + ".log").toFile());
        pb.environment().put(UserSettings.ENV, dir.resolve("config").toString());
        return pb.start();
    }

    private static void waitForBytes(Path f, long bytes, Process p) throws Exception {
        long end = System.nanoTime() + 30_000_000_000L;
        while (System.nanoTime() < end) {
            if (Files.exists(f) && Files.size(f) > bytes) return;
            if (!p.isAlive()) throw new AssertionError("child exited early with " + p.exitValue());
            Thread.sleep(100);
        }
        p.destroyForcibly();
        throw new AssertionError("the record file did not grow to " + bytes + " bytes");
    }
}
