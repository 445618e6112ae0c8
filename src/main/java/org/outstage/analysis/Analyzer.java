package org.outstage.analysis;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Optional;
import org.outstage.Require;
import org.outstage.analysis.stage.SignalCheck;
import org.outstage.analysis.stage.StageAnalyzer;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.analysis.stage.StageSettings;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;

/**
 * The measurement pipeline: one channel of a capture in, one {@link Measurement} out. Pure, thread-safe,
 * deterministic; no I/O beyond reading the capture's samples.
 *
 * <p>Steps (sources and assumptions in docs/methods.md):
 * <ol>
 * <li>Fundamental: coarse spectral peak, then the IEEE Std 1057-2017 four-parameter sine fit
 *     ({@link SineFitter}) on a bounded span (the first 2^18 samples), refined on records of many cycles
 *     by a window-weighted four-parameter fit so harmonics do not bias the frequency.</li>
 * <li>Long records (at least 50 cycles): averaged power spectra with the 7-term Blackman-Harris window
 *     (Solomon 1994, −180 dB sidelobes), power-of-two blocks of up to 2^20 samples tiling the record with
 *     at least 50 % overlap (Welch 1967). Each
 *     line's mean square is the power summed over its main lobe (free of scalloping loss, scaled by Σw²).
 *     Harmonic phases come from the first block's complex spectrum.</li>
 * <li>Short records (fewer than 50 cycles, up to 2^20 samples): a least-squares fit of DC, fundamental and
 *     harmonics at an iterated common frequency ({@code HarmonicFit}); the residual, band-limited by a
 *     rectangular-window FFT, is the noise.</li>
 * <li>THD_F = rss(H2…HN)/H1 and THD_R = THD_F/√(1+THD_F²); THD+N (AES17-style) = rms of everything but
 *     DC and the fundamental in the band (brick-wall, optionally A-weighted) over the rms of the total
 *     in the band; SINAD (IEEE Std 1241-2010) = fundamental over unweighted noise+distortion in the band;
 *     ENOB = (SINAD − 1.7609 dB)/6.0206 dB.</li>
 * <li>Floor: the larger of the quantisation floor (bit depth known) and the measured noise floor
 *     (median noise density between lines, integrated over the band).</li>
 * </ol>
 *
 * <p>Memory: bounded by the block length (about 50 MB at 2^20 samples), not by the capture length.
 *
 * <p>Threads: the output-stage diagnosis depends only on the span and the fit, so it runs on an idle core beside
 * the spectrum when one is free (one capture analysed alone), and inline when every core already analyses a
 * capture (a batch); the figures are the same either way ({@code Helper}).
 *
 * <p>Worked example (replayed in {@code AnalyzerTest.javadocExample_twoVoltSineReadsTwoVoltsRms}): a 1 s,
 * 48 kHz record of {@code 2·√2·sin(2π·1000·t)} in volts with a 8 Ω load comes back as
 * 2.0 V rms at 1000 Hz, 0.5 W, with THD below −160 dB (the double-precision floor of the method).
 */
public final class Analyzer {
    /** The largest block length. */
    static final int MAX_BLOCK = 1 << 20;
    /** Samples used for the sine fit (2.7 s at 96 kHz). */
    static final int FIT_SPAN = 1 << 18;
    /** Records with fewer cycles than this use the multi-harmonic fit. */
    static final double SHORT_RECORD_CYCLES = 50;
    /** Shortest usable record, in cycles of the fundamental. */
    static final double MIN_CYCLES = 1.5;
    /** A line must stand this far (power ratio) above the noise in its own main lobe. */
    static final double MIN_LINE_TO_NOISE = 100;
    /** A harmonic counts as resolved at this power ratio (10 dB) above the noise in its own bins. */
    static final double RESOLVED_ABOVE_NOISE = 10;
    static final Window WINDOW = Window.BLACKMAN_HARRIS_7;

    private static final double LOG_1_5 = 10 * Math.log10(1.5);   // 1.7609 dB, IEEE 1241 / Kester MT-001
    private static final double DB_PER_BIT = 20 * Math.log10(2);  // 6.0206 dB

    private Analyzer() {}

    /**
     * Analyses channel {@code channelIndex} (0-based) of {@code capture}.
     *
     * @throws IllegalArgumentException if the channel does not exist
     * @throws java.io.UncheckedIOException if the capture's samples cannot be read
     * @throws java.util.concurrent.CancellationException if the calling thread is interrupted while a long record
     *         is being read block by block (the workbench's Cancel)
     */
    public static Measurement analyze(Capture capture, int channelIndex, AnalysisSettings settings) {
        Require.notNull("capture", capture);
        Require.notNull("settings", settings);
        if (channelIndex < 0 || channelIndex >= capture.channelCount())
            throw new IllegalArgumentException("channel " + (channelIndex + 1) + " does not exist in " + capture.name() + " (it has " + capture.channelCount() + ")");
        Helper.enter();
        try {
            return new Run(capture, channelIndex, settings).run();
        } finally {
            Helper.leave();
        }
    }

