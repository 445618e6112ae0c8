package org.outstage.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.outstage.model.Bias;
import org.outstage.model.SolverSettings;
import org.outstage.model.StageParameters;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Option;

/**
 * Stage options shared by {@code model} and {@code fit}, and the stage file (key = value lines, see docs/model.md).
 * Values from the command line override the file; anything given in neither is defaulted (and reported so).
 */
final class ModelOptions {
    static final List<String> KEYS = List.of("topology", "vq_mv", "bias_v", "iq_a", "re", "load", "rails", "beta_driver", "beta_output",
            "is_driver", "is_output", "n", "temperature_c", "r_driver", "rbe", "cfp_re_in_loop", "ikf_driver", "ikf_output", "drive_sat_v");

    @Option(names = "--stage", paramLabel = "FILE", description = "Stage file (key = value lines; see docs/model.md). Options given here override it.")
    Path stageFile;

    @Option(names = "--topology", paramLabel = "NAME", description = "pair, darlington, cfp or quasi (default: pair).")
    String topology;

    static final class BiasGroup {
        @Option(names = "--vq-mv", paramLabel = "MV", converter = Units.MilliVolts.class, description = "Bias as the quiescent drop across each emitter resistor, mV (default 20).")
        Double vqMv;
        @Option(names = "--bias-v", paramLabel = "V", converter = Units.Volts.class, description = "Bias as the bias-generator voltage, V.")
        Double biasV;
        @Option(names = "--iq-a", paramLabel = "A", converter = Units.Amps.class, description = "Bias as the quiescent current through each emitter resistor, A.")
        Double iqA;
    }

    @ArgGroup(exclusive = true, multiplicity = "0..1")
    BiasGroup bias;

    @Option(names = "--re", paramLabel = "OHMS", converter = Units.Ohms.class, description = "Emitter resistor Re (default 0.22).") Double re;
    @Option(names = "--load", paramLabel = "OHMS", converter = Units.Ohms.class, description = "Load resistance (default 8).") Double load;
    @Option(names = "--rails", paramLabel = "V", converter = Units.Volts.class, description = "Symmetric supply rails, +/- V (default 35).") Double rails;
    @Option(names = "--beta-driver", paramLabel = "B", description = "Driver current gain (default 150).") Double betaDriver;
    @Option(names = "--beta-output", paramLabel = "B", description = "Output-device current gain (default 60).") Double betaOutput;
    @Option(names = "--is-driver", paramLabel = "A", converter = Units.Amps.class, description = "Driver saturation current Is (default 1e-14).") Double isDriver;
    @Option(names = "--is-output", paramLabel = "A", converter = Units.Amps.class, description = "Output-device saturation current Is (default 1e-12).") Double isOutput;
    @Option(names = "--n", paramLabel = "N", description = "Emission coefficient of every junction (default 1).") Double n;
    @Option(names = "--temperature-c", paramLabel = "C", description = "Junction temperature, degC (default 25).") Double temperatureC;
    @Option(names = "--r-driver", paramLabel = "OHMS", converter = Units.Ohms.class, description = "Darlington driver emitter resistor (darlington, quasi; default 200).") Double rDriver;
    @Option(names = "--rbe", paramLabel = "OHMS", description = "CFP output base-emitter resistor, ohms or 'none' (cfp, quasi; default 100, common practice).") String rbe;
    @Option(names = "--cfp-re-in-loop", arity = "0..1", paramLabel = "BOOL",
            description = "CFP halves: Re inside the local loop (driver emitter at the output) instead of outside (default false).") Boolean cfpReInLoop;
    @Option(names = "--ikf-output", paramLabel = "A", converter = Units.Amps.class, description = "Output-device knee current for beta fall-off (default none).") Double ikfOutput;
    @Option(names = "--ikf-driver", paramLabel = "A", converter = Units.Amps.class, description = "Driver knee current for beta fall-off (default none).") Double ikfDriver;
    @Option(names = "--drive-sat-v", paramLabel = "V", converter = Units.Volts.class, description = "How close to each rail the drive can swing (default 0.2).") Double driveSatV;

    @Option(names = "--max-iterations", paramLabel = "N", description = "Solver budget: Newton iterations per operating point before the fallbacks (default 100).")
    int maxIterations = 100;

