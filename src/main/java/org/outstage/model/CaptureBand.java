package org.outstage.model;

import org.outstage.Require;

/**
 * The band a capture kept: its band edge and the fundamental of the test tone, so the bias fit can pass the model's
 * curve through the same band (docs/model.md §6). A steady sine through a static curve gives harmonics of the
 * fundamental only; the fit keeps harmonics 0…H with H = ⌊bandHz / fundamentalHz⌋ ({@link #harmonics()}) and drops
 * the rest: an ideal (brick-wall) filter in place of the capture's anti-alias filter.
 *
 * <p>The band edge is the filter's half-amplitude point, the middle of its transition band, not the end of its
 * passband: a real filter still passes most of a harmonic just above its passband edge and little of one just below
 * its stopband. On the sample captures (flat to 20 kHz, 120 dB down from 24 kHz, half amplitude at 22 kHz) the 21st
 * harmonic of 997 Hz (20.94 kHz) passes at 0.97 and the 23rd (22.93 kHz) at 0.05; an edge at 20 kHz (H = 20) fits the
 * 3 mV capture with an RMS residual of 0.20 %, an edge at 22 kHz (H = 22) with 0.014 %, its noise level.
 *
 * <p>Worked case: a 997 Hz tone through a 22 kHz band keeps H = 22 (21.93 kHz).
 *
 * @param bandHz        band edge of the capture: where its anti-alias filter passes half the amplitude, &gt; 0
 * @param fundamentalHz frequency of the test tone, &gt; 0
 */
public record CaptureBand(double bandHz, double fundamentalHz) {
    public CaptureBand {
        Require.positive("bandHz", bandHz);
        Require.positive("fundamentalHz", fundamentalHz);
    }

    /**
     * A soundcard's band edge as a share of its sample rate: 0.4583·fs (22 kHz at 48 kHz, 44 kHz at 96 kHz), the middle
     * of the transition band of an anti-alias filter that is flat to 0.4167·fs (20 kHz at 48 kHz) and stops at fs/2.
     * Common practice, from memory; not checked against a published data sheet. The sample captures' modelled filter
     * (tools/GenerateSampleCaptures.java) has exactly this shape.
     */
    public static final double SOUNDCARD_BAND_FRACTION = 22_000.0 / 48_000.0;

    /** Harmonics of the fundamental inside the band: ⌊bandHz / fundamentalHz⌋ (0 when the tone itself is above it). */
    public int harmonics() {
        double h = Math.floor(bandHz / fundamentalHz * (1 + 1e-12));
        return h > Integer.MAX_VALUE ? Integer.MAX_VALUE : (int) h;
    }
}