    /**
     * Analyses channel {@code channelIndex} and adds the spec-sheet figures the conditions call for
     * ({@link SpecLines}; sources in docs/methods.md):
     * <ul>
     * <li>intermodulation when the stimulus is stated as {@code SMPTE} or {@code TWIN}, or, with
     *     {@link StimulusKind#AUTO}, when the capture holds no single tone and two strong tones are found
     *     (SMPTE RP120 modulation method; IEC 60268-3 / DIN 45403 difference-frequency method);</li>
     * <li>noise and hum when the stimulus is {@link StimulusKind#NONE}, or, with AUTO, when no tone is found:
     *     the measurement is "not measured", or its fundamental is below 10 mV in a capture in volts (the same
     *     rule as verify's noise limit) or below 1e-4 of full scale in an uncalibrated one
     *     ({@link #NOISE_TONE_LIMIT_FULL_SCALE}), and no driven channel is named; band and A-weighting after AES17 /
     *     IEC 61672-1;</li>
     * <li>crosstalk when a driven channel other than this one is named.</li>
     * </ul>
     */
    public static Measurement analyze(Capture capture, int channelIndex, AnalysisSettings settings, SpecConditions conditions) {
        Require.notNull("conditions", conditions);
        Measurement m = analyze(capture, channelIndex, settings);
        StimulusKind st = conditions.stimulus();
        boolean wantImd = st == StimulusKind.SMPTE || st == StimulusKind.TWIN || (st == StimulusKind.AUTO && !m.measured());
        boolean weak = !m.measured() || (capture.unit() == SampleUnit.VOLTS && m.fundamental().rms() < NOISE_TONE_LIMIT_VOLTS)
                || (capture.unit() == SampleUnit.FULL_SCALE && m.fundamental().rms() < NOISE_TONE_LIMIT_FULL_SCALE);
        // a channel of a crosstalk capture is not a noise capture, however weak its tone
        boolean wantNoise = st == StimulusKind.NONE || (st == StimulusKind.AUTO && weak && conditions.drivenChannel().isEmpty());
        int driven = conditions.drivenChannel().orElse(0) - 1;
        if (driven >= capture.channelCount())
            throw new IllegalArgumentException("driven channel " + (driven + 1) + " does not exist in " + capture.name()
                    + " (it has " + capture.channelCount() + ")");
        boolean wantCross = driven >= 0 && driven != channelIndex;
        if (!wantImd && !wantNoise && !wantCross) return m;
        Optional<SpecLines> lines = SpecLines.of(capture, channelIndex);
        if (lines.isEmpty()) return m;
        Optional<Intermodulation> imd = wantImd ? lines.get().intermodulation(st) : Optional.empty();
        Optional<NoiseFigures> noise = wantNoise && imd.isEmpty()
                ? Optional.of(lines.get().noise(settings.band().lowHz(), settings.band().effectiveHighHz(capture.sampleRateHz()), capture.unit(),
                        settings.loadOhms(), conditions.ratedPowerWatts()))
                : Optional.empty();
        Optional<Crosstalk> cross = Optional.empty();
        if (wantCross) {
            Optional<SpecLines> d = SpecLines.of(capture, driven);
            if (d.isPresent()) cross = SpecLines.crosstalk(lines.get(), d.get(), driven + 1, settings.fundamentalHz());
            // a sweep on the driven channel (stated, or no tone here): crosstalk against frequency; SweepResponse
            // refuses a stimulus that is not a sweep (less than two octaves), and the tone figure then stands
            if (st == StimulusKind.SWEEP || (st == StimulusKind.AUTO && !m.measured())) {
                try {
                    cross = Optional.of(Crosstalk.fromSweep(driven + 1, SweepResponse.measure(capture.readChannel(channelIndex),
                            capture.readChannel(driven), capture.sampleRateHz(), true, Band.AUDIO_20_20K)));
                } catch (IllegalArgumentException e) {
                    // not a sweep
                }
            }
        }
        return m.withSpecFigures(imd, noise, cross);
    }

    /** A tone below this (10 mV rms, in a capture in volts) is not a test signal: the capture is a noise capture (our rule). */
    public static final double NOISE_TONE_LIMIT_VOLTS = 0.01;

