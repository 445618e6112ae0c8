package org.outstage.model;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import org.outstage.Require;

/**
 * Everything that describes a stage. Build with {@link #builder()}: physically impossible values are
 * refused there (IllegalArgumentException naming parameter, value and rule); legal but unusual values are
 * accepted and listed in {@link #warnings()}; {@link #parameters()} says for each whether it was set or
 * defaulted.
 *
 * <p>Defaults describe a stage of about 60 W into 8 Ω: rails ±35 V, Re 0.22 Ω, driver β 150 and Is 1e-14 A,
 * output β 60 and Is 1e-12 A, n = 1, 25 °C, Vq 20 mV, Darlington driver emitter resistor 200 Ω, a CFP's output
 * base-emitter resistor (the driver's collector load) {@value #DEFAULT_CFP_RBE_OHMS} Ω in the cfp and quasi topologies
 * (none in the others) and its Re outside the local loop, driver (VAS) saturation 0.2 V from each rail.
 */
public record StageParameters(Topology topology, Bias bias, double emitterOhms, double loadOhms, double railVolts,
                              DeviceParameters driver, DeviceParameters output, double temperatureCelsius,
                              double driveSaturationVolts, Set<String> setExplicitly, List<String> warnings) {

    public static final double DEFAULT_RAIL_VOLTS = 35;
    public static final double DEFAULT_EMITTER_OHMS = 0.22;
    public static final double DEFAULT_LOAD_OHMS = 8;
    public static final double DEFAULT_BETA_DRIVER = 150;
    public static final double DEFAULT_BETA_OUTPUT = 60;
    public static final double DEFAULT_IS_DRIVER_AMPS = 1e-14;
    public static final double DEFAULT_IS_OUTPUT_AMPS = 1e-12;
    public static final double DEFAULT_EMISSION = 1;
    public static final double DEFAULT_TEMPERATURE_CELSIUS = 25;
    public static final double DEFAULT_VQ_VOLTS = 0.020;
    public static final double DEFAULT_DRIVER_EMITTER_OHMS = 200;
    public static final double DEFAULT_DRIVE_SATURATION_VOLTS = 0.2;
    /**
     * Default resistor across a CFP output device's base-emitter junction (the driver's collector load), ohms.
     * Common practice, value from memory (not checked against a published schematic): CFP output stages carry a
     * resistor of the order of 100 Ω there, so the driver runs a standing current of about Vbe/Rbe ≈ 6 mA and the
     * stored charge of the output device has a path out. Without it the CFP's crossover is that of a plain pair.
     */
    public static final double DEFAULT_CFP_RBE_OHMS = 100;
    /** Where {@link #DEFAULT_CFP_RBE_OHMS} comes from, as the summary prints it. */
    public static final String DEFAULT_CFP_RBE_SOURCE = "common practice, value from memory: about 100 ohm, driver standing current ~ Vbe/Rbe = 6 mA";

    public StageParameters {
        Require.notNull("topology", topology);
        Require.notNull("bias", bias);
        setExplicitly = Collections.unmodifiableSet(new LinkedHashSet<>(setExplicitly));
        warnings = List.copyOf(warnings);
    }

    /** Thermal voltage kT/q at the stage temperature (exact 2019 SI k and q). */
    public double thermalVolts() { return DeviceLaw.thermalVoltage(temperatureCelsius); }

    /** Whether the named parameter (as listed by {@link #parameters()}) was left at its default. */
    public boolean isDefaulted(String name) { return !setExplicitly.contains(name); }

    /** One named parameter with its value, unit and whether it was defaulted. */
    public record Parameter(String name, double value, String unit, boolean defaulted) {}

    /** The parameters as a list (bias in the form it was given). */
    public List<Parameter> parameters() {
        List<Parameter> p = new ArrayList<>();
        if (bias instanceof Bias.GeneratorVolts g) p.add(new Parameter("bias_v", g.volts(), "V", isDefaulted("bias")));
        else if (bias instanceof Bias.EmitterDropVolts v) p.add(new Parameter("vq_mv", v.volts() * 1e3, "mV", isDefaulted("bias")));
        else if (bias instanceof Bias.QuiescentAmps a) p.add(new Parameter("iq_a", a.amps(), "A", isDefaulted("bias")));
        p.add(new Parameter("re", emitterOhms, "ohm", isDefaulted("re")));
        p.add(new Parameter("load", loadOhms, "ohm", isDefaulted("load")));
        p.add(new Parameter("rails", railVolts, "V", isDefaulted("rails")));
        boolean drivers = !(topology instanceof Topology.Pair);
        if (drivers) p.add(new Parameter("beta_driver", driver.beta(), "", isDefaulted("beta_driver")));
        p.add(new Parameter("beta_output", output.beta(), "", isDefaulted("beta_output")));
        if (drivers) p.add(new Parameter("is_driver", driver.saturationCurrentAmps(), "A", isDefaulted("is_driver")));
        p.add(new Parameter("is_output", output.saturationCurrentAmps(), "A", isDefaulted("is_output")));
        p.add(new Parameter("n", driver.emissionCoefficient(), "", isDefaulted("n")));
        if (output.hasKnee()) p.add(new Parameter("ikf_output", output.kneeCurrentAmps(), "A", isDefaulted("ikf_output")));
        if (drivers && driver.hasKnee()) p.add(new Parameter("ikf_driver", driver.kneeCurrentAmps(), "A", isDefaulted("ikf_driver")));
        p.add(new Parameter("temperature_c", temperatureCelsius, "degC", isDefaulted("temperature_c")));
        p.add(new Parameter("drive_sat_v", driveSaturationVolts, "V", isDefaulted("drive_sat_v")));
        if (topology instanceof Topology.Darlington d) p.add(new Parameter("r_driver", d.driverEmitterOhms(), "ohm", isDefaulted("r_driver")));
        if (topology instanceof Topology.Cfp c) {
            p.add(new Parameter("rbe", c.outputBaseEmitterOhms(), "ohm", isDefaulted("rbe")));
            p.add(new Parameter("cfp_re_in_loop", c.emitterResistorInLoop() ? 1 : 0, "", isDefaulted("cfp_re_in_loop")));
        }
        if (topology instanceof Topology.Quasi q) {
            p.add(new Parameter("r_driver", q.driverEmitterOhms(), "ohm", isDefaulted("r_driver")));
            p.add(new Parameter("rbe", q.outputBaseEmitterOhms(), "ohm", isDefaulted("rbe")));
            p.add(new Parameter("cfp_re_in_loop", q.emitterResistorInLoop() ? 1 : 0, "", isDefaulted("cfp_re_in_loop")));
        }
        return p;
    }

    /** The same parameters with another bias (marked as set). */
    public StageParameters withBias(Bias newBias) {
        Set<String> s = new LinkedHashSet<>(setExplicitly);
        s.add("bias");
        return new StageParameters(topology, newBias, emitterOhms, loadOhms, railVolts, driver, output, temperatureCelsius,
                driveSaturationVolts, s, warnings);
    }

    public static Builder builder() { return new Builder(); }

    /** Collects parameters; {@link #build()} checks them. Every setter marks its parameter as set. */
    public static final class Builder {
        private String topologyName = "pair";
        private Bias bias = new Bias.EmitterDropVolts(DEFAULT_VQ_VOLTS);
        private double re = DEFAULT_EMITTER_OHMS, load = DEFAULT_LOAD_OHMS, rails = DEFAULT_RAIL_VOLTS;
        private double betaDriver = DEFAULT_BETA_DRIVER, betaOutput = DEFAULT_BETA_OUTPUT;
        private double isDriver = DEFAULT_IS_DRIVER_AMPS, isOutput = DEFAULT_IS_OUTPUT_AMPS, n = DEFAULT_EMISSION;
        private double ikfDriver = Double.POSITIVE_INFINITY, ikfOutput = Double.POSITIVE_INFINITY;
        private double temperature = DEFAULT_TEMPERATURE_CELSIUS, driveSat = DEFAULT_DRIVE_SATURATION_VOLTS;
        private double rDriver = DEFAULT_DRIVER_EMITTER_OHMS, rbe = Double.POSITIVE_INFINITY;
        private boolean reInLoop = false;
        private final Set<String> set = new LinkedHashSet<>();

        private Builder() {}

        private Builder mark(String name) { set.add(name); return this; }

        public Builder topology(String name) { topologyName = name; return mark("topology"); }
        public Builder bias(Bias b) { bias = b; return mark("bias"); }
        public Builder emitterOhms(double v) { re = v; return mark("re"); }
        public Builder loadOhms(double v) { load = v; return mark("load"); }
        public Builder railVolts(double v) { rails = v; return mark("rails"); }
        public Builder betaDriver(double v) { betaDriver = v; return mark("beta_driver"); }
        public Builder betaOutput(double v) { betaOutput = v; return mark("beta_output"); }
        public Builder isDriverAmps(double v) { isDriver = v; return mark("is_driver"); }
        public Builder isOutputAmps(double v) { isOutput = v; return mark("is_output"); }
        public Builder emissionCoefficient(double v) { n = v; return mark("n"); }
        public Builder kneeDriverAmps(double v) { ikfDriver = v; return mark("ikf_driver"); }
        public Builder kneeOutputAmps(double v) { ikfOutput = v; return mark("ikf_output"); }
        public Builder temperatureCelsius(double v) { temperature = v; return mark("temperature_c"); }
        public Builder driveSaturationVolts(double v) { driveSat = v; return mark("drive_sat_v"); }
        public Builder driverEmitterOhms(double v) { rDriver = v; return mark("r_driver"); }
        public Builder outputBaseEmitterOhms(double v) { rbe = v; return mark("rbe"); }
        /** CFP halves: Re inside the local loop (driver emitter at the output node) instead of outside (the default). */
        public Builder cfpEmitterResistorInLoop(boolean v) { reInLoop = v; return mark("cfp_re_in_loop"); }

        /** Checks every parameter: impossible ones throw IllegalArgumentException, unusual ones become warnings. */
        public StageParameters build() {
            List<String> w = new ArrayList<>();
            Require.positive("re", re);
            Require.positive("load", load);
            Require.positive("rails", rails);
            Require.positive("beta_driver", betaDriver);
            Require.positive("beta_output", betaOutput);
            Require.positive("is_driver", isDriver);
            Require.positive("is_output", isOutput);
            Require.positive("n", n);
            if (!(ikfDriver > 0)) throw new IllegalArgumentException("ikf_driver=" + ikfDriver + " must be > 0");
            if (!(ikfOutput > 0)) throw new IllegalArgumentException("ikf_output=" + ikfOutput + " must be > 0");
            Require.finite("temperature_c", temperature);
            if (!(temperature > -DeviceLaw.ZERO_CELSIUS_KELVIN))
                throw new IllegalArgumentException("temperature_c=" + temperature + " must be above absolute zero (-273.15)");
            Require.nonNegative("drive_sat_v", driveSat);
            Require.positive("r_driver", rDriver);
            if (!(rbe > 0)) throw new IllegalArgumentException("rbe=" + rbe + " must be > 0 (or omitted for none)");
            // A stage needs room for its junctions: two base-emitter drops per side plus the drive's saturation.
            if (!(rails > 1.5 + driveSat))
                throw new IllegalArgumentException("rails=" + rails + " must exceed " + fmt(1.5 + driveSat)
                        + " V (two base-emitter drops plus drive_sat_v) to bias the stage");
            if (!(driveSat < rails / 2)) throw new IllegalArgumentException("drive_sat_v=" + driveSat + " must be < rails/2 = " + fmt(rails / 2));
            if (bias instanceof Bias.GeneratorVolts g && !(Math.abs(g.volts()) / 2 < rails - driveSat))
                throw new IllegalArgumentException("bias_v=" + g.volts() + " must be < 2*(rails - drive_sat_v) = " + fmt(2 * (rails - driveSat))
                        + " so the bias source fits between the rails");
            String tn = topologyName.toLowerCase(Locale.ROOT);
            if (!set.contains("rbe") && (tn.equals("cfp") || tn.equals("quasi"))) rbe = DEFAULT_CFP_RBE_OHMS;
            Topology t = switch (tn) {
                case "pair" -> new Topology.Pair();
                case "darlington" -> new Topology.Darlington(rDriver);
                case "cfp" -> new Topology.Cfp(rbe, reInLoop);
                case "quasi" -> new Topology.Quasi(rDriver, rbe, reInLoop);
                default -> throw new IllegalArgumentException("topology=" + topologyName + " must be one of pair, darlington, cfp, quasi");
            };
            if (re < 0.05 || re > 2) w.add("re=" + fmt(re) + " ohm is outside the usual 0.05..2 ohm");
            if (load < 2 || load > 100) w.add("load=" + fmt(load) + " ohm is outside the usual 2..100 ohm");
            if (rails < 10 || rails > 120) w.add("rails=" + fmt(rails) + " V is outside the usual 10..120 V");
            if (betaDriver < 20 || betaDriver > 1000) w.add("beta_driver=" + fmt(betaDriver) + " is outside the usual 20..1000");
            if (betaOutput < 10 || betaOutput > 500) w.add("beta_output=" + fmt(betaOutput) + " is outside the usual 10..500");
            if (isDriver < 1e-17 || isDriver > 1e-10) w.add("is_driver=" + isDriver + " A is outside the usual 1e-17..1e-10 A");
            if (isOutput < 1e-16 || isOutput > 1e-8) w.add("is_output=" + isOutput + " A is outside the usual 1e-16..1e-8 A");
            if (n < 0.9 || n > 2) w.add("n=" + fmt(n) + " is outside the usual 0.9..2");
            if (temperature < -40 || temperature > 150) w.add("temperature_c=" + fmt(temperature) + " is outside the usual -40..150 degC");
            if (bias instanceof Bias.EmitterDropVolts v && v.volts() > 0.1)
                w.add("vq=" + fmt(v.volts() * 1e3) + " mV per emitter resistor is heavy class A: check dissipation");
            if (bias instanceof Bias.QuiescentAmps a && a.amps() * re > 0.1)
                w.add("iq=" + fmt(a.amps()) + " A gives " + fmt(a.amps() * re * 1e3) + " mV per emitter resistor: heavy class A, check dissipation");
            if ((t instanceof Topology.Darlington || t instanceof Topology.Quasi) && (rDriver < 20 || rDriver > 2000))
                w.add("r_driver=" + fmt(rDriver) + " ohm is outside the usual 20..2000 ohm");
            if ((t instanceof Topology.Cfp || t instanceof Topology.Quasi) && Double.isFinite(rbe) && (rbe < 10 || rbe > 10000))
                w.add("rbe=" + fmt(rbe) + " ohm is outside the usual 10..10000 ohm");
            if (!(t instanceof Topology.Darlington || t instanceof Topology.Quasi) && set.contains("r_driver"))
                w.add("r_driver is ignored by topology " + t.name());
            if (!(t instanceof Topology.Cfp || t instanceof Topology.Quasi) && set.contains("rbe"))
                w.add("rbe is ignored by topology " + t.name());
            if (!(t instanceof Topology.Cfp || t instanceof Topology.Quasi) && set.contains("cfp_re_in_loop"))
                w.add("cfp_re_in_loop is ignored by topology " + t.name());
            DeviceParameters drv = new DeviceParameters(isDriver, n, betaDriver, ikfDriver);
            DeviceParameters out = new DeviceParameters(isOutput, n, betaOutput, ikfOutput);
            return new StageParameters(t, bias, re, load, rails, drv, out, temperature, driveSat, set, w);
        }
    }

    static String fmt(double v) {
        return String.format(Locale.ROOT, "%.4g", v).replaceAll("\\.?0+($|e)", "$1");
    }
}
