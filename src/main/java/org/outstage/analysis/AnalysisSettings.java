package org.outstage.analysis;

import java.util.OptionalDouble;
import java.util.OptionalInt;
import org.outstage.Require;

/**
 * What to measure and how. Immutable; {@link #DEFAULT} is 20 Hz–20 kHz, unweighted, harmonics H2…H10,
 * fundamental found automatically, no load, bit depth unknown.
 *
 * @param band          band of THD+N, SINAD and the noise floor (brick-wall in the frequency domain)
 * @param weighting     weighting applied to the noise and distortion of THD+N
 * @param harmonics     highest harmonic order N of the profile H2…HN (2..50; default 10); orders above
 *                      the band's upper edge or the Nyquist frequency are left out
 * @param fundamentalHz optional hint for the fundamental; the fit starts there instead of at the
 *                      strongest spectral line
 * @param loadOhms      optional load resistance; output power is reported only with a load and a capture in volts
 * @param bitDepth      optional bit depth of the recording, for the quantisation floor (IEEE 1241);
 *                      the full-scale peak is taken as the capture's calibration scale
 * @param referenceChannel optional channel (1-based) carrying the generator signal; the stage diagnosis then
 *                      builds the X-Y transfer curve against it
 */
public record AnalysisSettings(Band band, Weighting weighting, int harmonics, OptionalDouble fundamentalHz,
                               OptionalDouble loadOhms, OptionalInt bitDepth, OptionalInt referenceChannel) {

    /** Default harmonic order N. */
    public static final int DEFAULT_HARMONICS = 10;

    /** 20 Hz–20 kHz, unweighted, H2…H10, no hints. */
    public static final AnalysisSettings DEFAULT = new AnalysisSettings(Band.AUDIO_20_20K, Weighting.NONE, DEFAULT_HARMONICS,
            OptionalDouble.empty(), OptionalDouble.empty(), OptionalInt.empty(), OptionalInt.empty());

    public AnalysisSettings {
        Require.notNull("band", band);
        Require.notNull("weighting", weighting);
        Require.notNull("fundamentalHz", fundamentalHz);
        Require.notNull("loadOhms", loadOhms);
        Require.notNull("bitDepth", bitDepth);
        Require.notNull("referenceChannel", referenceChannel);
        if (referenceChannel.isPresent() && referenceChannel.getAsInt() < 1)
            throw new IllegalArgumentException("referenceChannel=" + referenceChannel.getAsInt() + " must be >= 1");
        if (harmonics < 2 || harmonics > 50) throw new IllegalArgumentException("harmonics=" + harmonics + " must be in [2, 50]");
        if (fundamentalHz.isPresent()) Require.positive("fundamentalHz", fundamentalHz.getAsDouble());
        if (loadOhms.isPresent()) Require.positive("loadOhms", loadOhms.getAsDouble());
        if (bitDepth.isPresent() && (bitDepth.getAsInt() < 2 || bitDepth.getAsInt() > 64))
            throw new IllegalArgumentException("bitDepth=" + bitDepth.getAsInt() + " must be in [2, 64]");
    }

    /** Settings without a bit depth (the five components named in the design). */
    public AnalysisSettings(Band band, Weighting weighting, int harmonics, OptionalDouble fundamentalHz, OptionalDouble loadOhms) {
        this(band, weighting, harmonics, fundamentalHz, loadOhms, OptionalInt.empty(), OptionalInt.empty());
    }

    public AnalysisSettings(Band band, Weighting weighting, int harmonics, OptionalDouble fundamentalHz, OptionalDouble loadOhms,
                            OptionalInt bitDepth) {
        this(band, weighting, harmonics, fundamentalHz, loadOhms, bitDepth, OptionalInt.empty());
    }

    /** The same settings with the generator signal on channel {@code channel} (1-based): X-Y transfer curve. */
    public AnalysisSettings withReferenceChannel(int channel) {
        return new AnalysisSettings(band, weighting, harmonics, fundamentalHz, loadOhms, bitDepth, OptionalInt.of(channel));
    }

    public static AnalysisSettings defaults() { return DEFAULT; }

    public AnalysisSettings withBand(Band b) { return new AnalysisSettings(b, weighting, harmonics, fundamentalHz, loadOhms, bitDepth, referenceChannel); }
    public AnalysisSettings withWeighting(Weighting w) { return new AnalysisSettings(band, w, harmonics, fundamentalHz, loadOhms, bitDepth, referenceChannel); }
    public AnalysisSettings withHarmonics(int n) { return new AnalysisSettings(band, weighting, n, fundamentalHz, loadOhms, bitDepth, referenceChannel); }
    public AnalysisSettings withFundamentalHz(double hz) { return new AnalysisSettings(band, weighting, harmonics, OptionalDouble.of(hz), loadOhms, bitDepth, referenceChannel); }
    public AnalysisSettings withLoadOhms(double ohms) { return new AnalysisSettings(band, weighting, harmonics, fundamentalHz, OptionalDouble.of(ohms), bitDepth, referenceChannel); }
    public AnalysisSettings withBitDepth(int bits) { return new AnalysisSettings(band, weighting, harmonics, fundamentalHz, loadOhms, OptionalInt.of(bits), referenceChannel); }
}
