package org.outstage.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.OptionalInt;
import java.util.concurrent.Callable;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.OutputImpedance;
import org.outstage.json.JsonText;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code outstage impedance --load OHMS LOADED OPEN}: output impedance Z_out = R_L·(V_open/V_loaded − 1) and
 * damping factor R_L/Z_out from the same tone captured into the load and open-circuit (docs/methods.md).
 */
@Command(name = "impedance", mixinStandardHelpOptions = true, sortOptions = false,
        description = "Output impedance and damping factor from one tone captured into a load and open-circuit.")
public final class ImpedanceCommand implements Callable<Integer> {
    @Spec picocli.CommandLine.Model.CommandSpec spec;

    @Mixin AnalyzeOptions options;

    @Parameters(index = "0", paramLabel = "LOADED", description = "The tone captured with the load connected.")
    Path loaded;

    @Parameters(index = "1", paramLabel = "OPEN", description = "The same tone captured open-circuit.")
    Path open;

    @picocli.CommandLine.Option(names = "--json", description = "Print JSON (keys documented in docs/cli.md).")
    boolean json;

    @Override
    public Integer call() {
        if (options.load == null) throw new BadInputException("impedance needs --load OHMS (the load of the loaded capture)");
        var settings = options.settings();
        OptionalInt ch = options.channel().isPresent() ? options.channel() : OptionalInt.of(1);
        Measurement ml = one(loaded, settings, ch);
        Measurement mo = one(open, settings, ch);
        OutputImpedance z;
        try {
            z = OutputImpedance.of(options.load, mo, ml);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(loaded + ", " + open + ": " + e.getMessage());
        }
        PrintWriter out = spec.commandLine().getOut();
        if (json) {
            out.println(JsonText.pretty(JsonText.obj("output_impedance_ohms", z.zOutOhms(), "damping_factor", z.dampingFactor(),
                    "frequency_hz", z.frequencyHz(), "open_rms", z.openRms(), "loaded_rms", z.loadedRms(), "load_ohms", z.loadOhms(),
                    "unit", ml.unit(), "channel", ml.channel())));
        } else {
            out.printf(Locale.ROOT, "output impedance %.4g ohm, damping factor %.4g into %.4g ohm at %.1f Hz (open %.5g %s, loaded %.5g %s rms)%n",
                    z.zOutOhms(), z.dampingFactor(), z.loadOhms(), z.frequencyHz(), z.openRms(), ml.unit(), z.loadedRms(), ml.unit());
        }
        out.flush();
        return OutstageCommand.EXIT_OK;
    }

    private Measurement one(Path f, org.outstage.analysis.AnalysisSettings s, OptionalInt ch) {
        List<Measurement> ms = Measuring.measure(Measuring.open(f, options), s, ch, OptionalInt.empty(), f.toString());
        Measurement m = ms.get(0);
        if (!m.measured()) throw new BadInputException(f + ": not measured: " + m.notMeasuredReason().get());
        return m;
    }
}
