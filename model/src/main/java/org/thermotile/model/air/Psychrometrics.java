package org.thermotile.model.air;

import org.thermotile.model.constants.Physical;

/**
 * Moist-air relations used by the evaporation term.
 *
 * <p>Saturation vapour pressure over water follows the Magnus form with the coefficients the WMO
 * recommends (WMO-No. 8, Guide to Meteorological Instruments and Methods of Observation, 2018
 * edition, Annex 4.B): {@code e_w(t) = 6.112 hPa · exp(17.62 t / (243.12 + t))}, t in °C, stated
 * valid for −45…60 °C over water. It is used over water at all temperatures (the surfaces here
 * are wet, not iced); outside −60…80 °C it is clamped so that a wild Newton iterate stays finite.
 */
public final class Psychrometrics {
    private Psychrometrics() {}

    /** Magnus coefficients (WMO-No. 8, 2018, Annex 4.B): e_w = A exp(B t / (C + t)), t in °C. */
    public static final double MAGNUS_A_PA = 611.2;
    public static final double MAGNUS_B = 17.62;
    public static final double MAGNUS_C_K = 243.12;
    /** The clamp of the Magnus form's temperature [°C]; outside it the slope is zero. */
    public static final double MAGNUS_MIN_C = -60;
    public static final double MAGNUS_MAX_C = 80;

    /** Saturation vapour pressure over water e_w [Pa] at temperature {@code tempK} [K]. WMO-No. 8 (2018) Annex 4.B. */
    public static double saturationVapourPressurePa(double tempK) {
        double t = clampCelsius(tempK - Physical.ZERO_CELSIUS_K);
        return MAGNUS_A_PA * Math.exp(MAGNUS_B * t / (MAGNUS_C_K + t));
    }

    /**
     * d e_w / dT [Pa K⁻¹], the analytic derivative of the Magnus form:
     * {@code e_w · b c / (c + t)²}.
     */
    public static double saturationVapourPressureSlopePaK(double tempK) {
        return saturationVapourPressureSlopePaK(tempK, saturationVapourPressurePa(tempK));
    }

    /**
     * d e_w / dT [Pa K⁻¹] given e_w already computed at {@code tempK}: {@code e_w · b c / (c + t)²}.
     * Lets a solver pay for one exponential per iteration. Zero outside the clamp range, consistent
     * with the clamped {@link #saturationVapourPressurePa}.
     */
    public static double saturationVapourPressureSlopePaK(double tempK, double satVapourPa) {
        double t = tempK - Physical.ZERO_CELSIUS_K;
        if (t < MAGNUS_MIN_C || t > MAGNUS_MAX_C) {
            return 0.0;
        }
        double d = MAGNUS_C_K + t;
        return satVapourPa * MAGNUS_B * MAGNUS_C_K / (d * d);
    }

    /**
     * Specific humidity q [kg kg⁻¹] from vapour pressure e [Pa] and pressure p [Pa]:
     * {@code q = ε e / (p − (1 − ε) e)}, ε = 0.622 (WMO-No. 8, 2018, Annex 4.B).
     */
    public static double specificHumidity(double vapourPa, double pressurePa) {
        double eps = Physical.VAPOUR_MASS_RATIO;
        return eps * vapourPa / (pressurePa - (1.0 - eps) * vapourPa);
    }

    /** Vapour pressure e [Pa] from specific humidity q [kg kg⁻¹] and pressure p [Pa] (inverse of {@link #specificHumidity}). */
    public static double vapourPressurePa(double specificHumidity, double pressurePa) {
        double eps = Physical.VAPOUR_MASS_RATIO;
        return specificHumidity * pressurePa / (eps + (1.0 - eps) * specificHumidity);
    }

    /** Specific humidity [kg kg⁻¹] of air at {@code tempK} with relative humidity {@code rh} (fraction) and pressure [Pa]. */
    public static double specificHumidityFromRelative(double tempK, double rh, double pressurePa) {
        return specificHumidity(rh * saturationVapourPressurePa(tempK), pressurePa);
    }

    /** Saturation specific humidity q_sat [kg kg⁻¹] at surface temperature [K] and pressure [Pa]. */
    public static double saturationSpecificHumidity(double tempK, double pressurePa) {
        return specificHumidity(saturationVapourPressurePa(tempK), pressurePa);
    }

    /**
     * Latent heat of vaporisation of water L_v [J kg⁻¹] at temperature [K]: the linear fit
     * {@code L_v = 2.501e6 − 2361 t} (t in °C), Rogers &amp; Yau (1989), A Short Course in Cloud
     * Physics, 3rd ed., Table 2.1 fit (from memory; within 0.1 % of the tabulated values over
     * −40…40 °C).
     */
    public static double latentHeatVaporisationJkg(double tempK) {
        return 2.501e6 - 2361.0 * (tempK - Physical.ZERO_CELSIUS_K);
    }

    /**
     * Station pressure [Pa] at elevation z [m] from the ICAO standard atmosphere (troposphere):
     * {@code p = 101325 (1 − 2.25577e-5 z)^5.25588}.
     */
    public static double standardPressurePa(double elevationM) {
        return Physical.STANDARD_PRESSURE_PA * Math.pow(1.0 - 2.25577e-5 * elevationM, 5.25588);
    }

    private static double clampCelsius(double t) {
        return t < MAGNUS_MIN_C ? MAGNUS_MIN_C : (t > MAGNUS_MAX_C ? MAGNUS_MAX_C : t);
    }
}
