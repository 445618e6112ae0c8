package org.outstage.analysis;

import java.util.List;
import java.util.OptionalDouble;
import org.outstage.Require;

/**
 * Output noise and hum of a capture made without a test signal (input shorted or terminated). Levels in the
 * capture's unit. The noise is everything in the band (hum included), from the averaged power spectrum
 * (Welch 1967) summed over the band's bins; A-weighted with the analytic IEC 61672-1:2013 Annex E curve.
 *
 * @param rms             rms in the band, unweighted
 * @param rmsA            rms in the band, A-weighted (IEC 61672-1)
 * @param lowHz           lower band edge
 * @param highHz          upper band edge (limited to Nyquist)
 * @param mainsHz         the mains frequency found in the data (near 50 or 60 Hz), empty when no hum line stands clear
 * @param hum             the mains fundamental and its harmonics up to 1 kHz that stand clear of the noise
 * @param snrRe1WDb       20·lg(V(1 W)/rms), V(1 W) = √(1 W·R_L); with a load and a capture in volts (common practice)
 * @param snrRe1WADb      the same against the A-weighted noise
 * @param snrReRatedDb    20·lg(V(P_rated)/rms), with a load, a rated power and a capture in volts
 * @param snrReRatedADb   the same against the A-weighted noise
 */
public record NoiseFigures(double rms, double rmsA, double lowHz, double highHz, OptionalDouble mainsHz, List<HumLine> hum,
                           OptionalDouble snrRe1WDb, OptionalDouble snrRe1WADb, OptionalDouble snrReRatedDb,
                           OptionalDouble snrReRatedADb) {
    public NoiseFigures {
        Require.nonNegative("rms", rms);
        Require.nonNegative("rmsA", rmsA);
        Require.notNull("mainsHz", mainsHz);
        hum = List.copyOf(hum);
        Require.notNull("snrRe1WDb", snrRe1WDb);
        Require.notNull("snrRe1WADb", snrRe1WADb);
        Require.notNull("snrReRatedDb", snrReRatedDb);
        Require.notNull("snrReRatedADb", snrReRatedADb);
    }

    /**
     * One hum line.
     *
     * @param harmonic    k: the line is k × mains
     * @param frequencyHz where it lies
     * @param rms         its rms level, noise under the line subtracted
     */
    public record HumLine(int harmonic, double frequencyHz, double rms) {}

    /** 20·lg(rms): dBV for a capture in volts (dB re 1 unit otherwise). */
    public double db() { return Levels.ratioToDb(rms); }
    public double dbA() { return Levels.ratioToDb(rmsA); }
}
