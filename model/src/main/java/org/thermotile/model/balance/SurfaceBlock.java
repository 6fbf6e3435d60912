package org.thermotile.model.balance;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.thermotile.model.materials.Material;

/**
 * A block of cells (one tile, or one surface) as a struct of arrays: one primitive array per
 * property and per state variable, never one object per cell.
 *
 * <p>Each cell owns a run of conduction nodes {@code [nodeStart[c], nodeStart[c] + nodeCount[c])}
 * in the packed node arrays, node 0 of the run being the surface. Cells of the same construction
 * share a {@link ColumnGrid} while the block is built; the packed arrays are then independent.
 * Built by {@link Builder}; the kernel ({@link BalanceKernel}) mutates only the state arrays.
 */
public final class SurfaceBlock {
    public final int cells;

    // Per-cell properties.
    /** Solar absorptance 1 − α. */
    final double[] absorptance;
    /** Thermal emissivity ε. */
    final double[] emissivity;
    /** Moisture availability β. */
    final double[] moisture;
    /** Anthropogenic heat Q_F [W m⁻²]. */
    final double[] anthropogenicWm2;
    /** Bottom-boundary temperature [K] (deep ground or indoor air). */
    final double[] bottomTempK;
    /** Whether the bottom boundary is held at a temperature (else adiabatic). */
    final boolean[] bottomFixed;
    final int[] nodeStart;
    final int[] nodeCount;

    // Per-node properties.
    final double[] capacityJm2K;
    final double[] conductanceDownWm2K;
    final double[] depthM;

    // Per-node coefficients of the implicit step, set by prepare(dt).
    double dtSeconds = Double.NaN;
    final double[] capOverDt;
    final double[] invDen;
    final double[] coupleUp;
    /** Per-cell constant part of the surface equation's slope, C₀/Δt + K₀₁(1 − Q₁). */
    final double[] surfaceSlope;
    /** Scratch: the eliminated right-hand sides P_j. */
    final double[] scratchP;

    // State.
    /** Node temperatures [K]. */
    final double[] tempK;

    // Energy accounting per cell.
    /** Σ (surface flux − bottom flux)·Δt into the column [J m⁻²]. */
    final double[] energyInJm2;
    /** Σ of the magnitudes of every flux term·Δt [J m⁻²]. */
    final double[] energyGrossJm2;
    /** Column heat content Σ C_j T_j at the start of accounting [J m⁻²]. */
    final double[] heatContentStartJm2;

    // Urban geometry (null when the block has none: then the kernel's radiation is unscaled).
    /** Sky view factor Ψ per cell [–], or null. */
    double[] skyViewFactor;
    /** Beam factor per cell at the start and at the end of the current hour [–] (0 shade … 1 sun). */
    double[] beamFactorStart;
    double[] beamFactorEnd;
    /** Wall emissivity ε_w of the wall longwave term [–]. */
    double wallEmissivity;

    // Per-cell fluxes of the latest sub-step, or the hour's means when recording [W m⁻²].
    final boolean recordFluxes;
    final double[][] flux;

    SurfaceBlock(int cells, int totalNodes, boolean recordFluxes) {
        this.cells = cells;
        absorptance = new double[cells];
        emissivity = new double[cells];
        moisture = new double[cells];
        anthropogenicWm2 = new double[cells];
        bottomTempK = new double[cells];
        bottomFixed = new boolean[cells];
        nodeStart = new int[cells];
        nodeCount = new int[cells];
        capacityJm2K = new double[totalNodes];
        conductanceDownWm2K = new double[totalNodes];
        depthM = new double[totalNodes];
        capOverDt = new double[totalNodes];
        invDen = new double[totalNodes];
        coupleUp = new double[totalNodes];
        surfaceSlope = new double[cells];
        scratchP = new double[totalNodes];
        tempK = new double[totalNodes];
        energyInJm2 = new double[cells];
        energyGrossJm2 = new double[cells];
        heatContentStartJm2 = new double[cells];
        this.recordFluxes = recordFluxes;
        flux = recordFluxes ? new double[Flux.COUNT][cells] : null;
    }

