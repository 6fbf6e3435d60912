package org.thermotile.model.observe;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Objects;
import java.util.SplittableRandom;
import org.apache.commons.math3.analysis.MultivariateFunction;
import org.apache.commons.math3.analysis.UnivariateFunction;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.SingularValueDecomposition;
import org.apache.commons.math3.optim.InitialGuess;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.PointValuePair;
import org.apache.commons.math3.optim.SimpleBounds;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.nonlinear.scalar.ObjectiveFunction;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.BOBYQAOptimizer;
import org.apache.commons.math3.optim.univariate.BrentOptimizer;
import org.apache.commons.math3.optim.univariate.SearchInterval;
import org.apache.commons.math3.optim.univariate.UnivariateObjectiveFunction;
import org.apache.commons.math3.optim.univariate.UnivariatePointValuePair;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialProperty;
import org.thermotile.model.materials.MaterialOverrides;
import org.thermotile.model.tile.TileSimulation;

/**
 * Calibration of material parameters against observed surface temperatures: a bounded
 * least-squares fit whose every evaluation runs thermotile's own kernel ({@link TileSimulation})
 * on a sample of pixels, and an uncertainty per parameter from the curvature at the optimum.
 *
 * <p><b>Objective.</b> S(p) = Σ_i Σ_k (T_sim,ik(p) − T_obs,ik)² [K²] over the sampled pixels i and
 * the observation hours k where the pixel has an observation. Each evaluation asks a
 * {@link Simulator} for the sampled pixels' temperatures under the candidate palette: normally
 * {@link PixelSimulation} over each pixel's own cells ({@link PixelCells}: their materials and urban
 * geometry, area-weighted as in the comparison), on the calling thread ({@link #local}) or as a
 * Spark job over partitions of pixels (in jobs/). {@link #fit(Material[], List, Observed, Forcing,
 * TileSimulation.Settings, int, long, int)} keeps the simplest form: each pixel one flat cell of its
 * dominant material.
 *
 * <p><b>Sampling.</b> Stratified random sampling by dominant material with equal allocation and
 * a fixed seed: from each material's pixels that carry at least one observation, up to
 * {@code perStratum} pixels are drawn without replacement (a partial Fisher–Yates shuffle driven by
 * {@link SplittableRandom}{@code (seed)}); strata are visited in palette order, so the sample is
 * deterministic.
 *
 * <p><b>Optimiser.</b> Parameters are mapped to u = (p − lo)/(hi − lo) ∈ [0, 1]; with two or more
 * parameters the fit is Powell's BOBYQA (Powell 2009, "The BOBYQA algorithm for bound constrained
 * optimization without derivatives", Cambridge DAMTP 2009/NA06; Commons Math 3.6.1
 * {@link BOBYQAOptimizer}, 2n + 1 interpolation points); with one parameter, Brent's bounded
 * minimisation (Brent 1973, Algorithms for Minimization without Derivatives, ch. 5). BOBYQA's trust
 * region starts at 0.1 and stops at 1e-4 of each bound range (an albedo to 1e-4: far finer than any
 * image constrains it), which keeps the evaluations to a few per parameter beyond the 2n + 1 of the
 * initial model.
 *
 * <p><b>Uncertainty (from the curvature).</b> The Jacobian J_ij = ∂r_i/∂p_j of the residuals
 * r = T_sim − T_obs is taken by central finite differences at the optimum (one-sided at a
 * bound), step 1e-3 of the bound range; the Gauss–Newton approximation of the covariance is
 * Cov = σ̂² (JᵀJ)⁻¹ with σ̂² = S/(m − n) (m residuals, n parameters), and the standard error
 * SE_j = √Cov_jj (Bates &amp; Watts 1988, Nonlinear Regression Analysis and Its Applications,
 * eq. 2.26–2.27, from memory). (JᵀJ)⁻¹ is the SVD pseudo-inverse with singular values below
 * 1e-10 of the largest treated as zero. A parameter is <em>not identifiable</em> when its column of
 * J is ~0 (norm below 1e-8 of the largest column's), when it lies in the null space of JᵀJ, or when
 * its approximate 95 % interval p̂ ± 1.96·SE (Wald, normal theory) is wider than its bound range:
 * the data then leave it anywhere within the bounds. The fitted point is the best evaluated (the
 * start included), so a fit never reports a higher RMSE than its start.
 */
