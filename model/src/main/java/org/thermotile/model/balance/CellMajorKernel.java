package org.thermotile.model.balance;

import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.geometry.GeometryFactors;

/**
 * The reference path of the accuracy guard: the kernel as it was before the node-major layout,
 * every cell's conduction nodes packed together ({@code [cell][node]}) and each cell's Thomas
 * sweeps run as one chain (the elimination of four neighbouring cells of the same depth
 * interleaved). Same equations and the same operations per cell as {@link BalanceKernel}, so the
 * two agree to the bit; kept for the guard ({@code BalanceKernelTest}, the bench's
 * {@code KernelProfile}) and the side-by-side benchmark, not used by runs.
 *
 * <p>Built as a copy of a prepared {@link SurfaceBlock}'s cells (in cell order), with its own
 * state; {@link #initialise}, {@link #prepare} and {@link #step} as the block's.
 */
public final class CellMajorKernel {
    private static final double SIGMA = Physical.STEFAN_BOLTZMANN;
    private static final double EPS_VAPOUR = Physical.VAPOUR_MASS_RATIO;

    public final int cells;
    final double[] absorptance;
    final double[] emissivity;
    final double[] moisture;
    final double[] anthropogenicWm2;
    final double[] bottomTempK;
    final boolean[] bottomFixed;
    final int[] nodeStart;
    final int[] nodeCount;
    final double[] capacityJm2K;
    final double[] conductanceDownWm2K;
    final double[] depthM;
    double dtSeconds = Double.NaN;
    final double[] capOverDt;
    final double[] invDen;
    final double[] coupleUp;
    final double[] surfaceSlope;
    final double[] scratchP;
    final double[] tempK;
    final double[] energyInJm2;
    final double[] energyGrossJm2;
    final double[] heatContentStartJm2;
    double[] skyViewFactor;
    double[] beamFactorStart;
    double[] beamFactorEnd;
    double wallEmissivity;
    final boolean recordFluxes;
    final double[][] flux;

    /** A cell-major copy of {@code b}'s cells, properties and geometry (state not copied). */
    public CellMajorKernel(SurfaceBlock b) {
        cells = b.cells;
        absorptance = new double[cells];
        emissivity = new double[cells];
        moisture = new double[cells];
        anthropogenicWm2 = new double[cells];
        bottomTempK = new double[cells];
        bottomFixed = new boolean[cells];
        nodeStart = new int[cells];
        nodeCount = new int[cells];
        surfaceSlope = new double[cells];
        int total = 0;
        for (int c = 0; c < cells; c++) {
            total += b.nodes(c);
        }
        capacityJm2K = new double[total];
        conductanceDownWm2K = new double[total];
        depthM = new double[total];
        capOverDt = new double[total];
        invDen = new double[total];
        coupleUp = new double[total];
        scratchP = new double[total];
        tempK = new double[total];
        energyInJm2 = new double[cells];
        energyGrossJm2 = new double[cells];
        heatContentStartJm2 = new double[cells];
        recordFluxes = b.recordFluxes;
        flux = recordFluxes ? new double[SurfaceBlock.Flux.COUNT][cells] : null;
        int at = 0;
        for (int c = 0; c < cells; c++) {
            int s = b.slotOfCell[c];
            int g = b.groupOfCell[c];
            int n = b.groupNodes[g];
            absorptance[c] = b.absorptance[s];
            emissivity[c] = b.emissivity[s];
            moisture[c] = b.moisture[s];
            anthropogenicWm2[c] = b.anthropogenicWm2[s];
            bottomTempK[c] = b.bottomTempK[s];
            bottomFixed[c] = b.groupBottomFixed[g];
            nodeStart[c] = at;
            nodeCount[c] = n;
            System.arraycopy(b.capacityJm2K[g], 0, capacityJm2K, at, n);
            System.arraycopy(b.conductanceDownWm2K[g], 0, conductanceDownWm2K, at, n);
            System.arraycopy(b.depthM[g], 0, depthM, at, n);
            at += n;
        }
        if (b.hasGeometry()) {
            skyViewFactor = new double[cells];
            beamFactorStart = new double[cells];
            beamFactorEnd = new double[cells];
            for (int c = 0; c < cells; c++) {
                int s = b.slotOfCell[c];
                skyViewFactor[c] = b.skyViewFactor[s];
                beamFactorStart[c] = b.beamFactorStart[s];
                beamFactorEnd[c] = b.beamFactorEnd[s];
            }
            wallEmissivity = b.wallEmissivity;
        }
    }

    /** As {@link SurfaceBlock#prepare}, per cell. */
    public void prepare(double dt) {
        dtSeconds = dt;
        for (int c = 0; c < cells; c++) {
            int s = nodeStart[c];
            int n = nodeCount[c];
            double qNext = 0;
            for (int j = s + n - 1; j >= s; j--) {
                capOverDt[j] = capacityJm2K[j] / dt;
                double down = conductanceDownWm2K[j];
                if (j > s) {
                    double up = conductanceDownWm2K[j - 1];
                    double inv = 1.0 / (capOverDt[j] + up + down - down * qNext);
                    invDen[j] = inv;
                    coupleUp[j] = up * inv;
                    qNext = coupleUp[j];
                } else {
                    surfaceSlope[c] = capOverDt[j] + down * (1.0 - qNext);
                }
            }
        }
    }

