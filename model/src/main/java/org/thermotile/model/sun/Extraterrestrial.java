package org.thermotile.model.sun;

import org.thermotile.model.constants.Physical;

/**
 * Extraterrestrial solar irradiance on a plane normal to the sun's rays, E₀ₙ = S·(r₀/r)², with the
 * solar constant S = {@link Physical#SOLAR_CONSTANT} (1361 W m⁻², Kopp &amp; Lean 2011).
 *
 * <p>Two forms of the eccentricity factor (r₀/r)²: Spencer's Fourier series in the day of the year,
 * and 1/R² from the SPA radius vector R (see {@link SolarPosition}). Spencer's series runs up to
 * about 0.1 % above 1/R² near perihelion (measured over 2025 in the tests); the forcing uses the
 * SPA radius vector.
 */
public final class Extraterrestrial {
    private Extraterrestrial() {}

    /**
     * Eccentricity correction factor (r₀/r)² by the Fourier series of Spencer, J.W. (1971), "Fourier
     * series representation of the position of the sun", Search 2(5), 172:
     * <pre>E₀ = 1.000110 + 0.034221 cos Γ + 0.001280 sin Γ + 0.000719 cos 2Γ + 0.000077 sin 2Γ</pre>
     * with the day angle Γ = 2π(d − 1)/365 [rad] (coefficients as quoted by Iqbal, M. (1983), An
     * Introduction to Solar Radiation, eq. 1.2.1, from memory; they reproduce the factors tabulated
     * in NREL's Bird clear-sky spreadsheet). Within 0.1 % of the SPA 1/R².
     *
     * @param dayOfYear day number d, 1 (1 January) … 366
     * @return (r₀/r)² [–]
     */
    public static double eccentricityFactorSpencer(int dayOfYear) {
        if (dayOfYear < 1 || dayOfYear > 366) {
            throw new IllegalArgumentException("day of year " + dayOfYear + " is outside 1…366");
        }
        double g = 2.0 * Math.PI * (dayOfYear - 1) / 365.0;
        return 1.000110 + 0.034221 * Math.cos(g) + 0.001280 * Math.sin(g)
                + 0.000719 * Math.cos(2 * g) + 0.000077 * Math.sin(2 * g);
    }

    /**
     * Extraterrestrial normal irradiance E₀ₙ = S·E₀ [W m⁻²] for a day of the year (Spencer 1971).
     *
     * @param dayOfYear day number 1…366
     */
    public static double normalIrradianceWm2(int dayOfYear) {
        return Physical.SOLAR_CONSTANT * eccentricityFactorSpencer(dayOfYear);
    }

    /**
     * Extraterrestrial normal irradiance E₀ₙ = S / R² [W m⁻²] from the Earth–Sun distance R [au]
     * (e.g. the SPA radius vector, Reda &amp; Andreas 2004 eq. 11).
     *
     * @param radiusVectorAu Earth–Sun distance R [au], 0.98…1.02 in practice
     */
    public static double normalIrradianceFromRadiusWm2(double radiusVectorAu) {
        return Physical.SOLAR_CONSTANT / (radiusVectorAu * radiusVectorAu);
    }

    /**
     * Extraterrestrial irradiance on a horizontal plane E₀ₙ·max(cos θ, 0) [W m⁻²].
     *
     * @param normalWm2 E₀ₙ [W m⁻²]
     * @param zenithDeg zenith angle θ [°]
     */
    public static double horizontalIrradianceWm2(double normalWm2, double zenithDeg) {
        double c = Math.cos(Math.toRadians(zenithDeg));
        return c > 0 ? normalWm2 * c : 0.0;
    }
}
