package org.thermotile.model.sun;

import org.thermotile.model.constants.Physical;

/**
 * Downwelling longwave irradiance from the sky, L↓ = ε σ T_a⁴, with the clear-sky emissivity of
 * Brutsaert (1975) and the cloud correction of Crawford &amp; Duchon (1999).
 *
 * <ul>
 * <li>Brutsaert, W. (1975), "On a derivable formula for long-wave radiation from clear skies",
 *     Water Resources Research 11(5), 742–744: ε_clr = 1.24 (e_a / T_a)^(1/7), e_a in hPa, T_a in K.</li>
 * <li>Crawford, T.M. &amp; Duchon, C.E. (1999), "An improved parameterization for estimating effective
 *     atmospheric emissivity for use in calculating daytime downwelling longwave radiation",
 *     J. Applied Meteorology 38, 474–480: ε = c + (1 − c) ε_clr, with the cloud fraction
 *     c = 1 − s estimated from the ratio s of measured to clear-sky solar irradiance.</li>
 * </ul>
 */
public final class SkyLongwave {
    private SkyLongwave() {}

    /**
     * Brutsaert (1975) clear-sky emissivity ε_clr = 1.24 (e_a / T_a)^(1/7) [–], e_a in hPa.
     * Derived for clear skies from standard-atmosphere profiles of temperature and humidity; e_a and
     * T_a are screen-level values.
     *
     * @param vapourPressurePa screen-level vapour pressure e_a [Pa], ≥ 0
     * @param airTempK         screen-level air temperature T_a [K], &gt; 0
     */
    public static double brutsaertClearEmissivity(double vapourPressurePa, double airTempK) {
        if (!(vapourPressurePa >= 0) || !(airTempK > 0)) {
            throw new IllegalArgumentException("clear-sky emissivity needs vapour pressure ≥ 0 Pa and"
                    + " temperature > 0 K, got " + vapourPressurePa + " Pa and " + airTempK + " K");
        }
        return 1.24 * Math.pow((vapourPressurePa / 100.0) / airTempK, 1.0 / 7.0);
    }

    /**
     * Crawford &amp; Duchon (1999) all-sky emissivity ε = c + (1 − c) ε_clr [–]: clouds are taken as
     * black bodies at air temperature over the covered fraction.
     *
     * @param clearEmissivity ε_clr [–]
     * @param cloudFraction   c [–], clamped to 0…1
     */
    public static double cloudyEmissivity(double clearEmissivity, double cloudFraction) {
        double c = clamp01(cloudFraction);
        return c + (1.0 - c) * clearEmissivity;
    }

    /**
     * Cloud fraction from solar irradiance, c = 1 − s with s = G_measured / G_clear (Crawford &amp;
     * Duchon 1999), clamped to 0…1. NaN when the clear-sky value is not positive (sun down).
     *
     * @param ghiWm2      measured global horizontal irradiance [W m⁻²]
     * @param clearGhiWm2 clear-sky global horizontal irradiance [W m⁻²]
     */
    public static double cloudFractionFromSolarRatio(double ghiWm2, double clearGhiWm2) {
        if (!(clearGhiWm2 > 0)) {
            return Double.NaN;
        }
        return clamp01(1.0 - ghiWm2 / clearGhiWm2);
    }

    /**
     * Downwelling longwave irradiance L↓ = ε σ T_a⁴ [W m⁻²].
     *
     * @param emissivity effective sky emissivity ε [–]
     * @param airTempK   air temperature T_a [K]
     */
    public static double downwellingWm2(double emissivity, double airTempK) {
        double t2 = airTempK * airTempK;
        return emissivity * Physical.STEFAN_BOLTZMANN * t2 * t2;
    }

    private static double clamp01(double v) {
        return v < 0 ? 0 : (v > 1 ? 1 : v);
    }
}
