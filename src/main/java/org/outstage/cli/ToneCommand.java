package org.outstage.cli;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.outstage.capture.WavWriter;
import org.outstage.stimulus.Dither;
import org.outstage.stimulus.Generator;
import org.outstage.stimulus.Stimulus;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code outstage tone SIGNAL --seconds S --out FILE.wav}: writes a stimulus file with the same generator that live
 * playback uses. Integer formats get TPDF dither at their word length; float files none. No fade-in (a sweep has
 * its own fades), so the stated level holds from the first sample.
 */
@Command(name = "tone", mixinStandardHelpOptions = true, sortOptions = false,
        description = "Write a test signal to a WAV file: sine:F, twin:F1,F2, smpte:F1,F2, sweep:F1-F2[,T], burst:F,ON,OFF or silence.")
public final class ToneCommand implements Callable<Integer> {
    @Spec picocli.CommandLine.Model.CommandSpec spec;

    @Parameters(index = "0", paramLabel = "SIGNAL", description = "sine:F, twin:F1,F2, smpte:F1,F2, sweep:F1-F2[,T], burst:F,ON,OFF or silence (frequencies in Hz, k allowed).")
    String signal;

    @Option(names = "--seconds", paramLabel = "S", required = true, description = "Length of the file in seconds (a sweep without its own T lasts this long).")
    double seconds;

    @Option(names = "--out", paramLabel = "FILE.wav", required = true, description = "The WAV file to write (written whole, then moved into place).")
    Path out;

    @Option(names = "--sample-rate", paramLabel = "HZ", defaultValue = "96000", description = "Sample rate. Default: ${DEFAULT-VALUE}.")
    int sampleRate;

    @Option(names = "--bits", paramLabel = "16|24|32|float", defaultValue = "24", description = "Sample format. Default: ${DEFAULT-VALUE}.")
    String bits;

    @Option(names = "--level-dbfs", paramLabel = "L", defaultValue = "-20", description = "Peak level in dBFS. Default: ${DEFAULT-VALUE}.")
    double levelDbfs;

    @Option(names = "--allow-loud", description = "Allow a level above -20 dBFS.")
    boolean allowLoud;

    @Option(names = "--channels", paramLabel = "N", defaultValue = "1", description = "Channels (1 or 2; the signal on each). Default: ${DEFAULT-VALUE}.")
    int channels;

    /** Seed of the dither, so a file is reproducible. */
    static final long DITHER_SEED = 997;

    @Override
    public Integer call() throws IOException {
        Stimulus s;
        try {
            s = Stimulus.parse(signal);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage());
        }
        if (!(seconds > 0 && seconds <= 3600)) throw new BadInputException("--seconds: " + seconds + " must be between 0 and 3600");
        if (sampleRate < 8000 || sampleRate > 768_000) throw new BadInputException("--sample-rate: " + sampleRate + " must be between 8000 and 768000");
        if (channels < 1 || channels > 2) throw new BadInputException("--channels: " + channels + " must be 1 or 2");
        WavWriter.Encoding enc = switch (bits.trim().toLowerCase(Locale.ROOT)) {
            case "16" -> WavWriter.Encoding.PCM_16;
            case "24" -> WavWriter.Encoding.PCM_24;
            case "32" -> WavWriter.Encoding.PCM_32;
            case "float" -> WavWriter.Encoding.FLOAT_32;
            default -> throw new BadInputException("--bits: \"" + bits + "\" must be 16, 24, 32 or float");
        };
        Path dir = out.toAbsolutePath().getParent();
        if (dir == null || !Files.isDirectory(dir)) throw new BadInputException(out + ": the folder does not exist");
        Generator g;
        try {
            g = Generator.of(s, sampleRate, levelDbfs, seconds, allowLoud);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--level-dbfs / SIGNAL: " + e.getMessage());
        }
        long frames = Math.round(seconds * sampleRate);
        if (frames > 200_000_000L) throw new BadInputException("--seconds: " + seconds + " s at " + sampleRate + " Hz is too long for one file");
        double[] x = g.render((int) frames);
        if (!enc.isFloat()) new Dither(DITHER_SEED).apply(x, 0, x.length, enc.bitsPerSample());
        double[][] chans = channels == 1 ? new double[][] {x} : new double[][] {x, x};
        WavWriter.write(out, sampleRate, enc, false, chans);
        spec.commandLine().getErr().printf(Locale.ROOT, "outstage: wrote %s: %s, %.3f s, %d Hz, %s, %.1f dBFS peak%s%n", out, s.spec(), frames / (double) sampleRate,
                sampleRate, enc.isFloat() ? "float" : enc.bitsPerSample() + "-bit", levelDbfs,
                g.sweepParameters().map(p -> String.format(Locale.ROOT, ", sweep rate L %.6f s, fades %.3f/%.3f s", p.rateSeconds(), p.fadeInSeconds(), p.fadeOutSeconds())).orElse(""));
        spec.commandLine().getErr().flush();
        return OutstageCommand.EXIT_OK;
    }
}
