package org.outstage.analysis.stage;

import java.io.IOException;
import java.io.Writer;
import org.outstage.Require;
import org.outstage.analysis.SineFit;

/**
 * The residual: the capture minus the fitted fundamental and DC (IEEE Std 1057-2017 / 1241-2010 sine-fit
 * residual, "noise and distortion"), optionally band-limited by a zero-phase high-pass (hum) and low-pass
 * (band edge), on the same time base as the capture, so it lines up sample for sample with the output
 * voltage. On a bench this is the classic way to see crossover spikes at every zero crossing.
 *
 * <p>Worked example (replayed in the tests): a 1 V peak sine plus 0.01·cos(3ωt) gives a residual of RMS
 * 0.01/√2 and peak 0.01.
 *
 * @param samples         residual samples, same length and time base as the capture
 * @param sampleRateHz    sample rate
 * @param rmsVolts        RMS of the residual
 * @param peakVolts       largest |residual|
 * @param peakTimeSeconds time of the largest |residual| from the first sample
 * @param highPassHz      high-pass corner used (0 = none)
 * @param lowPassHz       low-pass corner used (0 = none)
 */
public record Residual(double[] samples, double sampleRateHz, double rmsVolts, double peakVolts, double peakTimeSeconds,
                       double highPassHz, double lowPassHz) {
    public Residual {
        Require.notNull("samples", samples);
        Require.positive("sampleRateHz", sampleRateHz);
        samples = samples.clone();
    }

    @Override public double[] samples() { return samples.clone(); }

    /** The samples without a copy, for this package only. */
    double[] view() { return samples; }

    /** The same figures without the samples. */
    public Summary summary() { return new Summary(rmsVolts, peakVolts, peakTimeSeconds, highPassHz, lowPassHz); }

    /**
     * Residual figures without the waveform.
     *
     * @param rmsVolts        RMS of the residual
     * @param peakVolts       largest |residual|
     * @param peakTimeSeconds time of that peak from the first sample
     * @param highPassHz      high-pass corner used (0 = none)
     * @param lowPassHz       low-pass corner used (0 = none)
     */
    public record Summary(double rmsVolts, double peakVolts, double peakTimeSeconds, double highPassHz, double lowPassHz) {}

    /**
     * Writes {@code time_s,output,fundamental,residual} rows (header first, '.' decimals, shortest round-trip
     * number form) to {@code out}; the caller owns the writer and the atomic move. "fundamental" is the
     * fitted sine with its DC; with no band limit, residual = output − fundamental exactly.
     *
     * @param output the capture's samples the residual was computed from (same length)
     * @param fit    the fit used
     */
    public void writeCsv(Writer out, double[] output, SineFit fit) throws IOException {
        Require.notNull("out", out);
        Require.that(output.length == samples.length,
                "output.length=" + output.length + " must equal the residual length " + samples.length);
        StringBuilder sb = new StringBuilder(64 * 1024);
        sb.append("time_s,output,fundamental,residual\n");
        for (int i = 0; i < samples.length; i++) {
            double t = i / sampleRateHz;
            sb.append(t).append(',').append(output[i]).append(',').append(fit.valueAt(t)).append(',').append(samples[i]).append('\n');
            if (sb.length() > 60 * 1024) { out.write(sb.toString()); sb.setLength(0); }
        }
        out.write(sb.toString());
        out.flush();
    }
}