    /**
     * The same rule for an uncalibrated capture (full-scale units): a strongest line below 1e-4 of full scale rms
     * (−77 dBFS) is no test tone. It is 10 mV at the amplifier for a full scale of 141 V peak, more than any bench
     * divider gives, so a tone this rule calls noise would be called noise in volts too; a test tone on a power
     * amplifier bench sits within some 40 dB of full scale (our rule). Without it, the input-shorted sample capture
     * read without its calibration gave THD figures of its 50 Hz hum.
     */
    public static final double NOISE_TONE_LIMIT_FULL_SCALE = 1e-4;

    /** Analyses every channel of {@code capture}, in channel order. */
    public static List<Measurement> analyzeAll(Capture capture, AnalysisSettings settings) {
        Require.notNull("capture", capture);
        List<Measurement> out = new ArrayList<>();
        for (int c = 0; c < capture.channelCount(); c++) out.add(analyze(capture, c, settings));
        return List.copyOf(out);
    }

    /** How many frames of a capture the fit and the stage diagnosis use (the analysis span, from the start). */
    public static int spanFrames(Capture capture) {
        return (int) Math.min(capture.frameCount(), MAX_BLOCK);
    }

    /** Analyses a record held in memory (name "samples", channel 1). */
    public static Measurement analyze(double[] samples, double sampleRateHz, SampleUnit unit, AnalysisSettings settings) {
        return analyze(Capture.inMemory("samples", sampleRateHz, unit, samples), 0, settings);
    }

    /** Analyses a record held in memory with the default settings. */
    public static Measurement analyze(double[] samples, double sampleRateHz, SampleUnit unit) {
        return analyze(samples, sampleRateHz, unit, AnalysisSettings.DEFAULT);
    }

    private static final class Run {
        final Capture capture;
        final int index;
        final AnalysisSettings s;
        final double fs;
        final long n;
        final double lowHz, highHz;
        final Weighting weighting;
        /** The coarse peak search's spectrum of the span's first samples (set by the fit, before the stage starts). */
        HannSpectrum coarse;
        /** The span's level figures (set before the stage starts; every sample finite). */
        SignalCheck.Level level;

        Run(Capture capture, int index, AnalysisSettings s) {
            this.capture = capture;
            this.index = index;
            this.s = s;
            this.fs = capture.sampleRateHz();
            this.n = capture.frameCount();
            this.lowHz = s.band().lowHz();
            this.highHz = s.band().effectiveHighHz(fs);
            this.weighting = s.weighting();
        }

        Measurement notMeasured(String reason) {
            return Analyzer.notMeasured(capture.name(), index + 1, fs, capture.unit().symbol(), n, s, reason);
        }

        Measurement run() {
            if (n < 16) return notMeasured("record too short: " + n + " samples");
            if (lowHz >= highHz) return notMeasured("band " + s.band().label() + " lies above the Nyquist frequency " + Levels.formatHz(fs / 2));
            int spanLen = (int) Math.min(n, MAX_BLOCK);
            double[] span = capture.readChannel(index, spanLen);
            double mean = 0;
            for (double v : span) mean += v;
            mean /= span.length;
            if (!Double.isFinite(mean)) return notMeasured("the record holds samples that are not finite numbers");
            double ac2 = 0, peak = 0;
            for (double v : span) { double d = v - mean; ac2 += d * d; peak = Math.max(peak, Math.abs(v)); }
            double acRms = Math.sqrt(ac2 / span.length);
            if (!(acRms > 1e-12 * Math.max(peak, Double.MIN_NORMAL)) || acRms == 0)
                return notMeasured("silence or DC only: no AC signal in the record");
            level = new SignalCheck.Level(mean, acRms, peak);   // summed as the signal check sums them: it need not again
            // The Welch spectrum of a long record depends on the record alone (its blocks are laid out by the record's
            // length; the offset taken off before windowing is the span's mean), so it starts beside the fit. A record
            // the fit then finds short, or a tone too low for the blocks, gives it up (see longRecord).
            int[] layout = blockLayout(Integer.highestOneBit((int) Math.min(n, MAX_BLOCK)));
            double offset = mean;
            Helper<PowerSpectrum> spectrum = Helper.start(span.length, () -> spectrum(span, layout, offset));
            SineFit fit;
            try {
                // the fit uses at most FIT_SPAN samples; a record with few cycles in that span is fitted whole
                double[] fitSpan = span.length <= FIT_SPAN ? span : Arrays.copyOf(span, FIT_SPAN);
                fit = fitFundamental(fitSpan);
                if (fitSpan.length < span.length && (!fit.converged() || fit.frequencyHz() * fitSpan.length / fs < 20)) fit = fitFundamental(span);
            } catch (ArithmeticException e) {
                spectrum.cancel();
                return notMeasured("no clear spectral line: the sine fit did not settle");
            } catch (RuntimeException | Error e) {
                spectrum.cancel();
                throw e;
            }
            double f = fit.frequencyHz();
            double cycles = n * f / fs;
            boolean shortOne = n <= MAX_BLOCK && cycles < SHORT_RECORD_CYCLES;
            if (!(f > 0) || f >= fs / 2 || cycles < MIN_CYCLES || shortOne) spectrum.cancel();
            if (!(f > 0) || f >= fs / 2) return notMeasured("no clear spectral line: fitted frequency " + f + " Hz is outside 0…Nyquist");
            if (cycles < MIN_CYCLES)
                return notMeasured(String.format(java.util.Locale.ROOT, "record too short: %.2f cycles of %s, at least %.1f needed", cycles, Levels.formatHz(f), MIN_CYCLES));
            final SineFit fitted = fit;
            // the figures from the spectrum follow it on its thread, so they are ready when the diagnosis is
            Helper<Measurement> fromSpectrum = shortOne ? null
                    : spectrum.then(span.length, () -> longRecord(span, fitted, spectrum, layout, offset));
            Helper<StageDiagnosis> stage = Helper.start(span.length, () -> diagnose(span, fitted));
            Measurement core;
            StageDiagnosis diagnosis = null;
            try {
                // with no idle core for the diagnosis, it runs here now, while the spectrum may still run beside it
                if (stage.inline()) diagnosis = stage.join();
                core = shortOne ? shortRecord(span, fit) : fromSpectrum.join();
            } catch (RuntimeException | Error e) {
                stage.cancel();
                if (fromSpectrum != null) fromSpectrum.cancel();
                spectrum.cancel();
                throw e;
            }
            if (!core.measured()) {
                stage.cancel();
                return core;
            }
            return withStage(core, diagnosis != null ? diagnosis : stage.join());
        }

