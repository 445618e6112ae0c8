package org.outstage.analysis;

import org.outstage.Require;

/**
 * Output impedance and damping factor from the same drive captured open-circuit and into a known load
 * (voltage divider: V_loaded = V_open·R_L/(R_L + Z_out), so Z_out = R_L·(V_open/V_loaded − 1)); the damping
 * factor DF = R_L/Z_out (common practice: quoted into 8 Ω at a stated frequency, docs/references.md §13).
 * Assumes the source is linear at this level and Z_out is resistive at the test frequency (a reactive Z_out
 * reads as its magnitude-projection |V_open/V_loaded| − 1).
 *
 * <p>Worked example (replayed in {@code OutputImpedanceTest}): 2.000 V open, 1.996 V into 8 Ω gives
 * Z_out = 8·(2/1.996 − 1) = 16.03 mΩ and DF = 499.
 *
 * @param loadOhms      the load of the loaded capture
 * @param frequencyHz   the test frequency (the loaded capture's fundamental)
 * @param openRms       fundamental rms open-circuit
 * @param loadedRms     fundamental rms into the load
 * @param zOutOhms      output impedance
 * @param dampingFactor R_L/Z_out (infinite when the two levels are equal)
 */
public record OutputImpedance(double loadOhms, double frequencyHz, double openRms, double loadedRms, double zOutOhms, double dampingFactor) {
    public OutputImpedance {
        Require.positive("loadOhms", loadOhms);
        Require.positive("openRms", openRms);
        Require.positive("loadedRms", loadedRms);
    }

    /**
     * From two fundamental levels.
     *
     * @throws IllegalArgumentException when a level is not positive
     */
    public static OutputImpedance of(double loadOhms, double frequencyHz, double openRms, double loadedRms) {
        Require.positive("loadOhms", loadOhms);
        Require.positive("openRms", openRms);
        Require.positive("loadedRms", loadedRms);
        double z = loadOhms * (openRms / loadedRms - 1);
        return new OutputImpedance(loadOhms, frequencyHz, openRms, loadedRms, z, loadOhms / z);
    }

    /** From two measurements of the same channel (open, loaded); their fundamentals must agree within 1 %. */
    public static OutputImpedance of(double loadOhms, Measurement open, Measurement loaded) {
        if (!open.measured()) throw new IllegalArgumentException("open-circuit capture: " + open.notMeasuredReason().get());
        if (!loaded.measured()) throw new IllegalArgumentException("loaded capture: " + loaded.notMeasuredReason().get());
        double fo = open.fundamental().frequencyHz(), fl = loaded.fundamental().frequencyHz();
        if (Math.abs(fo - fl) > 0.01 * fl)
            throw new IllegalArgumentException("the open-circuit tone " + Levels.formatHz(fo) + " and the loaded tone " + Levels.formatHz(fl)
                    + " differ by more than 1 %: capture the same drive twice");
        if (!open.unit().equals(loaded.unit()))
            throw new IllegalArgumentException("the two captures have different units (" + open.unit() + ", " + loaded.unit() + ")");
        return of(loadOhms, fl, open.fundamental().rms(), loaded.fundamental().rms());
    }
}
