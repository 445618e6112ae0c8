package org.outstage.analysis.stage;

/**
 * Crossover and gm-doubling metrics of a measured transfer curve.
 *
 * <p><b>gain_at_zero</b> = incremental gain at zero output / mean incremental gain over the outer swing
 * (|v| from 50 % to 90 % of peak). The mean of the derivative over an interval equals the chord
 * (y(b) − y(a))/(b − a), which is how it is computed, from local quadratic fits at ±0.5 and ±0.9 of peak.
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
 * @param gainAtZero              r = gain at zero / outer mean gain (ratio)
 * @param gainAtZeroStdError      σ of r from the propagated bin standard errors
 * @param incrementalGainAtZero   dOut/dIdeal at zero output (not normalised)
 * @param outerMeanGain           mean dOut/dIdeal over the outer swing
 * @param notchWidthVolts         output span around zero where |normalised gain − 1| exceeds the notch tolerance
 *                                (0 when the gain at zero is within it); resolution is the smoothing window
 * @param notchDepthVolts         largest |deviation from the best line| for |v| &lt; 50 % of peak
 * @param notchDepthFraction      notchDepthVolts / peak
 * @param nearZeroResidualShare   share of the residual energy in samples with |ideal| &lt; nearZeroFraction·peak
 * @param nearZeroTimeShare       share of time spent there (what a residual spread evenly in time would give)
 * @param verdict                 reading of the crossover region
 * @param confidence              probability (normal model with σ) that r lies in the band of the verdict; for
 *                                {@code UNCLEAR}, that of the most likely band (0 when hysteresis or clipping)
 * @param explanation             one sentence for the user
 */
public record CrossoverMetrics(double gainAtZero, double gainAtZeroStdError, double incrementalGainAtZero,
                               double outerMeanGain, double notchWidthVolts, double notchDepthVolts,
                               double notchDepthFraction, double nearZeroResidualShare, double nearZeroTimeShare,
                               BiasVerdict verdict, double confidence, String explanation) {}
