package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

class WeightingTest {
    /**
     * IEC 61672-1:2013, Table 3, A-weighting nominal column (dB) at the 34 exact base-10 mid-band frequencies
     * f = 1000·10^(n/10), n = −20…13 (transcription: docs/references.md §1.2, CONFIRMED from jmrplens/phonometry
     * tests/reference_data.py, IEC61672_TABLE3). Tolerance ±0.05 dB: the print rounding of the table.
     */
    private static final double[] TABLE3_A = {
        -70.4, -63.4, -56.7, -50.5, -44.7, -39.4, -34.6, -30.2, -26.2, -22.5, -19.1, -16.1, -13.4, -10.9, -8.6, -6.6, -4.8,
        -3.2, -1.9, -0.8, 0.0, 0.6, 1.0, 1.2, 1.3, 1.2, 1.0, 0.5, -0.1, -1.1, -2.5, -4.3, -6.6, -9.3};

    @Test
    void aWeighting_matchesIec61672Table3() {
        assertEquals(34, TABLE3_A.length);
        for (int i = 0; i < TABLE3_A.length; i++) {
            double f = 1000 * Math.pow(10, (i - 20) / 10.0);
            assertEquals(TABLE3_A[i], Weighting.A.db(f), 0.05, "A-weighting at " + f + " Hz");
        }
    }

    /** Exact normalisation: 0.000 dB at 1 kHz (docs/references.md §1.1 normalisation trap: the printed −2.000 dB gives +0.0003 dB). */
    @Test
    void aWeighting_isZeroDbAtOneKilohertz() {
        assertEquals(0.0, Weighting.A.db(1000), 1e-12);
    }

    /** Pole frequencies from the Annex E design constants (docs/references.md §1.1, COMPUTED values). */
    @Test
    void aWeighting_polesMatchAnnexE() {
        double[] p = Weighting.polesHz();
        assertEquals(20.598997, p[0], 1e-6);
        assertEquals(107.65265, p[1], 1e-5);
        assertEquals(737.86223, p[2], 1e-5);
        assertEquals(12194.217, p[3], 1e-3);
    }

    /** docs/references.md §11: A(997 Hz) = −0.009 dB, A(19.95 kHz) = −9.32 dB (COMPUTED there). */
    @Test
    void aWeighting_checkFrequencies() {
        assertEquals(-0.009, Weighting.A.db(997), 0.0005);
        assertEquals(-9.32, Weighting.A.db(19952.6), 0.005);
        assertEquals(0.0, Weighting.NONE.db(50), 0);
    }
}
