package org.outstage.analysis;

import java.io.IOException;
import java.io.UncheckedIOException;
import org.jtransforms.fft.DoubleFFT_1D;
import org.outstage.capture.Capture;
import org.outstage.capture.ChannelReader;

/**
 * Averaged windowed power spectrum of one channel (Welch's method: P. D. Welch, "The use of fast Fourier
 * transform for the estimation of power spectra", IEEE Trans. Audio Electroacoust. 15(2), 1967), read in
 * blocks so the heap is bounded by the block length, not the capture length.
 *
 * <p>Scaling: {@code p[k] = 2·|X[k]|²/(L·Σw²)}, averaged over blocks. With this scaling the sum of
 * {@code p} over a line's main lobe is the line's mean-square value, and the sum over any set of noise
 * bins is the noise power in those bins (the ENBW correction is built in: Heinzel et al. 2002, §9,
 * "PS" vs "PSD" scaling with S2 = Σw²). Also keeps the complex spectrum of the first block (for phases)
 * and the mean and mean square of every sample of the record (for the total rms), and the windowed mean
 * {@code Σw·x/Σw} averaged over blocks: the DC estimate, which the window's sidelobes keep free of the
 * leakage a plain mean suffers from on a non-integer number of cycles.
 */
final class PowerSpectrum {
    final int length;
    final double sampleRateHz;
    final Window window;
    final double[] power;       // p[k], k = 0..L/2
    final double[] firstBlock;  // JTransforms realForward layout of the first block
    final int blocks;
    final double mean;
    final double windowedMean;
    final double acMeanSquare;
    final long samples;

    private PowerSpectrum(int length, double fs, Window window, double[] power, double[] firstBlock, int blocks,
                          double mean, double windowedMean, double acMeanSquare, long samples) {
        this.length = length;
        this.sampleRateHz = fs;
        this.window = window;
        this.power = power;
        this.firstBlock = firstBlock;
        this.blocks = blocks;
        this.mean = mean;
        this.windowedMean = windowedMean;
        this.acMeanSquare = acMeanSquare;
        this.samples = samples;
    }

    double binWidthHz() { return sampleRateHz / length; }

    /** Averages spectra of blocks of {@code length} (even) with hop {@code hop}; {@code offset} is subtracted before windowing. */
    static PowerSpectrum of(Capture capture, int channelIndex, int length, int hop, Window window, double offset) {
        try (ChannelReader r = capture.openChannel(channelIndex)) {
            return of(r, capture.name(), capture.sampleRateHz(), length, hop, window, offset);
        } catch (IOException e) {
            throw new UncheckedIOException(capture.name() + ": " + e.getMessage(), e);
        }
    }

    /** As {@link #of(Capture, int, int, int, Window, double)}, on a whole record already in memory (no second decode). */
    static PowerSpectrum of(double[] record, String name, double sampleRateHz, int length, int hop, Window window, double offset) {
        int[] pos = {0};
        ChannelReader r = (buffer, off, len) -> {
            if (pos[0] >= record.length) return -1;
            int k = Math.min(len, record.length - pos[0]);
            System.arraycopy(record, pos[0], buffer, off, k);
            pos[0] += k;
            return k;
        };
        try {
            return of(r, name, sampleRateHz, length, hop, window, offset);
        } catch (IOException e) {
            throw new AssertionError("reading memory cannot fail", e);
        }
    }

    private static PowerSpectrum of(ChannelReader r, String name, double sampleRateHz, int length, int hop, Window window, double offset)
            throws IOException {
        if (length % 2 != 0 || length < 16) throw new IllegalArgumentException("block length=" + length + " must be even and >= 16");
        double[] w = window.samples(length);
        double sumW2 = 0;
        for (double v : w) sumW2 += v * v;
        double[] buf = new double[length];
        double[] work = new double[length];
        double[] acc = new double[length / 2 + 1];
        double[] first = null;
        DoubleFFT_1D fft = Fft.of(length);
        int blocks = 0;
        double sumD = 0, sumD2 = 0, sumX0 = 0, sumW = 0;
        for (double v : w) sumW += v;
        long total = 0;
        {
            int filled = fill(r, buf, 0, length);
            for (int i = 0; i < filled; i++) { double d = buf[i] - offset; sumD += d; sumD2 += d * d; }
            total += filled;
            boolean full = filled == length;
            while (full) {
                // a caller that gives up (the workbench's Cancel interrupts its worker) stops a long record between blocks
                if (Thread.currentThread().isInterrupted())
                    throw new java.util.concurrent.CancellationException("analysis of " + name + " interrupted");
                for (int i = 0; i < length; i++) work[i] = (buf[i] - offset) * w[i];
                fft.realForward(work);
                if (first == null) first = work.clone();
                sumX0 += work[0];
                acc[0] += work[0] * work[0];
                acc[length / 2] += work[1] * work[1];
                for (int k = 1; k < length / 2; k++) {
                    double re = work[2 * k], im = work[2 * k + 1];
                    acc[k] += re * re + im * im;
                }
                blocks++;
                System.arraycopy(buf, hop, buf, 0, length - hop);
                int got = fill(r, buf, length - hop, hop);
                for (int i = length - hop; i < length - hop + got; i++) { double d = buf[i] - offset; sumD += d; sumD2 += d * d; }
                total += got;
                full = got == hop;
            }
        }
        if (blocks == 0) throw new IllegalArgumentException(name + " is shorter than one analysis block (" + length + " samples)");
        double scale = 2.0 / (length * sumW2 * blocks);
        for (int k = 0; k < acc.length; k++) acc[k] *= scale;
        double meanD = sumD / total;
        return new PowerSpectrum(length, sampleRateHz, window, acc, first, blocks, offset + meanD,
                offset + sumX0 / (blocks * sumW),
                Math.max(0, sumD2 / total - meanD * meanD), total);
    }

    private static int fill(ChannelReader r, double[] buf, int off, int len) throws IOException {
        int pos = 0;
        while (pos < len) {
            int k = r.read(buf, off + pos, len - pos);
            if (k < 0) break;
            pos += k;
        }
        return pos;
    }

    /** First and last bin (inclusive) of the main lobe of a line at {@code frequencyHz}, clipped to 1..L/2−1. */
    int[] lobe(double frequencyHz) {
        double b = frequencyHz / binWidthHz();
        int hw = window.mainLobeHalfWidthBins();
        int lo = Math.max(1, (int) Math.ceil(b - hw));
        int hi = Math.min(length / 2 - 1, (int) Math.floor(b + hw));
        return new int[] {lo, hi};
    }

    /** Mean-square value of a line: power summed over its main lobe (free of scalloping loss). */
    double linePower(double frequencyHz) {
        int[] lh = lobe(frequencyHz);
        double s = 0;
        for (int k = lh[0]; k <= lh[1]; k++) s += power[k];
        return s;
    }

    /**
     * Phase (radians) of the cosine of a line at {@code frequencyHz} at the first sample of the first block:
     * {@code arg X[m] + π·(m − b)}, b the exact line position in bins, m the nearest bin. Holds for a
     * window symmetric about L/2 whose main lobe is real and positive (all windows here).
     */
    double linePhase(double frequencyHz) {
        double b = frequencyHz / binWidthHz();
        int m = (int) Math.round(b);
        m = Math.max(1, Math.min(length / 2 - 1, m));
        double re = firstBlock[2 * m], im = firstBlock[2 * m + 1];
        return Math.atan2(im, re) + Math.PI * (m - b);
    }
}
