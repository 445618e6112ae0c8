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
import picocli.CommandLine.Model.CommandSpec;

/**
 * The options shared by every command that reads and measures captures ({@code analyze}, {@code sweep},
 * {@code fit}, {@code session add}, {@code watch}, {@code verify}, {@code live}, {@code impedance}). A picocli mixin
 * built in code ({@link #mixin()}).
 */
public final class AnalyzeOptions {
    Integer channel;
    String bandwidth;
    String weighting;
    int harmonics;
    Double fsVolts;
    Double probe;
    Double sampleRate;
    Double load;
    Double fundamental;
    Integer reference;
    String roles;
    String stimulus;
    Integer driven;
    Double ratedPower;

    /** The name under which these options are mixed into a command's model. */
    static final String MIXIN = "analysis";

    /**
     * These options as a picocli mixin bound to this object's fields, in the order help lists them. Built in code
     * ({@link CodeModel}: no annotation is read on the analyze path); a command adds it with
     * {@code spec.addMixin(AnalyzeOptions.MIXIN, options.mixin())}.
     */
    CommandSpec mixin() {
        CommandSpec m = CommandSpec.wrapWithoutInspection(this);
        m.addOption(CodeModel.option("--channel", Integer.class, "N", "Channel to analyse, from 1 (default: every channel).",
                CodeModel.bind(() -> channel, v -> channel = (Integer) v)).build());
        m.addOption(CodeModel.option("--bandwidth", String.class, "LOW-HIGH",
                "Measurement band for THD+N and harmonics: LOW-HIGH in Hz (e.g. 20-20k, 22-22k), 'wide' (20 Hz-80 kHz) or 'nyquist'. Default: ${DEFAULT-VALUE}.",
                CodeModel.bind(() -> bandwidth, v -> bandwidth = (String) v)).defaultValue("20-20k").build());
        m.addOption(CodeModel.option("--weighting", String.class, "A|none",
                "Weighting of noise and distortion in THD+N: A (IEC 61672-1) or none. Default: ${DEFAULT-VALUE}.",
                CodeModel.bind(() -> weighting, v -> weighting = (String) v)).defaultValue("none").build());
        m.addOption(CodeModel.option("--harmonics", int.class, "N",
                "Highest harmonic order in THD (2..50, limited by the band). Default: ${DEFAULT-VALUE}.",
                CodeModel.bind(() -> harmonics, v -> harmonics = (Integer) v)).defaultValue("10").build());
        m.addOption(CodeModel.option("--fs-volts", Double.class, "V",
                "WAV calibration: peak volts at the amplifier output that reach digital full scale, divider included.",
                CodeModel.bind(() -> fsVolts, v -> fsVolts = (Double) v)).converters(new Units.Volts()).build());
        m.addOption(CodeModel.option("--probe", Double.class, "X", "Scope CSV calibration: multiply values by X (probe ratio not applied by the export).",
                CodeModel.bind(() -> probe, v -> probe = (Double) v)).build());
        m.addOption(CodeModel.option("--sample-rate", Double.class, "HZ", "Sample rate for a scope CSV without time column or interval.",
                CodeModel.bind(() -> sampleRate, v -> sampleRate = (Double) v)).converters(new Units.Hertz()).build());
        m.addOption(CodeModel.option("--load", Double.class, "OHMS", "Load resistance, for output power (P = Vrms^2/R; needs volts).",
                CodeModel.bind(() -> load, v -> load = (Double) v)).converters(new Units.Ohms()).build());
        m.addOption(CodeModel.option("--fundamental", Double.class, "HZ", "Expected fundamental frequency (default: strongest line).",
                CodeModel.bind(() -> fundamental, v -> fundamental = (Double) v)).converters(new Units.Hertz()).build());
        m.addOption(CodeModel.option("--reference", Integer.class, "N",
                "Channel (from 1) that carries the generator signal: gives the X-Y transfer curve of the other channels; it gets no power and no verdict. Default: the bench.txt beside the capture (reference= or roles=).",
                CodeModel.bind(() -> reference, v -> reference = (Integer) v)).build());
        m.addOption(CodeModel.option("--roles", String.class, "ROLE,...",
                "Role of each channel from channel 1: output, generator, left or right (e.g. generator,output). Default: from --reference, else the bench.txt beside the capture, else every channel an output.",
                CodeModel.bind(() -> roles, v -> roles = (String) v)).build());
        m.addOption(CodeModel.option("--stimulus", String.class, "KIND",
                "What drove the amplifier: smpte, twin, sine, sweep, none (input shorted: noise and hum) or auto (recognise two tones or no tone). Default: auto.",
                CodeModel.bind(() -> stimulus, v -> stimulus = (String) v)).build());
        m.addOption(CodeModel.option("--driven", Integer.class, "N",
                "The one driven channel (from 1) of a crosstalk capture: the other channels report the driven tone's level in dB.",
                CodeModel.bind(() -> driven, v -> driven = (Integer) v)).build());
        m.addOption(CodeModel.option("--rated-power", Double.class, "W", "Rated output power, for the signal-to-noise ratio re rated power (with --load).",
                CodeModel.bind(() -> ratedPower, v -> ratedPower = (Double) v)).build());
        return m;
    }

    /** These options read from {@code args} alone (defaults for what is not given); a bad one is a picocli parameter error. */
    static AnalyzeOptions parse(String... args) {
        AnalyzeOptions o = new AnalyzeOptions();
        new picocli.CommandLine(o.mixin()).parseArgs(args);
        return o;
    }

    /**
     * Adds the shared measurement options to the model of an annotated command that holds them
     * ({@link MeasuresCaptures}); used as its {@code @Command(modelTransformer = ...)}. They come where the command
     * says ({@link MeasuresCaptures#analyzeOptionsBefore()}), else after its own options; help and version stay last. picocli runs a transformer when a {@code CommandLine} is made from the
     * command (or from a parent that names it), not when a class is added with {@code addSubcommand(name, Class)}:
     * {@link OutstageCommand} makes each subcommand's {@code CommandLine} first.
     */
    public static final class Added implements picocli.CommandLine.IModelTransformer {
        @Override
        public CommandSpec transform(CommandSpec spec) {
            if (!(spec.userObject() instanceof MeasuresCaptures c) || spec.mixins().containsKey(MIXIN)) return spec;
            // options from the command's anchor on, and the standard help options, are taken off and put back after
            List<picocli.CommandLine.Model.OptionSpec> after = new java.util.ArrayList<>();
            boolean past = false;
            for (var o : spec.options()) {
                past |= List.of(o.names()).contains(c.analyzeOptionsBefore());
                // (an option of an argument group stays where it is: picocli cannot take it off)
                if ((past || o.usageHelp() || o.versionHelp()) && o.group() == null) after.add(o);
            }
            for (var o : after) spec.remove(o);
            spec.addMixin(MIXIN, c.analyzeOptions().mixin());
            for (var o : after) spec.addOption(o);
            return spec;
        }
    }

    /** A command that reads and measures captures with these options. */
    interface MeasuresCaptures {
        AnalyzeOptions analyzeOptions();

        /** The command's own option that help lists right after these options; none: they come before help and version. */
        default String analyzeOptionsBefore() { return ""; }
    }

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
