package org.thermotile.model.radiation;

import org.thermotile.model.constants.Physical;

/**
 * Blackbody (Planck) radiation: spectral radiance, band emission and the Wien peak.
 *
 * <p>Constants are formed from the exact CODATA 2018 values of h, c and k in {@link Physical}
 * (Tiesinga et al. 2021). Wavelengths are in metres, temperatures in kelvin, everywhere.
 *
 * <p>Band emission uses the series of Widger &amp; Woodall (1976), "Integration of the Planck
 * blackbody radiation function", Bull. Amer. Meteor. Soc. 57(10), 1217–1219, for x = c₂/(λT) ≥ 1,
 * and the Bernoulli-number expansion of ∫₀ˣ t³/(eᵗ − 1) dt for x &lt; 1 (the long-wave side, where
 * the Widger–Woodall series needs many terms). Both are truncated below 1e-15 relative.
 */
public final class Planck {
    private Planck() {}

    /** First radiation constant for spectral radiance c₁L = 2hc² [W m² sr⁻¹]. */
    public static final double C1L = 2.0 * Physical.PLANCK * Physical.SPEED_OF_LIGHT * Physical.SPEED_OF_LIGHT;
    /** Second radiation constant c₂ = hc/k [m K]. */
    public static final double C2 = Physical.PLANCK * Physical.SPEED_OF_LIGHT / Physical.BOLTZMANN;

    /**
     * Root x_w of x = 5(1 − e⁻ˣ), the Wien peak in x = c₂/(λT) of B_λ; solved by Newton once.
     * x_w ≈ 4.965114.
     */
    static final double WIEN_X = solveWienX();

    /** π⁴/15, the value of ∫₀^∞ t³/(eᵗ − 1) dt. */
    private static final double PI4_OVER_15 = Math.pow(Math.PI, 4) / 15.0;

    /**
     * Bernoulli numbers B₂, B₄, …, B₂₀ (exact rationals; B₁ = −1/2 is used separately), for
     * t/(eᵗ − 1) = Σ Bₙ tⁿ/n!.
     */
    private static final double[] BERNOULLI_EVEN = {
        1.0 / 6, -1.0 / 30, 1.0 / 42, -1.0 / 30, 5.0 / 66, -691.0 / 2730, 7.0 / 6,
        -3617.0 / 510, 43867.0 / 798, -174611.0 / 330
    };

    /**
     * Spectral radiance of a blackbody, Planck's law:
     * {@code B_λ(λ,T) = 2hc² / (λ⁵ (exp(hc/(λkT)) − 1))} [W m⁻² sr⁻¹ m⁻¹].
     *
     * <p>Valid for λ &gt; 0, T &gt; 0; evaluated with {@code expm1} so it stays accurate on the
     * long-wave (Rayleigh–Jeans) side; returns 0 where the exponential overflows (far short-wave).
     *
     * @param wavelengthM λ [m], &gt; 0
     * @param tempK       T [K], &gt; 0
     * @return B_λ [W m⁻² sr⁻¹ m⁻¹]
     */
    public static double spectralRadiance(double wavelengthM, double tempK) {
        requirePositive("wavelength [m]", wavelengthM);
        requirePositive("temperature [K]", tempK);
        double l2 = wavelengthM * wavelengthM;
        double l5 = l2 * l2 * wavelengthM;
        return C1L / (l5 * Math.expm1(C2 / (wavelengthM * tempK)));
    }

    /**
     * Fraction of blackbody hemispherical emission σT⁴ emitted at wavelengths below λ:
     * {@code F(0→λT) = (15/π⁴) ∫ₓ^∞ t³/(eᵗ − 1) dt}, x = c₂/(λT) [–].
     *
     * <p>For x ≥ 1, Widger &amp; Woodall (1976): ∫ₓ^∞ = Σₙ e⁻ⁿˣ (x³/n + 3x²/n² + 6x/n³ + 6/n⁴);
     * for x &lt; 1, π⁴/15 − Σₖ Bₖ x^{k+3}/(k!(k+3)). Valid for λT &gt; 0; 0 at λT → 0, 1 at λT → ∞.
     *
     * @param wavelengthM λ [m], &gt; 0 (may be +∞)
     * @param tempK       T [K], &gt; 0
     * @return F(0→λT) in [0, 1]
     */
    public static double fractionBelow(double wavelengthM, double tempK) {
        requirePositive("wavelength [m]", wavelengthM);
        requirePositive("temperature [K]", tempK);
        double x = C2 / (wavelengthM * tempK);
        return upperTailIntegral(x) / PI4_OVER_15;
    }

