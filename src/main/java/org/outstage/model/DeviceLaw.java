package org.outstage.model;

/**
 * The device law: Ebers-Moll, forward-active, in the transport form used by SPICE's Gummel-Poon model
 * reduced to IS, BF, NF and IKF.
 *
 * <pre>
 *   If  = Is·(exp(Vbe/(n·VT)) − 1) + Gmin·Vbe         (forward transport current, Gmin = 1e-12 S as in SPICE)
 *   qb  = (1 + sqrt(1 + 4·If/IKF)) / 2                 (high-injection factor; qb = 1 without IKF)
 *   Ic  = (If / qb) · s(Vce)                           (collector current)
 *   Ib  = If / β                                       (base current)
 *   s(Vce) = 1 − exp(−Vce/Vk)  for Vce &gt; 0,  Vce/Vk otherwise   (saturation knee, Vk = 50 mV)
 * </pre>
 *
 * The forward part is the Gummel-Poon model of SPICE (Nagel, SPICE2, 1975; ngspice manual, BJT model
 * equations) with the reverse junction left out: with the collector reverse biased by tens of volts its
 * terms are about Is (1e-14 A), far below what the model resolves. In their place {@code s(Vce)} makes the
 * collector current collapse as Vce falls towards zero, which is how this model saturates; above Vce = 1 V
 * it differs from 1 by less than 2e-9. VT = k·T/q with the exact 2019 SI values of k and q (CODATA 2018).
 */
final class DeviceLaw {
    /** Boltzmann constant, J/K, exact in the 2019 SI (CODATA 2018). */
    static final double BOLTZMANN = 1.380649e-23;
    /** Elementary charge, C, exact in the 2019 SI (CODATA 2018). */
    static final double CHARGE = 1.602176634e-19;
    static final double ZERO_CELSIUS_KELVIN = 273.15;
    static final double GMIN_SIEMENS = 1e-12;
    static final double KNEE_VOLTS = 0.05;
    private static final double EXP_LIMIT = 80.0;

    private DeviceLaw() {}

    static double thermalVoltage(double temperatureCelsius) {
        return BOLTZMANN * (temperatureCelsius + ZERO_CELSIUS_KELVIN) / CHARGE;
    }

    /**
     * Evaluates the law. {@code out} receives {Ic, Ib, dIc/dVbe, dIc/dVce, dIb/dVbe} in the device's own
     * polarity (Vbe and Vce positive in forward-active for both NPN and PNP).
     */
    static void evaluate(DeviceParameters d, double vt, double vbe, double vce, double[] out) {
        double nvt = d.emissionCoefficient() * vt;
        double x = vbe / nvt;
        double e, de;
        if (x <= EXP_LIMIT) {
            e = Math.exp(x);
            de = e;
        } else {
            double eL = Math.exp(EXP_LIMIT);
            e = eL * (1 + x - EXP_LIMIT);
            de = eL;
        }
        double is = d.saturationCurrentAmps();
        double iF = is * (e - 1) + GMIN_SIEMENS * vbe;
        double gF = is * de / nvt + GMIN_SIEMENS;
        double ic0, dic0;
        if (d.hasKnee()) {
            double ikf = d.kneeCurrentAmps();
            double root = Math.sqrt(Math.max(1 + 4 * iF / ikf, 1e-30));
            double qb = (1 + root) / 2;
            double dqb = 1 / (ikf * root);
            ic0 = iF / qb;
            dic0 = (qb - iF * dqb) / (qb * qb) * gF;
        } else {
            ic0 = iF;
            dic0 = gF;
        }
        double s, ds;
        if (vce > 0) {
            double ex = Math.exp(-vce / KNEE_VOLTS);
            s = 1 - ex;
            ds = ex / KNEE_VOLTS;
        } else {
            s = vce / KNEE_VOLTS;
            ds = 1 / KNEE_VOLTS;
        }
        out[0] = ic0 * s;
        out[1] = iF / d.beta();
        out[2] = dic0 * s;
        out[3] = ic0 * ds;
        out[4] = gF / d.beta();
    }
}