    /** Builds the stage parameters: file first, then options. IllegalArgumentException/BadInputException on bad input. */
    StageParameters parameters() {
        Map<String, String> v = new LinkedHashMap<>();
        if (stageFile != null) v.putAll(readStageFile(stageFile));
        put(v, "topology", topology);
        if (bias != null) {
            v.remove("vq_mv"); v.remove("bias_v"); v.remove("iq_a");
            put(v, "vq_mv", bias.vqMv);
            put(v, "bias_v", bias.biasV);
            put(v, "iq_a", bias.iqA);
        }
        put(v, "re", re); put(v, "load", load); put(v, "rails", rails);
        put(v, "beta_driver", betaDriver); put(v, "beta_output", betaOutput);
        put(v, "is_driver", isDriver); put(v, "is_output", isOutput); put(v, "n", n);
        put(v, "temperature_c", temperatureC); put(v, "r_driver", rDriver); put(v, "rbe", rbe); put(v, "cfp_re_in_loop", cfpReInLoop);
        put(v, "ikf_output", ikfOutput); put(v, "ikf_driver", ikfDriver); put(v, "drive_sat_v", driveSatV);
        StageParameters.Builder b = StageParameters.builder();
        String where = stageFile != null ? " (options and stage file " + stageFile + ")" : "";
        for (Map.Entry<String, String> e : v.entrySet()) {
            String k = e.getKey();
            if (k.equals("topology")) { b.topology(e.getValue()); continue; }
            if (k.equals("cfp_re_in_loop")) { b.cfpEmitterResistorInLoop(bool(k, e.getValue(), where)); continue; }
            if (k.equals("rbe") && e.getValue().strip().equalsIgnoreCase("none")) { b.outputBaseEmitterOhms(Double.POSITIVE_INFINITY); continue; }
            double x = number(k, e.getValue(), where);
            switch (k) {
                case "vq_mv" -> b.bias(new Bias.EmitterDropVolts(checkPositive("vq_mv", x) / 1e3));
                case "bias_v" -> b.bias(new Bias.GeneratorVolts(x));
                case "iq_a" -> b.bias(new Bias.QuiescentAmps(checkPositive("iq_a", x)));
                case "re" -> b.emitterOhms(x);
                case "load" -> b.loadOhms(x);
                case "rails" -> b.railVolts(x);
                case "beta_driver" -> b.betaDriver(x);
                case "beta_output" -> b.betaOutput(x);
                case "is_driver" -> b.isDriverAmps(x);
                case "is_output" -> b.isOutputAmps(x);
                case "n" -> b.emissionCoefficient(x);
                case "temperature_c" -> b.temperatureCelsius(x);
                case "r_driver" -> b.driverEmitterOhms(x);
                case "rbe" -> b.outputBaseEmitterOhms(x);
                case "ikf_output" -> b.kneeOutputAmps(x);
                case "ikf_driver" -> b.kneeDriverAmps(x);
                case "drive_sat_v" -> b.driveSaturationVolts(x);
                default -> throw new BadInputException("unknown stage parameter " + k);
            }
        }
        return b.build();
    }

    private static double checkPositive(String name, double x) {
        if (!(x > 0)) throw new IllegalArgumentException(name + "=" + x + " must be > 0");
        return x;
    }

    private static void put(Map<String, String> m, String key, Object value) {
        if (value != null) m.put(key, value instanceof Double d ? Double.toString(d) : value.toString());
    }

    private static boolean bool(String key, String text, String where) {
        return switch (text.trim().toLowerCase(Locale.ROOT)) {
            case "true", "yes", "1" -> true;
            case "false", "no", "0" -> false;
            default -> throw new BadInputException(key + "=" + text + " must be true or false" + where);
        };
    }

    private static double number(String key, String text, String where) {
        try {
            return Double.parseDouble(text.trim());
        } catch (NumberFormatException e) {
            throw new BadInputException(key + "=" + text + " must be a number" + where);
        }
    }

    /** Reads a stage file: one {@code key = value} per line, '#' starts a comment, keys as in {@link #KEYS} ('-' or '_'). */
    static Map<String, String> readStageFile(Path file) {
        List<String> lines;
        try {
            lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new BadInputException(file + ": cannot read stage file (" + e.getMessage() + ")");
        }
        Map<String, String> v = new LinkedHashMap<>();
        for (int i = 0; i < lines.size(); i++) {
            String line = lines.get(i);
            int hash = line.indexOf('#');
            if (hash >= 0) line = line.substring(0, hash);
            line = line.strip();
            if (line.isEmpty()) continue;
            int eq = line.indexOf('=');
            if (eq < 0) throw new BadInputException(file + " line " + (i + 1) + ": expected key = value, got '" + line + "'");
            String key = line.substring(0, eq).strip().toLowerCase(Locale.ROOT).replace('-', '_');
            String value = line.substring(eq + 1).strip();
            if (!KEYS.contains(key)) throw new BadInputException(file + " line " + (i + 1) + ": unknown key '" + key + "' (known: " + String.join(", ", KEYS) + ")");
            if (value.isEmpty()) throw new BadInputException(file + " line " + (i + 1) + ": key '" + key + "' has no value");
            if (v.containsKey(key)) throw new BadInputException(file + " line " + (i + 1) + ": key '" + key + "' given twice");
            if (!key.equals("topology") && !key.equals("cfp_re_in_loop") && !(key.equals("rbe") && value.equalsIgnoreCase("none"))) {
                try {
                    Double.parseDouble(value);
                } catch (NumberFormatException e) {
                    throw new BadInputException(file + " line " + (i + 1) + ": " + key + " = '" + value + "' is not a number");
                }
            }
            if (List.of("vq_mv", "bias_v", "iq_a").contains(key) && (v.containsKey("vq_mv") || v.containsKey("bias_v") || v.containsKey("iq_a")))
                throw new BadInputException(file + " line " + (i + 1) + ": give the bias once (vq_mv, bias_v or iq_a)");
            v.put(key, value);
        }
        return v;
    }

    /** The solver settings: the defaults with the iteration budget of {@code --max-iterations}. */
    SolverSettings solver() {
        if (maxIterations < 1) throw new BadInputException("max-iterations=" + maxIterations + " must be >= 1");
        SolverSettings d = SolverSettings.defaults();
        return new SolverSettings(d.voltageToleranceVolts(), maxIterations, d.maxJunctionStepVolts(), d.maxSubdivisionLevels());
    }

    static String fmt(String pattern, Object... args) { return String.format(Locale.ROOT, pattern, args); }
}
