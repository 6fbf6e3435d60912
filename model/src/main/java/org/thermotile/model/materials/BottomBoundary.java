package org.thermotile.model.materials;

/**
 * What lies under a surface's last layer.
 *
 * @param kind                 deep ground at a fixed temperature, indoor air through a film
 *                             resistance (roofs), or no flux
 * @param temperatureK         deep-ground or indoor-air temperature [K]; NaN means "the run's
 *                             default" (deep ground: the period's mean air temperature)
 * @param filmResistanceM2KW   inside surface resistance R_si [m² K W⁻¹] for {@link Kind#INDOOR_AIR}
 *                             (ISO 6946:2017 Table 7: 0.10 upward, 0.17 downward heat flow); 0 otherwise
 */
public record BottomBoundary(Kind kind, double temperatureK, double filmResistanceM2KW)
        implements java.io.Serializable {

    /** The kinds of bottom boundary. */
    public enum Kind { DEEP_GROUND, INDOOR_AIR, ADIABATIC }

    public BottomBoundary {
        if (kind == Kind.INDOOR_AIR) {
            MaterialProperty.BOTTOM_FILM_RESISTANCE.check("an indoor-air bottom needs a film resistance",
                    filmResistanceM2KW);
        }
        if (!Double.isNaN(temperatureK)) {
            MaterialProperty.BOTTOM_TEMPERATURE_C.check("bottom",
                    temperatureK - org.thermotile.model.constants.Physical.ZERO_CELSIUS_K);
        }
    }

    /** Deep ground at the run's default temperature (the period's mean air temperature). */
    public static BottomBoundary deepGround() {
        return new BottomBoundary(Kind.DEEP_GROUND, Double.NaN, 0);
    }

    /** Indoor air at {@code tempK} through an inside film resistance [m² K W⁻¹]. */
    public static BottomBoundary indoorAir(double tempK, double filmResistanceM2KW) {
        return new BottomBoundary(Kind.INDOOR_AIR, tempK, filmResistanceM2KW);
    }

    /** No heat flux through the bottom. */
    public static BottomBoundary adiabatic() {
        return new BottomBoundary(Kind.ADIABATIC, Double.NaN, 0);
    }
}
