package org.outstage.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalInt;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Band;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.Levels;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.SpecConditions;
import org.outstage.analysis.StimulusKind;
import org.outstage.analysis.SweepResponse;
import org.outstage.analysis.stage.ClippingMetrics;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.capture.Capture;
import org.outstage.capture.CaptureFormatException;
import org.outstage.capture.CaptureReader;

/**
 * Reads one capture file and measures the channels the options select. The one place where the command
 * line turns files into {@link Measurement}s, so every command measures the same way.
 */
public final class Measuring {
    private Measuring() {}

    /**
     * The measurements of one file, with the reader's warnings, and its generator channel (1-based; not measured as
     * an output: no power, no verdict).
     */
    public record FileResult(String file, Capture capture, List<Measurement> measurements, OptionalInt generatorChannel) {
        public FileResult(String file, Capture capture, List<Measurement> measurements) {
            this(file, capture, measurements, OptionalInt.empty());
        }
    }

    /**
     * Opens and analyses {@code file}.
     *
     * @throws BadInputException one line naming the file and the problem (unreadable, malformed, channel missing)
     */
    public static FileResult measure(Path file, AnalyzeOptions options) {
        return result(analyse(file, options, options.channel()), options);
    }

    /**
     * One file opened and its selected channels measured, before the sweep check: what {@link #measure(Path, AnalyzeOptions)}
     * and the logbook's measurer both start from, so a command that needs both ({@code verify}) analyses a file once.
     */
    public record Analysed(Path file, Capture capture, List<Measurement> measurements, OptionalInt generatorChannel) {}

    /** Opens {@code file} and measures {@code channel} (every channel when empty) with the options' settings. */
    public static Analysed analyse(Path file, AnalyzeOptions options, OptionalInt channel) {
        AnalysisSettings settings = options.settings();
        Capture capture = open(file, options);
        OptionalInt generator = options.generatorChannelFor(file);
        return new Analysed(file, capture, measure(capture, settings, options.specConditions(), channel, generator, file.toString()), generator);
    }

    /** The {@link FileResult} of an analysed file: its measurements after the sweep check, with its notes as warnings. */
    public static FileResult result(Analysed a, AnalyzeOptions options) {
        Capture capture = a.capture();
        SweepChecked checked = checked(a.file(), capture, a.measurements(), a.generatorChannel(), options.specConditions().stimulus());
        if (!checked.notes().isEmpty()) capture = capture.withWarnings(checked.notes());
        return new FileResult(a.file().toString(), capture, checked.measurements(), a.generatorChannel());
    }

    /** {@link #sweepChecked}, its notes followed by the band-limited clipping notes of a soundcard WAV ({@link #clippingNotes}). */
    public static SweepChecked checked(Path file, Capture capture, List<Measurement> ms, OptionalInt generator, StimulusKind stimulus) {
        SweepChecked s = sweepChecked(capture, ms, generator, stimulus);
        List<String> notes = new ArrayList<>(s.notes());
        notes.addAll(clippingNotes(file, s.measurements()));
        return new SweepChecked(s.measurements(), List.copyOf(notes));
    }

    /** For a soundcard WAV, one note per channel whose clipping figures are band-limited ({@link ClippingMetrics#BAND_LIMITED_NOTE}). */
    static List<String> clippingNotes(Path file, List<Measurement> ms) {
        boolean wav;
        try {
            wav = CaptureReader.isWav(file);
        } catch (CaptureFormatException e) {
            return List.of();
        }
        if (!wav) return List.of();
        List<String> out = new ArrayList<>();
        for (Measurement m : ms)
            if (m.stage() instanceof StageDiagnosis.Measured d && d.clipping().detected())
                out.add("channel " + m.channel() + ": clipping figures " + ClippingMetrics.BAND_LIMITED_NOTE);
        return out;
    }

    /** Measurements after {@link #sweepChecked}, and one note per channel found to be a sweep. */
    public record SweepChecked(List<Measurement> measurements, List<String> notes) {}

