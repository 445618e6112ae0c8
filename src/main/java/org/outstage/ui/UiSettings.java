package org.outstage.ui;

import java.util.OptionalInt;
import org.outstage.Require;

/**
 * The analysis settings the workbench offers: measurement band, weighting, highest harmonic and the
 * reference (generator) channel. Mapped onto the analysis settings by the backend.
 *
 * @param band             one of the offered bands
 * @param aWeighting       A-weighting (IEC 61672-1) on the noise and distortion of THD+N
 * @param harmonics        highest harmonic order N shown and summed (2..50)
 * @param referenceChannel 0-based channel holding the generator signal, or empty
 */
public record UiSettings(BandChoice band, boolean aWeighting, int harmonics, OptionalInt referenceChannel) {
    public UiSettings {
        Require.notNull("band", band);
        Require.inRange("harmonics", harmonics, 2, 50);
        Require.notNull("referenceChannel", referenceChannel);
    }

    public static final UiSettings DEFAULT = new UiSettings(BandChoice.AUDIO_20_20K, false, 10, OptionalInt.empty());

    /** Bands offered in the settings box. */
    public enum BandChoice {
        AUDIO_20_20K("20 Hz – 20 kHz", 20, 20_000),
        AUDIO_22_22K("22 Hz – 22 kHz", 22, 22_000),
        WIDE_80K("20 Hz – 80 kHz (wideband)", 20, 80_000),
        NYQUIST("to half the sample rate", 0, Double.POSITIVE_INFINITY);

        final String label;
        final double lowHz, highHz;

        BandChoice(String label, double lowHz, double highHz) { this.label = label; this.lowHz = lowHz; this.highHz = highHz; }

        @Override public String toString() { return label; }
    }

    UiSettings withBand(BandChoice b) { return new UiSettings(b, aWeighting, harmonics, referenceChannel); }
    UiSettings withAWeighting(boolean a) { return new UiSettings(band, a, harmonics, referenceChannel); }
    UiSettings withHarmonics(int n) { return new UiSettings(band, aWeighting, n, referenceChannel); }
    UiSettings withReference(OptionalInt c) { return new UiSettings(band, aWeighting, harmonics, c); }
}
