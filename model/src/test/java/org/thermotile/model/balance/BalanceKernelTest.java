package org.thermotile.model.balance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.junit.jupiter.api.Test;
import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.materials.BottomBoundary;
import org.thermotile.model.materials.Layer;
import org.thermotile.model.materials.Material;
import org.thermotile.model.stats.CellStatistics;

class BalanceKernelTest {

    static Material slab(double albedo, double eps, double cs, double beta) {
        return new Material("slab", "test slab", albedo, eps, List.of(), cs, BottomBoundary.adiabatic(),
                beta, 0, Map.of());
    }

    static Material layered(double albedo, double eps, double beta, BottomBoundary bottom, Layer... layers) {
        return new Material("layered", "test layered", albedo, eps, List.of(layers), Double.NaN, bottom,
                beta, 0, Map.of());
    }

    static SurfaceBlock block(Material m, double bottomK, boolean record) {
        return new SurfaceBlock.Builder(1, record).cell(0, m, bottomK).build();
    }

    /**
     * Semi-infinite solid under a sinusoidal surface temperature: below the surface the wave is
     * damped as exp(−z/d) and delayed by z/(ω d), d = √(2κ/ω) (Carslaw &amp; Jaeger 1959, Conduction
     * of Heat in Solids, 2nd ed., §2.6, eq. (2.6.7)). The surface is held at the air temperature by
     * a large convective coefficient, with no radiation and no evaporation, on the default
     * conduction grid. Amplitude within 2 % and lag within 10 min: with the default grid and
     * 10-minute sub-step down to one damping depth (where the daily wave is still above 37 % of
     * the surface's); with a refined grid and 2-minute sub-steps down to two damping depths, which
     * shows the discretisation converging. (Backward Euler over-damps by about ωΔt/4 per damping
     * depth, 1.1 % at 10 min; the geometric grid adds a spatial error that grows with depth.)
     */
    @Test
    void sinusoidalSurfaceTemperatureDampsAndLagsAsCarslawAndJaeger() {
        double k = 1.0, rhoC = 2.0e6;
        double omega = 2 * Math.PI / 86400.0;
        double d = Math.sqrt(2 * k / rhoC / omega);
        assertTrue(checkSinusoid(10, 1.0 * d, ColumnGrid.DEFAULT_FIRST_SEGMENT_M, ColumnGrid.DEFAULT_GROWTH) >= 3,
                "at least three nodes checked on the default grid");
        assertTrue(checkSinusoid(2, 2.0 * d, 0.005, 1.1) >= 10, "at least ten nodes checked on the refined grid");
    }

    /**
     * The coarse spacing passes the same check with the same tolerance (measured: amplitude within
     * 1.44 %, lag within 7 s down to one damping depth; the standard spacing 1.88 %, 22 s).
     */
    @Test
    void coarseSpacingPassesTheSameCarslawAndJaegerCheck() {
        double omega = 2 * Math.PI / 86400.0;
        double d = Math.sqrt(2 * 1.0 / 2.0e6 / omega);
        assertTrue(checkSinusoid(10, 1.0 * d, ColumnSpacing.COARSE) >= 3, "at least three nodes checked");
    }

    /** Runs the semi-infinite check at {@code minutes} per sub-step down to {@code maxDepthM}; returns nodes checked. */
    static int checkSinusoid(int minutes, double maxDepthM, double firstSegmentM, double growth) {
        return checkSinusoid(minutes, maxDepthM, ColumnSpacing.uniform(firstSegmentM, growth));
    }

    static int checkSinusoid(int minutes, double maxDepthM, ColumnSpacing spacing) {
        double k = 1.0, rhoC = 2.0e6, meanK = 300, ampK = 10;
        // "No radiation": emissivity 1e-9 (the schema refuses 0, which no real surface has); its emission,
        // below 1e-6 W/m² at 300 K, is negligible beside the convective forcing.
        Material soil = layered(1.0, 1e-9, 0.0, BottomBoundary.deepGround(),
                new Layer("uniform solid", 3.0, k, rhoC));
        int days = 12;
        double omega = 2 * Math.PI / 86400.0;
        Forcing f = TestForcings.of(days * 24 + 1, h -> meanK + ampK * Math.sin(omega * 3600.0 * h),
                h -> 0, h -> 0, 0.5, 1.0);
        SurfaceBlock b = new SurfaceBlock.Builder(1, false, spacing).cell(0, soil, meanK).build();
        SubstepForcing sf = SubstepForcing.of(f, minutes, Convection.fixed(499));
        int nodes = b.nodes(0);
        double[][] series = new double[nodes][days * 24 + 1];
        BlockSimulation.run(b, sf, (hour, blk) -> {
            for (int j = 0; j < nodes; j++) {
                series[j][hour] = blk.nodeTempK(0, j);
            }
        });
        double d = Math.sqrt(2 * k / rhoC / omega);
        double[] surf = fitSine(series[0], omega, days);
        int checked = 0;
        for (int j = 1; j < nodes; j++) {
            double z = b.nodeDepthM(0, j);
            if (z > maxDepthM) {
                break;
            }
            double[] fit = fitSine(series[j], omega, days);
            double ratio = fit[0] / surf[0];
            double expectRatio = Math.exp(-z / d);
            double lagS = phaseLagSeconds(surf[1], fit[1], omega);
            double expectLagS = z / (omega * d);
            assertEquals(expectRatio, ratio, 0.02 * expectRatio,
                    "amplitude ratio at z = " + z + " m, " + minutes + " min step");
            assertEquals(expectLagS, lagS, 600, "phase lag at z = " + z + " m, " + minutes + " min step");
            checked++;
        }
        return checked;
    }