    /**
     * Hemispherical blackbody emission between two wavelengths:
     * {@code E(λ₁,λ₂,T) = σT⁴ [F(0→λ₂T) − F(0→λ₁T)] = ∫ π B_λ dλ} [W m⁻²].
     *
     * <p>Band fractions from {@link #fractionBelow}; σ is CODATA 2018. Valid for
     * 0 &lt; λ₁ ≤ λ₂ (λ₂ may be +∞), T &gt; 0.
     *
     * @param fromWavelengthM λ₁ [m]
     * @param toWavelengthM   λ₂ [m], ≥ λ₁
     * @param tempK           T [K]
     * @return band emission [W m⁻²], ≥ 0
     */
    public static double bandEmissionWm2(double fromWavelengthM, double toWavelengthM, double tempK) {
        if (!(toWavelengthM >= fromWavelengthM)) {
            throw new IllegalArgumentException("band " + fromWavelengthM + " … " + toWavelengthM
                    + " m: the upper wavelength must not be below the lower one");
        }
        requirePositive("wavelength [m]", fromWavelengthM);
        requirePositive("temperature [K]", tempK);
        double t2 = tempK * tempK;
        double total = Physical.STEFAN_BOLTZMANN * t2 * t2;
        // Subtract the tail integrals directly: better conditioned than 1 − F for narrow bands.
        double x1 = C2 / (fromWavelengthM * tempK);
        double x2 = C2 / (toWavelengthM * tempK);
        return total * (upperTailIntegral(x2) - upperTailIntegral(x1)) / PI4_OVER_15;
    }

    /**
     * Wavelength of peak spectral radiance, Wien's displacement law: {@code λ_max = c₂ / (x_w T)},
     * where x_w ≈ 4.965114 solves x = 5(1 − e⁻ˣ) [m]. c₂/x_w equals the CODATA 2018 Wien constant
     * b = 2.897771955e-3 m K. Valid for T &gt; 0.
     *
     * @param tempK T [K]
     * @return λ_max [m]
     */
    public static double wienPeakWavelengthM(double tempK) {
        requirePositive("temperature [K]", tempK);
        return C2 / (WIEN_X * tempK);
    }

    /** ∫ₓ^∞ t³/(eᵗ − 1) dt for x ≥ 0 (x = +∞ gives 0). */
    static double upperTailIntegral(double x) {
        if (x >= 1.0) {
            if (x > 745.0) {
                return 0.0; // e^{-x} underflows
            }
            // Widger & Woodall (1976): terms fall as e^{-nx}; n up to 2 + 40/x leaves < e^{-40}.
            int terms = (int) Math.min(42, 2 + 40.0 / x);
            double x2 = x * x;
            double x3 = x2 * x;
            double sum = 0.0;
            for (int n = terms; n >= 1; n--) { // smallest terms first
                double dn = n;
                sum += Math.exp(-dn * x) * (x3 / dn + 3.0 * x2 / (dn * dn) + 6.0 * x / (dn * dn * dn)
                        + 6.0 / (dn * dn * dn * dn));
            }
            return sum;
        }
        return PI4_OVER_15 - lowerIntegral(x);
    }

    /** ∫₀ˣ t³/(eᵗ − 1) dt for 0 ≤ x &lt; 2π by the Bernoulli expansion Σ Bₖ x^{k+3}/(k!(k+3)). */
    private static double lowerIntegral(double x) {
        double x2 = x * x;
        double x3 = x2 * x;
        double sum = x3 / 3.0 - x3 * x / 8.0;       // B₀ = 1, B₁ = −1/2
        double power = x3 * x2;                      // x^{k+3} for k = 2
        double factorial = 2.0;                      // k! for k = 2
        for (int i = 0; i < BERNOULLI_EVEN.length; i++) {
            int k = 2 * i + 2;
            sum += BERNOULLI_EVEN[i] * power / (factorial * (k + 3));
            power *= x2;
            factorial *= (k + 1) * (k + 2);
        }
        return sum;
    }

    private static double solveWienX() {
        double x = 5.0;
        for (int i = 0; i < 50; i++) {
            double e = Math.exp(-x);
            double f = x - 5.0 * (1.0 - e);
            double df = 1.0 - 5.0 * e;
            double step = f / df;
            x -= step;
            if (Math.abs(step) < 1e-15) {
                break;
            }
        }
        return x;
    }

    private static void requirePositive(String what, double v) {
        if (!(v > 0)) {
            throw new IllegalArgumentException(what + " must be > 0, got " + v);
        }
    }
}
