package org.thermotile.model.rating;

import org.thermotile.model.constants.Physical;

/**
 * Solar Reflectance Index (SRI) of a horizontal or low-sloped opaque surface, after
 * ASTM E1980-11, "Standard Practice for Calculating Solar Reflectance Index of Horizontal and
 * Low-Sloped Opaque Surfaces".
 *
 * <p><b>Steady state.</b> Under the standard's solar and ambient conditions the surface
 * temperature T_s [K] solves the balance (conduction into the substrate neglected)
 * <pre>
 *   α I = ε σ (T_s⁴ − T_sky⁴) + h_c (T_s − T_a)
 * </pre>
 * with α = 1 − ρ the solar absorptance (ρ the solar reflectance), ε the thermal emittance,
 * I = 1000 W m⁻², T_a = 310 K, T_sky = 300 K and h_c = 5, 12, 30 W m⁻² K⁻¹ for low (0–2 m s⁻¹),
 * medium (2–6 m s⁻¹) and high (6–10 m s⁻¹) wind. We solve it ourselves: Newton from the root of
 * the tangent at T_a (the balance is convex and increasing in T_s, so Newton from there falls
 * monotonically onto the root), with a bisection on a proven bracket as fallback.
 *
 * <p><b>Index.</b> {@code SRI = 100 (T_b − T_s)/(T_b − T_w)}, where T_b and T_w are the steady
 * temperatures of the standard black (ρ = 0.05, ε = 0.90) and standard white (ρ = 0.80, ε = 0.90)
 * at the same wind; so black is 0 and white is 100 by construction. Hotter surfaces go negative;
 * a cool, high-emittance surface can exceed 100.
 *
 * <p><b>Constant.</b> σ is the CODATA 2018 value; the standard prints σ = 5.66961e-8
 * W m⁻² K⁻⁴ (an older value). The 0.01 % difference moves temperatures by &lt; 0.01 K.
 *
 * <p><b>Domain.</b> The standard is meant for ε &gt; 0.1; the steady-state solve itself works for
 * any 0 &lt; ε ≤ 1, 0 ≤ ρ ≤ 1, h_c &gt; 0.
 */
public final class SolarReflectanceIndex {
    private SolarReflectanceIndex() {}

    /** Solar flux of the standard conditions I [W m⁻²] (ASTM E1980-11 §3.1.11). */
    public static final double SOLAR_FLUX_WM2 = 1000.0;
    /** Ambient air temperature of the standard conditions T_a [K]. */
    public static final double AIR_TEMP_K = 310.0;
    /** Sky temperature of the standard conditions T_sky [K]. */
    public static final double SKY_TEMP_K = 300.0;
    /** Standard black: solar reflectance 0.05, thermal emittance 0.90 (SRI 0). */
    public static final double BLACK_REFLECTANCE = 0.05;
    /** Standard black thermal emittance. */
    public static final double BLACK_EMITTANCE = 0.90;
    /** Standard white: solar reflectance 0.80, thermal emittance 0.90 (SRI 100). */
    public static final double WHITE_REFLECTANCE = 0.80;
    /** Standard white thermal emittance. */
    public static final double WHITE_EMITTANCE = 0.90;

    /** The three wind conditions of ASTM E1980-11 and their convective coefficients. */
    public enum Wind {
        /** 0–2 m s⁻¹, h_c = 5 W m⁻² K⁻¹. */
        LOW(5.0),
        /** 2–6 m s⁻¹, h_c = 12 W m⁻² K⁻¹ (the condition usually quoted). */
        MEDIUM(12.0),
        /** 6–10 m s⁻¹, h_c = 30 W m⁻² K⁻¹. */
        HIGH(30.0);

        /** Convective coefficient h_c [W m⁻² K⁻¹]. */
        public final double convectionWm2K;

        Wind(double convectionWm2K) {
            this.convectionWm2K = convectionWm2K;
        }
    }

    /**
     * An SRI with the steady-state temperatures behind it.
     *
     * @param sri          solar reflectance index [–]
     * @param surfaceTempK steady-state temperature of the surface T_s [K]
     * @param blackTempK   steady-state temperature of the standard black T_b [K]
     * @param whiteTempK   steady-state temperature of the standard white T_w [K]
     * @param convectionWm2K the h_c used [W m⁻² K⁻¹]
     */
    public record Result(double sri, double surfaceTempK, double blackTempK, double whiteTempK,
            double convectionWm2K) {}