public final class Calibration {
    private Calibration() {}

    /** Two-sided 95 % quantile of the standard normal distribution (Wald interval ± z·SE). */
    static final double Z95 = 1.959964;

    /** Keys a calibration may move, as in {@link MaterialOverrides}. */
    public static final List<String> KEYS = MaterialProperty.keys(MaterialProperty.SURFACE);

    /**
     * One free parameter: a property of one palette material, with its bounds.
     *
     * @param material index into the palette
     * @param key      one of {@link #KEYS}
     * @param lo       lower bound (units of the key: [–] or [W m⁻²])
     * @param hi       upper bound
     */
    public record Parameter(int material, String key, double lo, double hi) {
        public Parameter {
            Objects.requireNonNull(key, "key");
            if (!KEYS.contains(key)) {
                throw new IllegalArgumentException("calibration parameter '" + key + "' is not one of " + KEYS);
            }
            if (!(lo < hi)) {
                throw new IllegalArgumentException("calibration parameter '" + key + "': lower bound " + lo
                        + " must be below the upper bound " + hi);
            }
        }

        /**
         * A parameter with the valid range of its key in {@link MaterialProperty} (the ranges
         * {@link Material} enforces): albedo and moisture availability 0…1 [–], anthropogenic heat
         * 0…2000 W m⁻². Emissivity is searched from 0.5 (not from its valid lower end), below which no
         * surface of the library lies and the longwave balance is not that of a built or natural surface.
         */
        public static Parameter of(int material, String key) {
            MaterialProperty p = MaterialProperty.byKey(key).filter(MaterialProperty.SURFACE::contains)
                    .orElseThrow(() -> new IllegalArgumentException("calibration parameter '" + key
                            + "' is not one of " + KEYS));
            double lo = p == MaterialProperty.EMISSIVITY ? 0.5 : p.lo();
            return new Parameter(material, p.key(), lo, p.hi());
        }

        /** Current value of this parameter in {@code m}. */
        public double valueIn(Material m) {
            return MaterialProperty.byKey(key).orElseThrow().valueIn(m);
        }
    }

    /**
     * The observed pixels: per pixel its dominant material; per observation its forcing hour and the
     * observed surface temperature of each pixel [K] (NaN where none).
     *
     * @param dominant  per pixel, an index into the palette or {@link TileSimulation#NO_MATERIAL}
     * @param hours     time of each observation as a forcing hour index, fractional between hours
     *                  (the simulated temperature is then linear between the two hours, as in the
     *                  comparison)
     * @param observedK [observation][pixel] surface temperature [K], NaN where not observed
     */
    public record Observed(int[] dominant, double[] hours, double[][] observedK) {
        public Observed {
            if (hours.length != observedK.length || hours.length == 0) {
                throw new IllegalArgumentException("need one or more observations, each with its hour");
            }
            for (double[] o : observedK) {
                if (o.length != dominant.length) {
                    throw new IllegalArgumentException("every observation needs one value per pixel ("
                            + dominant.length + ")");
                }
            }
        }
    }

    /** Per parameter: start, fitted value, standard error and whether the data identify it. */
    public record Estimate(Parameter parameter, double start, double value, double standardError,
            boolean identifiable, String why) {}

