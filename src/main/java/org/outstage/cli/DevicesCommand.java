package org.outstage.cli;

import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.outstage.audio.AudioBackend;
import org.outstage.audio.DeviceInfo;
import org.outstage.audio.JavaSoundBackend;
import org.outstage.audio.SampleFormat;
import org.outstage.json.JsonText;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code outstage devices [--json]}: the audio inputs and outputs, with the rates, encodings and channels each one
 * really accepted (a line is opened and closed at each format to find out).
 */
@Command(name = "devices", mixinStandardHelpOptions = true,
        description = "List audio inputs and outputs with the sample rates, bit depths and channels each one accepts.")
public final class DevicesCommand implements Callable<Integer> {
    @Spec picocli.CommandLine.Model.CommandSpec spec;

    @Option(names = "--json", description = "Print JSON: {\"inputs\": [...], \"outputs\": [...]} (keys in docs/cli.md).")
    boolean json;

    /** The backend; tests may replace it. */
    static java.util.function.Supplier<AudioBackend> backend = JavaSoundBackend::new;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        AudioBackend b = backend.get();
        List<DeviceInfo> in = b.inputs();
        List<DeviceInfo> outs = b.outputs();
        if (json) {
            out.println(JsonText.pretty(JsonText.obj("backend", b.name(), "inputs", list(in), "outputs", list(outs))));
        } else {
            out.println("inputs (" + b.name() + "):");
            text(out, in);
            out.println("outputs (" + b.name() + "):");
            text(out, outs);
            if (in.isEmpty() && outs.isEmpty())
                out.println("no audio device found (with PulseAudio, is the daemon running and PULSE_SERVER set?)");
        }
        out.flush();
        return OutstageCommand.EXIT_OK;
    }

    private static List<Object> list(List<DeviceInfo> ds) {
        List<Object> l = new ArrayList<>();
        for (DeviceInfo d : ds) {
            List<String> bits = new ArrayList<>();
            for (SampleFormat f : d.sampleFormats()) bits.add(f.label());
            Map<String, Object> o = JsonText.obj("name", d.name(), "description", d.description(), "channels", d.channels(),
                    "sample_rates_hz", d.sampleRatesHz(), "bits", bits, "default", d.isDefault());
            l.add(o);
        }
        return l;
    }

    private static void text(PrintWriter out, List<DeviceInfo> ds) {
        if (ds.isEmpty()) out.println("  (none)");
        for (DeviceInfo d : ds) {
            List<String> bits = new ArrayList<>();
            for (SampleFormat f : d.sampleFormats()) bits.add(f.label());
            out.printf(java.util.Locale.ROOT, "  %s%s  %d ch  rates %s Hz  bits %s%n", d.name(), d.isDefault() ? " (default)" : "", d.channels(),
                    d.sampleRatesHz(), String.join("/", bits));
        }
    }
}
