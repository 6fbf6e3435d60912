package org.thermotile.model.sun;

/**
 * Clear-sky broadband irradiance by the model of Bird, R.E. &amp; Hulstrom, R.L. (1981), <em>A
 * Simplified Clear Sky Model for Direct and Diffuse Insolation on Horizontal Surfaces</em>, SERI
 * technical report SERI/TR-642-761, Solar Energy Research Institute, Golden, CO.
 *
 * <p>Equations (M relative air mass, M' = M·P/1013 mbar pressure-corrected air mass, θ zenith angle):
 * <pre>
 * M    = 1 / (cos θ + 0.15 (93.885 − θ)^−1.25)                         (Kasten 1966, θ in °)
 * T_R  = exp(−0.0903 M'^0.84 (1 + M' − M'^1.01))                       Rayleigh
 * T_O  = 1 − 0.1611 X_O (1 + 139.48 X_O)^−0.3034 − 0.002715 X_O / (1 + 0.044 X_O + 0.0003 X_O²),  X_O = U_O M
 * T_UM = exp(−0.0127 M'^0.26)                                          mixed gases
 * T_W  = 1 − 2.4959 X_W / ((1 + 79.034 X_W)^0.6828 + 6.385 X_W),        X_W = W M
 * τ_A  = 0.2758 τ(380 nm) + 0.35 τ(500 nm)
 * T_A  = exp(−τ_A^0.873 (1 + τ_A − τ_A^0.7088) M^0.9108)
 * T_AA = 1 − 0.1 (1 − M + M^1.06)(1 − T_A),   T_AS = T_A / T_AA
 * DNI  = 0.9662 E₀ₙ T_R T_O T_UM T_W T_A
 * I_AS = 0.79 E₀ₙ cos θ T_O T_UM T_W T_AA (0.5 (1 − T_R) + B_a (1 − T_AS)) / (1 − M + M^1.02)
 * r_s  = 0.0685 + (1 − B_a)(1 − T_AS)
 * GHI  = (DNI cos θ + I_AS) / (1 − r_g r_s),   DHI = GHI − DNI cos θ
 * </pre>
 * The ozone exponent −0.3034 and the structure follow NREL's published spreadsheet implementation of
 * the model (Bird_08_16_2012), against whose tabulated values this class is tested. That
 * spreadsheet's notes state agreement within ±10 % with rigorous radiative-transfer codes.
 *
 * <p>Domain: θ &lt; 90° (at or below the horizon every output is 0). The Rayleigh fit
 * exp(−0.0903 M'^0.84 (1 + M' − M'^1.01)) reaches its minimum at M' ≈ 14.09 and rises again beyond
 * (outside the range it was fitted to), so the air mass entering the transmittances is capped at
 * {@link #MAX_AIR_MASS} (θ ≈ 86.6° at sea level); cos θ keeps its true value, so the irradiances still
 * fall to 0 at the horizon. Negative results are clamped to 0.
 */
public final class ClearSky {
    private ClearSky() {}

    /** Largest relative air mass used in the transmittances [–] (see the class comment). */
    public static final double MAX_AIR_MASS = 14.0;

    /** Index of global horizontal irradiance in the {@link #bird} output. */
    public static final int GHI = 0;
    /** Index of direct normal irradiance in the {@link #bird} output. */
    public static final int DNI = 1;
    /** Index of diffuse horizontal irradiance in the {@link #bird} output. */
    public static final int DHI = 2;

    /**
     * Atmosphere of the Bird &amp; Hulstrom model.
     *
     * @param ozoneCm             total ozone column U_O [atm-cm], 0…1
     * @param precipitableWaterCm precipitable water W [cm], 0…10
     * @param aod380              aerosol optical depth at 380 nm [–], 0…5
     * @param aod500              aerosol optical depth at 500 nm [–], 0…5
     * @param forwardScatter      aerosol forward-scattering ratio B_a [–], 0…1
     * @param groundAlbedo        ground albedo r_g [–], 0…1
     */
    public record Atmosphere(double ozoneCm, double precipitableWaterCm, double aod380, double aod500,
            double forwardScatter, double groundAlbedo) {
        public Atmosphere {
            check("ozone", ozoneCm, 0, 1);
            check("precipitable water", precipitableWaterCm, 0, 10);
            check("aerosol optical depth at 380 nm", aod380, 0, 5);
            check("aerosol optical depth at 500 nm", aod500, 0, 5);
            check("aerosol forward-scattering ratio", forwardScatter, 0, 1);
            check("ground albedo", groundAlbedo, 0, 1);
        }

        private static void check(String what, double v, double lo, double hi) {
            if (!(v >= lo && v <= hi)) {
                throw new IllegalArgumentException("clear-sky atmosphere: " + what + " = " + v
                        + " is outside " + lo + "…" + hi);
            }
        }
    }

