package org.thermotile.model.balance;

import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.geometry.GeometryFactors;

/**
 * The surface energy balance of every cell of a block, stepped implicitly.
 *
 * <p>Per cell and sub-step (DESIGN.md):
 * <pre>
 *   C₀ dT₀/dt = (1−α)K↓ + ε L↓ − ε σ T₀⁴ − h_c (T₀ − T_a) − β h_c (L_v/c_p)(q_sat(T₀) − q_a) + Q_F − G
 *   C_j dT_j/dt = K_{j−1}(T_{j−1} − T_j) − K_j (T_j − T_{j+1})          (conduction nodes, j ≥ 1)
 * </pre>
 * discretised by backward Euler, so hour-long steps stay stable. The linear conduction system is
 * eliminated from the bottom up (the Thomas algorithm run in reverse: T_j = P_j + Q_j T_{j−1},
 * Q_j constant for a fixed step and precomputed by {@link SurfaceBlock#prepare}), which leaves one
 * scalar equation g(T₀) = 0 for the surface, strictly increasing and convex in T₀:
 * <pre>
 *   g(T) = (A + h_c) T + ε σ T⁴ + β h_c (L_v/c_p) q_sat(T) − R
 * </pre>
 * solved by Newton's method (σT⁴ and q_sat linearised each iteration, one exponential per
 * iteration), with a bisection fallback should Newton fail to converge; then the node
 * temperatures are back-substituted. The energy moved by every term is accumulated per cell so
 * that closure can be checked ({@link SurfaceBlock#closureResidualFraction}).
 *
 * <p>Sign convention: radiative terms positive towards the surface; H, LE, G positive away from it.
 *
 * <p>Urban geometry (only for a block with {@link SurfaceBlock#useGeometry}): K↓ and L↓ are
 * replaced per cell by {@code b·K_beam,h + Ψ·K_dif,h} and {@code Ψ·L↓ + (1 − Ψ)·ε_w σ T_a⁴}
 * ({@link GeometryFactors}), b interpolated linearly in time between the hour's beam factors.
 * A block without geometry takes exactly the former path (K↓ = GHI, L↓ as given).
 */
public final class BalanceKernel {
    private BalanceKernel() {}

    /** Newton stops when the update is below this [K]. */
    static final double NEWTON_TOLERANCE_K = 1e-7;
    static final int NEWTON_MAX_ITERATIONS = 30;
    private static final double SIGMA = Physical.STEFAN_BOLTZMANN;
    private static final double EPS_VAPOUR = Physical.VAPOUR_MASS_RATIO;

    // ---- The physical terms, each as published; the loop below inlines the same algebra. ----

    /** Absorbed shortwave (1 − α) K↓ [W m⁻²]. */
    public static double absorbedShortwave(double albedo, double shortwaveDownWm2) {
        return (1.0 - albedo) * shortwaveDownWm2;
    }

    /** Emitted longwave ε σ T⁴ [W m⁻²] (Stefan–Boltzmann; T⁴ as a square of squares). */
    public static double emittedLongwave(double emissivity, double tempK) {
        double t2 = tempK * tempK;
        return emissivity * SIGMA * t2 * t2;
    }

    /** Absorbed sky longwave ε L↓ [W m⁻²] (Kirchhoff: thermal absorptance = emissivity). */
    public static double absorbedSkyLongwave(double emissivity, double skyLongwaveWm2) {
        return emissivity * skyLongwaveWm2;
    }

    /** Sky longwave reflected by the surface (1 − ε) L↓ [W m⁻²]. */
    public static double reflectedSkyLongwave(double emissivity, double skyLongwaveWm2) {
        return (1.0 - emissivity) * skyLongwaveWm2;
    }

    /** Sensible heat flux H = h_c (T_s − T_a) [W m⁻²]. */
    public static double sensibleHeat(double hcWm2K, double surfaceTempK, double airTempK) {
        return hcWm2K * (surfaceTempK - airTempK);
    }

