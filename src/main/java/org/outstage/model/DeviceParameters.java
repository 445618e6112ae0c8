package org.outstage.model;

import org.outstage.Require;

/**
 * Parameters of one bipolar transistor for the forward-active Ebers-Moll law used by the model
 * (see {@link DeviceLaw}). The same values describe the NPN and the PNP of a complementary pair.
 *
 * @param saturationCurrentAmps Is, the transport saturation current (SPICE IS), &gt; 0
 * @param emissionCoefficient   n, the forward emission coefficient (SPICE NF), &gt; 0
 * @param beta                  forward current gain Ic/Ib at low current (SPICE BF), &gt; 0
 * @param kneeCurrentAmps       high-injection knee current (SPICE IKF) where beta starts to fall;
 *                              {@code Double.POSITIVE_INFINITY} for none
 */
public record DeviceParameters(double saturationCurrentAmps, double emissionCoefficient, double beta, double kneeCurrentAmps) {
    public DeviceParameters {
        Require.positive("saturationCurrentAmps", saturationCurrentAmps);
        Require.positive("emissionCoefficient", emissionCoefficient);
        Require.positive("beta", beta);
        if (!(kneeCurrentAmps > 0)) throw new IllegalArgumentException("kneeCurrentAmps=" + kneeCurrentAmps + " must be > 0 (or infinite for none)");
    }

    /** A device without high-current beta fall-off. */
    public static DeviceParameters of(double saturationCurrentAmps, double emissionCoefficient, double beta) {
        return new DeviceParameters(saturationCurrentAmps, emissionCoefficient, beta, Double.POSITIVE_INFINITY);
    }

    public boolean hasKnee() { return Double.isFinite(kneeCurrentAmps); }
}