    /**
     * The default atmosphere of NREL's Bird model spreadsheet (Bird_08_16_2012): ozone 0.3 atm-cm,
     * precipitable water 1.5 cm, AOD 0.15 at 380 nm and 0.1 at 500 nm (broadband τ_A = 0.07637),
     * forward-scattering ratio 0.85, ground albedo 0.2: a clean, moderately dry mid-latitude sky.
     */
    public static final Atmosphere DEFAULT = new Atmosphere(0.3, 1.5, 0.15, 0.1, 0.85, 0.2);

    /**
     * Relative optical air mass M = 1 / (cos θ + 0.15 (93.885 − θ)^−1.25) [–] (Kasten 1966, as used by
     * Bird &amp; Hulstrom 1981), for θ &lt; 90° [°]; ≈ 1/cos θ high in the sky, about 36 at the horizon.
     */
    public static double relativeAirMass(double zenithDeg) {
        return 1.0 / (Math.cos(Math.toRadians(zenithDeg)) + 0.15 * Math.pow(93.885 - zenithDeg, -1.25));
    }

    /** Broadband aerosol optical depth τ_A = 0.2758 τ(380 nm) + 0.35 τ(500 nm) [–] (Bird &amp; Hulstrom 1981). */
    public static double broadbandAerosolOpticalDepth(double aod380, double aod500) {
        return 0.2758 * aod380 + 0.35 * aod500;
    }

    /**
     * Clear-sky GHI, DNI and DHI [W m⁻²] by Bird &amp; Hulstrom (1981); see the class comment for the
     * equations and the air-mass cap near the horizon.
     *
     * @param zenithDeg  zenith angle θ [°]
     * @param e0nWm2     extraterrestrial normal irradiance E₀ₙ [W m⁻²]
     * @param pressurePa station pressure P [Pa]
     * @param atm        atmosphere ({@link #DEFAULT} for a typical clean sky)
     * @param out        receives GHI at {@link #GHI}, DNI at {@link #DNI}, DHI at {@link #DHI}
     */
    public static void bird(double zenithDeg, double e0nWm2, double pressurePa, Atmosphere atm,
            double[] out) {
        if (!(zenithDeg >= 0 && zenithDeg < 90.0)) {
            out[GHI] = 0;
            out[DNI] = 0;
            out[DHI] = 0;
            return;
        }
        double cosZ = Math.cos(Math.toRadians(zenithDeg));
        double m = Math.min(relativeAirMass(zenithDeg), MAX_AIR_MASS);
        double mp = m * (pressurePa / 100.0) / 1013.0;

        double tRayleigh = Math.exp(-0.0903 * Math.pow(mp, 0.84) * (1.0 + mp - Math.pow(mp, 1.01)));
        double xo = atm.ozoneCm() * m;
        double tOzone = 1.0 - 0.1611 * xo * Math.pow(1.0 + 139.48 * xo, -0.3034)
                - 0.002715 * xo / (1.0 + 0.044 * xo + 0.0003 * xo * xo);
        double tGases = Math.exp(-0.0127 * Math.pow(mp, 0.26));
        double xw = atm.precipitableWaterCm() * m;
        double tWater = 1.0 - 2.4959 * xw / (Math.pow(1.0 + 79.034 * xw, 0.6828) + 6.385 * xw);
        double tauA = broadbandAerosolOpticalDepth(atm.aod380(), atm.aod500());
        double tAerosol = Math.exp(-Math.pow(tauA, 0.873) * (1.0 + tauA - Math.pow(tauA, 0.7088))
                * Math.pow(m, 0.9108));
        double tAa = 1.0 - 0.1 * (1.0 - m + Math.pow(m, 1.06)) * (1.0 - tAerosol);
        double tAs = tAerosol / tAa;

        double dni = 0.9662 * e0nWm2 * tRayleigh * tOzone * tGases * tWater * tAerosol;
        double ias = 0.79 * e0nWm2 * cosZ * tOzone * tGases * tWater * tAa
                * (0.5 * (1.0 - tRayleigh) + atm.forwardScatter() * (1.0 - tAs))
                / (1.0 - m + Math.pow(m, 1.02));
        double rs = 0.0685 + (1.0 - atm.forwardScatter()) * (1.0 - tAs);
        dni = Math.max(dni, 0.0);
        double beamH = dni * cosZ;
        double ghi = Math.max((beamH + ias) / (1.0 - atm.groundAlbedo() * rs), 0.0);
        out[GHI] = ghi;
        out[DNI] = dni;
        out[DHI] = Math.max(ghi - beamH, 0.0);
    }
}