    /** Least-squares fit over the last 4 days: returns {amplitude, phase}. */
    static double[] fitSine(double[] y, double omega, int days) {
        int from = (days - 4) * 24 + 1, to = days * 24;
        double ss = 0, sc = 0, cc = 0, ys = 0, yc = 0, s1 = 0, c1 = 0, y1 = 0, n = 0;
        for (int h = from; h <= to; h++) {
            double s = Math.sin(omega * 3600.0 * h), c = Math.cos(omega * 3600.0 * h);
            ss += s * s; sc += s * c; cc += c * c; ys += y[h] * s; yc += y[h] * c;
            s1 += s; c1 += c; y1 += y[h]; n++;
        }
        // Solve the 3x3 normal equations for [m, a, c].
        double[][] A = {{n, s1, c1}, {s1, ss, sc}, {c1, sc, cc}};
        double[] r = {y1, ys, yc};
        double[] x = solve3(A, r);
        return new double[] {Math.hypot(x[1], x[2]), Math.atan2(x[2], x[1])};
    }

    static double phaseLagSeconds(double surfacePhase, double depthPhase, double omega) {
        double dphi = surfacePhase - depthPhase;
        while (dphi < 0) {
            dphi += 2 * Math.PI;
        }
        return dphi / omega;
    }

    static double[] solve3(double[][] a, double[] b) {
        double det = det3(a);
        double[] x = new double[3];
        for (int i = 0; i < 3; i++) {
            double[][] m = {a[0].clone(), a[1].clone(), a[2].clone()};
            for (int r = 0; r < 3; r++) {
                m[r][i] = b[r];
            }
            x[i] = det3(m) / det;
        }
        return x;
    }