        /** Welch blocks of {@code len} samples over the record: {len, hop}, at least 50 % overlap, tiling the record. */
        int[] blockLayout(int len) {
            int hop = len;
            if (n > len) {
                long extra = n - len;
                long steps = (extra + len / 2 - 1) / (len / 2);
                hop = (int) (extra / steps);
            }
            return new int[] {len, hop};
        }

        /** The Welch spectrum with blocks laid out as {@code layout}, {@code offset} taken off before windowing. */
        PowerSpectrum spectrum(double[] span, int[] layout, double offset) {
            // the span holds the whole record when it is at most MAX_BLOCK long: no second decode of the file
            return span.length == n ? PowerSpectrum.of(span, capture.name(), fs, layout[0], layout[1], WINDOW, offset)
                    : PowerSpectrum.of(capture, index, layout[0], layout[1], WINDOW, offset);
        }

        /**
         * Adds the output-stage diagnosis of the same span (org.outstage.analysis.stage). When the stage's
         * signal check finds no single dominant tone (two tones, or noise), the core figures would describe the
         * wrong thing, so the whole measurement becomes "not measured" with that reason.
         */
        Measurement withStage(Measurement core, StageDiagnosis d) {
            if (d instanceof StageDiagnosis.NotMeasured nm && SignalCheck.isNoSingleTone(nm.reason())) return notMeasured(nm.reason());
            return core.withStage(d);
        }

        /** The output-stage diagnosis of the span (independent of the spectrum, so it may run beside it). */
        StageDiagnosis diagnose(double[] span, SineFit fit) {
            StageSettings ss = StageSettings.defaults().withUnit(capture.unit().symbol());
            StageDiagnosis d;
            if (s.referenceChannel().isPresent()) {
                int ref = s.referenceChannel().getAsInt() - 1;
                if (ref >= capture.channelCount())
                    throw new IllegalArgumentException("reference channel " + (ref + 1) + " does not exist in " + capture.name()
                            + " (it has " + capture.channelCount() + ")");
                if (ref == index) throw new IllegalArgumentException("reference channel " + (ref + 1) + " is the analysed channel");
                d = StageAnalyzer.diagnose(span, capture.readChannel(ref, span.length), fs, fit, ss, Optional.ofNullable(coarse));
            } else {
                d = StageAnalyzer.diagnose(span, fs, fit, ss, Optional.ofNullable(coarse), Optional.ofNullable(level));
            }
            return d;
        }

