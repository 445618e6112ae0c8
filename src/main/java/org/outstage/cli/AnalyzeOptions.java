package org.outstage.cli;

import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Band;
import org.outstage.analysis.SpecConditions;
import org.outstage.analysis.StimulusKind;
import org.outstage.analysis.Weighting;
import org.outstage.capture.BenchManifest;
import org.outstage.capture.CaptureFormatException;
import org.outstage.capture.CaptureOptions;
import org.outstage.capture.ChannelRole;
import picocli.CommandLine.Option;

/**
 * The options shared by every command that reads and measures captures ({@code analyze}, {@code sweep},
 * {@code fit}, {@code session add}, {@code watch}, {@code verify}). A picocli mixin.
 */
public final class AnalyzeOptions {
    @Option(names = "--channel", paramLabel = "N", description = "Channel to analyse, from 1 (default: every channel).")
    Integer channel;

    @Option(names = "--bandwidth", paramLabel = "LOW-HIGH", defaultValue = "20-20k",
            description = "Measurement band for THD+N and harmonics: LOW-HIGH in Hz (e.g. 20-20k, 22-22k), 'wide' (20 Hz-80 kHz) or 'nyquist'. Default: ${DEFAULT-VALUE}.")
    String bandwidth;

    @Option(names = "--weighting", paramLabel = "A|none", defaultValue = "none",
            description = "Weighting of noise and distortion in THD+N: A (IEC 61672-1) or none. Default: ${DEFAULT-VALUE}.")
    String weighting;

    @Option(names = "--harmonics", paramLabel = "N", defaultValue = "10",
            description = "Highest harmonic order in THD (2..50, limited by the band). Default: ${DEFAULT-VALUE}.")
    int harmonics;

    @Option(names = "--fs-volts", paramLabel = "V", converter = Units.Volts.class,
            description = "WAV calibration: peak volts at the amplifier output that reach digital full scale, divider included.")
    Double fsVolts;

    @Option(names = "--probe", paramLabel = "X", description = "Scope CSV calibration: multiply values by X (probe ratio not applied by the export).")
    Double probe;

    @Option(names = "--sample-rate", paramLabel = "HZ", converter = Units.Hertz.class, description = "Sample rate for a scope CSV without time column or interval.")
    Double sampleRate;

    @Option(names = "--load", paramLabel = "OHMS", converter = Units.Ohms.class, description = "Load resistance, for output power (P = Vrms^2/R; needs volts).")
    Double load;

    @Option(names = "--fundamental", paramLabel = "HZ", converter = Units.Hertz.class, description = "Expected fundamental frequency (default: strongest line).")
    Double fundamental;

    @Option(names = "--reference", paramLabel = "N",
            description = "Channel (from 1) that carries the generator signal: gives the X-Y transfer curve of the other channels; it gets no power and no verdict. Default: the bench.txt beside the capture (reference= or roles=).")
    Integer reference;

    @Option(names = "--roles", paramLabel = "ROLE,...",
            description = "Role of each channel from channel 1: output, generator, left or right (e.g. generator,output). Default: from --reference, else the bench.txt beside the capture, else every channel an output.")
    String roles;

    @Option(names = "--stimulus", paramLabel = "KIND",
            description = "What drove the amplifier: smpte, twin, sine, sweep, none (input shorted: noise and hum) or auto (recognise two tones or no tone). Default: auto.")
    String stimulus;

    @Option(names = "--driven", paramLabel = "N",
            description = "The one driven channel (from 1) of a crosstalk capture: the other channels report the driven tone's level in dB.")
    Integer driven;

    @Option(names = "--rated-power", paramLabel = "W", description = "Rated output power, for the signal-to-noise ratio re rated power (with --load).")
    Double ratedPower;