    static double det3(double[][] m) {
        return m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1])
                - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0])
                + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
    }

    /**
     * Under constant forcing a dry adiabatic slab reaches the steady state
     * (1−α)K + εL↓ = εσT⁴ + h_c (T − T_a), solved here independently with Commons Math's Brent
     * solver (Brent 1973); the kernel must agree within 1e-6 K.
     */
    @Test
    void dryAdiabaticSlabReachesTheSteadyStateOfAnIndependentSolver() {
        double albedo = 0.3, eps = 0.9, k = 700, lsky = 350, ta = 303.15, hc = 12;
        Forcing f = TestForcings.of(24 * 5 + 1, h -> ta, h -> k, h -> lsky, 0.4, 3.0);
        SurfaceBlock b = block(slab(albedo, eps, 2e4, 0.0), Double.NaN, false);
        BlockSimulation.run(b, SubstepForcing.of(f, 10, Convection.fixed(hc)), (h, blk) -> { });
        double expected = new BrentSolver(1e-12).solve(1000,
                t -> (1 - albedo) * k + eps * lsky - eps * Physical.STEFAN_BOLTZMANN * Math.pow(t, 4)
                        - hc * (t - ta), 200, 500);
        assertEquals(expected, b.surfaceTempK(0), 1e-6);
    }

    /** The same with evaporation: the wet steady state includes β h_c (L_v/c_p)(q_sat(T) − q_a). */
    @Test
    void wetSlabReachesTheSteadyStateIncludingEvaporation() {
        double albedo = 0.2, eps = 0.95, k = 600, lsky = 360, ta = 301.15, hc = 10, beta = 0.7, rh = 0.4;
        Forcing f = TestForcings.of(24 * 5 + 1, h -> ta, h -> k, h -> lsky, rh, 1.0);
        SurfaceBlock b = block(slab(albedo, eps, 2e4, beta), Double.NaN, false);
        BlockSimulation.run(b, SubstepForcing.of(f, 10, Convection.fixed(hc)), (h, blk) -> { });
        double qa = Psychrometrics.specificHumidityFromRelative(ta, rh, 101_325);
        double lvcp = Psychrometrics.latentHeatVaporisationJkg(ta) / Physical.CP_DRY_AIR;
        double expected = new BrentSolver(1e-12).solve(1000,
                t -> (1 - albedo) * k + eps * lsky - eps * Physical.STEFAN_BOLTZMANN * Math.pow(t, 4)
                        - hc * (t - ta)
                        - beta * hc * lvcp * (Psychrometrics.saturationSpecificHumidity(t, 101_325) - qa),
                200, 500);
        assertEquals(expected, b.surfaceTempK(0), 1e-6);
        assertTrue(b.surfaceTempK(0) < new BrentSolver(1e-12).solve(1000,
                t -> (1 - albedo) * k + eps * lsky - eps * Physical.STEFAN_BOLTZMANN * Math.pow(t, 4)
                        - hc * (t - ta), 200, 500), "evaporation cools the surface");
    }

    /** Halving the sub-step (10 → 5 min) changes the peak by less than 0.05 K (issue's check). */
    @Test
    void halvingTheSubStepChangesThePeakByLessThanFiveHundredthsOfAKelvin() {
        Material asphalt = layered(0.1, 0.93, 0.0, BottomBoundary.deepGround(),
                new Layer("asphalt", 0.05, 0.75, 1.94e6), new Layer("base", 0.25, 1.5, 2.0e6),
                new Layer("subgrade", 1.2, 1.0, 1.8e6));
        Forcing f = TestForcings.summerDays(6);
        double p10 = peak(asphalt, f, 10), p5 = peak(asphalt, f, 5), p20 = peak(asphalt, f, 20);
        assertTrue(Math.abs(p10 - p5) < 0.05, "peak 10 min " + p10 + " vs 5 min " + p5);
        assertTrue(Math.abs(p20 - p10) > Math.abs(p10 - p5), "the change shrinks as the step halves");
    }

    static double peak(Material m, Forcing f, int minutes) {
        SurfaceBlock b = block(m, 299.15, false);
        CellStatistics st = new CellStatistics(1, 318.15);
        BlockSimulation.run(b, SubstepForcing.of(f, minutes, Convection.mcAdams()),
                (h, blk) -> { if (h > 72) st.sample(blk, h % 24, false); });
        return st.peakK(0);
    }

    /**
     * Energy closure over 30 days for each construction kind: |Σ fluxes·Δt − Δ storage| &lt; 0.1 %
     * of Σ|fluxes|·Δt, and the per-hour recorded residual is tiny.
     */
    @Test
    void energyClosesWithinATenthOfAPercentOverThirtyDays() {
        Material[] ms = {
            layered(0.1, 0.93, 0.0, BottomBoundary.deepGround(),
                    new Layer("asphalt", 0.05, 0.75, 1.94e6), new Layer("subgrade", 1.5, 1.0, 1.8e6)),
            layered(0.75, 0.9, 0.0, BottomBoundary.indoorAir(297.15, 0.10),
                    new Layer("membrane", 0.002, 0.2, 1.6e6), new Layer("insulation", 0.1, 0.035, 3e4),
                    new Layer("deck", 0.15, 1.4, 2.0e6)),
            slab(0.06, 0.97, 4.18e6, 1.0),
            layered(0.23, 0.96, 0.8, BottomBoundary.deepGround(),
                    new Layer("moist soil", 1.0, 1.2, 2.5e6))
        };
        Forcing f = TestForcings.summerDays(30);
        for (Material m : ms) {
            SurfaceBlock b = block(m, 296.15, true);
            double[] maxHourResidual = {0};
            BlockSimulation.run(b, SubstepForcing.of(f, 10, Convection.mcAdams()), (h, blk) ->
                    maxHourResidual[0] = Math.max(maxHourResidual[0],
                            Math.abs(blk.flux(SurfaceBlock.Flux.RESIDUAL, 0))));
            assertTrue(Math.abs(b.closureResidualFraction(0)) < 1e-3,
                    m.name() + ": closure " + b.closureResidualFraction(0));
            assertTrue(maxHourResidual[0] < 1e-3, m.name() + ": hourly residual " + maxHourResidual[0]);
        }
    }

    /** A dry roof under a clear night sky radiates below the air temperature (common practice). */
    @Test
    void dryRoofUnderAClearNightSkyCoolsBelowAirTemperature() {
        Material roof = layered(0.1, 0.9, 0.0, BottomBoundary.indoorAir(297.15, 0.10),
                new Layer("membrane", 0.002, 0.2, 1.6e6), new Layer("insulation", 0.12, 0.035, 3e4));
        // Clear night: air 18 °C, sky longwave 300 W m⁻² (a clear-sky emissivity of about 0.73).
        Forcing f = TestForcings.of(48, h -> 291.15, h -> 0, h -> 300, 0.6, 1.0);
        SurfaceBlock b = block(roof, 297.15, false);
        BlockSimulation.run(b, SubstepForcing.of(f, 10, Convection.mcAdams()), (h, blk) -> { });
        assertTrue(b.surfaceTempK(0) < 291.15 - 2, "roof at " + b.surfaceTempK(0) + " K");
    }

    /** Raising albedo never raises the peak (monotonic response). */
    @Test
    void raisingAlbedoNeverRaisesThePeak() {
        Forcing f = TestForcings.summerDays(4);
        double prev = Double.POSITIVE_INFINITY;
        for (double a = 0.05; a <= 0.9; a += 0.05) {
            Material m = layered(a, 0.9, 0.0, BottomBoundary.deepGround(),
                    new Layer("concrete", 0.2, 1.5, 2.1e6), new Layer("soil", 1.0, 1.0, 1.8e6));
            double p = peak(m, f, 10);
            assertTrue(p <= prev + 1e-9, "albedo " + a + " peak " + p + " > " + prev);
            prev = p;
        }
    }
}
