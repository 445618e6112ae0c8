package org.outstage.ui;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.Optional;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.Future;
import org.outstage.capture.BenchManifest;
import org.outstage.capture.Capture;

/**
 * The first capture the workbench starts with, opened and analysed on a background thread while the window toolkit
 * starts (the toolkit's start is mostly one thread; the second core is otherwise idle then). The window's own open
 * step and its first analysis take the results when they ask for the same thing: the same file with the same
 * calibration, then the same capture, channel, calibration and settings. Otherwise they do their own work and this
 * one is cancelled. It resolves the file's notes and channel roles with the window's own rules
 * ({@link WorkbenchPane#notesFor}, {@link WorkbenchPane#applyNotes}, {@link WorkbenchPane#settleChannels}), so the
 * figures are the ones the window would have computed itself.
 */
final class EarlyAnalysis {
    private record Key(Capture capture, int channel, Calibration calibration, UiSettings settings) {}

    private final Path file;
    private final CompletableFuture<Optional<Opened>> opened = new CompletableFuture<>();
    private final CompletableFuture<ViewData> result = new CompletableFuture<>();
    private volatile Key key;

    private record Opened(Calibration calibration, Capture capture) {}

    private EarlyAnalysis(Path file) { this.file = file.toAbsolutePath(); }

    /**
     * Starts opening and analysing {@code file} on a daemon thread; {@code fallback} is the calibration the window
     * gives a file its folder's notes do not name, {@code settings} the window's analysis settings at start.
     */
    static EarlyAnalysis start(Backend backend, Path file, Calibration fallback, UiSettings settings) {
        EarlyAnalysis a = new EarlyAnalysis(file);
        Thread t = new Thread(() -> a.run(backend, fallback, settings), "outstage-early-analysis");
        t.setDaemon(true);
        t.start();
        return a;
    }

    private void run(Backend backend, Calibration fallback, UiSettings settings) {
        Capture capture;
        CaptureEntry scratch = new CaptureEntry("", Optional.of(file));
        scratch.calibration = fallback;
        Optional<BenchManifest.Entry> notes;
        try {
            notes = WorkbenchPane.notesFor(file, new HashMap<>(), new ArrayList<>());
            notes.ifPresent(n -> WorkbenchPane.applyNotes(scratch, n, ""));
            capture = backend.open(file, scratch.calibration);
        } catch (Exception | Error e) {
            // the window opens the file again and reports its own error
            opened.complete(Optional.empty());
            result.cancel(false);
            return;
        }
        scratch.capture = capture;
        WorkbenchPane.settleChannels(scratch, notes);
        UiSettings s = settings.withReference(scratch.reference);
        key = new Key(capture, scratch.channel, scratch.calibration, s);   // before the window can take the capture
        opened.complete(Optional.of(new Opened(scratch.calibration, capture)));
        try {
            result.complete(backend.analyze(capture, scratch.channel, scratch.calibration, s, f -> {}, result::isCancelled));
        } catch (RuntimeException | Error e) {
            result.completeExceptionally(e);
        }
    }

    /** The capture opened early, if it is {@code file} opened with {@code calibration}; waits for the open step. */
    Capture captureFor(Path file, Calibration calibration) throws InterruptedException {
        if (!this.file.equals(file.toAbsolutePath())) return null;
        try {
            return opened.get().filter(o -> o.calibration().equals(calibration)).map(Opened::capture).orElse(null);
        } catch (ExecutionException e) {
            return null;
        }
    }

    /** The early analysis, if it is of this capture, channel, calibration and settings. */
    Optional<Future<ViewData>> resultFor(Capture capture, int channel, Calibration calibration, UiSettings settings) {
        Key k = key;
        return k != null && k.equals(new Key(capture, channel, calibration, settings)) ? Optional.of(result) : Optional.empty();
    }

    /** Stops the early analysis (the window asked for something else). */
    void cancel() { result.cancel(false); }
}