    /**
     * The fit.
     *
     * @param palette     the calibrated materials (fitted values applied)
     * @param estimates   per parameter
     * @param sample      sampled pixel indices, in sample order
     * @param residuals   number of residuals m
     * @param rmseBeforeK RMSE of the sample with the starting palette [K]
     * @param rmseAfterK  RMSE of the sample with the calibrated palette [K]
     * @param biasBeforeK mean (sim − obs) before [K]
     * @param biasAfterK  mean (sim − obs) after [K]
     * @param evaluations kernel runs spent (fit and Jacobian)
     */
    public record Fit(Material[] palette, List<Estimate> estimates, int[] sample, int residuals,
            double rmseBeforeK, double rmseAfterK, double biasBeforeK, double biasAfterK, int evaluations) {}

    /**
     * Stratified random sample by dominant material, equal allocation, fixed seed (see the class
     * comment). Only pixels with a material and at least one observation are eligible.
     *
     * @return sampled pixel indices, strata in palette order
     */
    public static int[] stratifiedSample(Observed obs, int paletteSize, int perStratum, long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        List<Integer> out = new ArrayList<>();
        for (int m = 0; m < paletteSize; m++) {
            int[] pool = new int[obs.dominant().length];
            int n = 0;
            for (int p = 0; p < obs.dominant().length; p++) {
                if (obs.dominant()[p] == m && observedAnywhere(obs, p)) {
                    pool[n++] = p;
                }
            }
            int take = Math.min(perStratum, n);
            for (int i = 0; i < take; i++) {
                int j = i + rnd.nextInt(n - i);
                int t = pool[i];
                pool[i] = pool[j];
                pool[j] = t;
                out.add(pool[i]);
            }
        }
        return out.stream().mapToInt(Integer::intValue).toArray();
    }

    private static boolean observedAnywhere(Observed obs, int p) {
        for (double[] o : obs.observedK()) {
            if (!Double.isNaN(o[p])) {
                return true;
            }
        }
        return false;
    }

    /** The sampled pixels' simulated temperatures for a candidate palette. */
    @FunctionalInterface
    public interface Simulator {
        /** [sampled pixel][observation] simulated surface temperature [K] (NaN where none). */
        double[][] simulate(Material[] palette);
    }

    /** Told after each evaluation of the objective. */
    @FunctionalInterface
    public interface Progress {
        /**
         * @param evaluation 1, 2, … (fit and Jacobian alike)
         * @param rmseK      this evaluation's RMSE over the sample [K]
         * @param bestRmseK  the lowest RMSE so far [K]
         */
        void evaluated(int evaluation, double rmseK, double bestRmseK);

        /** Tells nothing. */
        Progress NONE = (n, r, b) -> {};
    }

    /** A simulator running {@code sim} over {@code pixels} on the calling thread. */
    public static Simulator local(PixelSimulation sim, List<PixelCells> pixels) {
        List<PixelCells> copy = List.copyOf(pixels);
        return palette -> sim.simulate(palette, copy);
    }

    /**
     * Fits {@code free} to the observations, each sampled pixel simulated as one flat cell of its
     * dominant material on the calling thread.
     *
     * @param palette    the starting materials (e.g. the library's values)
     * @param free       the parameters that may move (two need not share a material)
     * @param obs        observed pixels
     * @param forcing    the run's forcing
     * @param settings   the run's kernel settings (its hourly output hours are replaced by the
     *                   observation hours)
     * @param perStratum pixels per material in the sample
     * @param seed       sampling seed
     * @param maxEvaluations cap on kernel runs for the optimiser
     * @throws IllegalArgumentException when the optimiser does not converge within the cap (the
     *                                  message says to free fewer parameters)
     */
    public static Fit fit(Material[] palette, List<Parameter> free, Observed obs, Forcing forcing,
            TileSimulation.Settings settings, int perStratum, long seed, int maxEvaluations) {
        int[] sample = stratifiedSample(obs, palette.length, perStratum, seed);
        List<PixelCells> cells = new ArrayList<>();
        for (int p : sample) {
            cells.add(PixelCells.flat(obs.dominant()[p]));
        }
        PixelSimulation sim = new PixelSimulation(forcing, settings, obs.hours());
        return fit(palette, free, sample, observedOf(obs, sample), local(sim, cells), maxEvaluations, Progress.NONE);
    }