    /**
     * SRI by our steady-state solve, {@code SRI = 100 (T_b − T_s)/(T_b − T_w)}, at one of the
     * standard wind conditions (ASTM E1980-11).
     *
     * @param reflectance solar reflectance ρ [0…1]
     * @param emittance   thermal emittance ε (0…1]
     * @param wind        wind condition (sets h_c)
     * @return the index and the three steady temperatures [K]
     */
    public static Result of(double reflectance, double emittance, Wind wind) {
        return of(reflectance, emittance, wind.convectionWm2K);
    }

    /**
     * SRI by our steady-state solve at any convective coefficient h_c [W m⁻² K⁻¹] &gt; 0, under
     * the standard solar flux, air and sky temperatures.
     *
     * @param reflectance    solar reflectance ρ [0…1]
     * @param emittance      thermal emittance ε (0…1]
     * @param convectionWm2K h_c [W m⁻² K⁻¹]
     * @return the index and the three steady temperatures [K]
     */
    public static Result of(double reflectance, double emittance, double convectionWm2K) {
        checkReflectance(reflectance);
        double ts = steadyStateTempK(1.0 - reflectance, emittance, convectionWm2K);
        double tb = steadyStateTempK(1.0 - BLACK_REFLECTANCE, BLACK_EMITTANCE, convectionWm2K);
        double tw = steadyStateTempK(1.0 - WHITE_REFLECTANCE, WHITE_EMITTANCE, convectionWm2K);
        return new Result(100.0 * (tb - ts) / (tb - tw), ts, tb, tw, convectionWm2K);
    }

    /**
     * Steady-state surface temperature under the standard conditions of ASTM E1980-11:
     * root of {@code α I − ε σ (T⁴ − T_sky⁴) − h_c (T − T_a) = 0} [K].
     *
     * @param absorptance    solar absorptance α = 1 − ρ [0…1]
     * @param emittance      thermal emittance ε (0…1]
     * @param convectionWm2K h_c [W m⁻² K⁻¹], &gt; 0
     * @return T_s [K]
     */
    public static double steadyStateTempK(double absorptance, double emittance, double convectionWm2K) {
        return steadyStateTempK(absorptance, emittance, SOLAR_FLUX_WM2, AIR_TEMP_K, SKY_TEMP_K, convectionWm2K);
    }

    /**
     * Steady-state temperature of a sunlit surface with no conduction, for any conditions:
     * root T of {@code f(T) = ε σ (T⁴ − T_sky⁴) + h_c (T − T_a) − α I} [K].
     *
     * <p>Newton starts at the root of the tangent at T_a; since f is convex and increasing for
     * T &gt; 0, that start is at or above the root and Newton converges monotonically (|ΔT| &lt;
     * 1e-10 K). Should it not, bisection on [min(T_a, T_sky), the smaller of
     * max(T_a,T_sky) + αI/h_c and (max(T_a,T_sky)⁴ + αI/(εσ))^¼] — f ≤ 0 at the lower end and f ≥ 0
     * at the upper by inspection — finishes the job; failing that an {@link ArithmeticException}.
     *
     * @param absorptance    α [0…1]
     * @param emittance      ε (0…1]
     * @param solarWm2       absorbed-before-α flux I [W m⁻²], ≥ 0
     * @param airTempK       T_a [K], &gt; 0
     * @param skyTempK       T_sky [K], &gt; 0
     * @param convectionWm2K h_c [W m⁻² K⁻¹], &gt; 0
     * @return T_s [K]
     */
    public static double steadyStateTempK(double absorptance, double emittance, double solarWm2,
            double airTempK, double skyTempK, double convectionWm2K) {
        if (!(absorptance >= 0 && absorptance <= 1)) {
            throw new IllegalArgumentException("solar absorptance " + absorptance + " must be in 0…1");
        }
        if (!(emittance > 0 && emittance <= 1)) {
            throw new IllegalArgumentException("thermal emittance " + emittance + " must be in (0, 1]");
        }
        if (!(convectionWm2K > 0) || !(solarWm2 >= 0) || !(airTempK > 0) || !(skyTempK > 0)) {
            throw new IllegalArgumentException("need h_c > 0, I ≥ 0, T_a > 0, T_sky > 0; got h_c="
                    + convectionWm2K + ", I=" + solarWm2 + ", T_a=" + airTempK + ", T_sky=" + skyTempK);
        }
        double es = emittance * Physical.STEFAN_BOLTZMANN;
        double sky2 = skyTempK * skyTempK;
        double sky4 = sky2 * sky2;
        double gain = absorptance * solarWm2;

        double t = airTempK - balance(airTempK, es, sky4, convectionWm2K, airTempK, gain)
                / slope(airTempK, es, convectionWm2K);
        for (int i = 0; i < 50; i++) {
            double step = balance(t, es, sky4, convectionWm2K, airTempK, gain) / slope(t, es, convectionWm2K);
            t -= step;
            if (Math.abs(step) < 1e-10) {
                return t;
            }
        }
        return bisect(es, sky4, convectionWm2K, airTempK, skyTempK, gain);
    }