    /** The flux terms recorded per cell when a block is built with flux recording on. */
    public enum Flux {
        /** Absorbed shortwave (1 − α)K↓. */
        NET_SHORTWAVE,
        /** Absorbed sky longwave ε L↓. */
        ABSORBED_SKY_LONGWAVE,
        /** Emitted longwave ε σ T_s⁴. */
        EMITTED_LONGWAVE,
        /** Sensible heat to the air H. */
        SENSIBLE,
        /** Latent heat to the air LE. */
        LATENT,
        /** Anthropogenic heat Q_F. */
        ANTHROPOGENIC,
        /**
         * Conduction into the construction through its top face, G = ΔQ_S + bottom [W m⁻²]: the
         * surface node's heat capacity belongs to the construction, so the surface balance is
         * Q* + Q_F − H − LE − G = residual.
         */
        CONDUCTION,
        /** Rate of change of the construction's heat content ΔQ_S = Σ_j C_j dT_j/dt, surface node included. */
        STORAGE,
        /** Heat leaving the construction through its bottom boundary (0 when adiabatic). */
        BOTTOM,
        /** Closure residual: Q* + Q_F − H − LE − ΔQ_S − bottom. */
        RESIDUAL;
        public static final int COUNT = values().length;
    }

    /** Number of conduction nodes of cell {@code c}. */
    public int nodes(int c) {
        return nodeCount[c];
    }

    /** Surface temperature of cell {@code c} [K]. */
    public double surfaceTempK(int c) {
        return tempK[nodeStart[c]];
    }

    /** Temperature of node {@code j} (0 = surface) of cell {@code c} [K]. */
    public double nodeTempK(int c, int j) {
        return tempK[nodeStart[c] + j];
    }

    /** Depth of node {@code j} of cell {@code c} [m]. */
    public double nodeDepthM(int c, int j) {
        return depthM[nodeStart[c] + j];
    }

    /** A recorded flux of cell {@code c} [W m⁻²] (the hour's mean after each hour). */
    public double flux(Flux f, int c) {
        if (!recordFluxes) {
            throw new IllegalStateException("this block was built without flux recording");
        }
        return flux[f.ordinal()][c];
    }

    /** Column heat content Σ C_j T_j of cell {@code c} [J m⁻²]. */
    public double heatContentJm2(int c) {
        double s = 0;
        for (int i = nodeStart[c], e = i + nodeCount[c]; i < e; i++) {
            s += capacityJm2K[i] * tempK[i];
        }
        return s;
    }

    /**
     * Energy-closure residual of cell {@code c} since {@link #initialise}: (energy in through the
     * surface and bottom) − (change of heat content), as a fraction of the gross energy moved by
     * every flux term. Zero for an exact implicit solve.
     */
    public double closureResidualFraction(int c) {
        double gross = energyGrossJm2[c];
        if (gross == 0) {
            return 0;
        }
        return (energyInJm2[c] - (heatContentJm2(c) - heatContentStartJm2[c])) / gross;
    }

    /**
     * Turns on urban geometry for this block: from now on the kernel scales each cell's radiation
     * as in {@link org.thermotile.model.geometry.GeometryFactors} (beam by the beam factor, diffuse
     * and sky longwave by Ψ, wall longwave at the air temperature filling 1 − Ψ). Beam factors
     * start at 1 (sunlit) until {@link #beamFactors} sets them.
     *
     * @param skyViewFactor  Ψ per cell [–], 0…1 (copied)
     * @param wallEmissivity ε_w [–], 0…1
     */
    public void useGeometry(double[] skyViewFactor, double wallEmissivity) {
        checkPerCell("sky view factors", skyViewFactor);
        if (!(wallEmissivity >= 0 && wallEmissivity <= 1)) {
            throw new IllegalArgumentException("wall emissivity " + wallEmissivity + ": must be 0…1");
        }
        this.skyViewFactor = skyViewFactor.clone();
        this.wallEmissivity = wallEmissivity;
        beamFactorStart = new double[cells];
        beamFactorEnd = new double[cells];
        java.util.Arrays.fill(beamFactorStart, 1.0);
        java.util.Arrays.fill(beamFactorEnd, 1.0);
    }

    /** True once {@link #useGeometry} was called. */
    public boolean hasGeometry() {
        return skyViewFactor != null;
    }

    /**
     * Sets the beam factors [–] at the start and at the end of the next hour to be stepped; the
     * kernel interpolates linearly between them at each sub-step's end time, as it does the
     * beam irradiance (copied; no allocation).
     */
    public void beamFactors(double[] atHourStart, double[] atHourEnd) {
        if (!hasGeometry()) {
            throw new IllegalStateException("this block has no geometry: call useGeometry first");
        }
        checkPerCell("beam factors at the hour's start", atHourStart);
        checkPerCell("beam factors at the hour's end", atHourEnd);
        System.arraycopy(atHourStart, 0, beamFactorStart, 0, cells);
        System.arraycopy(atHourEnd, 0, beamFactorEnd, 0, cells);
    }