    /**
     * Latent heat flux by the Lewis analogy LE = β h_c (L_v / c_p)(q_sat(T_s) − q_a) [W m⁻²]
     * (Monteith &amp; Unsworth 2013, §10.1 and §13.1).
     */
    public static double latentHeat(double beta, double hcWm2K, double surfaceTempK, double airTempK,
            double airSpecificHumidity, double pressurePa) {
        double qs = Psychrometrics.saturationSpecificHumidity(surfaceTempK, pressurePa);
        return beta * hcWm2K * Psychrometrics.latentHeatVaporisationJkg(airTempK) / Physical.CP_DRY_AIR
                * (qs - airSpecificHumidity);
    }

    // ---- The per-tile loop. ----

    /**
     * Advances every cell of {@code block} by sub-step {@code m} of {@code sf}. No allocation,
     * no boxing; an exception only when even the bracketed fallback finds no physical root.
     */
    public static void step(SurfaceBlock block, SubstepForcing sf, int m) {
        step(block, sf, m, 0, block.cells);
    }

    /**
     * Advances cells {@code [from, to)} of {@code block} by sub-step {@code m}. Cells are
     * independent, so any partition of the cells into ranges gives the same bits; running a
     * cache-sized range through all sub-steps of an hour before the next range keeps its node
     * arrays in cache ({@link BlockSimulation}).
     */
    public static void step(SurfaceBlock block, SubstepForcing sf, int m, int from, int to) {
        if (block.dtSeconds != sf.dtSeconds) {
            throw new IllegalStateException("block prepared for a " + block.dtSeconds
                    + " s step, forcing has " + sf.dtSeconds + " s");
        }
        final double dt = sf.dtSeconds;
        final double ta = sf.airTempK[m];
        final double qa = sf.specificHumidity[m];
        final double p = sf.pressurePa[m];
        final double hc = sf.convectionWm2K[m];
        final double evap = sf.evaporationConductance[m];
        final double kDown = sf.ghiWm2[m];
        final double lDown = sf.skyLongwaveWm2[m];
        final double[] temp = block.tempK;
        final double[] capDt = block.capOverDt;
        final double[] cond = block.conductanceDownWm2K;
        final double[] invDen = block.invDen;
        final double[] up = block.coupleUp;
        final double[] pj = block.scratchP;
        final boolean record = block.recordFluxes;
        // Urban geometry, when the block has it (else these stay unused).
        final double[] svf = block.skyViewFactor;
        final boolean geometry = svf != null;
        final double[] bStart = block.beamFactorStart;
        final double[] bEnd = block.beamFactorEnd;
        final double beamH = sf.beamHorizontalWm2[m];
        final double diffuseH = sf.diffuseHorizontalWm2[m];
        final double hourFraction = (double) (m % sf.substepsPerHour + 1) / sf.substepsPerHour;
        final double wallLw = geometry
                ? GeometryFactors.wallEmittedWm2(block.wallEmissivity, GeometryFactors.wallTempK(ta)) : 0.0;

        final int[] nodeStart = block.nodeStart;
        final int[] nodeCount = block.nodeCount;
        final double[] bottomTemp = block.bottomTempK;
        int eliminatedUntil = from; // cells below it have their surface-level P in pj[nodeStart]
        for (int c = from; c < to; c++) {
            final int s = nodeStart[c];
            final int last = s + nodeCount[c] - 1;
            final double tb = bottomTemp[c];

            // Bottom-up elimination: P_j = (C_j/Δt T_j + K_j P_{j+1}) / den_j, boundary P = T_b.
            // Each cell's sweep is a chain of dependent multiply-adds, so four neighbouring cells
            // of the same depth are swept together, their chains interleaved (the same
            // operations per cell, so the same bits); the surface slot of pj, unused by the
            // sweep, carries each cell's result to its turn below.
            if (c >= eliminatedUntil && c + 3 < to) {
                final int n = nodeCount[c];
                if (n > 1 && nodeCount[c + 1] == n && nodeCount[c + 2] == n && nodeCount[c + 3] == n) {
                    final int s0 = s, s1 = nodeStart[c + 1], s2 = nodeStart[c + 2], s3 = nodeStart[c + 3];
                    double q0 = tb, q1 = bottomTemp[c + 1], q2 = bottomTemp[c + 2], q3 = bottomTemp[c + 3];
                    for (int k = n - 1; k > 0; k--) {
                        final int j0 = s0 + k, j1 = s1 + k, j2 = s2 + k, j3 = s3 + k;
                        q0 = (capDt[j0] * temp[j0] + cond[j0] * q0) * invDen[j0];
                        q1 = (capDt[j1] * temp[j1] + cond[j1] * q1) * invDen[j1];
                        q2 = (capDt[j2] * temp[j2] + cond[j2] * q2) * invDen[j2];
                        q3 = (capDt[j3] * temp[j3] + cond[j3] * q3) * invDen[j3];
                        pj[j0] = q0;
                        pj[j1] = q1;
                        pj[j2] = q2;
                        pj[j3] = q3;
                    }
                    pj[s0] = q0;
                    pj[s1] = q1;
                    pj[s2] = q2;
                    pj[s3] = q3;
                    eliminatedUntil = c + 4;
                }
            }
            double pNext;
            if (c < eliminatedUntil) {
                pNext = pj[s];
            } else {
                pNext = tb;
                for (int j = last; j > s; j--) {
                    double pv = (capDt[j] * temp[j] + cond[j] * pNext) * invDen[j];
                    pj[j] = pv;
                    pNext = pv;
                }
            }
            // Surface: g(T) = a0 T + εσT⁴ + b q_sat(T) − R = 0.
            final double eps = block.emissivity[c];
            final double beta = block.moisture[c];
            final double es = eps * SIGMA;
            final double bq = beta * evap;
            final double t0Old = temp[s];
            final double sw;
            final double lwIn;
            if (geometry) {
                double psi = svf[c];
                double b = bStart[c] + hourFraction * (bEnd[c] - bStart[c]);
                sw = block.absorptance[c] * GeometryFactors.shortwaveDownWm2(beamH, diffuseH, b, psi);
                lwIn = eps * GeometryFactors.longwaveDownWm2(psi, lDown, wallLw);
            } else {
                sw = block.absorptance[c] * kDown;
                lwIn = eps * lDown;
            }
            final double qf = block.anthropogenicWm2[c];
            final double rhs = capDt[s] * t0Old + cond[s] * pNext + sw + lwIn + qf + hc * ta + bq * qa;
            final double a0 = block.surfaceSlope[c] + hc;

            double t = t0Old;
            double qsAt = 0, dqsAt = 0, tAt = t;
            boolean converged = false;
            for (int it = 0; it < NEWTON_MAX_ITERATIONS; it++) {
                double t2 = t * t;
                double g = a0 * t + es * t2 * t2 - rhs;
                double gp = a0 + 4.0 * es * t2 * t;
                if (bq != 0) {
                    double e = Psychrometrics.saturationVapourPressurePa(t);
                    double de = Psychrometrics.saturationVapourPressureSlopePaK(t, e);
                    double den = p - (1.0 - EPS_VAPOUR) * e;
                    qsAt = EPS_VAPOUR * e / den;
                    dqsAt = EPS_VAPOUR * p * de / (den * den);
                    tAt = t;
                    g += bq * qsAt;
                    gp += bq * dqsAt;
                }
                double dT = g / gp;
                t -= dT;
                if (Math.abs(dT) < NEWTON_TOLERANCE_K) {
                    converged = true;
                    break;
                }
            }
            if (!converged || !(t > 0)) {
                t = bisect(a0, es, bq, rhs, p, t0Old);
                if (bq != 0) {
                    double e = Psychrometrics.saturationVapourPressurePa(t);
                    double den = p - (1.0 - EPS_VAPOUR) * e;
                    qsAt = EPS_VAPOUR * e / den;
                    dqsAt = 0;
                    tAt = t;
                }
            }
            temp[s] = t;
            double prev = t;
            for (int j = s + 1; j <= last; j++) {
                double v = pj[j] + up[j] * prev;
                temp[j] = v;
                prev = v;
            }

            // Energy accounting with the converged temperatures (q_sat from its last linearisation).
            double t2 = t * t;
            double lwOut = es * t2 * t2;
            double h = hc * (t - ta);
            double le = bq == 0 ? 0.0 : bq * (qsAt + dqsAt * (t - tAt) - qa);
            double bottom = block.bottomFixed[c] ? cond[last] * (temp[last] - tb) : 0.0;
            double surfaceNet = sw + lwIn - lwOut - h - le + qf;
            block.energyInJm2[c] += (surfaceNet - bottom) * dt;
            block.energyGrossJm2[c] += (Math.abs(sw) + Math.abs(lwIn) + Math.abs(lwOut) + Math.abs(h)
                    + Math.abs(le) + Math.abs(qf) + Math.abs(bottom)) * dt;
            if (record) {
                // g: conduction from the surface node to the node below it (the bottom flux for
                // a single node). ΔQ_S = Σ C_j ΔT_j / Δt over the whole construction, surface node
                // included; the node equations j ≥ 1 telescope to g − bottom, so only the surface
                // node's own storage needs the temperatures.
                double g = last > s ? cond[s] * (t - temp[s + 1]) : bottom;
                double surfaceNodeStorage = capDt[s] * (t - t0Old);
                double storage = surfaceNodeStorage + (g - bottom);
                // G: heat entering the construction through its top face (the surface node's
                // capacity belongs to the construction), so G = ΔQ_S + bottom and the surface
                // balance is Q* + Q_F − H − LE − G = residual; no term is counted twice.
                double conduction = surfaceNodeStorage + g;
                double[][] fl = block.flux;
                fl[SurfaceBlock.Flux.NET_SHORTWAVE.ordinal()][c] += sw;
                fl[SurfaceBlock.Flux.ABSORBED_SKY_LONGWAVE.ordinal()][c] += lwIn;
                fl[SurfaceBlock.Flux.EMITTED_LONGWAVE.ordinal()][c] += lwOut;
                fl[SurfaceBlock.Flux.SENSIBLE.ordinal()][c] += h;
                fl[SurfaceBlock.Flux.LATENT.ordinal()][c] += le;
                fl[SurfaceBlock.Flux.ANTHROPOGENIC.ordinal()][c] += qf;
                fl[SurfaceBlock.Flux.CONDUCTION.ordinal()][c] += conduction;
                fl[SurfaceBlock.Flux.STORAGE.ordinal()][c] += storage;
                fl[SurfaceBlock.Flux.BOTTOM.ordinal()][c] += bottom;
                fl[SurfaceBlock.Flux.RESIDUAL.ordinal()][c] += surfaceNet - storage - bottom;
            }
        }
    }

    /**
     * Bracketed fallback: bisection on the strictly increasing g(T) between 100 K and 500 K.
     *
     * @throws ArithmeticException if the root is not inside that bracket (non-physical inputs)
     */
    static double bisect(double a0, double es, double bq, double rhs, double p, double guess) {
        double lo = 100.0;
        double hi = 500.0;
        if (g(lo, a0, es, bq, rhs, p) > 0 || g(hi, a0, es, bq, rhs, p) < 0) {
            throw new ArithmeticException("surface temperature outside 100…500 K: the forcing or the "
                    + "material properties are not physical (check units)");
        }
        for (int i = 0; i < 100 && hi - lo > NEWTON_TOLERANCE_K; i++) {
            double mid = 0.5 * (lo + hi);
            if (g(mid, a0, es, bq, rhs, p) > 0) {
                hi = mid;
            } else {
                lo = mid;
            }
        }
        return 0.5 * (lo + hi);
    }

    private static double g(double t, double a0, double es, double bq, double rhs, double p) {
        double t2 = t * t;
        double v = a0 * t + es * t2 * t2 - rhs;
        if (bq != 0) {
            v += bq * Psychrometrics.saturationSpecificHumidity(t, p);
        }
        return v;
    }
}
