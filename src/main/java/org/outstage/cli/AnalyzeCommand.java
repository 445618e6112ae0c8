package org.outstage.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.Plausibility;
import org.outstage.analysis.stage.Residual;
import org.outstage.analysis.stage.StageAnalyzer;
import org.outstage.analysis.stage.StageSettings;
import org.outstage.json.JsonText;
import org.outstage.report.FigureTable;
import org.outstage.report.MeasurementJson;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Model.PositionalParamSpec;

/**
 * {@code outstage analyze [options] FILE...}: distortion figures and output-stage diagnosis of captures.
 * A readable table by default, {@code --json} (the contract in docs/cli.md) or {@code --csv}. Files are
 * analysed in parallel; a file that cannot be read is reported on stderr (one line) and the others still
 * are, with exit code 2 at the end.
 */
public final class AnalyzeCommand implements Callable<Integer> {
    static final String NAME = "analyze";

    private CommandSpec spec;

    // the options' fields, bound by model()
    final AnalyzeOptions options = new AnalyzeOptions();
    boolean json;
    boolean csv;
    Path residual;
    String residualBand;
    List<Path> files;

    /**
     * A new command with its picocli model, built in code ({@link CodeModel}): the measurement options, then this
     * command's own, then help and version, as help lists them.
     */
    static CommandSpec model() {
        AnalyzeCommand c = new AnalyzeCommand();
        CommandSpec s = CodeModel.command(c, NAME, "Measure THD, THD+N, harmonics, crossover and clipping of captures (WAV or scope CSV).");
        s.usageMessage().sortOptions(false);
        s.addMixin(AnalyzeOptions.MIXIN, c.options.mixin());
        s.addOption(CodeModel.option("--json", boolean.class, null, "Print JSON (keys documented in docs/cli.md).",
                CodeModel.bind(() -> c.json, v -> c.json = (Boolean) v)).build());
        s.addOption(CodeModel.option("--csv", boolean.class, null, "Print one CSV row per analysed channel.",
                CodeModel.bind(() -> c.csv, v -> c.csv = (Boolean) v)).build());
        s.addOption(CodeModel.option("--residual", Path.class, "FILE.csv",
                "Write the residual (capture minus fitted fundamental and DC, band-limited) of the one analysed channel as CSV.",
                CodeModel.bind(() -> c.residual, v -> c.residual = (Path) v)).build());
        s.addOption(CodeModel.option("--residual-band", String.class, "LOW-HIGH",
                "Band-limit the exported residual (zero-phase high-pass and low-pass), e.g. 20-80k. Default: unfiltered, so crossover spikes keep their edges.",
                CodeModel.bind(() -> c.residualBand, v -> c.residualBand = (String) v)).build());
        CodeModel.Binding files = CodeModel.bind(() -> c.files, v -> c.files = castPaths(v));
        s.addPositional(PositionalParamSpec.builder().paramLabel("FILE").arity("1..*").required(true).type(List.class).auxiliaryTypes(Path.class)
                .description("Captures: WAV (PCM, float, extensible, RF64) or scope CSV.").getter(files).setter(files).build());
        CodeModel.standardHelp(s);
        c.spec = s;
        return s;
    }

