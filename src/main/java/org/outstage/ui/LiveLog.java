package org.outstage.ui;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import org.outstage.capture.Capture;
import org.outstage.capture.WavWriter;
import org.outstage.cli.OutstageCommand;

/**
 * Logs a live block as a bias step through the {@code session add} command, so the step is measured, stored and
 * advised exactly as one added from the command line (one way to add a step). Runs off the FX thread.
 */
final class LiveLog {
    private LiveLog() {}

    /**
     * Writes the block to a temporary 32-bit float WAV in full-scale units (divided by its calibration scale) and runs
     * {@code session add SESSION --bias-mv|--bias-ma BIAS [--fs-volts FS] [--load R] --channel 1 FILE}.
     *
     * @return the command's first output line (the step), or its error line
     */
    static String addStep(Capture block, long session, String biasOption, double bias, OptionalDouble fsVolts, OptionalDouble load,
                          java.util.Optional<Path> logbook) throws Exception {
        Path tmp = Files.createTempFile("outstage-live-step-", ".wav");
        try {
            int n = (int) Math.min(Integer.MAX_VALUE - 8, block.frameCount());
            double[][] ch = new double[block.channelCount()][];
            for (int c = 0; c < ch.length; c++) {
                double[] x = block.readChannel(c, n);
                double scale = block.scale();
                for (int i = 0; i < x.length; i++) x[i] /= scale;
                ch[c] = x;
            }
            WavWriter.write(tmp, (int) Math.round(block.sampleRateHz()), WavWriter.Encoding.FLOAT_32, false, ch);
            List<String> args = new ArrayList<>(List.of("session", "add", Long.toString(session), biasOption, num(bias), "--channel", "1"));
            double fs = fsVolts.isPresent() ? fsVolts.getAsDouble() : block.scale() != 1 ? block.scale() : Double.NaN;
            if (Double.isFinite(fs)) { args.add("--fs-volts"); args.add(num(fs)); }
            if (load.isPresent()) { args.add("--load"); args.add(num(load.getAsDouble())); }
            if (logbook.isPresent()) { args.add("--logbook"); args.add(logbook.get().toString()); }
            args.add(tmp.toString());
            StringWriter out = new StringWriter(), err = new StringWriter();
            int code = OutstageCommand.commandLine(new PrintWriter(out), new PrintWriter(err)).execute(args.toArray(String[]::new));
            String first = (code == 0 ? out : err).toString().strip().lines().findFirst().orElse("");
            return code == 0 ? "Logged to session " + session + ": " + first : "Not logged: " + first.replaceFirst("^outstage: ", "");
        } finally {
            Files.deleteIfExists(tmp);
        }
    }

    private static String num(double v) { return v == Math.rint(v) && Math.abs(v) < 1e12 ? Long.toString((long) v) : String.format(Locale.ROOT, "%s", v); }
}
