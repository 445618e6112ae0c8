package org.outstage.analysis;

import java.util.Arrays;
import java.util.List;
import java.util.Optional;
import org.outstage.Require;
import org.outstage.analysis.stage.StageDiagnosis;

/**
 * The result of analysing one channel of one capture: every figure the command line, the report, the
 * workbench and the logbook show. Immutable, no nulls. Levels ({@code rms}, {@code dcOffset},
 * {@code totalRms}) are in the capture's {@link #unit} ("V" or "FS"); ratios are plain fractions
 * (see {@link Levels} for percent and dB).
 *
 * <p><b>Not measured.</b> When the record cannot carry a measurement (shorter than 1.5 cycles, silence
 * or DC only, no clear spectral line), {@link #notMeasuredReason} says why, every numeric figure is
 * {@code NaN}, the lists and arrays are empty and {@link #powerWatts} is empty. Callers test
 * {@link #measured()} before showing numbers.
 *
 * @param captureName       name of the capture
 * @param channel           channel number, 1-based
 * @param sampleRateHz      sample rate
 * @param unit              unit symbol of levels, "V" or "FS"
 * @param frameCount        samples in the channel
 * @param durationSeconds   length of the record
 * @param settings          the settings used
 * @param notMeasuredReason why there are no figures, or empty
 * @param method            how harmonics and THD+N were obtained
 * @param fundamental       the fundamental
 * @param dcOffset          DC: the window-weighted mean over the record (long records) or the fitted constant (short records); never part of THD or THD+N
 * @param harmonics         H2…HN within the band and below Nyquist, in order
 * @param thd               THD_F: rss of the listed harmonics relative to the fundamental (IEEE/IEC 61000 convention)
 * @param thdR              THD_R = THD_F/√(1+THD_F²): relative to the fundamental and listed harmonics together
 * @param thdN              THD+N in the band (AES17-style, relative to the total in the band)
 * @param sinadDb           SINAD in dB: fundamental power over unweighted noise+distortion power in the band (IEEE 1241)
 * @param enob              effective number of bits (SINAD − 1.7609)/6.0206 (datasheet form; see docs/methods.md)
 * @param floor             what THD+N can resolve on this record
 * @param totalRms          rms of the record without DC, full bandwidth
 * @param powerWatts        output power into the load, only for a capture in volts with a load given
 * @param sineFit           the IEEE 1057 four-parameter fit of the fundamental (on the fit span, see docs/methods.md)
 * @param spectrum          a bounded log-frequency spectrum for plotting
 * @param waveform          a short excerpt of a few cycles for plotting
 * @param stage             the output-stage diagnosis (residual, transfer curve, crossover, clipping) of the same
 *                          span, or the reason it could not be made ({@code org.outstage.analysis.stage})
 * @param imd               two-tone intermodulation, for a two-tone capture (recognised or stated), else empty
 * @param noise             output noise and hum, for a capture without a test signal (stated, or no tone found)
 * @param crosstalk         crosstalk from the driven channel, on an undriven channel of a crosstalk capture
 *                          ({@link SpecConditions#drivenChannel}); empty otherwise. These three are measured even
 *                          when the THD figures are not (a two-tone or noise capture has no single fundamental).
 */