        /**
         * Coarse start (hint or spectral peak), then the window-weighted four-parameter fit of the span (records of
         * many cycles) or the plain one (docs/methods.md §1).
         */
        SineFit fitFundamental(double[] span) {
            int pre = Math.min(span.length, 1 << 16);
            double[] prefix = pre == span.length ? span : Arrays.copyOf(span, pre);
            // with a hint: the strongest line within ±10 % of it (the hint need not be exact)
            coarse = HannSpectrum.of(prefix, pre);   // the signal check reads it again when it looks at the same samples
            double start = s.fundamentalHz().isPresent()
                    ? SineFitter.coarseFrequency(coarse, fs, 0.9 * s.fundamentalHz().getAsDouble(), 1.1 * s.fundamentalHz().getAsDouble())
                    : SineFitter.coarseFrequency(coarse, fs, 0, Double.POSITIVE_INFINITY);
            // On records of many cycles, refine with window-weighted least squares: the window's sidelobes keep
            // harmonics and other tones from biasing the frequency of a fit over a non-integer number of cycles.
            // The iteration converges to the same point from any start within a fraction of a bin, so it starts from
            // the coarse peak when the prefix is at least half the span (the peak is then within a small fraction of
            // the span's bin), else from the prefix's four-parameter fit; the unweighted fit of the whole span is made
            // only when the weighted one does not settle.
            boolean fromCoarse = span.length <= 2 * pre;
            if (fromCoarse) {
                Optional<SineFit> w = weighted(span, start);
                if (w.isPresent()) return w.get();
            }
            SineFit first = SineFitter.fourParameter(prefix, fs, start);
            if (!fromCoarse) {
                Optional<SineFit> w = weighted(span, first.frequencyHz());
                if (w.isPresent()) return w.get();
            }
            return pre == span.length ? first : SineFitter.fourParameter(span, fs, first.frequencyHz());
        }

        /** The window-weighted fit of a span of many cycles from {@code startHz}, when it settles inside 0…Nyquist. */
        Optional<SineFit> weighted(double[] span, double startHz) {
            if (!(startHz * span.length / fs >= SHORT_RECORD_CYCLES && span.length >= 64)) return Optional.empty();
            SineFit w = SineFitter.fourParameterWeighted(span, fs, startHz, WINDOW.samples(span.length));
            return w.converged() && w.frequencyHz() > 0 && w.frequencyHz() < fs / 2 ? Optional.of(w) : Optional.empty();
        }

        int maxOrder(double f, double guardHz) {
            int last = 1;
            for (int k = 2; k <= s.harmonics(); k++) {
                double fk = k * f;
                if (fk > highHz || fk + guardHz >= fs / 2) break;
                last = k;
            }
            return last;
        }

        // ---------------------------------------------------------------- long records

