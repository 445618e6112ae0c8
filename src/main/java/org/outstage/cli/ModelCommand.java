package org.outstage.cli;

import static org.outstage.cli.ModelOptions.fmt;

import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.outstage.analysis.TransferCurve;
import org.outstage.json.JsonText;
import org.outstage.analysis.stage.BiasCriterion;
import org.outstage.model.BiasFit;
import org.outstage.model.ClipLevels;
import org.outstage.model.CrossoverOptimum;
import org.outstage.model.Distortion;
import org.outstage.model.OperatingPoint;
import org.outstage.model.OptimumBias;
import org.outstage.model.SolverFailureException;
import org.outstage.model.StageModel;
import org.outstage.model.StageParameters;
import org.outstage.model.ThermalSensitivity;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

/**
 * {@code outstage model}: what a class-AB output stage should do. Prints a summary (default), the transfer curve
 * as CSV ({@code --csv}: vin,vout,gain) or JSON ({@code --json}). Exit codes: 0 ok, 2 bad parameters, 1 solver failure.
 */
@Command(name = "model", sortOptions = false, mixinStandardHelpOptions = true,
        description = {"Predict a class-AB push-pull output stage: quiescent currents, optimum bias, clip levels, gain, THD.",
                "Exit codes: 0 ok, 1 solver failure, 2 bad parameters."})
public final class ModelCommand implements Callable<Integer> {
    @Spec CommandSpec spec;
    @Mixin ModelOptions stage;

