package org.outstage.analysis.stage;

/**
 * One clipped side (flat top) of the waveform.
 *
 * @param levelVolts           mean of the samples on the flat top (negative for the negative side), capture unit
 * @param fractionOfCycle      share of the time spent on this flat top
 * @param onsetIdealVolts      mean |ideal output| at which the waveform reaches the flat top
 * @param recoveryTimeSeconds  rail sticking: mean over flat tops of (time from the ideal's peak to leaving the
 *                             top) − (time from reaching the top to the ideal's peak); a static clipper is
 *                             symmetric about the ideal's peak and gives 0 (resolution about one sample)
 * @param knee                 hard flat top or soft knee
 * @param kneeDepthVolts       how far below the level the incremental gain has already fallen under 90 % of the
 *                             straight-line gain
 * @param flatTops             number of flat tops (runs) found
 */
public record ClipSide(double levelVolts, double fractionOfCycle, double onsetIdealVolts, double recoveryTimeSeconds,
                       Knee knee, double kneeDepthVolts, int flatTops) {
    /** Shape of the approach to the clip level. */
    public enum Knee { HARD, SOFT }
}