        Measurement longRecord(double[] span, SineFit fit, Helper<PowerSpectrum> started, int[] startedLayout, double offset) {
            // a fit that did not settle on a line weaker than its residual is no tone at all (a sweep, or noise
            // without a dominant line): its "fundamental" would be wherever the iteration stopped
            double fitPower = fit.amplitudePeak() * fit.amplitudePeak() / 2;
            if (!fit.converged() && !(fitPower > fit.residualRms() * fit.residualRms())) {
                started.cancel();
                return notMeasured("no clear spectral line: the sine fit did not settle, and its line is weaker than what is left over");
            }
            double f = fit.frequencyHz();
            // power-of-two blocks (fast FFT), at least 50 % overlap, hop chosen so the blocks tile the record
            int len = startedLayout[0];
            if (len * f / fs < SHORT_RECORD_CYCLES) {
                started.cancel();
                if (n > MAX_BLOCK)
                    return notMeasured("fundamental " + Levels.formatHz(f) + " is too low for the analysis block of " + len + " samples");
                len = (int) (n - n % 2);   // one block of the whole record (mixed-radix FFT)
            }
            int[] layout = blockLayout(len);
            PowerSpectrum ps = Arrays.equals(layout, startedLayout) ? started.join() : spectrum(span, layout, offset);
            double binW = ps.binWidthHz();
            int hw = WINDOW.mainLobeHalfWidthBins();
            int top = maxOrder(f, (hw + 1) * binW);
            double p1 = ps.linePower(f);
            double phi1 = ps.linePhase(f);

            // bins belonging to DC, the fundamental or a harmonic (any order up to N below Nyquist)
            int half = len / 2;
            boolean[] line = new boolean[half + 1];
            for (int k = 0; k <= Math.min(half, hw); k++) line[k] = true;
            int[] l1 = ps.lobe(f);
            for (int k = l1[0]; k <= l1[1]; k++) line[k] = true;
            for (int h = 2; h <= s.harmonics() && h * f + hw * binW < fs / 2; h++) {
                int[] lh = ps.lobe(h * f);
                for (int k = lh[0]; k <= lh[1]; k++) line[k] = true;
            }
            int kLo = Math.max(1, (int) Math.ceil(lowHz / binW));
            int kHi = Math.min(half - 1, (int) Math.floor(highHz / binW));
            double[] noiseBins = new double[Math.max(0, kHi - kLo + 1)];
            int nb = 0;
            for (int k = kLo; k <= kHi; k++) if (!line[k]) noiseBins[nb++] = ps.power[k];
            double density = nb > 0 ? Stats.median(noiseBins, nb) * Stats.medianToMean(ps.blocks) : 0;

            if (!(p1 > MIN_LINE_TO_NOISE * density * (2 * hw + 1)) || !(p1 > 0))
                return notMeasured("no clear spectral line: the strongest line at " + Levels.formatHz(f) + " does not stand 20 dB above the noise");

            // THD+N: everything in the band but DC and the fundamental; excluded bins filled with the noise density
            double ndU = 0, ndW = 0, bandG2 = 0;
            for (int k = kLo; k <= kHi; k++) {
                double fk = k * binW;
                double g = weighting.gainAt(fk);
                double g2 = g * g;
                bandG2 += g2;
                boolean excluded = k <= hw || (k >= l1[0] && k <= l1[1]);
                double p = excluded ? density : ps.power[k];
                ndU += p;
                ndW += p * g2;
            }
            List<Measurement.Harmonic> harmonics = new ArrayList<>();
            double sumH = 0;
            for (int h = 2; h <= top; h++) {
                double raw = ps.linePower(h * f);
                int[] lh = ps.lobe(h * f);
                double underLine = density * (lh[1] - lh[0] + 1);   // the noise expected in the lobe's bins
                boolean resolved = raw >= RESOLVED_ABOVE_NOISE * underLine;
                double ph = resolved ? raw - underLine : raw;
                double ratio = Math.sqrt(ph / p1);
                double rel = wrapDeg(Math.toDegrees(ps.linePhase(h * f) - h * phi1));
                harmonics.add(new Measurement.Harmonic(h, h * f, Math.sqrt(ph), ratio, Levels.ratioToDb(ratio), rel, resolved));
                sumH += ph;
            }
            double noiseFloorPower = density * bandG2;
            // total mean square without DC from the spectrum (free of the partial-cycle error of a plain mean square)
            double totalMs = 0;
            for (int k = 1; k < half; k++) totalMs += k <= hw ? density : ps.power[k];
            Measurement.Spectrum spectrum = summary(ps.power, binW, 1, half - 1, p1 / WINDOW.enbwBins(len), density, ps.blocks);
            return finish(fit, f, p1, fit.phaseRadians(), ps.windowedMean, totalMs, harmonics, sumH, ndU, ndW, noiseFloorPower,
                    Measurement.Method.WINDOWED_SPECTRUM, spectrum, span);
        }

        // ---------------------------------------------------------------- short records