    /** [observation][sampled pixel] observed [K] of {@code sample}. */
    public static double[][] observedOf(Observed obs, int[] sample) {
        double[][] o = new double[obs.hours().length][sample.length];
        for (int k = 0; k < o.length; k++) {
            for (int i = 0; i < sample.length; i++) {
                o[k][i] = obs.observedK()[k][sample[i]];
            }
        }
        return o;
    }

    /**
     * Fits {@code free} to the sampled pixels' observations.
     *
     * @param palette        the starting materials
     * @param free           the parameters that may move
     * @param sample         the sampled pixels' indices (reported in the fit)
     * @param observedK      [observation][sampled pixel] observed [K], NaN where not observed
     * @param simulator      the sampled pixels' temperatures for a palette, in the same order
     * @param maxEvaluations cap on evaluations for the optimiser
     * @param progress       told after each evaluation
     * @throws IllegalArgumentException when nothing is free, the sample has no observation, or the
     *                                  optimiser does not converge within the cap
     */
    public static Fit fit(Material[] palette, List<Parameter> free, int[] sample, double[][] observedK,
            Simulator simulator, int maxEvaluations, Progress progress) {
        if (free.isEmpty()) {
            throw new IllegalArgumentException("choose at least one parameter to calibrate");
        }
        Problem pr = new Problem(palette, free, observedK, simulator, sample, progress);
        int n = free.size();
        double[] u0 = new double[n];
        double[] start = new double[n];
        for (int j = 0; j < n; j++) {
            Parameter p = free.get(j);
            start[j] = p.valueIn(palette[p.material()]);
            u0[j] = clamp01((start[j] - p.lo()) / (p.hi() - p.lo()));
        }
        double[] r0 = pr.residuals(u0);
        double[] uBest;
        try {
            uBest = optimise(pr, u0, maxEvaluations);
        } catch (org.apache.commons.math3.exception.TooManyEvaluationsException e) {
            throw new IllegalArgumentException("the fit of " + n + " parameters did not converge within "
                    + maxEvaluations + " kernel runs; calibrate fewer parameters (keys or materials) at once");
        }
        // The best point evaluated, the start included: BOBYQA may shift a start lying within its
        // initial trust radius of a bound, and its last point need not be the best seen.
        if (pr.bestU != null && pr.bestSum < sumSquares(pr.residualsSeen(uBest))) {
            uBest = pr.bestU.clone();
        }
        return finish(pr, free, start, r0, uBest);
    }

    private static double[] optimise(Problem pr, double[] u0, int maxEvaluations) {
        int n = u0.length;
        double[] uBest;
        if (n == 1) {
            UnivariateFunction f = x -> sumSquares(pr.residuals(new double[] {x}));
            UnivariatePointValuePair best = new BrentOptimizer(1e-8, 1e-10).optimize(new MaxEval(maxEvaluations),
                    new UnivariateObjectiveFunction(f), GoalType.MINIMIZE, new SearchInterval(0, 1, u0[0]));
            uBest = new double[] {best.getPoint()};
        } else {
            MultivariateFunction f = u -> sumSquares(pr.residuals(u));
            double[] lower = new double[n];
            double[] upper = new double[n];
            Arrays.fill(upper, 1.0);
            // Start the trust region at 0.1 of the bound range, stop at 1e-4 of it.
            PointValuePair best = new BOBYQAOptimizer(2 * n + 1, 0.1, 1e-4).optimize(new MaxEval(maxEvaluations),
                    new ObjectiveFunction(f), GoalType.MINIMIZE, new InitialGuess(u0), new SimpleBounds(lower, upper));
            uBest = best.getPoint();
        }
        return uBest;
    }

