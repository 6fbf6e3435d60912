package org.thermotile.model.sun;

/**
 * Split of measured global horizontal irradiance into beam and diffuse parts by the diffuse-fraction
 * correlation of Erbs, D.G., Klein, S.A. &amp; Duffie, J.A. (1982), "Estimation of the diffuse
 * radiation fraction for hourly, daily and monthly-average global radiation", Solar Energy 28(4),
 * 293–302 (the hourly correlation).
 *
 * <p>The correlation was fitted to hourly sums; here it is applied to the hourly values as given.
 */
public final class DiffuseSplit {
    private DiffuseSplit() {}

    /** Above this zenith angle [°] everything is put into the diffuse part (see {@link #split}). */
    public static final double LOW_SUN_ZENITH_DEG = 87.0;

    /** Index of beam horizontal irradiance in the {@link #split} output. */
    public static final int BEAM = 0;
    /** Index of diffuse horizontal irradiance in the {@link #split} output. */
    public static final int DIFFUSE = 1;

    /**
     * Clearness index k_t = G / (E₀ₙ cos θ) [–]: global horizontal over extraterrestrial horizontal
     * irradiance. Zero when the sun is at or below the horizon or G ≤ 0.
     *
     * @param ghiWm2    global horizontal irradiance G [W m⁻²]
     * @param zenithDeg zenith angle θ [°]
     * @param e0nWm2    extraterrestrial normal irradiance E₀ₙ [W m⁻²]
     */
    public static double clearnessIndex(double ghiWm2, double zenithDeg, double e0nWm2) {
        double h = Extraterrestrial.horizontalIrradianceWm2(e0nWm2, zenithDeg);
        return (h > 0 && ghiWm2 > 0) ? ghiWm2 / h : 0.0;
    }

    /**
     * Erbs et al. (1982) diffuse fraction k_d = D/G [–] of the hourly clearness index k_t:
     * <pre>
     * k_d = 1.0 − 0.09 k_t                                                  for k_t ≤ 0.22
     * k_d = 0.9511 − 0.1604 k_t + 4.388 k_t² − 16.638 k_t³ + 12.336 k_t⁴     for 0.22 &lt; k_t ≤ 0.80
     * k_d = 0.165                                                           for k_t &gt; 0.80
     * </pre>
     * The published coefficients are rounded, so the pieces meet within 0.001 at the breakpoints.
     *
     * @param kt clearness index k_t [–], ≥ 0
     */
    public static double erbsDiffuseFraction(double kt) {
        if (kt <= 0.22) {
            return 1.0 - 0.09 * kt;
        }
        if (kt <= 0.80) {
            return 0.9511 + kt * (-0.1604 + kt * (4.388 + kt * (-16.638 + kt * 12.336)));
        }
        return 0.165;
    }

    /**
     * Beam horizontal B = (1 − k_d)·G and diffuse horizontal D = k_d·G [W m⁻²] from global
     * horizontal irradiance G by {@link #erbsDiffuseFraction}, so that B + D = G.
     *
     * <p>Guards: G ≤ 0 gives B = D = 0; at zenith angles above {@link #LOW_SUN_ZENITH_DEG} (87°) the
     * clearness index is ill-defined (cos θ → 0) and all of G is taken as diffuse; and the beam is
     * capped so that the implied direct normal B / cos θ does not exceed E₀ₙ (the excess goes to D).
     *
     * @param ghiWm2    G [W m⁻²]
     * @param zenithDeg zenith angle θ [°]
     * @param e0nWm2    extraterrestrial normal irradiance E₀ₙ [W m⁻²]
     * @param out       receives B at {@link #BEAM} and D at {@link #DIFFUSE}
     */
    public static void split(double ghiWm2, double zenithDeg, double e0nWm2, double[] out) {
        if (!(ghiWm2 > 0)) {
            out[BEAM] = 0;
            out[DIFFUSE] = 0;
            return;
        }
        if (zenithDeg > LOW_SUN_ZENITH_DEG) {
            out[BEAM] = 0;
            out[DIFFUSE] = ghiWm2;
            return;
        }
        double kd = erbsDiffuseFraction(clearnessIndex(ghiWm2, zenithDeg, e0nWm2));
        double beam = (1.0 - kd) * ghiWm2;
        double beamMax = Extraterrestrial.horizontalIrradianceWm2(e0nWm2, zenithDeg);
        if (beam > beamMax) {
            beam = beamMax;
        }
        out[BEAM] = beam;
        out[DIFFUSE] = ghiWm2 - beam;
    }
}
