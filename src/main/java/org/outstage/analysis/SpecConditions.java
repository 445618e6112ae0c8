package org.outstage.analysis;

import java.util.OptionalDouble;
import java.util.OptionalInt;
import org.outstage.Require;

/**
 * The test conditions that the spec-sheet figures (intermodulation, noise and hum, crosstalk) need beyond
 * {@link AnalysisSettings}. Immutable.
 *
 * @param stimulus        what drove the amplifier, or {@link StimulusKind#AUTO} to recognise it
 * @param drivenChannel   the one driven channel (1-based) of a crosstalk capture; the others are undriven
 * @param ratedPowerWatts rated output power, for the signal-to-noise ratio against rated power (with a load)
 */
public record SpecConditions(StimulusKind stimulus, OptionalInt drivenChannel, OptionalDouble ratedPowerWatts) {
    /** Recognise the stimulus, no driven channel, no rated power. */
    public static final SpecConditions AUTO = new SpecConditions(StimulusKind.AUTO, OptionalInt.empty(), OptionalDouble.empty());

    public SpecConditions {
        Require.notNull("stimulus", stimulus);
        Require.notNull("drivenChannel", drivenChannel);
        Require.notNull("ratedPowerWatts", ratedPowerWatts);
        if (drivenChannel.isPresent()) Require.positive("drivenChannel", drivenChannel.getAsInt());
        if (ratedPowerWatts.isPresent()) Require.positive("ratedPowerWatts", ratedPowerWatts.getAsDouble());
    }

    public SpecConditions withStimulus(StimulusKind s) { return new SpecConditions(s, drivenChannel, ratedPowerWatts); }
    public SpecConditions withDrivenChannel(int ch) { return new SpecConditions(stimulus, OptionalInt.of(ch), ratedPowerWatts); }
    public SpecConditions withRatedPowerWatts(double w) { return new SpecConditions(stimulus, drivenChannel, OptionalDouble.of(w)); }
}
