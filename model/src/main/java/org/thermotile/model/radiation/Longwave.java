package org.thermotile.model.radiation;

import org.thermotile.model.constants.Physical;

/**
 * Thermal-infrared (longwave) exchange terms of a grey surface, each a small static method
 * named for its term. Kirchhoff's law is assumed: thermal absorptance = emissivity ε.
 *
 * <p>Symbols: ε emissivity [–], σ Stefan–Boltzmann constant (CODATA 2018) [W m⁻² K⁻⁴],
 * T_s surface temperature [K], L↓ incoming (sky) longwave irradiance [W m⁻²]. The fourth power
 * is formed as the square of a square (two multiplications, no {@code Math.pow}). No allocation;
 * safe in per-cell loops. Inputs are not checked here (the kernel validates once per tile).
 */
public final class Longwave {
    private Longwave() {}

    /**
     * Emitted longwave radiation, the Stefan–Boltzmann law for a grey body:
     * {@code E = ε σ T_s⁴} [W m⁻²]. Valid for T_s ≥ 0, 0 ≤ ε ≤ 1.
     *
     * @param emissivity ε [–]
     * @param tempK      T_s [K]
     * @return emitted flux [W m⁻²]
     */
    public static double emittedWm2(double emissivity, double tempK) {
        double t2 = tempK * tempK;
        return emissivity * Physical.STEFAN_BOLTZMANN * (t2 * t2);
    }

    /**
     * Derivative of the emitted flux with temperature, for Newton steps on the balance:
     * {@code dE/dT_s = 4 ε σ T_s³} [W m⁻² K⁻¹].
     *
     * @param emissivity ε [–]
     * @param tempK      T_s [K]
     * @return dE/dT_s [W m⁻² K⁻¹]
     */
    public static double emittedSlopeWm2K(double emissivity, double tempK) {
        return 4.0 * emissivity * Physical.STEFAN_BOLTZMANN * (tempK * tempK * tempK);
    }

    /**
     * Sky longwave reflected by a grey surface: {@code R = (1 − ε) L↓} [W m⁻²].
     *
     * @param emissivity   ε [–]
     * @param skyLongwaveWm2 L↓ [W m⁻²]
     * @return reflected flux [W m⁻²]
     */
    public static double reflectedSkyWm2(double emissivity, double skyLongwaveWm2) {
        return (1.0 - emissivity) * skyLongwaveWm2;
    }

    /**
     * Sky longwave absorbed by a grey surface (Kirchhoff): {@code A = ε L↓} [W m⁻²].
     *
     * @param emissivity     ε [–]
     * @param skyLongwaveWm2 L↓ [W m⁻²]
     * @return absorbed flux [W m⁻²]
     */
    public static double absorbedSkyWm2(double emissivity, double skyLongwaveWm2) {
        return emissivity * skyLongwaveWm2;
    }

    /**
     * Temperature of the blackbody that emits a given flux, the inverse Stefan–Boltzmann law:
     * {@code T = (E/σ)^¼} [K] (e.g. the effective sky temperature from L↓). Valid for E ≥ 0.
     *
     * @param fluxWm2 E [W m⁻²]
     * @return T [K]
     */
    public static double blackbodyTempK(double fluxWm2) {
        return Math.sqrt(Math.sqrt(fluxWm2 / Physical.STEFAN_BOLTZMANN));
    }
}
