package org.outstage.analysis.stage;

/**
 * Crossover and gm-doubling metrics of a measured transfer curve.
 *
 * <p><b>gain_at_zero</b> = incremental gain at zero output / mean incremental gain over the outer swing
 * (|v| from 50 % to 90 % of peak). The mean of the derivative over an interval equals the chord
 * (y(b) − y(a))/(b − a), which is how it is computed, from local cubic fits of the bins at ±0.5 and ±0.9 of peak.
 * The gain at zero itself is read from the raw samples by local cubic regression with a window chosen by Lepski's
 * method ({@link AdaptiveSlope}; Lepski, Mammen &amp; Spokoiny, Ann. Statist. 25(3), 1997), so a notch narrower than
 * the bins is resolved; its σ includes the estimated resolution bias ({@link Resolution}).
 * Below 1 the gain dips at the crossing (notch, under-biased); above 1 it rises (gm-doubling, over-biased).
 *
 * <p><b>Thresholds</b> (derivation in docs/diagnosis.md): for an emitter-follower pair with exponential law
 * (VT = 25.852 mV at 300 K, Re = 0.22 Ω, RL = 8 Ω), the small-signal gain at zero is RL/(RL + (Re + VT/Iq)/2)
 * (both halves conduct) while the large-signal gain tends to RL/(RL + Re + VT/I). Oliver (Hewlett-Packard
 * Journal, Feb 1971) puts the optimum at Iq·Re ≈ VT (117.5 mA here), where both gains agree. Solved per
 * sample at 17.9 V peak, gain_at_zero is 0.9888 at 0.5× the Oliver current, 1.0021 at 1×, 1.0066 at 1.5×
 * (0.9880, 1.0012, 1.0057 at 30 V peak). A ±50 % error of Iq therefore moves gain_at_zero by about −1.2 %
 * and +0.5 %; the near-optimal band of ±0.3 % (default) covers roughly 0.75× to 1.1× the Oliver current,
 * half the way to either error. Verdict rule with σ the standard uncertainty and k the coverage factor:
 * underbiased if r + kσ &lt; 1 − band; overbiased if r − kσ &gt; 1 + band; near-optimal if |r − 1| + kσ ≤ band;
 * otherwise, or when hysteresis or clipping of the outer swing is present, unclear.
 *
 * <p><b>Level.</b> At a modest level the outer swing has not reached the large-current gain (VT/I still adds to
 * the emitter resistance), so r reads high at a given bias and a well-biased stage looks gm-doubled. When the
 * outer gain rises measurably from 50 % to 90 % of peak, the verdict reads r∞ = g(0)·a instead, with a from
 * 1/g = a + b/|v| (one device conducting, exponential law: 1/g = (RL + Re)/RL + VT/|v|) — the gain at zero
 * against the large-current asymptote, which at Oliver's condition (Iq·Re = VT) is exactly 1 at every level.
 * Worked values for Re = 0.22 Ω, RL = 8 Ω: r∞ = 0.9868 at 0.5× the Oliver current, 0.9956 at 0.75×, 1.0000 at
 * 1×, 1.0045 at 1.5×, 1.0067 at 2× (from g(0) = RL/(RL + (Re + VT/Iq)/2) and 1/a = RL/(RL + Re)), so the ±0.3 %
 * band spans about 0.8× to 1.3× the Oliver current. {@code gainAtZero} keeps its stated definition.
 *
 * @param gainAtZero              r = gain at zero / outer mean gain (ratio)
 * @param gainAtZeroStdError      σ of r: sample noise, the estimated resolution bias and the outer gain's σ in quadrature
 * @param incrementalGainAtZero   dOut/dIdeal at zero output (not normalised)
 * @param outerMeanGain           mean dOut/dIdeal over the outer swing
 * @param notchWidthVolts         output span around zero where |normalised gain − 1| exceeds the notch tolerance
 *                                (0 when the gain at zero is within it); edges located with the adaptive slope
 *                                (σ in {@link Resolution#notchWidthStdErrorVolts})
 * @param notchDepthVolts         largest |deviation from the best line| for |v| &lt; 50 % of peak, read from the raw
 *                                samples with the adaptive local regression (σ in
 *                                {@link Resolution#notchDepthStdErrorVolts})
 * @param notchDepthFraction      notchDepthVolts / peak
 * @param nearZeroResidualShare   share of the residual energy in samples with |ideal| &lt; nearZeroFraction·peak
 * @param nearZeroTimeShare       share of time spent there (what a residual spread evenly in time would give)
 * @param verdict                 reading of the crossover region
 * @param confidence              probability (normal model with σ) that r lies in the band of the verdict; for
 *                                {@code UNCLEAR}, that of the most likely band (0 when hysteresis or clipping)
 * @param explanation             one sentence for the user
 * @param asymptoticGain          the large-current asymptote 1/a of the gain, from 1/g = a + b/|v| through the local
 *                                gains at 50 % and 90 % of peak, when the outer gain still rises measurably at this
 *                                level; NaN when it does not (then the outer mean gain is the reference)
 * @param verdictRatio            what the verdict reads: gain at zero / asymptotic gain when that exists, otherwise
 *                                {@code gainAtZero}
 * @param verdictRatioStdError    σ of {@code verdictRatio}, including the resolution bias of the gain at zero
 * @param resolution              window and error breakdown of the gain at zero
 */
public record CrossoverMetrics(double gainAtZero, double gainAtZeroStdError, double incrementalGainAtZero,
                               double outerMeanGain, double notchWidthVolts, double notchDepthVolts,
                               double notchDepthFraction, double nearZeroResidualShare, double nearZeroTimeShare,
                               BiasVerdict verdict, double confidence, String explanation,
                               double asymptoticGain, double verdictRatio, double verdictRatioStdError,
                               Resolution resolution) {

    /**
     * How the gain at zero was resolved (see {@link AdaptiveSlope}): the half width of the window of ideal output
     * chosen around zero, and the two parts of {@code gainAtZeroStdError} (which is their quadrature sum together
     * with the outer gain's part): sample noise and resolution bias, both as fractions of the outer mean gain.
     *
     * @param windowHalfWidthVolts half width of the local-regression window around zero (capture unit)
     * @param noiseStdError        noise part of the gain at zero's standard error (ratio)
     * @param resolutionBias       estimated resolution bias of the gain at zero (ratio, absolute value)
     * @param notchWidthStdErrorVolts σ of {@code notchWidthVolts}: each edge's gain σ (noise and resolution bias) over
     *                             the rate at which the gain crosses the tolerance there, both edges in quadrature
     *                             (0 when there is no notch)
     * @param notchDepthStdErrorVolts σ of {@code notchDepthVolts}: the noise of the adaptive local value at the
     *                             extremum, its resolution bias (h⁴ ladder) and the best line's binning, in quadrature
     * @param crossingObserved     whether the samples cover the crossing: false when they sit on a few values near
     *                             zero with a gap wider than a quarter of the window (a tone locked to the sample rate,
     *                             or too short a record). Then the gain at zero is read between sample values, where
     *                             a notch may hide whole, its error is not bounded by its standard error, and the
     *                             crossover figures are not given (analysis.Plausibility)
     */
    public record Resolution(double windowHalfWidthVolts, double noiseStdError, double resolutionBias,
                             double notchWidthStdErrorVolts, double notchDepthStdErrorVolts, boolean crossingObserved) {}
}