        Measurement shortRecord(double[] y, SineFit fit) {
            // The rule at the end (the fundamental must outweigh what the harmonic fit leaves over) cannot pass when
            // the sine fit's line holds under 1 % of its residual's power (THD+N above 1000 %): say so before the
            // harmonic fit, whose cost on a record that is not a steady tone (an exponential sweep read as a few-hertz
            // "tone") was seconds of iterations that do not settle.
            double fitPower = fit.amplitudePeak() * fit.amplitudePeak() / 2;
            if (!(fitPower >= 0.01 * fit.residualRms() * fit.residualRms()))
                return notMeasured("no clear spectral line: the fitted fundamental is weaker than what is left over");
            double f0 = fit.frequencyHz();
            int orders = 1;
            for (int k = 2; k <= s.harmonics() && k * f0 < fs / 2 * 0.98; k++) orders = k;
            HarmonicFit hf;
            try {
                hf = HarmonicFit.fit(y, fs, f0, orders);
            } catch (ArithmeticException e) {
                return notMeasured("no clear spectral line: the harmonic fit is singular");
            }
            double f = hf.frequencyHz;
            double p1 = hf.amplitude[1] * hf.amplitude[1] / 2;
            double phi1Mid = hf.phaseMid[1];
            int top = maxOrder(f, 0);
            List<Measurement.Harmonic> harmonics = new ArrayList<>();
            double sumH = 0, ndU = 0, ndW = 0;
            for (int h = 2; h <= hf.orders(); h++) {
                double fh = h * f;
                if (fh < lowHz || fh > highHz) continue;
                double ph = hf.amplitude[h] * hf.amplitude[h] / 2;
                double g = weighting.gainAt(fh);
                ndU += ph;
                ndW += ph * g * g;
            }
            // residual (noise and harmonics above the fitted orders), band-limited with a rectangular-window FFT
            int m = y.length - (y.length % 2);
            double[] r = Arrays.copyOf(hf.residual, m);
            Fft.of(m).realForward(r);
            double binW = fs / m;
            int kLo = Math.max(1, (int) Math.ceil(lowHz / binW));
            int kHi = Math.min(m / 2 - 1, (int) Math.floor(highHz / binW));
            double[] pr = new double[m / 2 + 1];
            double scale = 2.0 / ((double) m * m);
            double resU = 0, resW = 0, bandG2 = 0;
            double[] noiseBins = new double[Math.max(0, kHi - kLo + 1)];
            int nb = 0;
            for (int k = 1; k < m / 2; k++) pr[k] = (r[2 * k] * r[2 * k] + r[2 * k + 1] * r[2 * k + 1]) * scale;
            for (int k = kLo; k <= kHi; k++) {
                double g = weighting.gainAt(k * binW);
                resU += pr[k];
                resW += pr[k] * g * g;
                bandG2 += g * g;
                noiseBins[nb++] = pr[k];
            }
            double resAll = 0;
            for (double v : hf.residual) resAll += v * v;
            resAll /= hf.residual.length;
            if (!(p1 > resAll)) return notMeasured("no clear spectral line: the fitted fundamental is weaker than what is left over");
            ndU += resU;
            ndW += resW;
            double density = nb > 0 ? Stats.median(noiseBins, nb) * Stats.medianToMean(1) : 0;
            for (int h = 2; h <= Math.min(top, hf.orders()); h++) {
                double ph = hf.amplitude[h] * hf.amplitude[h] / 2;
                double ratio = Math.sqrt(ph / p1);
                double rel = wrapDeg(Math.toDegrees(hf.phaseMid[h] - h * phi1Mid));
                // the least-squares estimate of a line's power carries about one bin of the residual's noise
                boolean resolved = ph >= RESOLVED_ABOVE_NOISE * density;
                harmonics.add(new Measurement.Harmonic(h, h * f, Math.sqrt(ph), ratio, Levels.ratioToDb(ratio), rel, resolved));
                sumH += ph;
            }
            double mean = hf.dc;
            // total mean square without DC: fitted lines plus what is left over (free of the partial-cycle error)
            double ms = resAll;
            for (int h = 1; h <= hf.orders(); h++) ms += hf.amplitude[h] * hf.amplitude[h] / 2;
            // spectrum for plotting: the record through the analysis window (one block)
            Measurement.Spectrum spectrum;
            if (m >= 16) {
                double[] w = WINDOW.samples(m);
                double sw2 = 0;
                double[] x = new double[m];
                for (int i = 0; i < m; i++) { x[i] = (y[i] - mean) * w[i]; sw2 += w[i] * w[i]; }
                Fft.of(m).realForward(x);
                double[] pw = new double[m / 2 + 1];
                for (int k = 1; k < m / 2; k++) pw[k] = (x[2 * k] * x[2 * k] + x[2 * k + 1] * x[2 * k + 1]) * 2 / (m * sw2);
                spectrum = summary(pw, binW, 1, m / 2 - 1, p1 / WINDOW.enbwBins(m), density, 1);   // noise per bin is window-independent with Σw² scaling
            } else {
                spectrum = Measurement.Spectrum.empty();
            }
            double phi1Start = hf.phaseAtStart(1);
            return finish(fit, f, p1, phi1Start, mean, ms, harmonics, sumH, ndU, ndW, density * bandG2,
                    Measurement.Method.MULTI_HARMONIC_FIT, spectrum, y);
        }

        // ---------------------------------------------------------------- common figures

        Measurement finish(SineFit fit, double f, double p1, double phi1, double mean, double acMeanSquare,
                           List<Measurement.Harmonic> harmonics, double sumH, double ndU, double ndW, double noiseFloorPower,
                           Measurement.Method method, Measurement.Spectrum spectrum, double[] span) {
            double rms1 = Math.sqrt(p1);
            double thdF = Math.sqrt(sumH / p1);
            double thdN = Math.sqrt(ndW / (p1 + ndU));
            double sinad = 10 * Math.log10(p1 / ndU);
            double enob = (sinad - LOG_1_5) / DB_PER_BIT;
            double measuredFloor = Math.sqrt(noiseFloorPower / p1);
            double quant = Double.NaN;
            java.util.OptionalInt bits = s.bitDepth().isPresent() ? s.bitDepth() : capture.bitDepth();
            if (bits.isPresent()) {
                // IEEE 1241 / Kester MT-001: q = FSR/2^N, noise q²/12 white over 0…fs/2; scaled to the band and weighting.
                double fsPeak = capture.scale();
                double q = 2 * fsPeak / Math.pow(2, bits.getAsInt());
                double bandFraction = weightedBandFraction();
                quant = Math.sqrt(q * q / 12 * bandFraction / p1);
            }
            Measurement.Floor floor;
            if (Double.isNaN(quant) || measuredFloor >= quant) floor = new Measurement.Floor(measuredFloor, Measurement.FloorKind.MEASURED_NOISE, quant, measuredFloor);
            else floor = new Measurement.Floor(quant, Measurement.FloorKind.QUANTISATION, quant, measuredFloor);
            boolean atFloor = thdN < floor.ratio() * Math.pow(10, 3.0 / 20);
            double totalRms = Math.sqrt(acMeanSquare);
            Optional<Measurement.Power> power = Optional.empty();
            if (capture.unit() == SampleUnit.VOLTS && s.loadOhms().isPresent()) {
                double r = s.loadOhms().getAsDouble();
                power = Optional.of(new Measurement.Power(r, p1 / r, acMeanSquare / r));
            }
            Measurement.Fundamental fund = new Measurement.Fundamental(f, rms1, rms1 * Math.sqrt(2), wrapDeg(Math.toDegrees(phi1)));
            return new Measurement(capture.name(), index + 1, fs, capture.unit().symbol(), n, n / fs, s, Optional.empty(), method,
                    fund, mean, harmonics, new Measurement.Ratio(thdF), new Measurement.Ratio(Levels.thdFToThdR(thdF)),
                    new Measurement.ThdN(thdN, lowHz, highHz, weighting, atFloor), sinad, enob, floor, totalRms, power, fit,
                    spectrum, excerpt(span, f));
        }