    @Option(names = "--vin-max", paramLabel = "V", converter = Units.Volts.class, description = "Curve input range +/- V (default: the rail voltage).") Double vinMax;
    @Option(names = "--points", paramLabel = "N", description = "Curve points (default 2001).") int points = 2001;
    @Option(names = "--level-v", paramLabel = "V", converter = Units.Volts.class, description = "Output level of the optimum-bias criterion (default 0.6 x rails).") Double levelV;
    @Option(names = "--thd-levels", paramLabel = "V", converter = Units.Volts.class, split = ",", description = "Output peak levels for predicted THD (default 1,5,10,20).")
    double[] thdLevels = {1, 5, 10, 20};
    @Option(names = "--csv", description = "Print the transfer curve as CSV (vin,vout,gain).") boolean csv;
    @Option(names = "--json", description = "Print the results as JSON.") boolean json;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        if (csv && json) throw new BadInputException("model: --csv and --json are mutually exclusive");
        if (points < 2) throw new BadInputException("points=" + points + " must be >= 2");
        StageParameters p = stage.parameters();
        double vmax = vinMax != null ? vinMax : p.railVolts();
        if (!(vmax > 0) || !Double.isFinite(vmax)) throw new BadInputException("vin-max=" + vmax + " must be > 0");
        double level = levelV != null ? levelV : 0.6 * p.railVolts();
        if (!(level > 0)) throw new BadInputException("level-v=" + level + " must be > 0");
        for (double l : thdLevels) if (!(l > 0)) throw new BadInputException("thd-levels: " + l + " must be > 0");
        try {
            StageModel m = StageModel.of(p, stage.solver());
            TransferCurve curve = m.transferCurve(-vmax, vmax, points).curve();
            if (csv) {
                printCsv(out, curve);
                out.flush();
                return 0;
            }
            Summary s = summary(m, curve, level, thdLevels);
            if (json) out.println(JsonText.pretty(s.json()));
            else s.print(out);
            out.flush();
            return 0;
        } catch (SolverFailureException e) {
            PrintWriter err = spec.commandLine().getErr();
            err.println("outstage: model: solver failure: " + e.getMessage());
            err.flush();
            return OutstageCommand.EXIT_FAULT;
        }
    }

    static void printCsv(PrintWriter out, TransferCurve c) {
        double[] vin = c.inputVolts(), vout = c.outputVolts(), g = c.incrementalGain();
        out.println("vin,vout,gain");
        for (int i = 0; i < vin.length; i++) out.println(fmt("%.9g,%.9g,%.9g", vin[i], vout[i], g[i]));
    }

    record Summary(StageModel m, double gainZero, double gainLarge, double gainPositive, double gainNegative, double levelVolts, OptimumBias optimum,
                   java.util.Optional<CrossoverOptimum> crossoverOptimum, ClipLevels clip, List<Distortion> thd, ThermalSensitivity thermalFixed, ThermalSensitivity thermalTracked) {

        /** (g(+level) − g(−level)) / mean: how much the halves' large-signal gains differ (0 for a symmetric stage). */
        double gainAsymmetry() { return (gainPositive - gainNegative) / ((gainPositive + gainNegative) / 2); }

        /** (I_upper − I_lower) / mean at rest. */
        double currentAsymmetry() {
            double u = m.quiescentUpperAmps(), l = m.quiescentLowerAmps();
            return (u - l) / ((u + l) / 2);
        }

        Map<String, Object> json() {
            StageParameters p = m.parameters();
            List<Object> params = new ArrayList<>();
            for (StageParameters.Parameter q : p.parameters())
                params.add(JsonText.obj("name", q.name(), "value", q.value(), "unit", q.unit(), "defaulted", q.defaulted()));
            List<Object> devices = new ArrayList<>();
            for (OperatingPoint.DeviceCurrent d : m.quiescent().devices())
                devices.add(JsonText.obj("name", d.name(), "role", d.role(), "collector_a", d.collectorAmps(), "base_a", d.baseAmps()));
            List<Object> thdList = new ArrayList<>();
            for (Distortion d : thd)
                thdList.add(JsonText.obj("level_v", d.outputPeakVolts(), "input_peak_v", d.inputPeakVolts(), "thd", d.thd(), "thd_percent", d.thd() * 100,
                        "h2", d.harmonic(2), "h3", d.harmonic(3), "h5", d.harmonic(5),
                        "h2_percent", d.harmonic(2) * 100, "h3_percent", d.harmonic(3) * 100, "h5_percent", d.harmonic(5) * 100));
            return JsonText.obj("topology", p.topology().name(), "parameters", params,
                    "bias_v", m.biasVolts(), "vq_mv", m.vqVolts() * 1e3, "quiescent_current_a", m.quiescentAmps(), "devices", devices,
                    "optimum_vq_mv", optimum.vqVolts() * 1e3, "optimum_level_v", levelVolts, "optimum_max_gain_deviation", optimum.maxGainDeviation(),
                    "optimum_at_search_limit", optimum.atSearchLimit(),
                    "optimum_criterion", "flattest gain over |Vout| <= optimum_level_v (model criterion, not the bias advice)",
                    "flattest_gain_vq_mv", optimum.vqVolts() * 1e3,
                    "crossover_optimum_vq_mv", crossoverOptimum.map(c -> (Object) (c.vqVolts() * 1e3)).orElse(null),
                    "crossover_band_low_vq_mv", crossoverOptimum.map(c -> (Object) (c.bandLowVqVolts() * 1e3)).orElse(null),
                    "crossover_band_high_vq_mv", crossoverOptimum.map(c -> (Object) (c.bandHighVqVolts() * 1e3)).orElse(null),
                    "crossover_criterion", BiasCriterion.DEFINITION,
                    "clip_positive_v", clip.positiveVolts(), "clip_negative_v", clip.negativeVolts(),
                    "gain_at_zero", gainZero, "gain_large_signal", gainLarge, "thd", thdList,
                    "thermal", JsonText.obj("junctions_in_bias_loop", thermalFixed.junctionsInLoop(), "diq_dvbias_a_per_v", thermalFixed.ampsPerBiasVolt(),
                            "diq_dt_fixed_bias_a_per_k", thermalFixed.untrackedAmpsPerKelvin(),
                            "tracked_junctions", thermalTracked.trackedJunctions(), "diq_dt_tracked_a_per_k", thermalTracked.trackedAmpsPerKelvin()),
                    "warnings", m.warnings(), "thermal_voltage_v", p.thermalVolts(),
                    "rest_input_offset_v", m.inputOffsetVolts(), "rest_output_v", m.quiescent().outputVolts(),
                    "quiescent_upper_a", m.quiescentUpperAmps(), "quiescent_lower_a", m.quiescentLowerAmps(),
                    "quiescent_current_asymmetry", currentAsymmetry(), "gain_positive_large_signal", gainPositive,
                    "gain_negative_large_signal", gainNegative, "gain_asymmetry", gainAsymmetry(),
                    "rbe_source", rbeSource(p));
        }

        void print(PrintWriter o) {
            StageParameters p = m.parameters();
            o.println("Output-stage model: " + p.topology().name() + " (" + describe(p) + ")");
            o.println("Parameters (* = given, others defaulted):");
            for (StageParameters.Parameter q : p.parameters())
                o.println(fmt("  %-14s %12s %-4s%s", q.name(), q.name().equals("cfp_re_in_loop") ? (q.value() != 0 ? "yes" : "no") : num(q.value()),
                        q.unit(), q.defaulted() ? "" : " *"));
            o.println("Quiescent point (Vin = 0):");
            o.println(fmt("  bias generator %12.4f V", m.biasVolts()));
            o.println(fmt("  Vq per Re      %12.2f mV  (Iq %.1f mA per emitter resistor, mean of the halves)", m.vqVolts() * 1e3, m.quiescentAmps() * 1e3));
            o.println(fmt("  rest point     output %.6f V, held there by an input offset of %+.3f mV (as global feedback does)",
                    Math.abs(m.quiescent().outputVolts()) < 5e-7 ? 0.0 : m.quiescent().outputVolts(), m.inputOffsetVolts() * 1e3 + 0.0));
            o.println(fmt("  halves at rest upper %.2f mA, lower %.2f mA (difference %+.2f %% of the mean)", m.quiescentUpperAmps() * 1e3,
                    m.quiescentLowerAmps() * 1e3, currentAsymmetry() * 100));
            for (OperatingPoint.DeviceCurrent d : m.quiescent().devices())
                o.println(fmt("  %-3s %-13s Ic %9.3f mA  Ib %8.4f mA", d.name(), d.role(), d.collectorAmps() * 1e3, d.baseAmps() * 1e3));
            if (crossoverOptimum.isPresent())
                o.println(fmt("Optimum Vq     %12.2f mV  near-optimal %.2f to %.2f mV (crossover ratio 1 +/- %.1f %% read at %.3g V peak, Oliver 1971)",
                        crossoverOptimum.get().vqVolts() * 1e3, crossoverOptimum.get().bandLowVqVolts() * 1e3, crossoverOptimum.get().bandHighVqVolts() * 1e3,
                        BiasCriterion.BAND * 100, levelVolts));
            else
                o.println(fmt("Optimum Vq       none: the crossover ratio (gain at zero / large-current gain at %.3g V peak) does not reach 1 below 200 mV",
                        levelVolts));
            if (optimum.atSearchLimit())
                o.println(fmt("Flattest gain    none below class A (other criterion: gain flattens steadily with bias up to %.0f mV; level %.3g V)",
                        optimum.vqVolts() * 1e3, levelVolts));
            else
                o.println(fmt("Flattest gain  %12.2f mV  (other criterion, not advice: flattest gain over |Vout| <= %.3g V, max deviation %.3f %%)",
                        optimum.vqVolts() * 1e3, levelVolts, optimum.maxGainDeviation() * 100));
            o.println(fmt("Clip levels    %+12.3f V / %+.3f V", clip.positiveVolts(), clip.negativeVolts()));
            o.println(fmt("Gain at zero   %12.5f    (large-signal %.5f at |Vout| = %.3g V)", gainZero, gainLarge, levelVolts));
            o.println(fmt("Gain asymmetry %+12.3f %%  (large-signal %.5f at +%.3g V, %.5f at -%.3g V)", gainAsymmetry() * 100, gainPositive, levelVolts,
                    gainNegative, levelVolts));
            o.println("Predicted THD (static curve, sine of " + StageModel.SAMPLES_PER_CYCLE + " points per cycle):");
            for (Distortion d : thd)
                o.println(fmt("  %8.3g V peak  THD %9.4f %%   H2 %9.4f %%   H3 %9.4f %%", d.outputPeakVolts(), d.thd() * 100, d.harmonic(2) * 100,
                        d.harmonic(3) * 100));
            o.println(fmt("Thermal (common practice -2 mV/degC per junction): dIq/dT %+.2f mA/degC with a fixed bias voltage (%d junctions in the bias loop); "
                    + "%+.2f mA/degC when the bias generator tracks all %d", thermalFixed.untrackedAmpsPerKelvin() * 1e3, thermalFixed.junctionsInLoop(),
                    thermalTracked.trackedAmpsPerKelvin() * 1e3, thermalTracked.trackedJunctions()));
            if (m.warnings().isEmpty()) o.println("Warnings: none");
            else for (String w : m.warnings()) o.println("Warning: " + w);
            boolean noRbe = p.topology() instanceof org.outstage.model.Topology.Cfp c ? Double.isInfinite(c.outputBaseEmitterOhms())
                    : p.topology() instanceof org.outstage.model.Topology.Quasi q && Double.isInfinite(q.outputBaseEmitterOhms());
            String src = rbeSource(p);
            if (!src.isEmpty()) o.println("Rbe: " + src);
            if (noRbe)
                o.println("Note: without a base-emitter resistor on the output device (--rbe) the CFP's crossover behaves like a plain pair's;"
                        + " with one (e.g. --rbe 100) the driver carries the small currents and the optimum bias falls (docs/model.md).");
        }
    }

    /** Where the CFP's Rbe came from, for the cfp and quasi topologies; empty for the others. */
    static String rbeSource(StageParameters p) {
        double rbe = p.topology() instanceof org.outstage.model.Topology.Cfp c ? c.outputBaseEmitterOhms()
                : p.topology() instanceof org.outstage.model.Topology.Quasi q ? q.outputBaseEmitterOhms() : Double.NaN;
        if (Double.isNaN(rbe)) return "";
        String v = Double.isInfinite(rbe) ? "none" : rbe == Math.rint(rbe) ? fmt("%.0f ohm", rbe) : fmt("%.4g ohm", rbe);
        if (!p.isDefaulted("rbe")) return v + " (given)";
        return v + " (default; " + StageParameters.DEFAULT_CFP_RBE_SOURCE + ")";
    }

    static String describe(StageParameters p) {
        return switch (p.topology().name()) {
            case "pair" -> "complementary emitter-follower pair";
            case "darlington" -> "emitter-follower Darlington each side";
            case "cfp" -> "complementary feedback pair each side";
            default -> "quasi-complementary: Darlington above, CFP below";
        };
    }

    static String num(double v) {
        if (Double.isInfinite(v)) return "none";
        double a = Math.abs(v);
        return a != 0 && (a < 1e-3 || a >= 1e6) ? fmt("%.3g", v) : fmt("%.6g", v);
    }

    static Summary summary(StageModel m, TransferCurve curve, double level, double[] thdLevels) {
        double[] out = curve.outputVolts(), g = curve.incrementalGain();
        double gz = m.transferCurve(-1e-6, 1e-6, 3).curve().incrementalGain()[1];
        double gp = interp(out, g, level), gn = interp(out, g, -level);
        double gl = (gp + gn) / 2;
        OptimumBias opt = m.optimumBias(level);
        java.util.Optional<CrossoverOptimum> co = BiasFit.crossoverOptimum(m.parameters(), level, m.solverSettings());
        return new Summary(m, gz, gl, gp, gn, level, opt, co, m.clipLevels(), m.distortionVersusLevel(thdLevels),
                m.thermalSensitivity(0), m.thermalSensitivity(m.parameters().topology().junctionsInBiasLoop()));
    }

    static double interp(double[] x, double[] y, double x0) {
        int n = x.length;
        if (x0 <= x[0]) return y[0];
        if (x0 >= x[n - 1]) return y[n - 1];
        for (int i = 1; i < n; i++)
            if (x[i] >= x0) {
                double t = (x0 - x[i - 1]) / (x[i] - x[i - 1]);
                return y[i - 1] + t * (y[i] - y[i - 1]);
            }
        return y[n - 1];
    }
}