    /** The bracketed fallback alone (for tests): same root as {@link #steadyStateTempK} [K]. */
    static double steadyStateTempByBisectionK(double absorptance, double emittance, double solarWm2,
            double airTempK, double skyTempK, double convectionWm2K) {
        double sky2 = skyTempK * skyTempK;
        return bisect(emittance * Physical.STEFAN_BOLTZMANN, sky2 * sky2, convectionWm2K, airTempK,
                skyTempK, absorptance * solarWm2);
    }

    /**
     * The standard's closed-form SRI (ASTM E1980-11, Eq. 4), written here from memory of the
     * standard and checked against our steady-state solve in the tests:
     * <pre>
     *   SRI = 123.97 − 141.35 χ + 9.655 χ²,  χ = (α − 0.029 ε)(8.797 + h_c) / (9.5205 ε + h_c)
     * </pre>
     * with α = 1 − ρ. The standard states it holds for α &gt; 0.1, excluding collector surfaces
     * (α &gt; 0.8 with ε &lt; 0.2), with an average error of 0.9 and a maximum of 2 SRI units.
     *
     * @param reflectance    solar reflectance ρ [0…1]
     * @param emittance      thermal emittance ε [0…1]
     * @param convectionWm2K h_c [W m⁻² K⁻¹]
     * @return SRI [–]
     */
    public static double closedForm(double reflectance, double emittance, double convectionWm2K) {
        checkReflectance(reflectance);
        double absorptance = 1.0 - reflectance;
        double chi = (absorptance - 0.029 * emittance) * (8.797 + convectionWm2K)
                / (9.5205 * emittance + convectionWm2K);
        return 123.97 - 141.35 * chi + 9.655 * chi * chi;
    }

    /** {@link #closedForm(double, double, double)} at a standard wind condition. */
    public static double closedForm(double reflectance, double emittance, Wind wind) {
        return closedForm(reflectance, emittance, wind.convectionWm2K);
    }

    /**
     * The standard's closed-form approximation of the steady-state temperature, written here from
     * memory of ASTM E1980-11 (its approximate solution of the balance; not used by {@link #of}):
     * <pre>
     *   T_s = 309.07 + (1066.07 α − 31.98 ε)/(6.78 ε + h_c) − (890.94 α² + 2153.86 α ε)/(6.78 ε + h_c)²
     * </pre>
     * [K], α = 1 − ρ. Used only as a cross-check of {@link #steadyStateTempK}.
     *
     * @param reflectance    ρ [0…1]
     * @param emittance      ε [0…1]
     * @param convectionWm2K h_c [W m⁻² K⁻¹]
     * @return approximate T_s [K]
     */
    public static double closedFormTempK(double reflectance, double emittance, double convectionWm2K) {
        double a = 1.0 - reflectance;
        double d = 6.78 * emittance + convectionWm2K;
        return 309.07 + (1066.07 * a - 31.98 * emittance) / d
                - (890.94 * a * a + 2153.86 * a * emittance) / (d * d);
    }

    private static double balance(double t, double es, double sky4, double hc, double airK, double gain) {
        double t2 = t * t;
        return es * (t2 * t2 - sky4) + hc * (t - airK) - gain;
    }

    private static double slope(double t, double es, double hc) {
        return 4.0 * es * t * t * t + hc;
    }

    private static double bisect(double es, double sky4, double hc, double airK, double skyK, double gain) {
        double lo = Math.min(airK, skyK);
        double top = Math.max(airK, skyK);
        double top2 = top * top;
        double hi = Math.min(top + gain / hc, Math.sqrt(Math.sqrt(top2 * top2 + gain / es)));
        for (int i = 0; i < 200 && hi - lo > 1e-10; i++) {
            double mid = 0.5 * (lo + hi);
            if (balance(mid, es, sky4, hc, airK, gain) > 0) {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        double t = 0.5 * (lo + hi);
        if (!(Math.abs(balance(t, es, sky4, hc, airK, gain)) < 1e-6)) {
            throw new ArithmeticException("steady-state temperature did not converge (ε σ = " + es
                    + ", h_c = " + hc + ", αI = " + gain + ")");
        }
        return t;
    }

    private static void checkReflectance(double reflectance) {
        if (!(reflectance >= 0 && reflectance <= 1)) {
            throw new IllegalArgumentException("solar reflectance " + reflectance + " must be in 0…1");
        }
    }
}