    private static Fit finish(Problem pr, List<Parameter> free, double[] start, double[] r0, double[] uBest) {
        int n = uBest.length;
        double[] r = pr.residuals(uBest);
        int m = r.length;
        // Jacobian in the parameters' own units, central differences (one-sided at a bound).
        double[][] jac = new double[m][n];
        for (int j = 0; j < n; j++) {
            double h = 1e-3;
            double up = Math.min(1.0, uBest[j] + h);
            double dn = Math.max(0.0, uBest[j] - h);
            double[] uu = uBest.clone();
            uu[j] = up;
            double[] ru = pr.residuals(uu);
            uu[j] = dn;
            double[] rd = pr.residuals(uu);
            double dp = (up - dn) * (free.get(j).hi() - free.get(j).lo());
            for (int i = 0; i < m; i++) {
                jac[i][j] = (ru[i] - rd[i]) / dp;
            }
        }
        double s = sumSquares(r);
        double sigma2 = m > n ? s / (m - n) : Double.NaN;
        List<Estimate> est = uncertainty(free, start, pr.values(uBest), jac, sigma2);
        return new Fit(pr.palette(uBest), est, pr.sample, m, Math.sqrt(sumSquares(r0) / m), Math.sqrt(s / m),
                mean(r0), mean(r), pr.evaluations);
    }

    /**
     * Standard errors SE_j = √(σ̂² [(JᵀJ)⁺]_jj) and the identifiability verdicts (class comment).
     *
     * @param jac    J [residual][parameter], in K per parameter unit
     * @param sigma2 σ̂² [K²]
     */
    static List<Estimate> uncertainty(List<Parameter> free, double[] start, double[] value, double[][] jac,
            double sigma2) {
        int n = free.size();
        RealMatrix j = new Array2DRowRealMatrix(jac, false);
        RealMatrix jtj = j.transpose().multiply(j);
        double[] colNorm = new double[n];
        double maxCol = 0;
        for (int c = 0; c < n; c++) {
            colNorm[c] = j.getColumnVector(c).getNorm() * (free.get(c).hi() - free.get(c).lo());
            maxCol = Math.max(maxCol, colNorm[c]);
        }
        SingularValueDecomposition svd = new SingularValueDecomposition(jtj);
        double[] sv = svd.getSingularValues();
        double tol = 1e-10 * (sv.length == 0 ? 0 : sv[0]);
        RealMatrix v = svd.getV();
        double[][] pinv = new double[n][n];
        // null-space weight of each parameter: Σ over zero singular values of V_ck².
        double[] nullWeight = new double[n];
        for (int k = 0; k < n; k++) {
            boolean zero = !(sv[k] > tol);
            for (int a = 0; a < n; a++) {
                if (zero) {
                    nullWeight[a] += v.getEntry(a, k) * v.getEntry(a, k);
                    continue;
                }
                for (int b = 0; b < n; b++) {
                    pinv[a][b] += v.getEntry(a, k) * v.getEntry(b, k) / sv[k];
                }
            }
        }
        List<Estimate> out = new ArrayList<>();
        for (int c = 0; c < n; c++) {
            Parameter p = free.get(c);
            double range = p.hi() - p.lo();
            double se = Math.sqrt(sigma2 * pinv[c][c]);
            String why = "";
            if (!(colNorm[c] > 1e-8 * maxCol) || maxCol == 0) {
                why = "the observations do not respond to it (its Jacobian column is ~0)";
                se = Double.POSITIVE_INFINITY;
            } else if (nullWeight[c] > 1e-6) {
                why = "the observations constrain it only together with other parameters (JᵀJ is singular)";
                se = Double.POSITIVE_INFINITY;
            } else if (!(2 * Z95 * se <= range)) {
                why = String.format(java.util.Locale.ROOT, "its approximate 95 %% interval (± %.3g) is wider than "
                        + "its bound range %.3g", Z95 * se, range);
            }
            out.add(new Estimate(p, start[c], value[c], se, why.isEmpty(), why));
        }
        return out;
    }