    @SuppressWarnings("unchecked")
    private static List<Path> castPaths(Object v) { return (List<Path>) v; }

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (json && csv) throw new BadInputException("--json and --csv exclude each other");
        options.settings(); // validate options once, before any file is read
        prepareTextOutput();
        List<Outcome> outcomes = analyseAll(files, options, err);
        int bad = 0;
        List<Measuring.FileResult> good = new ArrayList<>();
        for (Outcome o : outcomes) {
            if (o.error != null) {
                err.println("outstage: " + o.error);
                bad++;
            } else good.add(o.result);
        }
        // warnings about a file go to stderr in every mode, one line naming the file (with --json they are also in the JSON)
        for (Measuring.FileResult r : good) {
            for (String w : r.capture().warnings()) err.println("outstage: warning: " + r.file() + ": " + w);
            for (Measurement m : r.measurements())
                for (String c : Plausibility.cautions(m, options.settings().loadOhms()))
                    err.println("outstage: warning: " + r.file() + ", channel " + m.channel() + ": " + c);
        }
        err.flush();
        if (residual != null) writeResidual(good);
        if (json) {
            List<Object> caps = new ArrayList<>();
            for (Measuring.FileResult r : good)
                for (Measurement m : r.measurements()) caps.add(MeasurementJson.capture(r.file(), m, r.capture().warnings()));
            out.println(JsonText.pretty(JsonText.obj("captures", caps)));
        } else if (csv) {
            out.print(FigureTable.csvHeader());
            for (Measuring.FileResult r : good)
                for (Measurement m : r.measurements()) out.print(FigureTable.csvRow(r.file(), m));
        } else {
            for (Measuring.FileResult r : good) {
                for (Measurement m : r.measurements()) out.print(FigureTable.text(r.file(), m));
                r.generatorChannel().ifPresent(g -> out.println(FigureTable.generatorLine(r.file(), g)));
            }
        }
        out.flush();
        return bad > 0 ? OutstageCommand.EXIT_BAD_INPUT : OutstageCommand.EXIT_OK;
    }

    /**
     * Makes the JDK's number formatting and the JSON writer ready on another thread while the captures are read: their
     * first use loads and initialises the locale data and some 60 classes (8-10 ms), which would otherwise fall on the
     * analysis's own path when it writes the crossover verdict's text and on the output (docs/performance.md, "Fourth
     * round"). Only with a second core, which is idle then; nothing it makes is kept.
     */
    static void prepareTextOutput() {
        if (Runtime.getRuntime().availableProcessors() < 2) return;
        Thread t = new Thread(() -> {
            String text = String.format(java.util.Locale.ROOT, "%.4f %.1e %.4g %.2f %s %d", 1.0, 2.0, 3.0, 4.0, "x", 5);
            JsonText.pretty(JsonText.obj("text", text, "number", 0.25, "list", List.of(1, 2.5)));
        }, "outstage-prepare-text");
        t.setDaemon(true);
        t.setPriority(Thread.MIN_PRIORITY);
        t.start();
    }

    /** The result of one file: figures or a one-line error. */
    record Outcome(Measuring.FileResult result, String error) {}

    /**
     * Analyses files in parallel, keeping their order: as many threads as cores, bounded by memory (see
     * {@link #threadsFor}).
     */
    static List<Outcome> analyseAll(List<Path> files, AnalyzeOptions options, PrintWriter err) throws InterruptedException {
        long largest = 0;
        for (Path f : files) {
            try {
                largest = Math.max(largest, java.nio.file.Files.size(f));
            } catch (IOException | RuntimeException e) {
                // reported by the file's own analysis
            }
        }
        int threads = threadsFor(files.size(), Runtime.getRuntime().availableProcessors(), Runtime.getRuntime().maxMemory(), largest);
        ExecutorService pool = Executors.newFixedThreadPool(threads, r -> {
            Thread t = new Thread(r, "analyze");
            t.setDaemon(true);
            return t;
        });
        try (Progress progress = new Progress(err, files.size(), Progress.onTerminal())) {
            List<Future<Outcome>> futures = new ArrayList<>();
            int i = 0;
            for (Path f : files) {
                int index = ++i;
                futures.add(pool.submit(() -> {
                    progress.step("analysing " + f + " (" + index + " of " + files.size() + ")");
                    try {
                        return new Outcome(Measuring.measure(f, options), null);
                    } catch (BadInputException | IllegalArgumentException e) {
                        return new Outcome(null, e.getMessage());
                    } catch (java.io.UncheckedIOException e) {
                        return new Outcome(null, f + ": " + e.getCause().getMessage());
                    } finally {
                        progress.itemDone();
                    }
                }));
            }
            List<Outcome> outcomes = new ArrayList<>();
            for (Future<Outcome> fu : futures) {
                try {
                    outcomes.add(fu.get());
                } catch (ExecutionException e) {
                    throw new IllegalStateException(e.getCause());
                }
            }
            return outcomes;
        } finally {
            pool.shutdownNow();
        }
    }

    /**
     * Threads for a batch: one per core, at most one per file, and no more than the heap holds at once. A file's
     * analysis keeps its samples as doubles (up to 8 bytes per stored byte, for 8-bit data) plus the spectrum's
     * work arrays of about the same size again, so one file needs about 16 times its size; half the heap is given
     * to files in flight.
     */
    static int threadsFor(int files, int cores, long maxHeapBytes, long largestFileBytes) {
        int t = Math.max(1, Math.min(files, cores));
        long perFile = Math.max(1, largestFileBytes) * 16;
        long fit = (maxHeapBytes / 2) / perFile;
        return (int) Math.max(1, Math.min(t, fit));
    }

    private void writeResidual(List<Measuring.FileResult> good) throws IOException {
        List<Measurement> all = new ArrayList<>();
        Measuring.FileResult owner = null;
        for (Measuring.FileResult r : good) {
            all.addAll(r.measurements());
            if (!r.measurements().isEmpty()) owner = r;
        }
        if (all.size() != 1)
            throw new BadInputException(good.size() > 1
                    ? "--residual writes one channel of one file, but " + good.size() + " files were analysed; give one file (and --channel N if it has several channels)"
                    : "--residual needs exactly one analysed channel (got " + all.size() + "; pick one with --channel)");
        Measurement m = all.get(0);
        if (!m.measured()) throw new BadInputException(owner.file() + ": no residual: " + m.notMeasuredReason().get());
        double[] samples = owner.capture().readChannel(m.channel() - 1, Analyzer.spanFrames(owner.capture()));
        StageSettings ss = StageSettings.defaults().withUnit(m.unit());
        if (residualBand != null) {
            org.outstage.analysis.Band b;
            try {
                b = org.outstage.analysis.Band.parse(residualBand);
            } catch (IllegalArgumentException e) {
                throw new BadInputException("--residual-band: " + e.getMessage());
            }
            double hi = b.toNyquist() || b.highHz() >= m.sampleRateHz() / 2 ? 0 : b.highHz();
            ss = ss.withResidualBand(b.lowHz(), hi);
        }
        Residual res = StageAnalyzer.residual(samples, m.sampleRateHz(), m.sineFit(), ss);
        double[] out = samples;
        org.outstage.report.AtomicFile.write(residual, w -> res.writeCsv(w, out, m.sineFit()));
    }
}