public record Measurement(String captureName, int channel, double sampleRateHz, String unit, long frameCount,
                          double durationSeconds, AnalysisSettings settings, Optional<String> notMeasuredReason,
                          Method method, Fundamental fundamental, double dcOffset, List<Harmonic> harmonics,
                          Ratio thd, Ratio thdR, ThdN thdN, double sinadDb, double enob, Floor floor, double totalRms,
                          Optional<Power> powerWatts, SineFit sineFit, Spectrum spectrum, Waveform waveform,
                          StageDiagnosis stage, Optional<Intermodulation> imd, Optional<NoiseFigures> noise,
                          Optional<Crosstalk> crosstalk) {

    public Measurement {
        Require.notNull("captureName", captureName);
        Require.that(channel >= 1, "channel=" + channel + " must be >= 1");
        Require.positive("sampleRateHz", sampleRateHz);
        Require.notNull("unit", unit);
        Require.notNull("settings", settings);
        Require.notNull("notMeasuredReason", notMeasuredReason);
        Require.notNull("method", method);
        Require.notNull("fundamental", fundamental);
        harmonics = List.copyOf(harmonics);
        Require.notNull("thd", thd);
        Require.notNull("thdR", thdR);
        Require.notNull("thdN", thdN);
        Require.notNull("floor", floor);
        Require.notNull("powerWatts", powerWatts);
        Require.notNull("sineFit", sineFit);
        Require.notNull("spectrum", spectrum);
        Require.notNull("waveform", waveform);
        Require.notNull("stage", stage);
        Require.notNull("imd", imd);
        Require.notNull("noise", noise);
        Require.notNull("crosstalk", crosstalk);
    }

    /** The figures with an output-stage diagnosis and no spec-sheet figures. */
    public Measurement(String captureName, int channel, double sampleRateHz, String unit, long frameCount,
                       double durationSeconds, AnalysisSettings settings, Optional<String> notMeasuredReason,
                       Method method, Fundamental fundamental, double dcOffset, List<Harmonic> harmonics,
                       Ratio thd, Ratio thdR, ThdN thdN, double sinadDb, double enob, Floor floor, double totalRms,
                       Optional<Power> powerWatts, SineFit sineFit, Spectrum spectrum, Waveform waveform, StageDiagnosis stage) {
        this(captureName, channel, sampleRateHz, unit, frameCount, durationSeconds, settings, notMeasuredReason, method, fundamental,
                dcOffset, harmonics, thd, thdR, thdN, sinadDb, enob, floor, totalRms, powerWatts, sineFit, spectrum, waveform, stage,
                Optional.empty(), Optional.empty(), Optional.empty());
    }

    /** The same figures with the spec-sheet figures {@code imd}, {@code noise} and {@code crosstalk}. */
    public Measurement withSpecFigures(Optional<Intermodulation> imd, Optional<NoiseFigures> noise, Optional<Crosstalk> crosstalk) {
        return new Measurement(captureName, channel, sampleRateHz, unit, frameCount, durationSeconds, settings, notMeasuredReason, method,
                fundamental, dcOffset, harmonics, thd, thdR, thdN, sinadDb, enob, floor, totalRms, powerWatts, sineFit, spectrum, waveform,
                stage, imd, noise, crosstalk);
    }

    /** The core figures without an output-stage diagnosis (yet). */
    public Measurement(String captureName, int channel, double sampleRateHz, String unit, long frameCount,
                       double durationSeconds, AnalysisSettings settings, Optional<String> notMeasuredReason,
                       Method method, Fundamental fundamental, double dcOffset, List<Harmonic> harmonics,
                       Ratio thd, Ratio thdR, ThdN thdN, double sinadDb, double enob, Floor floor, double totalRms,
                       Optional<Power> powerWatts, SineFit sineFit, Spectrum spectrum, Waveform waveform) {
        this(captureName, channel, sampleRateHz, unit, frameCount, durationSeconds, settings, notMeasuredReason, method, fundamental,
                dcOffset, harmonics, thd, thdR, thdN, sinadDb, enob, floor, totalRms, powerWatts, sineFit, spectrum, waveform,
                new StageDiagnosis.NotMeasured(notMeasuredReason.orElse("output stage not diagnosed")));
    }

    /** The same figures with the output-stage diagnosis {@code d}. */
    public Measurement withStage(StageDiagnosis d) {
        return new Measurement(captureName, channel, sampleRateHz, unit, frameCount, durationSeconds, settings, notMeasuredReason, method,
                fundamental, dcOffset, harmonics, thd, thdR, thdN, sinadDb, enob, floor, totalRms, powerWatts, sineFit, spectrum, waveform, d,
                imd, noise, crosstalk);
    }

    /** Whether the figures are real (no "not measured" reason). */
    public boolean measured() { return notMeasuredReason.isEmpty(); }

    /** How the harmonic levels and THD+N were obtained. */
    public enum Method {
        /** Averaged windowed power spectra (long records): line power summed over the window's main lobe. */
        WINDOWED_SPECTRUM,
        /** Least-squares fit of DC, fundamental and harmonics at the fitted frequency (short records). */
        MULTI_HARMONIC_FIT,
        /** Nothing was measured. */
        NONE
    }

    /**
     * The fundamental.
     *
     * @param frequencyHz   fitted frequency (IEEE 1057 four-parameter fit)
     * @param rms           rms level
     * @param amplitudePeak peak amplitude, {@code rms·√2}
     * @param phaseDeg      phase of {@code cos(2πft + φ)} at the first sample, degrees in (−180, 180]
     */
    public record Fundamental(double frequencyHz, double rms, double amplitudePeak, double phaseDeg) {}

    /**
     * One harmonic.
     *
     * @param order       k (2…N)
     * @param frequencyHz k × fundamental frequency
     * @param rms         rms level, with the estimated noise under the line subtracted when {@code resolved};
     *                    otherwise the uncorrected figure, an upper bound (the line does not stand clear of the noise)
     * @param ratio       rms / fundamental rms
     * @param dbc         20·lg(ratio), dB relative to the carrier (fundamental)
     * @param phaseDeg    φ_k − k·φ_1 in degrees, wrapped to (−180, 180], where φ_k is the phase of the
     *                    cosine of harmonic k at the first sample. This does not depend on where the
     *                    record starts (a time shift τ adds kωτ to both terms).
     * @param resolved    whether the line stands at least 10 dB above the noise estimated in the same bins
     *                    (its main lobe, or one bin of the fit residual for short records); when false, the
     *                    level is an upper bound and the phase is not meaningful
     */
    public record Harmonic(int order, double frequencyHz, double rms, double ratio, double dbc, double phaseDeg, boolean resolved) {}

    /** A plain ratio with percent and dB views. */
    public record Ratio(double ratio) {
        public double percent() { return Levels.ratioToPercent(ratio); }
        public double db() { return Levels.ratioToDb(ratio); }
    }

    /**
     * THD+N after AES17 (from memory, see docs/methods.md): everything except the fundamental and DC inside
     * the band, weighted if asked, rms relative to the rms of the total signal in the band.
     *
     * @param ratio      (noise+distortion)/total, both in the band
     * @param lowHz      lower band edge used
     * @param highHz     upper band edge used (already limited to Nyquist)
     * @param weighting  weighting applied to the noise and distortion
     * @param atFloor    true when THD+N is within 3 dB of the {@link Floor}: the figure then says more about the record than about the amplifier
     */
    public record ThdN(double ratio, double lowHz, double highHz, Weighting weighting, boolean atFloor) {
        public double percent() { return Levels.ratioToPercent(ratio); }
        public double db() { return Levels.ratioToDb(ratio); }
    }

    /** What the floor figure is. */
    public enum FloorKind {
        /** Ideal quantisation noise q/√12 of the stated bit depth, white, scaled to the band (IEEE 1241). */
        QUANTISATION,
        /** Measured noise floor: median noise density between the lines, integrated over the band. */
        MEASURED_NOISE,
        /** Not known. */
        NONE
    }

    /**
     * The measurement floor beside THD+N: the larger of the quantisation floor (if the bit depth is known)
     * and the measured noise floor, as an rms ratio to the fundamental.
     *
     * @param ratio              the larger of the two
     * @param kind               which one it is
     * @param quantisationRatio  quantisation floor, NaN if the bit depth is unknown
     * @param measuredNoiseRatio measured noise floor
     */
    public record Floor(double ratio, FloorKind kind, double quantisationRatio, double measuredNoiseRatio) {
        public double db() { return Levels.ratioToDb(ratio); }
    }

    /**
     * Output power into the load, {@code P = Vrms²/R} (IEC 60268-3 practice; textbook identity).
     *
     * @param loadOhms         the load
     * @param fundamentalWatts power of the fundamental alone
     * @param totalWatts       power of the whole record without DC
     */
    public record Power(double loadOhms, double fundamentalWatts, double totalWatts) {}

    /**
     * A bounded spectrum for plotting: at most {@link #MAX_POINTS} points on a log-frequency grid, each the
     * maximum of the bins it covers (so narrow lines stay visible). Levels are in dB relative to the
     * fundamental's power, amplitude-scaled: a line reads its own level (within the window's scalloping
     * loss, 0.48 dB for the 7-term Blackman-Harris); noise reads per bin, so it depends on
     * {@code binWidthHz}.
     *
     * @param frequencyHz  centre of each point
     * @param levelDb      level of each point, dB re fundamental
     * @param noiseFloorDb median noise level per bin on the same scale
     * @param binWidthHz   FFT bin width
     * @param window       the analysis window
     * @param blocks       number of averaged blocks (1 for a single record)
     */
    public record Spectrum(double[] frequencyHz, double[] levelDb, double noiseFloorDb, double binWidthHz, Window window, int blocks) {
        public static final int MAX_POINTS = 4096;

        public Spectrum {
            Require.that(frequencyHz.length == levelDb.length, "spectrum arrays differ in length");
            Require.that(frequencyHz.length <= MAX_POINTS, "spectrum has " + frequencyHz.length + " points, more than " + MAX_POINTS);
            Require.notNull("window", window);
            frequencyHz = frequencyHz.clone();
            levelDb = levelDb.clone();
        }

        static Spectrum empty() { return new Spectrum(new double[0], new double[0], Double.NaN, Double.NaN, Window.BLACKMAN_HARRIS_7, 0); }

        @Override public double[] frequencyHz() { return frequencyHz.clone(); }
        @Override public double[] levelDb() { return levelDb.clone(); }
        public int size() { return frequencyHz.length; }

        @Override public boolean equals(Object o) {
            return o instanceof Spectrum s && Arrays.equals(frequencyHz, s.frequencyHz) && Arrays.equals(levelDb, s.levelDb)
                    && Double.compare(noiseFloorDb, s.noiseFloorDb) == 0 && Double.compare(binWidthHz, s.binWidthHz) == 0
                    && window == s.window && blocks == s.blocks;
        }
        @Override public int hashCode() { return Arrays.hashCode(levelDb); }
        @Override public String toString() { return "Spectrum[" + frequencyHz.length + " points, " + window + ", " + blocks + " blocks]"; }
    }

    /**
     * A few cycles of the record for plotting (the workbench reads the full samples from the capture).
     *
     * @param startSeconds time of the first excerpt sample from the start of the record
     * @param sampleRateHz sample rate
     * @param samples      the samples, in the capture's unit
     */
    public record Waveform(double startSeconds, double sampleRateHz, double[] samples) {
        public Waveform { samples = samples.clone(); }
        static Waveform empty(double fs) { return new Waveform(0, fs, new double[0]); }
        @Override public double[] samples() { return samples.clone(); }
        @Override public boolean equals(Object o) {
            return o instanceof Waveform w && startSeconds == w.startSeconds && sampleRateHz == w.sampleRateHz && Arrays.equals(samples, w.samples);
        }
        @Override public int hashCode() { return Arrays.hashCode(samples); }
        @Override public String toString() { return "Waveform[" + samples.length + " samples]"; }
    }
}
