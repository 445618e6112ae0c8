package org.outstage.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalInt;
import java.util.concurrent.Callable;
import org.outstage.analysis.Band;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.SweepResponse;
import org.outstage.capture.Capture;
import org.outstage.analysis.OutputImpedance;
import org.outstage.json.JsonText;
import picocli.CommandLine.Command;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code outstage impedance --load OHMS LOADED OPEN}: output impedance Z_out = R_L·(V_open/V_loaded − 1) and
 * damping factor R_L/Z_out from the same tone captured into the load and open-circuit; when both captures are
 * exponential sweeps with a generator channel, complex Z_out(f) from the two responses (docs/methods.md §7f).
 */
@Command(name = "impedance", mixinStandardHelpOptions = true, modelTransformer = AnalyzeOptions.Added.class, sortOptions = false,
        description = {"Output impedance and damping factor from one tone captured into a load and open-circuit;",
                "against frequency when both captures are sweeps with a generator channel (--reference or bench.txt)."})
public final class ImpedanceCommand implements Callable<Integer>, AnalyzeOptions.MeasuresCaptures {
    @Spec picocli.CommandLine.Model.CommandSpec spec;

    final AnalyzeOptions options = new AnalyzeOptions();   // mixed in by AnalyzeOptions.Added

    @Override
    public AnalyzeOptions analyzeOptions() { return options; }

    @Override
    public String analyzeOptionsBefore() { return "--json"; }

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
        OptionalInt genL = options.generatorChannelFor(loaded), genO = options.generatorChannelFor(open);
        Capture cl = Measuring.open(loaded, options), co = Measuring.open(open, options);
        OptionalInt ch = options.channel().isPresent() ? options.channel() : OptionalInt.of(firstOutput(genL));
        Measurement ml = first(cl, settings, ch, genL, loaded);
        Measurement mo = first(co, settings, ch, genO, open);
        PrintWriter out = spec.commandLine().getOut();
        var stimulus = options.specConditions().stimulus();
        if (genL.isPresent() && genO.isPresent() && SweepResponse.sweepCandidate(ml, stimulus) && SweepResponse.sweepCandidate(mo, stimulus)) {
            sweeps(out, cl, co, genL.getAsInt(), genO.getAsInt(), ml);
            out.flush();
            return OutstageCommand.EXIT_OK;
        }
        if (!ml.measured()) throw new BadInputException(loaded + ": not measured: " + ml.notMeasuredReason().get());
        if (!mo.measured()) throw new BadInputException(open + ": not measured: " + mo.notMeasuredReason().get());
        OutputImpedance z;
        try {
            z = OutputImpedance.of(options.load, mo, ml);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(loaded + ", " + open + ": " + e.getMessage());
        }
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

    /** Third-octave centres (IEC 61260 nominal) for the text table. */
    private static final double[] THIRD_OCTAVES = {20, 25, 31.5, 40, 50, 63, 80, 100, 125, 160, 200, 250, 315, 400, 500, 630, 800, 1000,
            1250, 1600, 2000, 2500, 3150, 4000, 5000, 6300, 8000, 10000, 12500, 16000, 20000};

    /** Both captures are sweeps with a generator channel: each response against its own generator, then Z_out(f). */
    private void sweeps(PrintWriter out, Capture cl, Capture co, int genL, int genO, Measurement ml) {
        OutputImpedance.VersusFrequency z;
        try {
            int c = ml.channel() - 1;
            FrequencyResponse hl = SweepResponse.measure(cl.readChannel(c), cl.readChannel(genL - 1), cl.sampleRateHz(), true, Band.AUDIO_20_20K);
            FrequencyResponse ho = SweepResponse.measure(co.readChannel(c), co.readChannel(genO - 1), co.sampleRateHz(), true, Band.AUDIO_20_20K);
            z = OutputImpedance.againstFrequency(ho, hl, options.load);
        } catch (IllegalArgumentException e) {
            throw new BadInputException(loaded + ", " + open + ": " + e.getMessage());
        }
        OutputImpedance.Point k = z.nearest(1000);
        if (json) {
            List<Object> pts = new ArrayList<>();
            for (OutputImpedance.Point p : z.points())
                pts.add(JsonText.obj("frequency_hz", p.frequencyHz(), "output_impedance_ohms", p.zOutOhms(),
                        "output_impedance_phase_deg", p.zOutPhaseDeg(), "damping_factor", p.dampingFactor()));
            out.println(JsonText.pretty(JsonText.obj("output_impedance_ohms", k.zOutOhms(), "damping_factor", k.dampingFactor(),
                    "frequency_hz", k.frequencyHz(), "open_rms", null, "loaded_rms", null, "load_ohms", z.loadOhms(),
                    "unit", ml.unit(), "channel", ml.channel(), "points", pts)));
            return;
        }
        out.printf(Locale.ROOT, "output impedance against frequency (two sweeps) into %.4g ohm, channel %d%n", z.loadOhms(), ml.channel());
        out.printf(Locale.ROOT, "%10s  %12s  %9s  %10s%n", "Hz", "|Zout| ohm", "phase deg", "DF");
        OutputImpedance.Point last = null;
        for (double f : THIRD_OCTAVES) {
            OutputImpedance.Point p = z.nearest(f);
            if (p == last || Math.abs(Math.log(p.frequencyHz() / f)) > Math.log(2) / 12) continue;
            last = p;
            out.printf(Locale.ROOT, "%10.1f  %12.4g  %9.1f  %10.4g%n", p.frequencyHz(), p.zOutOhms(), p.zOutPhaseDeg(), p.dampingFactor());
        }
        out.printf(Locale.ROOT, "at %.1f Hz: output impedance %.4g ohm, damping factor %.4g%n", k.frequencyHz(), k.zOutOhms(), k.dampingFactor());
    }

    /** The first channel that is not the generator (1 without one). */
    private static int firstOutput(OptionalInt generator) {
        return generator.isPresent() && generator.getAsInt() == 1 ? 2 : 1;
    }

    private Measurement first(Capture c, org.outstage.analysis.AnalysisSettings s, OptionalInt ch, OptionalInt gen, Path f) {
        List<Measurement> ms = Measuring.measure(c, s, options.specConditions(), ch, gen, f.toString());
        return ms.get(0);
    }
}