    /**
     * A channel with no tone beside a generator channel may be an exponential sweep (SweepResponse's rule, as verify
     * and the workbench read it): then it is no noise capture, and its "hum" lines would be the sweep's. Such a
     * channel loses its noise figures and gets a note naming the sweep and `response`.
     */
    public static SweepChecked sweepChecked(Capture capture, List<Measurement> ms, OptionalInt generator, StimulusKind stimulus) {
        if (generator.isEmpty() || capture.frameCount() > SWEEP_CHECK_MAX_FRAMES) return new SweepChecked(ms, List.of());
        List<Measurement> checked = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        for (Measurement m : ms) {
            if (m.noise().isPresent() && SweepResponse.sweepCandidate(m, stimulus)) {
                try {
                    FrequencyResponse r = SweepResponse.measure(capture.readChannel(m.channel() - 1),
                            capture.readChannel(generator.getAsInt() - 1), capture.sampleRateHz(), true, Band.AUDIO_20_20K);
                    m = m.withSpecFigures(m.imd(), Optional.empty(), m.crosstalk());
                    notes.add(String.format(Locale.ROOT, "channel %d is an exponential sweep (%s to %s in %.3g s) against the generator on channel %d:"
                            + " its response and THD against frequency come from `response`; no noise or hum figures", m.channel(),
                            Levels.formatHz(r.sweepLowHz()), Levels.formatHz(r.sweepHighHz()), r.sweepSeconds(), generator.getAsInt()));
                } catch (IllegalArgumentException e) {
                    // not a sweep: the noise figures stand
                }
            }
            checked.add(m);
        }
        return new SweepChecked(List.copyOf(checked), List.copyOf(notes));
    }

    /** Longest capture (frames) read whole to check for a sweep: 2^22, 44 s at 96 kHz. */
    static final long SWEEP_CHECK_MAX_FRAMES = 1L << 22;

    /** Opens a capture with the options' calibration; a reader error becomes a {@link BadInputException}. */
    public static Capture open(Path file, AnalyzeOptions options) {
        if (!Files.exists(file)) throw new BadInputException(file + ": no such file");
        try {
            return CaptureReader.open(file, options.captureOptions());
        } catch (CaptureFormatException e) {
            throw new BadInputException(e.getMessage().startsWith(file.getFileName().toString()) && !file.toString().equals(file.getFileName().toString())
                    ? file.getParent() + java.io.File.separator + e.getMessage() : e.getMessage(), e);
        }
    }

    /** Measures the selected channels of an open capture (1-based channel numbers). */
    public static List<Measurement> measure(Capture capture, AnalysisSettings settings, OptionalInt channel, OptionalInt reference, String label) {
        return measure(capture, settings, SpecConditions.AUTO, channel, reference, label);
    }

    /** Measures the selected channels with the spec-sheet conditions (stimulus, driven channel, rated power). */
    public static List<Measurement> measure(Capture capture, AnalysisSettings settings, SpecConditions conditions, OptionalInt channel,
                                            OptionalInt reference, String label) {
        if (conditions.drivenChannel().isPresent() && conditions.drivenChannel().getAsInt() > capture.channelCount())
            throw new BadInputException(label + ": --driven " + conditions.drivenChannel().getAsInt() + " does not exist (the capture has "
                    + capture.channelCount() + ")");
        int count = capture.channelCount();
        if (channel.isPresent() && channel.getAsInt() > count)
            throw new BadInputException(label + ": --channel " + channel.getAsInt() + " does not exist (the capture has " + count + ")");
        if (reference.isPresent() && reference.getAsInt() > count)
            throw new BadInputException(label + ": --reference " + reference.getAsInt() + " does not exist (the capture has " + count + ")");
        if (reference.isPresent() && channel.isPresent() && reference.getAsInt() == channel.getAsInt())
            throw new BadInputException(label + ": --reference and --channel name the same channel " + channel.getAsInt());
        if (reference.isPresent() && count < 2)
            throw new BadInputException(label + ": --reference needs a second channel (the capture has 1)");
        AnalysisSettings s = reference.isPresent() ? settings.withReferenceChannel(reference.getAsInt()) : settings;
        List<Measurement> out = new ArrayList<>();
        for (int c = 1; c <= count; c++) {
            if (channel.isPresent() && c != channel.getAsInt()) continue;
            if (reference.isPresent() && c == reference.getAsInt()) continue;
            out.add(Analyzer.analyze(capture, c - 1, s, conditions));
        }
        return out;
    }
}
