package org.thermotile.model.balance;

import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;

/**
 * Forcing at every sub-step of a period, computed once and shared by every cell of a block:
 * the kernel's per-cell loop only reads these arrays.
 *
 * <p>Sub-step {@code m} belongs to the interval between forcing hours {@code k−1} and
 * {@code k = m / n + 1} (n sub-steps per hour) and ends at fraction {@code f = (m mod n + 1)/n}
 * of it; backward Euler evaluates the forcing at that end time, linearly interpolated between
 * the two hours. The sub-steps of the last forcing hour end exactly at it.
 */
public final class SubstepForcing {
    public final int substepsPerHour;
    public final double dtSeconds;
    /** Number of sub-steps: (hours − 1) × substepsPerHour. */
    public final int substeps;
    public final double[] airTempK;
    public final double[] specificHumidity;
    public final double[] pressurePa;
    /** Convective coefficient h_c [W m⁻² K⁻¹]. */
    public final double[] convectionWm2K;
    /** h_c · L_v / c_p [W m⁻² (kg/kg)⁻¹], the Lewis-analogy evaporation conductance for β = 1. */
    public final double[] evaporationConductance;
    public final double[] ghiWm2;
    public final double[] beamHorizontalWm2;
    public final double[] diffuseHorizontalWm2;
    public final double[] skyLongwaveWm2;

    private SubstepForcing(int n, int hours) {
        substepsPerHour = n;
        dtSeconds = (double) Physical.SECONDS_PER_HOUR / n;
        substeps = Math.max(0, hours - 1) * n;
        airTempK = new double[substeps];
        specificHumidity = new double[substeps];
        pressurePa = new double[substeps];
        convectionWm2K = new double[substeps];
        evaporationConductance = new double[substeps];
        ghiWm2 = new double[substeps];
        beamHorizontalWm2 = new double[substeps];
        diffuseHorizontalWm2 = new double[substeps];
        skyLongwaveWm2 = new double[substeps];
    }

    /**
     * Sub-step forcing for {@code forcing} with {@code substepMinutes} (must divide 60).
     *
     * <p>Evaporation follows the Lewis analogy (Monteith &amp; Unsworth 2013, Principles of
     * Environmental Physics, 4th ed., §10.1): the moisture transfer coefficient is h_c/(ρ c_p)
     * with a Lewis number of 1, so {@code LE = β h_c (L_v/c_p)(q_sat(T_s) − q_a)}.
     */
    public static SubstepForcing of(Forcing forcing, int substepMinutes, Convection convection) {
        if (substepMinutes < 1 || 60 % substepMinutes != 0) {
            throw new IllegalArgumentException("sub-step of " + substepMinutes
                    + " min must divide 60 (e.g. 5, 10, 15, 20, 30, 60)");
        }
        int n = 60 / substepMinutes;
        SubstepForcing sf = new SubstepForcing(n, forcing.hours());
        for (int m = 0; m < sf.substeps; m++) {
            int k = m / n + 1;
            double f = (double) (m % n + 1) / n;
            double ta = lerp(forcing.airTempK, k, f);
            double wind = lerp(forcing.windMs, k, f);
            double hc = convection.coefficientWm2K(wind);
            sf.airTempK[m] = ta;
            sf.specificHumidity[m] = lerp(forcing.specificHumidity, k, f);
            sf.pressurePa[m] = lerp(forcing.pressurePa, k, f);
            sf.convectionWm2K[m] = hc;
            sf.evaporationConductance[m] = hc * Psychrometrics.latentHeatVaporisationJkg(ta)
                    / Physical.CP_DRY_AIR;
            sf.ghiWm2[m] = lerp(forcing.ghiWm2, k, f);
            sf.beamHorizontalWm2[m] = lerp(forcing.beamHorizontalWm2, k, f);
            sf.diffuseHorizontalWm2[m] = lerp(forcing.diffuseHorizontalWm2, k, f);
            sf.skyLongwaveWm2[m] = lerp(forcing.skyLongwaveWm2, k, f);
        }
        return sf;
    }

    private static double lerp(double[] a, int k, double f) {
        return a[k - 1] + f * (a[k] - a[k - 1]);
    }
}
