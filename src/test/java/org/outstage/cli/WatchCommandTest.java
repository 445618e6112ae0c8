package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.logbook.BiasReading;
import org.outstage.logbook.BiasStep;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.SessionKind;
import org.outstage.logbook.UnitUnderTest;

class WatchCommandTest {
    @TempDir Path dir;

    @Test
    void namesAndSidecars_giveTheReading() throws Exception {
        WatchNames.Tags t = WatchNames.fromName("ch1_bias-23.5mV_hs-41C.wav");
        assertEquals(BiasReading.millivolts(23.5), t.reading().orElseThrow());
        assertEquals(41.0, t.heatsinkC().getAsDouble());
        assertEquals(BiasReading.milliamps(120), WatchNames.fromName("x_bias-120mA.csv").reading().orElseThrow());
        assertTrue(WatchNames.fromName("x_bias-12.wav").reading().isEmpty());
        Path cap = dir.resolve("take7.wav");
        Files.writeString(dir.resolve("take7.bias"), "# trimmer at 3 o'clock\nbias_mv = 18.2\nheatsink_c=37\n");
        WatchNames.Tags s = WatchNames.fromSidecar(cap).orElseThrow();
        assertEquals(BiasReading.millivolts(18.2), s.reading().orElseThrow());
        Files.writeString(dir.resolve("take8.bias"), "bias_mv=eighteen\n");
        BadInputException e = org.junit.jupiter.api.Assertions.assertThrows(BadInputException.class,
                () -> WatchNames.fromSidecar(dir.resolve("take8.wav")));
        assertTrue(e.getMessage().contains("take8.bias, line 1"), e.getMessage());
    }

    @Test
    void growingFiles_areTakenWhenComplete_badOnesSkipped_sessionGoesOn() throws Exception {
        Path in = Files.createDirectory(dir.resolve("in"));
        Path db = dir.resolve("lb.db");
        long sid;
        try (Logbook lb = Logbook.open(db)) {
            sid = lb.startSession(UnitUnderTest.named("DA-60"), SessionKind.BIAS_ADJUSTMENT, java.time.Instant.now(), "");
        }
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int[] code = {-1};
        try (AutoCloseable fake = LogbookMeasurers.install(new FakeMeasurer())) {
            Thread t = new Thread(() -> code[0] = OutstageCommand.commandLine(new PrintWriter(out), new PrintWriter(err)).execute("watch",
                    in.toString(), "--session", Long.toString(sid), "--logbook", db.toString(), "--settle-ms", "400", "--poll-ms", "50",
                    "--max-captures", "3"));
            t.start();
            long until = System.nanoTime() + TimeUnit.SECONDS.toNanos(20);
            while (!err.toString().contains("watching") && System.nanoTime() < until) Thread.sleep(20);
            // written in two pieces 200 ms apart: the first piece alone would be rejected (no f= line)
            Path a = in.resolve("a_bias-10mV.txt");
            Files.writeString(a, "rms=2.8\n");
            Thread.sleep(200);
            Files.writeString(a, "g0=0.99\nf=1000\n", StandardOpenOption.APPEND);
            Thread.sleep(700);
            Files.writeString(in.resolve("b_bias-20mV.txt"), "this is no capture\n");
            Thread.sleep(700);
            Files.writeString(in.resolve("c_bias-30mV_hs-44C.txt"), "f=1000\ng0=1.002\n");
            t.join(20_000);
            assertEquals(0, code[0], err.toString());
        }
        String o = out.toString();
        assertEquals(2, o.lines().count(), o);
        assertTrue(o.contains("a_bias-10mV.txt") && o.contains("c_bias-30mV_hs-44C.txt"), o);
        assertTrue(err.toString().contains("skipped b_bias-20mV.txt"), err.toString());
        try (Logbook lb = Logbook.open(db)) {
            List<BiasStep> steps = lb.biasSteps(sid);
            assertEquals(2, steps.size());
            assertEquals(BiasReading.millivolts(10), steps.get(0).reading());
            assertEquals(44.0, steps.get(1).heatsinkCelsius().getAsDouble());
        }
    }

    @Test
    void terminatedWatch_stopsCleanly_everyPrintedStepCommitted() throws Exception {
        Path in = Files.createDirectory(dir.resolve("in"));
        Path db = dir.resolve("lb.db");
        long sid;
        try (Logbook lb = Logbook.open(db)) {
            sid = lb.startSession(UnitUnderTest.named("DA-60"), SessionKind.BIAS_ADJUSTMENT, java.time.Instant.now(), "");
        }
        Path outFile = dir.resolve("child.out");
        Path errFile = dir.resolve("child.err");
        Process p = new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(), "-XX:TieredStopAtLevel=1",
                "-cp", System.getProperty("java.class.path"), WatchChildMain.class.getName(), "watch", in.toString(), "--session",
                Long.toString(sid), "--logbook", db.toString(), "--settle-ms", "100", "--poll-ms", "20")
                .redirectOutput(outFile.toFile()).redirectError(errFile.toFile()).start();
        long until = System.nanoTime() + TimeUnit.SECONDS.toNanos(20);
        while (!(Files.exists(errFile) && Files.readString(errFile).contains("watching")) && System.nanoTime() < until) Thread.sleep(20);
        for (int i = 0; i < 30; i++) {
            Files.writeString(in.resolve("s" + i + "_bias-" + (5 + i) + "mV.txt"), "f=1000\ng0=" + (0.99 + 0.001 * i) + "\n");
            Thread.sleep(15);
        }
        Thread.sleep(400);
        p.destroy(); // SIGTERM: the shutdown hook lets the step in progress finish
        assertTrue(p.waitFor(20, TimeUnit.SECONDS));
        String printed = Files.readString(outFile);
        String rest = Files.readString(errFile);
        assertTrue(rest.contains("watch stopped"), rest);
        long lines = printed.lines().filter(l -> l.contains("step ")).count();
        try (Logbook lb = Logbook.open(db)) {
            assertEquals("ok", lb.integrityCheck());
            assertTrue(lb.biasSteps(sid).size() >= lines, "every printed step is in the logbook");
            assertTrue(lines > 0, printed);
        }
    }
}
