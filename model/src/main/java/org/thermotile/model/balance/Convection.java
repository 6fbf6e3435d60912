package org.thermotile.model.balance;

/**
 * Convective heat-transfer coefficient h_c between a surface and the air [W m⁻² K⁻¹].
 *
 * <p>Either a fixed coefficient (as the ASTM E1980 rating conditions prescribe) or the McAdams
 * wind correlation for a flat plate in wind, as quoted by Duffie &amp; Beckman (Solar Engineering of
 * Thermal Processes, 4th ed. 2013, §3.15; from memory): {@code h_c = 5.7 + 3.8 V} for
 * V ≤ 5 m s⁻¹ and {@code h_c = 7.2 V^0.78} above, V the wind speed [m s⁻¹] near the surface.
 * The two branches differ by 0.6 W m⁻² K⁻¹ at 5 m s⁻¹; that step is part of the published fit.
 */
public final class Convection implements java.io.Serializable {
    private static final long serialVersionUID = 1L;
    private final double fixedWm2K;

    private Convection(double fixedWm2K) {
        this.fixedWm2K = fixedWm2K;
    }

    /** The McAdams wind correlation. */
    public static Convection mcAdams() {
        return new Convection(Double.NaN);
    }

    /** A fixed coefficient [W m⁻² K⁻¹], in (0, 500). */
    public static Convection fixed(double hcWm2K) {
        if (!(hcWm2K > 0 && hcWm2K < 500)) {
            throw new IllegalArgumentException("convection coefficient " + hcWm2K
                    + " W/(m² K) must be in (0, 500)");
        }
        return new Convection(hcWm2K);
    }

    /** True when the coefficient is fixed. */
    public boolean isFixed() {
        return !Double.isNaN(fixedWm2K);
    }

    /** h_c [W m⁻² K⁻¹] at wind speed {@code windMs} [m s⁻¹]. */
    public double coefficientWm2K(double windMs) {
        return isFixed() ? fixedWm2K : mcAdamsWm2K(windMs);
    }

    /** McAdams: 5.7 + 3.8 V (V ≤ 5 m/s), 7.2 V^0.78 above [W m⁻² K⁻¹]. */
    public static double mcAdamsWm2K(double windMs) {
        double v = Math.max(0.0, windMs);
        return v <= 5.0 ? 5.7 + 3.8 * v : 7.2 * Math.pow(v, 0.78);
    }

    @Override
    public String toString() {
        return isFixed() ? "fixed " + fixedWm2K + " W/(m² K)" : "McAdams wind correlation";
    }
}