    /** The spec-sheet conditions (stimulus, driven channel, rated power); bad values raise {@link BadInputException}. */
    public SpecConditions specConditions() {
        StimulusKind k;
        try {
            k = stimulus == null ? StimulusKind.AUTO : StimulusKind.parse(stimulus);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--stimulus: " + e.getMessage());
        }
        if (driven != null && driven < 1) throw new BadInputException("--driven: " + driven + " must be 1 or more");
        positive("--rated-power", ratedPower);
        return new SpecConditions(k, driven == null ? OptionalInt.empty() : OptionalInt.of(driven), opt(ratedPower));
    }

    /** The capture reader options. */
    public CaptureOptions captureOptions() {
        return new CaptureOptions(opt(fsVolts), opt(probe), opt(sampleRate));
    }

    /** The analysis settings; bad values raise {@link BadInputException} naming the option. */
    public AnalysisSettings settings() {
        Band band;
        try {
            band = Band.parse(bandwidth);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--bandwidth: " + e.getMessage());
        }
        Weighting w = switch (weighting.trim().toLowerCase(java.util.Locale.ROOT)) {
            case "a" -> Weighting.A;
            case "none", "flat" -> Weighting.NONE;
            default -> throw new BadInputException("--weighting: \"" + weighting + "\" must be A or none");
        };
        if (harmonics < 2 || harmonics > 50) throw new BadInputException("--harmonics: " + harmonics + " must be between 2 and 50");
        positive("--load", load);
        positive("--fundamental", fundamental);
        positive("--fs-volts", fsVolts);
        positive("--probe", probe);
        positive("--sample-rate", sampleRate);
        if (channel != null && channel < 1) throw new BadInputException("--channel: " + channel + " must be 1 or more");
        if (reference != null && reference < 1) throw new BadInputException("--reference: " + reference + " must be 1 or more");
        Optional<List<ChannelRole>> r = explicitRoles();
        if (reference != null && r.isPresent() && !r.map(ChannelRole::generatorChannel).get().equals(OptionalInt.of(reference)))
            throw new BadInputException("--reference " + reference + " and --roles " + roles + " disagree about the generator channel");
        return new AnalysisSettings(band, w, harmonics, opt(fundamental), opt(load), OptionalInt.empty());
    }

    /** The chosen channel (1-based), if any. */
    public OptionalInt channel() { return channel == null ? OptionalInt.empty() : OptionalInt.of(channel); }

    /** The reference channel (1-based) given on the command line ({@code --reference} or the generator in {@code --roles}), if any. */
    public OptionalInt reference() {
        if (reference != null) return OptionalInt.of(reference);
        return explicitRoles().map(ChannelRole::generatorChannel).orElse(OptionalInt.empty());
    }

    /** The roles given with {@code --roles}, if any; a bad word is a {@link BadInputException}. */
    public Optional<List<ChannelRole>> explicitRoles() {
        if (roles == null) return Optional.empty();
        try {
            return Optional.of(ChannelRole.parseList(roles));
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--roles: " + e.getMessage());
        }
    }

    /**
     * The generator channel (1-based) of a capture file: from the options when they name one ({@code --reference},
     * {@code --roles}), else from the calibration notes ({@code bench.txt}) in the file's folder, else none. The one
     * place the command line decides a channel's role.
     */
    public OptionalInt generatorChannelFor(Path file) {
        if (reference != null || roles != null) return reference();
        Path folder = file.toAbsolutePath().getParent();
        if (folder == null) return OptionalInt.empty();
        try {
            return BenchManifest.forFolder(folder).entryFor(file).generatorChannel();
        } catch (CaptureFormatException e) {
            throw new BadInputException(folder.resolve(e.getMessage()).toString());
        }
    }

    /** A short label of the calibration, used to refuse a level series that mixes calibrations. */
    public String calibrationLabel() {
        if (fsVolts != null) return "fs-volts " + fsVolts;
        if (probe != null) return "probe " + probe;
        return "uncalibrated";
    }

    private static void positive(String name, Double v) {
        if (v != null && !(v > 0 && Double.isFinite(v))) throw new BadInputException(name + ": " + v + " must be a positive number");
    }

    private static OptionalDouble opt(Double v) { return v == null ? OptionalDouble.empty() : OptionalDouble.of(v); }
}