    /** Sky view factor Ψ of cell {@code c} [–] (1 without geometry). */
    public double skyViewFactor(int c) {
        return skyViewFactor == null ? 1.0 : skyViewFactor[c];
    }

    private void checkPerCell(String what, double[] v) {
        if (v.length != cells) {
            throw new IllegalArgumentException(what + ": " + v.length + " values for " + cells + " cells");
        }
        for (int c = 0; c < cells; c++) {
            if (!(v[c] >= 0 && v[c] <= 1)) {
                throw new IllegalArgumentException(what + " of cell " + c + " is " + v[c] + ": must be 0…1");
            }
        }
    }

    /** Sets the implicit-step coefficients for sub-step {@code dt} [s]; the grids do not change. */
    public void prepare(double dt) {
        if (!(dt > 0)) {
            throw new IllegalArgumentException("sub-step must be > 0 s");
        }
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

    /**
     * Sets every node's temperature: the surface at {@code surfaceTempK}, the rest linearly
     * towards the bottom temperature with depth (uniform when the bottom is adiabatic), and starts
     * energy accounting.
     */
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

    /** Builds a block cell by cell. */
    public static final class Builder {
        private final int cells;
        private final boolean recordFluxes;
        private final Material[] material;
        private final ColumnGrid[] grid;
        private final double[] bottomTemp;
        private final Map<List<Object>, ColumnGrid> grids = new HashMap<>();
        private final double firstSegmentM;
        private final double growth;

        /** A builder with the default conduction grid spacing. */
        public Builder(int cells, boolean recordFluxes) {
            this(cells, recordFluxes, ColumnGrid.DEFAULT_FIRST_SEGMENT_M, ColumnGrid.DEFAULT_GROWTH);
        }

        /** A builder with a given conduction grid spacing (see {@link ColumnGrid#of(Material, double, double)}). */
        public Builder(int cells, boolean recordFluxes, double firstSegmentM, double growth) {
            if (cells <= 0) {
                throw new IllegalArgumentException("a block needs at least one cell");
            }
            this.cells = cells;
            this.recordFluxes = recordFluxes;
            this.material = new Material[cells];
            this.grid = new ColumnGrid[cells];
            this.bottomTemp = new double[cells];
            this.firstSegmentM = firstSegmentM;
            this.growth = growth;
        }

        /**
         * Sets cell {@code c}'s material; {@code defaultBottomTempK} is used when the material's
         * bottom temperature is NaN (deep ground at the run's default).
         */
        public Builder cell(int c, Material m, double defaultBottomTempK) {
            material[c] = m;
            grid[c] = grids.computeIfAbsent(List.of(m.layers(), m.bottom(), m.slabHeatCapacityJm2K()),
                    k -> ColumnGrid.of(m, firstSegmentM, growth));
            double t = m.bottom().temperatureK();
            // An adiabatic bottom has no temperature; 0 keeps the kernel's 0·T_b term finite.
            bottomTemp[c] = !grid[c].bottomFixed ? 0.0 : Double.isNaN(t) ? defaultBottomTempK : t;
            return this;
        }

        public SurfaceBlock build() {
            int total = 0;
            for (int c = 0; c < cells; c++) {
                if (material[c] == null) {
                    throw new IllegalStateException("cell " + c + " has no material");
                }
                total += grid[c].nodes();
            }
            SurfaceBlock b = new SurfaceBlock(cells, total, recordFluxes);
            int at = 0;
            for (int c = 0; c < cells; c++) {
                Material m = material[c];
                ColumnGrid g = grid[c];
                b.absorptance[c] = 1.0 - m.albedo();
                b.emissivity[c] = m.emissivity();
                b.moisture[c] = m.moistureAvailability();
                b.anthropogenicWm2[c] = m.anthropogenicHeatWm2();
                b.bottomTempK[c] = bottomTemp[c];
                b.bottomFixed[c] = g.bottomFixed;
                if (g.bottomFixed && !Double.isFinite(bottomTemp[c])) {
                    throw new IllegalArgumentException("material '" + m.id()
                            + "' needs a bottom temperature and no default was given");
                }
                b.nodeStart[c] = at;
                b.nodeCount[c] = g.nodes();
                System.arraycopy(g.capacityJm2K, 0, b.capacityJm2K, at, g.nodes());
                System.arraycopy(g.conductanceDownWm2K, 0, b.conductanceDownWm2K, at, g.nodes());
                System.arraycopy(g.depthM, 0, b.depthM, at, g.nodes());
                at += g.nodes();
            }
            return b;
        }
    }

}