        /** Fraction of white noise from 0…fs/2 that the band (with its weighting) passes: ∫band g² df / (fs/2). */
        double weightedBandFraction() {
            int steps = 20000;
            double df = (highHz - lowHz) / steps;
            double sum = 0;
            for (int i = 0; i < steps; i++) {
                double g = weighting.gainAt(lowHz + (i + 0.5) * df);
                sum += g * g * df;
            }
            return sum / (fs / 2);
        }

        Measurement.Waveform excerpt(double[] span, double f) {
            int want = (int) Math.ceil(3 * fs / f) + 1;
            int k = Math.min(Math.min(span.length, want), 8192);
            return new Measurement.Waveform(0, fs, Arrays.copyOf(span, k));
        }
    }

    /**
     * Log-frequency summary of a one-sided power spectrum: at most {@link Measurement.Spectrum#MAX_POINTS}
     * points, each the largest bin it covers, in dB relative to {@code refPerBin} (the fundamental's power
     * divided by the window's ENBW, so a line reads its own level).
     */
    static Measurement.Spectrum summary(double[] p, double binW, int k0, int k1, double refPerBin, double density, int blocks) {
        int points = Measurement.Spectrum.MAX_POINTS;
        double lnLo = Math.log(k0), lnHi = Math.log(k1 + 1);
        double[] fOut = new double[points];
        double[] vOut = new double[points];
        int[] bestK = new int[points];
        Arrays.fill(bestK, -1);
        for (int k = k0; k <= k1; k++) {
            int idx = (int) ((Math.log(k) - lnLo) / (lnHi - lnLo) * points);
            idx = Math.min(points - 1, Math.max(0, idx));
            if (bestK[idx] < 0 || p[k] > p[bestK[idx]]) bestK[idx] = k;
        }
        int c = 0;
        for (int i = 0; i < points; i++) {
            if (bestK[i] < 0) continue;
            fOut[c] = bestK[i] * binW;
            vOut[c] = 10 * Math.log10(Math.max(p[bestK[i]], 1e-300) / refPerBin);
            c++;
        }
        double floorDb = density > 0 ? 10 * Math.log10(density / refPerBin) : Double.NEGATIVE_INFINITY;
        return new Measurement.Spectrum(Arrays.copyOf(fOut, c), Arrays.copyOf(vOut, c), floorDb, binW, WINDOW, blocks);
    }

    static double wrapDeg(double deg) {
        double d = deg % 360;
        if (d <= -180) d += 360;
        if (d > 180) d -= 360;
        return d;
    }

    static Measurement notMeasured(String name, int channel, double fs, String unit, long frames, AnalysisSettings settings, String reason) {
        double nan = Double.NaN;
        return new Measurement(name, channel, fs, unit, frames, frames / fs, settings, Optional.of(reason), Measurement.Method.NONE,
                new Measurement.Fundamental(nan, nan, nan, nan), nan, List.of(), new Measurement.Ratio(nan), new Measurement.Ratio(nan),
                new Measurement.ThdN(nan, settings.band().lowHz(), settings.band().effectiveHighHz(fs), settings.weighting(), false), nan, nan,
                new Measurement.Floor(nan, Measurement.FloorKind.NONE, nan, nan), nan, Optional.empty(),
                new SineFit(nan, nan, nan, nan, nan, 0, false), Measurement.Spectrum.empty(), Measurement.Waveform.empty(fs));
    }
}
