package org.outstage.cli;

import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import org.outstage.audio.LineFormat;
import org.outstage.audio.SampleFormat;
import org.outstage.live.LiveCautions;
import org.outstage.live.LiveSettings;
import org.outstage.live.UserSettings;
import org.outstage.stimulus.Stimulus;
import picocli.CommandLine.Option;

/**
 * Options shared by {@code live} and {@code session add --live}: devices, format, stimulus and level. A picocli
 * mixin. The sample rate is {@code --sample-rate} of {@link AnalyzeOptions} (one option, one meaning: the rate of the
 * samples being analysed; default 96000 for live input).
 */
public final class LiveOptions {
    @Option(names = "--input", paramLabel = "NAME", description = "Input device (a part of its name; see 'devices'). Default: the system default input.")
    String input;

    @Option(names = "--output", paramLabel = "NAME", description = "Output device for --play. Default: the system default output.")
    String output;

    @Option(names = "--play", paramLabel = "SIGNAL", description = "Play a test signal while capturing: sine:F, twin:F1,F2, smpte:F1,F2, sweep:F1-F2[,T], burst:F,ON,OFF, silence.")
    String play;

    @Option(names = "--level-dbfs", paramLabel = "L", defaultValue = "-20", description = "Peak level of --play in dBFS. Default: ${DEFAULT-VALUE}.")
    double levelDbfs;

    @Option(names = "--allow-loud", description = "Allow --play above -20 dBFS (check the attenuator and the load first).")
    boolean allowLoud;

    @Option(names = "--bits", paramLabel = "16|24|32|float", defaultValue = "24", description = "Sample format of the input and output lines. Default: ${DEFAULT-VALUE}.")
    String bits;

    @Option(names = "--channels", paramLabel = "N", defaultValue = "2", description = "Input channels, 1 or 2. Default: ${DEFAULT-VALUE}.")
    int channels;

    static final int DEFAULT_RATE_HZ = 96_000;

    /** The input format; {@code rate} from --sample-rate. */
    LineFormat inputFormat(Double rate) {
        SampleFormat sf = sampleFormat();
        int r = rate == null ? DEFAULT_RATE_HZ : (int) Math.round(rate);
        if (rate != null && r != rate) throw new BadInputException("--sample-rate: " + rate + " must be a whole number of hertz");
        if (channels < 1 || channels > 2) throw new BadInputException("--channels: " + channels + " must be 1 or 2");
        try {
            return new LineFormat(r, sf, channels);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--sample-rate: " + e.getMessage());
        }
    }

    SampleFormat sampleFormat() {
        try {
            return SampleFormat.parse(bits);
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--bits: " + e.getMessage());
        }
    }

    Optional<Stimulus> stimulus() {
        if (play == null) return Optional.empty();
        try {
            return Optional.of(Stimulus.parse(play));
        } catch (IllegalArgumentException e) {
            throw new BadInputException("--play: " + e.getMessage());
        }
    }

    /** The key under which a calibration is remembered: the device as named (or "default") plus PulseAudio's source, if set. */
    String deviceKey() {
        String src = System.getenv("PULSE_SOURCE");
        return (input == null ? "default" : input) + (src != null && !src.isBlank() ? "@" + src : "");
    }

    /** Live settings from these options and the analysis options; calibration: --fs-volts, else the remembered one. */
    LiveSettings settings(AnalyzeOptions a, UserSettings user) {
        var analysis = a.settings();
        LineFormat f = inputFormat(a.sampleRate);
        OptionalDouble fs = a.fsVolts != null ? OptionalDouble.of(a.fsVolts) : user.fullScaleVolts(deviceKey(), a.channel().orElse(1));
        try {
            return LiveSettings.defaults()
                    .withDevices(Optional.ofNullable(input), Optional.ofNullable(output))
                    .withFormat(f, sampleFormat())
                    .withStimulus(stimulus(), levelDbfs, allowLoud)
                    .withAnalysis(analysis, a.channel(), a.reference())
                    .withFullScaleVolts(fs);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(e.getMessage().contains("dBFS") ? "--level-dbfs: " + e.getMessage() : e.getMessage());
        }
    }

    /** Prints the live cautions on {@code err} once, then remembers that they were shown. */
    static void cautionsOnce(UserSettings user, java.io.PrintWriter err) {
        if (user.cautionsDismissed()) return;
        err.println("outstage: before the first live start:");
        for (String c : LiveCautions.TEXT) err.println("  - " + c);
        err.println("  (shown once; remembered in " + user.file() + ")");
        err.flush();
        try {
            user.dismissCautions();
        } catch (java.io.IOException e) {
            err.println("outstage: warning: could not remember the cautions in " + user.file() + ": " + e.getMessage());
        }
    }

    static OptionalInt opt(Integer v) { return v == null ? OptionalInt.empty() : OptionalInt.of(v); }
}
