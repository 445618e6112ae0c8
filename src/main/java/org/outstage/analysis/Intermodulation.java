package org.outstage.analysis;

import java.util.List;
import org.outstage.Require;

/**
 * Two-tone intermodulation distortion of one channel. Amplitudes are rms values of spectral lines (power summed
 * over the analysis window's main lobe, noise under the line subtracted). Conventions (docs/methods.md,
 * "Intermodulation"):
 * <ul>
 * <li>{@link Method#MODULATION} (SMPTE RP120 practice; IEC 60268-3 "modulation distortion"): f1 the low, strong
 *     tone, f2 the high tone. For orders n = 2…5, {@code dn = [U(f2 − (n−1)·f1) + U(f2 + (n−1)·f1)] / U(f2)}
 *     (the two sidebands of one order added arithmetically); {@code IMD = √(Σ dn²)}.</li>
 * <li>{@link Method#DIFFERENCE_FREQUENCY} (IEC 60268-3 / DIN 45403 twin tone): f1 &lt; f2 of about equal level.
 *     {@code d2 = U(f2 − f1) / (U(f1) + U(f2))}, {@code d3 = [U(2f1 − f2) + U(2f2 − f1)] / (U(f1) + U(f2))},
 *     {@code IMD = √(d2² + d3²)}. The reference U(f1) + U(f2) is one of the conventions in circulation
 *     (docs/references.md §3 lists the others).</li>
 * </ul>
 *
 * @param method       which convention
 * @param f1Hz         the first tone (the low, strong one for the modulation method; the lower one for twin)
 * @param f2Hz         the second tone
 * @param f1Rms        rms of the f1 line, in the capture's unit
 * @param f2Rms        rms of the f2 line
 * @param ratio        amplitude ratio U(f1)/U(f2) (4 for SMPTE 4:1, about 1 for twin)
 * @param imdRatio     IMD as a fraction
 * @param orderRatios  dn for n = 2, 3, … (modulation: 2…5; difference frequency: 2, 3); 0 where a product falls
 *                     outside 0…Nyquist
 * @param products     every product line used, with its level
 * @param stimulusFromCapture true when the method was recognised from the capture, false when it was given
 */
public record Intermodulation(Method method, double f1Hz, double f2Hz, double f1Rms, double f2Rms, double ratio,
                              double imdRatio, List<Double> orderRatios, List<Product> products, boolean stimulusFromCapture) {
    public Intermodulation {
        Require.notNull("method", method);
        Require.positive("f1Hz", f1Hz);
        Require.positive("f2Hz", f2Hz);
        Require.nonNegative("imdRatio", imdRatio);
        orderRatios = List.copyOf(orderRatios);
        products = List.copyOf(products);
    }

    /** The two conventions. */
    public enum Method {
        /** Modulation method, SMPTE RP120 practice (JSON "smpte"). */
        MODULATION("smpte"),
        /** Difference-frequency (twin-tone) method, IEC 60268-3 / DIN 45403 (JSON "difference-frequency"). */
        DIFFERENCE_FREQUENCY("difference-frequency");

        private final String label;
        Method(String label) { this.label = label; }
        public String label() { return label; }
    }

    /**
     * One intermodulation product.
     *
     * @param order       the order n of the product (2 for f2 ± f1, 3 for f2 ± 2f1 or 2f1 − f2, …)
     * @param frequencyHz where it lies
     * @param rms         its rms level (an upper bound when not {@code resolved})
     * @param ratio       rms relative to the method's reference: U(f2) (modulation) or U(f1) + U(f2) (difference frequency)
     * @param resolved    whether the line stands at least 10 dB above the noise in its own bins
     */
    public record Product(int order, double frequencyHz, double rms, double ratio, boolean resolved) {
        public double dbc() { return Levels.ratioToDb(ratio); }
    }

    /** dn of order n (2…), or 0 when not computed. */
    public double order(int n) { return n - 2 < orderRatios.size() && n >= 2 ? orderRatios.get(n - 2) : 0; }

    public double percent() { return Levels.ratioToPercent(imdRatio); }
    public double db() { return Levels.ratioToDb(imdRatio); }
}
