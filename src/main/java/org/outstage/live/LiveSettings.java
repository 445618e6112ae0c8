package org.outstage.live;

import java.nio.file.Path;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.audio.LineFormat;
import org.outstage.audio.SampleFormat;
import org.outstage.stimulus.Stimulus;

/**
 * Everything a {@link LiveSession} needs.
 *
 * @param inputDevice      substring of the input device name; empty for the system default
 * @param outputDevice     substring of the output device name; empty for the system default
 * @param inputFormat      rate, encoding and channels (1 or 2) of the capture
 * @param outputFormat     encoding of the playback line (same rate as the input; 2 channels, the stimulus on both)
 * @param blockSeconds     length of one analysed block
 * @param hopSeconds       time between block starts (equal to the block: no overlap; shorter: overlap)
 * @param stimulus         what to play while capturing; empty to capture only
 * @param levelDbfs        stimulus level, dBFS peak
 * @param allowLoud        allow a start above {@link org.outstage.stimulus.Generator#SAFE_START_DBFS}
 * @param recordFile       where to keep the raw input (32-bit float WAV); empty for none
 * @param analysis         analysis settings, as for {@code analyze}
 * @param channel          the one channel (from 1) to analyse; empty for every channel
 * @param reference        the channel (from 1) carrying the generator signal; empty for none
 * @param fullScaleVolts   peak volts at full scale (calibration); empty for full-scale units
 */
public record LiveSettings(Optional<String> inputDevice, Optional<String> outputDevice, LineFormat inputFormat, SampleFormat outputFormat,
                           double blockSeconds, double hopSeconds, Optional<Stimulus> stimulus, double levelDbfs, boolean allowLoud,
                           Optional<Path> recordFile, AnalysisSettings analysis, OptionalInt channel, OptionalInt reference,
                           OptionalDouble fullScaleVolts) {
    public LiveSettings {
        if (!(blockSeconds >= 0.05 && blockSeconds <= 60)) throw new IllegalArgumentException("block " + blockSeconds + " s must be between 0.05 and 60 s");
        if (!(hopSeconds > 0 && hopSeconds <= blockSeconds))
            throw new IllegalArgumentException("hop " + hopSeconds + " s must be positive and no longer than the block (" + blockSeconds + " s)");
        if (channel.isPresent() && (channel.getAsInt() < 1 || channel.getAsInt() > inputFormat.channels()))
            throw new IllegalArgumentException("channel " + channel.getAsInt() + " does not exist (the input has " + inputFormat.channels() + ")");
        if (reference.isPresent() && (reference.getAsInt() < 1 || reference.getAsInt() > inputFormat.channels()))
            throw new IllegalArgumentException("reference channel " + reference.getAsInt() + " does not exist (the input has " + inputFormat.channels() + ")");
        if (reference.isPresent() && channel.isPresent() && reference.getAsInt() == channel.getAsInt())
            throw new IllegalArgumentException("the reference and the analysed channel are the same channel " + channel.getAsInt());
        if (fullScaleVolts.isPresent() && !(fullScaleVolts.getAsDouble() > 0 && Double.isFinite(fullScaleVolts.getAsDouble())))
            throw new IllegalArgumentException("full-scale volts " + fullScaleVolts.getAsDouble() + " must be a positive number");
        if (stimulus.isPresent()) org.outstage.stimulus.Generator.checkLevel(levelDbfs, allowLoud);
    }

    /** Capture only, default devices, 96 kHz 24-bit stereo, 1 s blocks without overlap, default analysis. */
    public static LiveSettings defaults() {
        return new LiveSettings(Optional.empty(), Optional.empty(), new LineFormat(96_000, SampleFormat.PCM_24, 2), SampleFormat.PCM_24, 1.0, 1.0,
                Optional.empty(), -20, false, Optional.empty(), AnalysisSettings.defaults(), OptionalInt.empty(), OptionalInt.empty(), OptionalDouble.empty());
    }

    public LiveSettings withDevices(Optional<String> input, Optional<String> output) {
        return new LiveSettings(input, output, inputFormat, outputFormat, blockSeconds, hopSeconds, stimulus, levelDbfs, allowLoud, recordFile, analysis, channel, reference, fullScaleVolts);
    }

    public LiveSettings withFormat(LineFormat input, SampleFormat output) {
        return new LiveSettings(inputDevice, outputDevice, input, output, blockSeconds, hopSeconds, stimulus, levelDbfs, allowLoud, recordFile, analysis, channel, reference, fullScaleVolts);
    }

    public LiveSettings withBlocks(double block, double hop) {
        return new LiveSettings(inputDevice, outputDevice, inputFormat, outputFormat, block, hop, stimulus, levelDbfs, allowLoud, recordFile, analysis, channel, reference, fullScaleVolts);
    }

    public LiveSettings withStimulus(Optional<Stimulus> s, double level, boolean loud) {
        return new LiveSettings(inputDevice, outputDevice, inputFormat, outputFormat, blockSeconds, hopSeconds, s, level, loud, recordFile, analysis, channel, reference, fullScaleVolts);
    }

    public LiveSettings withRecordFile(Optional<Path> file) {
        return new LiveSettings(inputDevice, outputDevice, inputFormat, outputFormat, blockSeconds, hopSeconds, stimulus, levelDbfs, allowLoud, file, analysis, channel, reference, fullScaleVolts);
    }

    public LiveSettings withAnalysis(AnalysisSettings a, OptionalInt ch, OptionalInt ref) {
        return new LiveSettings(inputDevice, outputDevice, inputFormat, outputFormat, blockSeconds, hopSeconds, stimulus, levelDbfs, allowLoud, recordFile, a, ch, ref, fullScaleVolts);
    }

    public LiveSettings withFullScaleVolts(OptionalDouble v) {
        return new LiveSettings(inputDevice, outputDevice, inputFormat, outputFormat, blockSeconds, hopSeconds, stimulus, levelDbfs, allowLoud, recordFile, analysis, channel, reference, v);
    }
}
