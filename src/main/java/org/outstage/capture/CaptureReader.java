package org.outstage.capture;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Opens a capture file of either kind. The content decides first ({@code RIFF}, {@code RF64} or
 * {@code BW64} at the start → WAV), then the extension ({@code .wav}, {@code .wave}, {@code .rf64},
 * {@code .bw64} → WAV, so a damaged WAV gets a WAV error); anything else is read as a scope CSV.
 * Calibration follows {@link CaptureOptions}.
 */
public final class CaptureReader {
    private CaptureReader() {}

    /**
     * Opens {@code file}. A WAV is file-backed; a CSV is read into memory.
     *
     * @throws CaptureFormatException when the file is missing, unreadable, or malformed, or disagrees with options
     */
    public static Capture open(Path file, CaptureOptions options) throws CaptureFormatException {
        if (file == null) throw new IllegalArgumentException("file must not be null");
        if (options == null) throw new IllegalArgumentException("options must not be null");
        byte[] head = head(file);
        String name = String.valueOf(file.getFileName()).toLowerCase(Locale.ROOT);
        boolean wavName = name.endsWith(".wav") || name.endsWith(".wave") || name.endsWith(".rf64") || name.endsWith(".bw64");
        if (WavReader.hasWavMagic(head) || wavName) return calibrateWav(file, WavReader.read(file), options);
        return ScopeCsvReader.read(file, options);
    }

    /**
     * True when {@link #open} reads {@code file} as a WAV (by content, then by extension), false for a scope CSV. A
     * soundcard WAV is band-limited by the card's anti-alias filter; a scope export usually is not.
     *
     * @throws CaptureFormatException when the file cannot be read
     */
    public static boolean isWav(Path file) throws CaptureFormatException {
        if (file == null) throw new IllegalArgumentException("file must not be null");
        return isWavName(String.valueOf(file.getFileName())) || WavReader.hasWavMagic(head(file));
    }

    /** True when a file or capture name carries a WAV extension (.wav, .wave, .rf64, .bw64; any case). */
    public static boolean isWavName(String name) {
        String n = String.valueOf(name).toLowerCase(Locale.ROOT);
        return n.endsWith(".wav") || n.endsWith(".wave") || n.endsWith(".rf64") || n.endsWith(".bw64");
    }

    static Capture calibrateWav(Path file, Capture raw, CaptureOptions options) throws CaptureFormatException {
        if (options.sampleRateHz().isPresent()) {
            double given = options.sampleRateHz().getAsDouble();
            if (Math.abs(given - raw.sampleRateHz()) > CaptureOptions.RATE_TOLERANCE * raw.sampleRateHz())
                throw new CaptureFormatException(file, "fmt chunk", "the file says " + fmt(raw.sampleRateHz())
                        + " Hz, the given sample rate is " + fmt(given) + " Hz");
        }
        List<String> more = new ArrayList<>();
        if (options.probeFactor().isPresent())
            more.add("the probe factor applies to scope CSV files only; ignored for this WAV (use the full-scale voltage)");
        Capture c = more.isEmpty() ? raw : raw.withWarnings(more);
        if (options.fullScaleVolts().isPresent()) c = c.calibrated(options.fullScaleVolts().getAsDouble(), SampleUnit.VOLTS);
        return c;
    }

    static String fmt(double hz) {
        return hz == Math.rint(hz) && Math.abs(hz) < 1e15 ? Long.toString((long) hz) : Double.toString(hz);
    }

    private static byte[] head(Path file) throws CaptureFormatException {
        if (Files.isDirectory(file)) throw new CaptureFormatException(file, "file", "is a directory, not a capture file");
        try (InputStream in = Files.newInputStream(file)) {
            return in.readNBytes(12);
        } catch (IOException e) {
            throw CaptureFormatException.unreadable(file, e);
        }
    }
}
