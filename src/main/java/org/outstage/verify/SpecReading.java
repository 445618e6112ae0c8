package org.outstage.verify;

import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import org.outstage.analysis.Crosstalk;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.Intermodulation;
import org.outstage.analysis.NoiseFigures;
import org.outstage.analysis.OutputImpedance;

/**
 * The spec-sheet figures of one channel of one capture (or of a pair, for the output impedance), as handed to the
 * {@link Verifier}: measured elsewhere, only read here.
 *
 * @param captureName the capture (for the impedance: the loaded capture)
 * @param channel     channel (1-based)
 * @param unit        "V" or "FS"
 * @param loadOhms    the load the capture was made into, when given
 */
public record SpecReading(String captureName, int channel, String unit, OptionalDouble loadOhms, Optional<Intermodulation> imd,
                          Optional<NoiseFigures> noise, Optional<Crosstalk> crosstalk, Optional<FrequencyResponse> response,
                          Optional<OutputImpedance> impedance) {
    public SpecReading {
        Objects.requireNonNull(captureName, "captureName");
        Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(loadOhms, "loadOhms");
        Objects.requireNonNull(imd, "imd");
        Objects.requireNonNull(noise, "noise");
        Objects.requireNonNull(crosstalk, "crosstalk");
        Objects.requireNonNull(response, "response");
        Objects.requireNonNull(impedance, "impedance");
    }

    public static SpecReading of(String captureName, int channel, String unit, OptionalDouble loadOhms) {
        return new SpecReading(captureName, channel, unit, loadOhms, Optional.empty(), Optional.empty(), Optional.empty(), Optional.empty(),
                Optional.empty());
    }

    public SpecReading withImd(Optional<Intermodulation> v) { return new SpecReading(captureName, channel, unit, loadOhms, v, noise, crosstalk, response, impedance); }
    public SpecReading withNoise(Optional<NoiseFigures> v) { return new SpecReading(captureName, channel, unit, loadOhms, imd, v, crosstalk, response, impedance); }
    public SpecReading withCrosstalk(Optional<Crosstalk> v) { return new SpecReading(captureName, channel, unit, loadOhms, imd, noise, v, response, impedance); }
    public SpecReading withResponse(Optional<FrequencyResponse> v) { return new SpecReading(captureName, channel, unit, loadOhms, imd, noise, crosstalk, v, impedance); }
    public SpecReading withImpedance(Optional<OutputImpedance> v) { return new SpecReading(captureName, channel, unit, loadOhms, imd, noise, crosstalk, response, v); }
}
