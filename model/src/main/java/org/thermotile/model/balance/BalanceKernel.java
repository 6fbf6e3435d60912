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
     * Advances the cells in slots {@code [from, to)} of {@code block} by sub-step {@code m} (slots:
     * see {@link SurfaceBlock}; a block of one construction has slot = cell). Cells are
     * independent, so any partition of the slots into ranges gives the same bits; running a
     * cache-sized range through all sub-steps of an hour before the next range keeps its node
     * arrays in cache ({@link BlockSimulation}).
     */
    public static void step(SurfaceBlock block, SubstepForcing sf, int m, int from, int to) {
        if (block.dtSeconds != sf.dtSeconds) {
            throw new IllegalStateException("block prepared for a " + block.dtSeconds
                    + " s step, forcing has " + sf.dtSeconds + " s");
        }
        if (from < 0 || to > block.cells || from > to) {
            throw new IndexOutOfBoundsException("slots [" + from + ", " + to + ") of a block of " + block.cells);
        }
        final int[] groupStart = block.groupSlotStart;
        for (int g = 0; g < block.groups; g++) {
            int a = Math.max(from, groupStart[g]);
            int b = Math.min(to, groupStart[g + 1]);
            if (a < b) {
                stepGroup(block, sf, m, g, a, b);
            }
        }
    }

    /**
     * Slots {@code [a, b)} of group {@code g}, in four passes: the bottom-up elimination node by
     * node across the cells; the surface equation cell by cell; the back-substitution node by
     * node across the cells; the energy accounting cell by cell. Each cell sees exactly the
     * operations, in the same order, of a cell-at-a-time sweep ({@link CellMajorKernel}), so the
     * bits are the same; the node loops are simple counted loops that write one node row from
     * another, each row its own array, which the JIT compiles to vector instructions.
     */
    private static void stepGroup(SurfaceBlock block, SubstepForcing sf, int m, int g, int a, int b) {
        final double dt = sf.dtSeconds;
        final double ta = sf.airTempK[m];
        final double qa = sf.specificHumidity[m];
        final double p = sf.pressurePa[m];
        final double hc = sf.convectionWm2K[m];
        final double evap = sf.evaporationConductance[m];
        final double kDown = sf.ghiWm2[m];
        final double lDown = sf.skyLongwaveWm2[m];
        final double[][] temp = block.tempRows[g];
        final double[][] pRow = block.scratchRows[g];
        final double[] capDt = block.capOverDt[g];
        final double[] cond = block.conductanceDownWm2K[g];
        final double[] invDen = block.invDen[g];
        final double[] up = block.coupleUp[g];
        final double[] bottomTemp = block.bottomTempK;
        final double[] t0Of = block.scratchT0;
        final double[] netOf = block.scratchNet;
        final double[] grossOf = block.scratchGross;
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

        final int n = block.groupNodes[g];
        // Node k of slot s is temp[k][s − first]; the group's cells [a, b) are rows' [ia, ib).
        final int first = block.groupSlotStart[g];
        final int ia = a - first;
        final int ib = b - first;
        final double[] t0Row = temp[0];
        final double[] tLast = temp[n - 1];
        final double[] t1Row = n > 1 ? temp[1] : null;
        final double[] p1Row = n > 1 ? pRow[1] : null;
        final boolean bottomFixed = block.groupBottomFixed[g];

        // 1. Bottom-up elimination: P_j = (C_j/Δt T_j + K_j P_{j+1}) / den_j, boundary P = T_b.
        if (n > 1) {
            eliminate(temp, pRow, capDt, cond, invDen, bottomTemp, first, ia, ib);
        }

        // 2. Surface: g(T) = a0 T + εσT⁴ + b q_sat(T) − R = 0, a chunk of slots at a time.
        final double cap0 = capDt[0];
        final double cond0 = cond[0];
        final double a0 = block.surfaceSlope[g] + hc;
        final SurfaceScratch sc = block.surfaceScratch;
        final double[] rhsOf = sc.rhs;
        final double[] esOf = sc.es;
        final double[] bqOf = sc.bq;
        final double[] swOf = sc.shortwave;
        final double[] lwInOf = sc.longwaveIn;
        final double[] tStart = sc.t[0];
        for (int c0 = a; c0 < b; c0 += SurfaceScratch.CHUNK) {
            final int len = Math.min(b - c0, SurfaceScratch.CHUNK);
            // 2a. The right-hand side R and the coefficients of every cell of the chunk.
            boolean evaporating = false;
            for (int i = 0; i < len; i++) {
                final int s = c0 + i;
                final double pNext = n > 1 ? p1Row[s - first] : bottomTemp[s];
                final double eps = block.emissivity[s];
                final double bq = block.moisture[s] * evap;
                final double t0Old = t0Row[s - first];
                final double sw;
                final double lwIn;
                if (geometry) {
                    double psi = svf[s];
                    double bf = bStart[s] + hourFraction * (bEnd[s] - bStart[s]);
                    sw = block.absorptance[s] * GeometryFactors.shortwaveDownWm2(beamH, diffuseH, bf, psi);
                    lwIn = eps * GeometryFactors.longwaveDownWm2(psi, lDown, wallLw);
                } else {
                    sw = block.absorptance[s] * kDown;
                    lwIn = eps * lDown;
                }
                final double qf = block.anthropogenicWm2[s];
                rhsOf[i] = cap0 * t0Old + cond0 * pNext + sw + lwIn + qf + hc * ta + bq * qa;
                esOf[i] = eps * SIGMA;
                bqOf[i] = bq;
                swOf[i] = sw;
                lwInOf[i] = lwIn;
                tStart[i] = t0Old;
                evaporating |= bq != 0;
            }
            // 2b. Newton iterations in lockstep across the chunk, each one a loop without branches,
            // until every cell's update is below the tolerance (or LOCKSTEP iterations are done).
            int done = 0;
            while (done < SurfaceScratch.LOCKSTEP) {
                if (evaporating) {
                    newtonEvaporating(sc, done, len, a0, p);
                } else {
                    newtonDry(sc, done, len, a0);
                }
                final double[] dk = sc.d[done];
                done++;
                boolean all = true;
                for (int i = 0; i < len; i++) {
                    if (!(Math.abs(dk[i]) < NEWTON_TOLERANCE_K)) {
                        all = false;
                        break;
                    }
                }
                if (all) {
                    break;
                }
            }
            // 2c. Each cell takes the iterate at which its own Newton sequence stopped — the
            // first update below the tolerance — so the result is the cell-by-cell sweep's, bit
            // for bit; a cell still moving after the lockstep iterations goes on alone.
            for (int i = 0; i < len; i++) {
                final int s = c0 + i;
                final double es = esOf[i];
                final double bq = bqOf[i];
                final double rhs = rhsOf[i];
                final double t0Old = tStart[i];
                // The iterate the cell keeps and the iteration whose linearisation of q_sat goes with it.
                final int stop = stoppedAt(sc, i, done);
                boolean converged = stop >= 0;
                final int from = converged ? stop : done - 1;
                double t = sc.t[from + 1][i];
                double qsAt = 0, dqsAt = 0, tAt = t0Old;
                if (bq != 0) {
                    qsAt = sc.qs[from][i];
                    dqsAt = sc.dqs[from][i];
                    tAt = sc.t[from][i];
                }
                if (!converged) {
                    for (int it = done; it < NEWTON_MAX_ITERATIONS; it++) {
                        double t2 = t * t;
                        double gv = a0 * t + es * t2 * t2 - rhs;
                        double gp = a0 + 4.0 * es * t2 * t;
                        if (bq != 0) {
                            double e = Psychrometrics.saturationVapourPressurePa(t);
                            double de = Psychrometrics.saturationVapourPressureSlopePaK(t, e);
                            double den = p - (1.0 - EPS_VAPOUR) * e;
                            qsAt = EPS_VAPOUR * e / den;
                            dqsAt = EPS_VAPOUR * p * de / (den * den);
                            tAt = t;
                            gv += bq * qsAt;
                            gp += bq * dqsAt;
                        }
                        double dT = gv / gp;
                        t -= dT;
                        if (Math.abs(dT) < NEWTON_TOLERANCE_K) {
                            converged = true;
                            break;
                        }
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
                t0Row[s - first] = t;

                // The surface terms with the converged temperature (q_sat from its last linearisation).
                final double sw = swOf[i];
                final double lwIn = lwInOf[i];
                final double qf = block.anthropogenicWm2[s];
                double t2 = t * t;
                double lwOut = es * t2 * t2;
                double h = hc * (t - ta);
                double le = bq == 0 ? 0.0 : bq * (qsAt + dqsAt * (t - tAt) - qa);
                t0Of[s] = t0Old;
                netOf[s] = sw + lwIn - lwOut - h - le + qf;
                grossOf[s] = Math.abs(sw) + Math.abs(lwIn) + Math.abs(lwOut) + Math.abs(h)
                        + Math.abs(le) + Math.abs(qf);
                if (record) {
                    double[][] fl = block.flux;
                    fl[SurfaceBlock.Flux.NET_SHORTWAVE.ordinal()][s] += sw;
                    fl[SurfaceBlock.Flux.ABSORBED_SKY_LONGWAVE.ordinal()][s] += lwIn;
                    fl[SurfaceBlock.Flux.EMITTED_LONGWAVE.ordinal()][s] += lwOut;
                    fl[SurfaceBlock.Flux.SENSIBLE.ordinal()][s] += h;
                    fl[SurfaceBlock.Flux.LATENT.ordinal()][s] += le;
                    fl[SurfaceBlock.Flux.ANTHROPOGENIC.ordinal()][s] += qf;
                }
            }
        }

        // 3. Back-substitution: T_j = P_j + Q_j T_{j−1}, node by node across the cells.
        for (int j = 1; j < n; j++) {
            substitute(temp[j], pRow[j], up[j], temp[j - 1], ia, ib);
        }

        // 4. Energy accounting with the converged temperatures.
        final double condLast = cond[n - 1];
        final double[] energyIn = block.energyInJm2;
        final double[] energyGross = block.energyGrossJm2;
        for (int s = a; s < b; s++) {
            double bottom = bottomFixed ? condLast * (tLast[s - first] - bottomTemp[s]) : 0.0;
            energyIn[s] += (netOf[s] - bottom) * dt;
            energyGross[s] += (grossOf[s] + Math.abs(bottom)) * dt;
        }
        if (record) {
            double[][] fl = block.flux;
            for (int s = a; s < b; s++) {
                double t = t0Row[s - first];
                double bottom = bottomFixed ? condLast * (tLast[s - first] - bottomTemp[s]) : 0.0;
                double gc = n > 1 ? cond0 * (t - t1Row[s - first]) : bottom;
                // gc: conduction from the surface node to the node below it (the bottom flux for
                // a single node). ΔQ_S = Σ C_j ΔT_j / Δt over the whole construction, surface node
                // included; the node equations j ≥ 1 telescope to gc − bottom, so only the surface
                // node's own storage needs the temperatures.
                double surfaceNodeStorage = cap0 * (t - t0Of[s]);
                double storage = surfaceNodeStorage + (gc - bottom);
                // G: heat entering the construction through its top face (the surface node's
                // capacity belongs to the construction), so G = ΔQ_S + bottom and the surface
                // balance is Q* + Q_F − H − LE − G = residual; no term is counted twice.
                fl[SurfaceBlock.Flux.CONDUCTION.ordinal()][s] += surfaceNodeStorage + gc;
                fl[SurfaceBlock.Flux.STORAGE.ordinal()][s] += storage;
                fl[SurfaceBlock.Flux.BOTTOM.ordinal()][s] += bottom;
                fl[SurfaceBlock.Flux.RESIDUAL.ordinal()][s] += netOf[s] - storage - bottom;
            }
        }
    }

    /** The bottom-up elimination of rows n−1 … 1 over the group's cells [ia, ib). */
    private static void eliminate(double[][] temp, double[][] pRow, double[] capDt, double[] cond,
            double[] invDen, double[] bottomTemp, int first, int ia, int ib) {
        final int n = temp.length;
        final double c = capDt[n - 1], k = cond[n - 1], inv = invDen[n - 1];
        final double[] pLast = pRow[n - 1];
        final double[] tLast = temp[n - 1];
        for (int i = ia; i < ib; i++) {
            pLast[i] = (c * tLast[i] + k * bottomTemp[i + first]) * inv;
        }
        for (int j = n - 2; j > 0; j--) {
            eliminateRow(pRow[j], temp[j], pRow[j + 1], capDt[j], cond[j], invDen[j], ia, ib);
        }
    }

    /** One row of the elimination: P_j = (C_j/Δt T_j + K_j P_{j+1}) / den_j. */
    private static void eliminateRow(double[] pj, double[] tj, double[] below, double cj, double kj,
            double invj, int ia, int ib) {
        for (int i = ia; i < ib; i++) {
            pj[i] = (cj * tj[i] + kj * below[i]) * invj;
        }
    }

    /** One row of the back-substitution: T_j = P_j + Q_j T_{j−1}. */
    private static void substitute(double[] tj, double[] pj, double qj, double[] above, int ia, int ib) {
        for (int i = ia; i < ib; i++) {
            tj[i] = pj[i] + qj * above[i];
        }
    }

    /** The first lockstep iteration whose update of cell {@code i} was below the tolerance, or −1. */
    private static int stoppedAt(SurfaceScratch sc, int i, int done) {
        for (int k = 0; k < done; k++) {
            if (Math.abs(sc.d[k][i]) < NEWTON_TOLERANCE_K) {
                return k;
            }
        }
        return -1;
    }

    /**
     * Newton iteration {@code k} for every cell of a chunk without evaporation:
     * {@code t[k+1] = t[k] − g/g′} with the cell-by-cell sweep's operations in its order (so the
     * same bits); one counted loop without branches, which the JIT compiles to vector instructions.
     */
    private static void newtonDry(SurfaceScratch sc, int k, int len, double a0) {
        final double[] tin = sc.t[k];
        final double[] tout = sc.t[k + 1];
        final double[] dk = sc.d[k];
        final double[] es = sc.es;
        final double[] rhs = sc.rhs;
        for (int i = 0; i < len; i++) {
            double t = tin[i];
            double t2 = t * t;
            double gv = a0 * t + es[i] * t2 * t2 - rhs[i];
            double gp = a0 + 4.0 * es[i] * t2 * t;
            double dT = gv / gp;
            tout[i] = t - dT;
            dk[i] = dT;
        }
    }

    // Derived from Psychrometrics' Magnus coefficients and clamp, for the lockstep loop.
    private static final double MAGNUS_BC = Psychrometrics.MAGNUS_B * Psychrometrics.MAGNUS_C_K;
    private static final double MAGNUS_MID_C = 0.5 * (Psychrometrics.MAGNUS_MIN_C + Psychrometrics.MAGNUS_MAX_C);
    private static final double MAGNUS_HALF_C = 0.5 * (Psychrometrics.MAGNUS_MAX_C - Psychrometrics.MAGNUS_MIN_C);

    /**
     * Newton iteration {@code k} for a chunk where some cells evaporate: q_sat linearised at
     * {@code t[k]} and kept for the latent flux. For a cell with b = 0 the added terms are exact
     * zeros (q_sat is finite), so its iterate is the dry one, bit for bit.
     *
     * <p>The same Magnus form as {@link Psychrometrics} (clamped to −60…80 °C, zero slope outside),
     * written as four small loops without calls or branches, which the JIT compiles to vector
     * instructions (one loop doing all of it stays scalar, and a call to {@link Math#exp} keeps any
     * loop scalar): e^x by {@link SeriesExp} (within 4e-15 of {@link Math#exp}), the clamp by
     * min/max, the zero slope outside the clamp by a 0/1 factor, and three divisions where the
     * scalar form has five. The iterates of evaporating cells therefore differ from the scalar
     * form's in the last bits; the accuracy guard ({@code NodeMajorLayoutTest}) holds them within
     * 1e-9 K of it.
     */
    private static void newtonEvaporating(SurfaceScratch sc, int k, int len, double a0, double p) {
        final double[] tin = sc.t[k];
        final double[] x = sc.work0;
        final double[] slope = sc.work1;
        magnusExponent(tin, x, slope, len);
        for (int i = 0; i < len; i++) {
            x[i] = Psychrometrics.MAGNUS_A_PA * SeriesExp.exp(x[i]);
        }
        saturationHumidity(x, slope, sc.qs[k], sc.dqs[k], p, len);
        newtonUpdate(tin, sc.t[k + 1], sc.d[k], sc.qs[k], sc.dqs[k], sc.es, sc.bq, sc.rhs, a0, len);
    }

    /**
     * The Magnus exponent b·t/(c + t) of the clamped temperature t [°C] into {@code x}, and the
     * factor of e_w in its slope, b·c/(c + t)² inside the clamp and 0 outside, into {@code slope}.
     */
    private static void magnusExponent(double[] tempK, double[] x, double[] slope, int len) {
        for (int i = 0; i < len; i++) {
            double tc = tempK[i] - Physical.ZERO_CELSIUS_K;
            double tcl = Math.min(Math.max(tc, Psychrometrics.MAGNUS_MIN_C), Psychrometrics.MAGNUS_MAX_C);
            double invC = 1.0 / (Psychrometrics.MAGNUS_C_K + tcl);
            x[i] = Psychrometrics.MAGNUS_B * tcl * invC;
            // 1 inside the clamp (edges included), 0 outside: (half − |tc − mid|) is ≥ 0 inside.
            double inside = Math.max(0.0, Math.min(1.0, (MAGNUS_HALF_C - Math.abs(tc - MAGNUS_MID_C)) * 1e300 + 1.0));
            slope[i] = MAGNUS_BC * invC * invC * inside;
        }
    }

    /** q_sat = ε e/(p − (1 − ε) e) and its slope in T, from e_w and its slope factor. */
    private static void saturationHumidity(double[] e, double[] slope, double[] q, double[] dq, double p, int len) {
        final double dryPart = 1.0 - EPS_VAPOUR;
        final double epsP = EPS_VAPOUR * p;
        for (int i = 0; i < len; i++) {
            double ei = e[i];
            double inv = 1.0 / (p - dryPart * ei);
            q[i] = EPS_VAPOUR * ei * inv;
            dq[i] = epsP * (ei * slope[i]) * inv * inv;
        }
    }

    /** The Newton update with the latent term linearised: t_out = t − g/g′. */
    private static void newtonUpdate(double[] tin, double[] tout, double[] dk, double[] q, double[] dq, double[] es,
            double[] bq, double[] rhs, double a0, int len) {
        for (int i = 0; i < len; i++) {
            double t = tin[i];
            double t2 = t * t;
            double gv = a0 * t + es[i] * t2 * t2 - rhs[i] + bq[i] * q[i];
            double gp = a0 + 4.0 * es[i] * t2 * t + bq[i] * dq[i];
            double dT = gv / gp;
            tout[i] = t - dT;
            dk[i] = dT;
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
