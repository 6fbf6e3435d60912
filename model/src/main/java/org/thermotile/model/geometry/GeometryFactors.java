package org.thermotile.model.geometry;

import org.thermotile.model.constants.Physical;

/**
 * How urban geometry enters a cell's surface energy balance: beam sunlight scaled by a beam
 * factor (cast shadow), diffuse sunlight and sky longwave scaled by the sky view factor Ψ, and
 * longwave from the walls filling the part of the view the sky does not.
 * <pre>
 *   K↓_eff = b · K_beam,h + Ψ · K_dif,h                                            (1)
 *   L↓_eff = Ψ · L↓ + (1 − Ψ) · ε_w σ T_w⁴                                         (2)
 * </pre>
 * b the beam factor (0 building shadow, τ tree shadow, 1 sunlit; {@link Shadows}), K_beam,h and
 * K_dif,h beam and diffuse irradiance on the horizontal [W m⁻²], L↓ the sky's longwave
 * irradiance [W m⁻²], ε_w and T_w the walls' emissivity and temperature. (1) is the isotropic
 * diffuse sky; (2) treats everything the cell sees that is not sky as a wall at T_w, the
 * usual partition of a canyon surface's radiation by view factors (Oke 1987, Boundary Layer
 * Climates, 2nd ed., urban canyon radiation; from memory), with the sky view factor of
 * {@link SkyViewFactor}.
 *
 * <p><b>Left out, and why it matters.</b> Shortwave reflected by walls and neighbouring
 * surfaces onto the cell is not added: canyon floors receive somewhat less than they would
 * (the error grows with the walls' albedo and as Ψ falls). Longwave reflected by walls
 * ((1 − ε_w) of what they receive) is not added either. The walls are one surface of one
 * temperature.
 *
 * <p><b>Wall temperature.</b> T_w = T_a, the air temperature ({@link #wallTempK}). Limits: a
 * sunlit wall in the afternoon is warmer than the air, and at night walls stay warmer than the
 * air for the heat they stored by day, so (2) underestimates the walls' longwave, most in deep
 * canyons; the estimate is neutral in the sense that it adds no assumed offset of its own.
 */
public final class GeometryFactors {
    private GeometryFactors() {}

    /**
     * Default wall emissivity ε_w: 0.90, within Oke (1987), Boundary Layer Climates, 2nd ed.,
     * table of radiative properties of urban materials: concrete 0.71–0.90, brick 0.90–0.92
     * (from memory).
     */
    public static final double DEFAULT_WALL_EMISSIVITY = 0.90;

    /**
     * Effective shortwave irradiance on the cell, eq. (1): {@code b·K_beam,h + Ψ·K_dif,h} [W m⁻²].
     *
     * @param beamHorizontalWm2    K_beam,h [W m⁻²], ≥ 0
     * @param diffuseHorizontalWm2 K_dif,h [W m⁻²], ≥ 0
     * @param beamFactor           b [–], 0…1
     * @param skyViewFactor        Ψ [–], 0…1
     */
    public static double shortwaveDownWm2(double beamHorizontalWm2, double diffuseHorizontalWm2,
            double beamFactor, double skyViewFactor) {
        return beamFactor * beamHorizontalWm2 + skyViewFactor * diffuseHorizontalWm2;
    }

    /**
     * Absorbed effective shortwave {@code (1 − α)(b·K_beam,h + Ψ·K_dif,h)} [W m⁻²], eq. (1)
     * times the absorptance; α the surface albedo [–].
     */
    public static double absorbedShortwaveWm2(double albedo, double beamHorizontalWm2,
            double diffuseHorizontalWm2, double beamFactor, double skyViewFactor) {
        return (1.0 - albedo) * shortwaveDownWm2(beamHorizontalWm2, diffuseHorizontalWm2, beamFactor,
                skyViewFactor);
    }

    /** The wall-temperature estimate T_w = T_a [K] (see the class notes for its limits). */
    public static double wallTempK(double airTempK) {
        return airTempK;
    }

    /** Longwave emitted by a wall, ε_w σ T_w⁴ [W m⁻²] (Stefan–Boltzmann, CODATA 2018 σ). */
    public static double wallEmittedWm2(double wallEmissivity, double wallTempK) {
        double t2 = wallTempK * wallTempK;
        return wallEmissivity * Physical.STEFAN_BOLTZMANN * t2 * t2;
    }

    /** The walls' share of the longwave reaching the cell, (1 − Ψ) ε_w σ T_w⁴ [W m⁻²]. */
    public static double wallLongwaveWm2(double skyViewFactor, double wallEmissivity, double wallTempK) {
        return (1.0 - skyViewFactor) * wallEmittedWm2(wallEmissivity, wallTempK);
    }

    /**
     * Effective longwave irradiance on the cell, eq. (2): {@code Ψ·L↓ + (1 − Ψ)·E_w} [W m⁻²],
     * with {@code E_w = ε_w σ T_w⁴} ({@link #wallEmittedWm2}) computed once per time step.
     *
     * @param skyViewFactor    Ψ [–], 0…1
     * @param skyLongwaveWm2   L↓ [W m⁻²]
     * @param wallEmittedWm2   E_w [W m⁻²]
     */
    public static double longwaveDownWm2(double skyViewFactor, double skyLongwaveWm2, double wallEmittedWm2) {
        return skyViewFactor * skyLongwaveWm2 + (1.0 - skyViewFactor) * wallEmittedWm2;
    }

    /**
     * Beam factors of a window for one hour's sun, with the policy for low and absent sun:
     * <ul>
     * <li>sun at or below the horizon (e ≤ 0): 0 (no beam);</li>
     * <li>sun below {@code minSunElevationDeg} (0 &lt; e &lt; e_min): b = Ψ, the beam counted as
     *     diffuse. Shadows are then longer than the tiles' halo; a beam only a few degrees above
     *     the horizon is small (K_beam,h = DNI · sin e), and this keeps tile edges exact while
     *     conserving it on open ground (Ψ = 1). It overestimates a low sun's beam in narrow
     *     streets, where it is truly blocked;</li>
     * <li>otherwise the cast-shadow factor of {@link Shadows#beamFactors}.</li>
     * </ul>
     *
     * @param skyViewFactor Ψ of the same window, row-major ({@code wCols × wRows})
     */
    public static void beamFactors(Shadows shadows, double minSunElevationDeg, float[] heightsM,
            float[] treeHeightsM, double canopyTransmissivity, int cols, int rows, int col0, int row0,
            int wCols, int wRows, double sunElevationDeg, double sunAzimuthDeg, double[] skyViewFactor,
            double[] out) {
        if (skyViewFactor.length != out.length) {
            throw new IllegalArgumentException("sky view factors hold " + skyViewFactor.length
                    + " values, the output " + out.length);
        }
        if (sunElevationDeg > 0 && sunElevationDeg < minSunElevationDeg) {
            HeightRaster.checkWindow(cols, rows, col0, row0, wCols, wRows, out.length);
            System.arraycopy(skyViewFactor, 0, out, 0, out.length);
            return;
        }
        shadows.beamFactors(heightsM, treeHeightsM, canopyTransmissivity, cols, rows, col0, row0, wCols,
                wRows, sunElevationDeg, sunAzimuthDeg, out);
    }
}
