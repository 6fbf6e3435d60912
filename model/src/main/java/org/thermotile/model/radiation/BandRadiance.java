package org.thermotile.model.radiation;

/**
 * Thermal-band radiance and brightness temperature: the sensor constants K1/K2 form, thermotile's
 * own band-averaged Planck radiance and its inversion, and the single-channel emissivity
 * correction of Artis &amp; Carnahan (1982).
 *
 * <p>Radiances are band-averaged spectral radiances in the remote-sensing unit
 * [W m⁻² sr⁻¹ µm⁻¹]; wavelengths are in metres, temperatures in kelvin.
 */
public final class BandRadiance {
    private BandRadiance() {}

    /** ρ = h c / k_B [m K] (CODATA 2018 exact constants), the constant of Artis &amp; Carnahan (1982). */
    public static final double RHO_MK = Planck.C2;

    /**
     * Brightness temperature from at-sensor radiance with a sensor's calibration constants:
     * {@code T_B = K2 / ln(K1/L + 1)} [K] (Landsat 8 Data Users Handbook, USGS 2019, §5.3, for
     * TIRS band 10 K1 = 774.8853 W m⁻² sr⁻¹ µm⁻¹, K2 = 1321.0789 K).
     *
     * @param radiance L [W m⁻² sr⁻¹ µm⁻¹], &gt; 0
     * @param k1       K1 [W m⁻² sr⁻¹ µm⁻¹]
     * @param k2       K2 [K]
     * @return T_B [K]; NaN when L ≤ 0 or not finite
     */
    public static double brightnessFromK(double radiance, double k1, double k2) {
        if (!(radiance > 0) || Double.isInfinite(radiance)) {
            return Double.NaN;
        }
        return k2 / Math.log(k1 / radiance + 1.0);
    }

    /**
     * Radiance for a brightness temperature, the inverse of {@link #brightnessFromK}:
     * {@code L = K1 / (exp(K2/T) − 1)} [W m⁻² sr⁻¹ µm⁻¹] (Landsat 8 Data Users Handbook, USGS 2019).
     *
     * @param tempK T [K], &gt; 0
     */
    public static double radianceFromK(double tempK, double k1, double k2) {
        return k1 / Math.expm1(k2 / tempK);
    }

    /**
     * Blackbody radiance averaged over a flat band:
     * {@code L̄ = (1/(λ₂−λ₁)) ∫ B_λ dλ = E(λ₁,λ₂,T) / (π (λ₂−λ₁))}, returned per µm
     * [W m⁻² sr⁻¹ µm⁻¹]; E from {@link Planck#bandEmissionWm2} (Widger &amp; Woodall 1976).
     *
     * @param fromM λ₁ [m]
     * @param toM   λ₂ [m], &gt; λ₁
     * @param tempK T [K]
     */
    public static double bandMeanRadiance(double fromM, double toM, double tempK) {
        double widthUm = (toM - fromM) * 1e6;
        return Planck.bandEmissionWm2(fromM, toM, tempK) / (Math.PI * widthUm);
    }

    /**
     * Brightness temperature by inverting {@link #bandMeanRadiance}: the T with L̄(λ₁,λ₂,T) = L,
     * solved by Newton steps inside a bracket [1 K, 5000 K] that is bisected when a step would leave
     * it (L̄ is strictly increasing in T), to 1e-9 K.
     *
     * @param radiance L [W m⁻² sr⁻¹ µm⁻¹]
     * @return T_B [K]; NaN when L ≤ 0, not finite, or outside the bracket's radiances
     */
    public static double brightnessFromBand(double radiance, double fromM, double toM) {
        if (!(radiance > 0) || Double.isInfinite(radiance)) {
            return Double.NaN;
        }
        double lo = 1.0;
        double hi = 5000.0;
        if (radiance < bandMeanRadiance(fromM, toM, lo) || radiance > bandMeanRadiance(fromM, toM, hi)) {
            return Double.NaN;
        }
        // Start from the single-wavelength inversion at the band centre.
        double centre = 0.5 * (fromM + toM);
        double t = Planck.C2 / (centre * Math.log1p(Planck.C1L * 1e-6 / (Math.pow(centre, 5) * radiance)));
        if (!(t > lo && t < hi)) {
            t = 300.0;
        }
        for (int i = 0; i < 100; i++) {
            double f = bandMeanRadiance(fromM, toM, t) - radiance;
            if (f > 0) {
                hi = t;
            } else {
                lo = t;
            }
            double dt = 1e-4 * t;
            double df = (bandMeanRadiance(fromM, toM, t + dt) - bandMeanRadiance(fromM, toM, t - dt)) / (2 * dt);
            double next = t - f / df;
            if (!(next > lo && next < hi)) {
                next = 0.5 * (lo + hi);
            }
            if (Math.abs(next - t) < 1e-9) {
                return next;
            }
            t = next;
        }
        return t;
    }

    /**
     * Surface temperature from brightness temperature, single-channel emissivity correction of
     * Artis &amp; Carnahan (1982), Remote Sens. Environ. 12, 313–329:
     * {@code T_s = T_B / (1 + (λ T_B / ρ) ln ε)} [K], ρ = h c / k_B = 1.438777e-2 m K. It is exact
     * under Wien's approximation of Planck's law and neglects reflected sky radiance and the
     * atmosphere.
     *
     * @param brightnessK T_B [K]
     * @param wavelengthM λ, the band's effective wavelength [m]
     * @param emissivity  ε in (0, 1]
     * @return T_s [K]
     */
    public static double artisCarnahan(double brightnessK, double wavelengthM, double emissivity) {
        return brightnessK / (1.0 + (wavelengthM * brightnessK / RHO_MK) * Math.log(emissivity));
    }

    /**
     * Surface temperature through the band integral: T_s with ε L̄(λ₁,λ₂,T_s) = L̄(λ₁,λ₂,T_B), i.e.
     * the band radiance of a grey emitter (no reflected sky, no atmosphere) inverted with
     * {@link #brightnessFromBand}.
     *
     * @return T_s [K]
     */
    public static double surfaceFromBand(double brightnessK, double fromM, double toM, double emissivity) {
        return brightnessFromBand(bandMeanRadiance(fromM, toM, brightnessK) / emissivity, fromM, toM);
    }
}
