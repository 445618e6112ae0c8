package org.outstage.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.LocalTime;
import java.time.ZoneId;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import org.outstage.logbook.BiasAdvice;
import org.outstage.logbook.BiasAdvisor;
import org.outstage.logbook.BiasReading;
import org.outstage.logbook.BiasStep;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.MeasurementRecord;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * {@code watch DIR --session ID}: adds each new capture in a folder to a bias session as the recorder writes
 * it, one line per capture. Ctrl-C stops cleanly: the step in progress is either committed or, if the
 * process dies mid-way, rolled back by SQLite; nothing is half-written.
 */
@Command(name = "watch", mixinStandardHelpOptions = true, modelTransformer = AnalyzeOptions.Added.class, description = "Add each new capture in a folder to a bias session as it is written; one line per capture.")
public final class WatchCommand implements Callable<Integer>, AnalyzeOptions.MeasuresCaptures {
    @CommandLine.Spec CommandLine.Model.CommandSpec spec;
    @Mixin LogbookPathOption logbook;
    final AnalyzeOptions analyze = new AnalyzeOptions();   // mixed in by AnalyzeOptions.Added

    @Override
    public AnalyzeOptions analyzeOptions() { return analyze; }

    @Parameters(index = "0", paramLabel = "DIR", description = "Folder the recorder or scope writes into.")
    Path dir;

    @Option(names = "--session", required = true, paramLabel = "ID", converter = Units.SessionId.class, description = "Bias session to add the steps to.")
    long sessionId;

    @Option(names = "--bias-mv", paramLabel = "MV", converter = Units.MilliVolts.class, description = "Reading for captures whose name and sidecar give none (constant setting).")
    Double biasMv;

    @Option(names = "--bias-ma", paramLabel = "MA", converter = Units.MilliAmps.class, description = "As --bias-mv, in mA.")
    Double biasMa;

    @Option(names = "--heatsink-c", paramLabel = "C", description = "Heatsink temperature when the name and sidecar give none.")
    Double heatsinkC;

    @Option(names = "--existing", description = "Also add the captures already in the folder.")
    boolean existing;

    @Option(names = "--settle-ms", paramLabel = "MS", description = "A file is complete when unchanged this long (default 1000).")
    long settleMs = 1000;

    @Option(names = "--poll-ms", paramLabel = "MS", description = "How often to look (default 250).")
    long pollMs = 250;

    @Option(names = "--max-captures", paramLabel = "N", hidden = true, description = "Stop after N captures (tests, scripts).")
    int maxCaptures = Integer.MAX_VALUE;

    private final AtomicBoolean stop = new AtomicBoolean();

    /** Asks the loop to stop after the capture in progress. */
    void requestStop() { stop.set(true); }

    @Override
    public Integer call() throws IOException, InterruptedException {
        analyze.settings(); // validate once
        if (!Files.isDirectory(dir)) throw new BadInputException(dir + ": not a folder");
        if (biasMv != null && biasMa != null) throw new BadInputException("give --bias-mv or --bias-ma, not both");
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        CountDownLatch finished = new CountDownLatch(1);
        Thread hook = new Thread(() -> {
            stop.set(true);
            try {
                finished.await(15, TimeUnit.SECONDS);
            } catch (InterruptedException ignored) {
                Thread.currentThread().interrupt();
            }
        }, "watch-stop");
        Runtime.getRuntime().addShutdownHook(hook);
        int handled = 0;
        int added = 0;
        int skipped = 0;
        try (Logbook lb = logbook.open()) {
            if (lb.session(sessionId).isEmpty()) throw new BadInputException("no session " + sessionId + " in logbook " + lb.display());
            if (!lb.session(sessionId).get().open()) throw new BadInputException("session " + sessionId + " has ended; start a new one");
            WatchFolder folder = new WatchFolder(dir, TimeUnit.MILLISECONDS.toNanos(settleMs), existing);
            err.println("outstage: watching " + dir + " for session " + sessionId + " (Ctrl-C to stop)");
            err.flush();
            while (!stop.get() && handled < maxCaptures) {
                for (Path p : folder.poll(System.nanoTime())) {
                    if (stop.get() || handled >= maxCaptures) break;
                    handled++;
                    String time = LocalTime.now(ZoneId.systemDefault()).format(DateTimeFormatter.ofPattern("HH:mm:ss"));
                    try {
                        BiasStep s = addOne(lb, p);
                        added++;
                        BiasAdvice a = BiasAdvisor.recommendFromSeries(lb.stepSeries(sessionId));
                        out.println(time + "  " + p.getFileName() + "  " + SessionSupport.stepLine(s) + "  -> "
                                + a.direction().name().toLowerCase(java.util.Locale.ROOT));
                        out.flush();
                    } catch (org.outstage.logbook.LogbookUnavailableException e) {
                        skipped++;
                        err.println(time + "  not saved " + p.getFileName() + ": " + e.getMessage());
                        err.flush();
                    } catch (BadInputException | IllegalArgumentException e) {
                        skipped++;
                        err.println(time + "  skipped " + p.getFileName() + ": " + e.getMessage());
                        err.flush();
                    }
                }
                if (!stop.get() && handled < maxCaptures) Thread.sleep(pollMs);
            }
        } finally {
            err.println("outstage: watch stopped: " + added + " step(s) added, " + skipped + " capture(s) skipped");
            err.flush();
            finished.countDown();
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException shuttingDown) {
                // the hook is running: it returns now that we are finished
            }
        }
        return 0;
    }

    private BiasStep addOne(Logbook lb, Path p) {
        WatchNames.Tags tags = WatchNames.fromSidecar(p).orElse(WatchNames.fromName(p.getFileName().toString()));
        WatchNames.Tags byName = WatchNames.fromName(p.getFileName().toString());
        Optional<BiasReading> r = tags.reading().or(byName::reading);
        if (r.isEmpty() && biasMv != null) r = Optional.of(BiasReading.millivolts(biasMv));
        if (r.isEmpty() && biasMa != null) r = Optional.of(BiasReading.milliamps(biasMa));
        if (r.isEmpty()) {
            throw new BadInputException("no bias reading: name it ..._bias-23.5mV.wav, add a " + WatchNames.sidecarOf(p).getFileName()
                    + " sidecar, or give --bias-mv");
        }
        OptionalDouble hs = tags.heatsinkC().isPresent() ? tags.heatsinkC() : byName.heatsinkC();
        if (hs.isEmpty() && heatsinkC != null) hs = OptionalDouble.of(heatsinkC);
        List<String> warnings = new ArrayList<>();
        MeasurementRecord m = SessionSupport.measureAndStore(lb, p, analyze, spec.commandLine().getParseResult(), warnings);
        return lb.addBiasStep(sessionId, BiasStep.draft(Instant.now(), r.get(), hs, tags.ambientC(), m.channel(), Optional.of(m)));
    }
}