    /** As {@link SurfaceBlock#initialise}. */
    public void initialise(double surfaceTempK) {
        for (int c = 0; c < cells; c++) {
            int s = nodeStart[c];
            int n = nodeCount[c];
            double bottomDepth = depthM[s + n - 1];
            for (int j = s; j < s + n; j++) {
                double f = (bottomFixed[c] && bottomDepth > 0) ? depthM[j] / bottomDepth : 0;
                tempK[j] = surfaceTempK + f * (bottomTempK[c] - surfaceTempK);
            }
            energyInJm2[c] = 0;
            energyGrossJm2[c] = 0;
            heatContentStartJm2[c] = heatContentJm2(c);
        }
    }

    /** As {@link SurfaceBlock#beamFactors} (by cell, no checks). */
    public void beamFactors(double[] atHourStart, double[] atHourEnd) {
        System.arraycopy(atHourStart, 0, beamFactorStart, 0, cells);
        System.arraycopy(atHourEnd, 0, beamFactorEnd, 0, cells);
    }

    /** Clears the recorded fluxes (before an hour). */
    public void clearFluxes() {
        for (double[] f : flux) {
            java.util.Arrays.fill(f, 0.0);
        }
    }

    /** Surface temperature of cell {@code c} [K]. */
    public double surfaceTempK(int c) {
        return tempK[nodeStart[c]];
    }

    /** Temperature of node {@code j} of cell {@code c} [K]. */
    public double nodeTempK(int c, int j) {
        return tempK[nodeStart[c] + j];
    }

    /** Recorded flux sum of cell {@code c} over the sub-steps since {@link #clearFluxes} [W m⁻²]. */
    public double fluxSum(SurfaceBlock.Flux f, int c) {
        return flux[f.ordinal()][c];
    }

    /** Σ (surface flux − bottom flux)·Δt of cell {@code c} [J m⁻²]. */
    public double energyInJm2(int c) {
        return energyInJm2[c];
    }

    /** Σ |flux|·Δt of cell {@code c} [J m⁻²]. */
    public double energyGrossJm2(int c) {
        return energyGrossJm2[c];
    }

    /** Σ C_j T_j of cell {@code c} [J m⁻²]. */
    public double heatContentJm2(int c) {
        double s = 0;
        for (int i = nodeStart[c], e = i + nodeCount[c]; i < e; i++) {
            s += capacityJm2K[i] * tempK[i];
        }
        return s;
    }

    /** Advances every cell by sub-step {@code m}. */
    public void step(SubstepForcing sf, int m) {
        step(this, sf, m, 0, cells);
    }

    /** Advances cells {@code [from, to)} by sub-step {@code m}. */
    public void step(SubstepForcing sf, int m, int from, int to) {
        step(this, sf, m, from, to);
    }

    static void step(CellMajorKernel block, SubstepForcing sf, int m, int from, int to) {
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
            for (int it = 0; it < BalanceKernel.NEWTON_MAX_ITERATIONS; it++) {
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
                if (Math.abs(dT) < BalanceKernel.NEWTON_TOLERANCE_K) {
                    converged = true;
                    break;
                }
            }
            if (!converged || !(t > 0)) {
                t = BalanceKernel.bisect(a0, es, bq, rhs, p, t0Old);
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
                double g;
                if (last > s) {
                    g = cond[s] * (t - temp[s + 1]);
                } else {
                    g = bottom;
                }
                // ΔQ_S = Σ C_j ΔT_j / Δt; the node equations j ≥ 1 telescope to G − bottom, so
                // only the surface node's own storage needs the temperatures.
                double surfaceNodeStorage = capDt[s] * (t - t0Old);
                double storage = surfaceNodeStorage + (g - bottom);
                double[][] fl = block.flux;
                fl[SurfaceBlock.Flux.NET_SHORTWAVE.ordinal()][c] += sw;
                fl[SurfaceBlock.Flux.ABSORBED_SKY_LONGWAVE.ordinal()][c] += lwIn;
                fl[SurfaceBlock.Flux.EMITTED_LONGWAVE.ordinal()][c] += lwOut;
                fl[SurfaceBlock.Flux.SENSIBLE.ordinal()][c] += h;
                fl[SurfaceBlock.Flux.LATENT.ordinal()][c] += le;
                fl[SurfaceBlock.Flux.ANTHROPOGENIC.ordinal()][c] += qf;
                fl[SurfaceBlock.Flux.CONDUCTION.ordinal()][c] += surfaceNodeStorage + g; // G = ΔQ_S + bottom
                fl[SurfaceBlock.Flux.STORAGE.ordinal()][c] += storage;
                fl[SurfaceBlock.Flux.BOTTOM.ordinal()][c] += bottom;
                fl[SurfaceBlock.Flux.RESIDUAL.ordinal()][c] += surfaceNet - storage - bottom;
            }
        }
    }

}