    private static double clamp01(double x) {
        return Math.max(0.0, Math.min(1.0, x));
    }

    private static double sumSquares(double[] r) {
        double s = 0;
        for (double x : r) {
            s += x * x;
        }
        return s;
    }

    private static double mean(double[] r) {
        double s = 0;
        for (double x : r) {
            s += x;
        }
        return r.length == 0 ? Double.NaN : s / r.length;
    }

    /** The sample's observed values, and one simulation per candidate. */
    private static final class Problem {
        private final Material[] base;
        private final List<Parameter> free;
        private final Simulator simulator;
        private final Progress progress;
        /** [observation][sampled pixel] observed [K]. */
        private final double[][] observed;
        private final int residuals;
        final int[] sample;
        int evaluations;
        double best = Double.POSITIVE_INFINITY;
        double bestSum = Double.POSITIVE_INFINITY;
        double[] bestU;
        private double[] lastU;
        private double[] lastR;

        /** Residuals at {@code u}, reusing the last evaluation when it was at {@code u}. */
        double[] residualsSeen(double[] u) {
            return lastU != null && Arrays.equals(lastU, u) ? lastR : residuals(u);
        }

        Problem(Material[] base, List<Parameter> free, double[][] observedK, Simulator simulator, int[] sample,
                Progress progress) {
            this.base = base.clone();
            this.free = List.copyOf(free);
            this.simulator = simulator;
            this.progress = progress;
            for (Parameter p : free) {
                if (p.material() < 0 || p.material() >= base.length) {
                    throw new IllegalArgumentException("calibration parameter " + p.key() + " names material "
                            + p.material() + ", outside the palette of " + base.length);
                }
            }
            if (observedK.length == 0) {
                throw new IllegalArgumentException("need one or more observations");
            }
            this.sample = sample.clone();
            observed = new double[observedK.length][];
            int m = 0;
            for (int k = 0; k < observedK.length; k++) {
                if (observedK[k].length != sample.length) {
                    throw new IllegalArgumentException("every observation needs one value per sampled pixel ("
                            + sample.length + ")");
                }
                observed[k] = observedK[k].clone();
                for (double v : observed[k]) {
                    if (!Double.isNaN(v)) {
                        m++;
                    }
                }
            }
            if (m == 0) {
                throw new IllegalArgumentException("the sample has no observed pixel with a material");
            }
            residuals = m;
        }

        double[] values(double[] u) {
            double[] v = new double[u.length];
            for (int j = 0; j < u.length; j++) {
                Parameter p = free.get(j);
                v[j] = p.lo() + clamp01(u[j]) * (p.hi() - p.lo());
            }
            return v;
        }

        Material[] palette(double[] u) {
            Material[] pal = base.clone();
            double[] v = values(u);
            for (int j = 0; j < v.length; j++) {
                Parameter p = free.get(j);
                pal[p.material()] = MaterialOverrides.apply(pal[p.material()], p.key(), v[j], "calibration");
            }
            return pal;
        }

        double[] residuals(double[] u) {
            evaluations++;
            double[][] sim = simulator.simulate(palette(u));
            if (sim.length != sample.length) {
                throw new IllegalStateException("simulator gave " + sim.length + " pixels for a sample of "
                        + sample.length);
            }
            double[] r = new double[residuals];
            int i = 0;
            for (int c = 0; c < sample.length; c++) {
                for (int k = 0; k < observed.length; k++) {
                    if (!Double.isNaN(observed[k][c])) {
                        // A sampled pixel has a dominant material, so its simulated value is a number.
                        r[i++] = sim[c][k] - observed[k][c];
                    }
                }
            }
            double ss = sumSquares(r);
            double rmse = Math.sqrt(ss / r.length);
            best = Math.min(best, rmse);
            if (ss < bestSum) {
                bestSum = ss;
                bestU = u.clone();
            }
            lastU = u.clone();
            lastR = r;
            progress.evaluated(evaluations, rmse, best);
            return r;
        }
    }
}
