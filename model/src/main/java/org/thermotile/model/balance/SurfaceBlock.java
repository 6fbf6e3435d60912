package org.thermotile.model.balance;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;
import org.thermotile.model.materials.Material;

/**
 * A block of cells (one tile, or one surface) as a struct of arrays: one primitive array per
 * property and per state variable, never one object per cell.
 *
 * <p>Layout. Cells of the same construction (one {@link ColumnGrid}: same layers, bottom and
 * spacing) form a <em>group</em>; the groups are numbered in order of their first cell, and
 * inside the block every cell has a <em>slot</em>: the slots of a group are contiguous, its cells
 * in ascending cell order. Per-cell arrays are indexed by slot. A group of {@code m} cells and
 * {@code n} nodes owns {@code n} node rows of {@code m} entries each, stored node-major: node
 * {@code k} of the group's {@code i}-th cell is {@code tempRows[g][k][i]}. Each row is an array of
 * its own, so a Thomas sweep of {@link BalanceKernel}, which writes one row from the row beside it,
 * reads and writes different arrays: the JIT then knows they do not overlap and compiles the loop
 * across the group's cells to vector instructions (with the rows at offsets of one array it does
 * not). The nodes' heat capacities, conductances and implicit-step coefficients are the group's,
 * once per node. Public accessors take cell indices, as the builder does.
 * Built by {@link Builder}; the kernel mutates only the state arrays.
 */
public final class SurfaceBlock {
    public final int cells;

    // Cells and slots.
    /** Slot of each cell. */
    final int[] slotOfCell;
    /** Cell of each slot. */
    final int[] cellOfSlot;
    /** True when every cell is its own slot (one group, or groups already in cell order). */
    final boolean identityOrder;
    /** Index of each cell inside its group's node rows (by cell): slot − first slot of the group. */
    final int[] indexInGroup;
    /** Group of each cell (by cell). */
    final int[] groupOfCell;

    // Groups: cells of one construction.
    final int groups;
    /** First slot of each group, and {@code groupSlotStart[groups] == cells}. */
    final int[] groupSlotStart;
    /** Nodes per cell of each group. */
    final int[] groupNodes;
    /** Whether each group's bottom boundary is held at a temperature (else adiabatic). */
    final boolean[] groupBottomFixed;
    /** Per group and node: heat capacity [J m⁻² K⁻¹], conductance down [W m⁻² K⁻¹], depth [m]. */
    final double[][] capacityJm2K;
    final double[][] conductanceDownWm2K;
    final double[][] depthM;

    // Per group and node, the implicit-step coefficients, set by prepare(dt).
    double dtSeconds = Double.NaN;
    final double[][] capOverDt;
    final double[][] invDen;
    final double[][] coupleUp;
    /** Per group, the constant part of the surface equation's slope, C₀/Δt + K₀₁(1 − Q₁). */
    final double[] surfaceSlope;

    // Per-cell properties (by slot).
    /** Solar absorptance 1 − α. */
    final double[] absorptance;
    /** Thermal emissivity ε. */
    final double[] emissivity;
    /** Moisture availability β. */
    final double[] moisture;
    /** Anthropogenic heat Q_F [W m⁻²]. */
    final double[] anthropogenicWm2;
    /** Bottom-boundary temperature [K] (deep ground or indoor air; 0 when adiabatic). */
    final double[] bottomTempK;

    // Node state and scratch: per group, one row per node, one entry per cell of the group.
    /** Node temperatures [K], {@code [group][node][index in group]}. */
    final double[][][] tempRows;
    /** Scratch: the eliminated right-hand sides P_j, laid out as {@link #tempRows}. */
    final double[][][] scratchRows;
    /** Scratch per slot between the kernel's passes: surface temperature before the step [K]. */
    final double[] scratchT0;
    /** Scratch per slot: net surface flux Q* + Q_F − H − LE [W m⁻²]. */
    final double[] scratchNet;
    /** Scratch per slot: Σ |flux| of the surface terms [W m⁻²]. */
    final double[] scratchGross;
    /** Scratch of the surface solve (one chunk of slots). */
    final SurfaceScratch surfaceScratch = new SurfaceScratch();

    // Energy accounting per cell (by slot).
    /** Σ (surface flux − bottom flux)·Δt into the column [J m⁻²]. */
    final double[] energyInJm2;
    /** Σ of the magnitudes of every flux term·Δt [J m⁻²]. */
    final double[] energyGrossJm2;
    /** Column heat content Σ C_j T_j at the start of accounting [J m⁻²]. */
    final double[] heatContentStartJm2;

    // Urban geometry (null when the block has none: then the kernel's radiation is unscaled).
    /** Sky view factor Ψ per slot [–], or null. */
    double[] skyViewFactor;
    /** Beam factor per slot at the start and at the end of the current hour [–] (0 shade … 1 sun). */
    double[] beamFactorStart;
    double[] beamFactorEnd;
    /** Wall emissivity ε_w of the wall longwave term [–]. */
    double wallEmissivity;

    // Per-slot fluxes of the latest sub-step, or the hour's means when recording [W m⁻²].
    final boolean recordFluxes;
    final double[][] flux;

    private SurfaceBlock(int cells, ColumnGrid[] gridOfGroup, int[] groupOfCell, boolean recordFluxes) {
        this.cells = cells;
        this.groups = gridOfGroup.length;
        this.groupOfCell = groupOfCell;
        groupSlotStart = new int[groups + 1];
        for (int c = 0; c < cells; c++) {
            groupSlotStart[groupOfCell[c] + 1]++;
        }
        for (int g = 0; g < groups; g++) {
            groupSlotStart[g + 1] += groupSlotStart[g];
        }
        groupNodes = new int[groups];
        groupBottomFixed = new boolean[groups];
        capacityJm2K = new double[groups][];
        conductanceDownWm2K = new double[groups][];
        depthM = new double[groups][];
        capOverDt = new double[groups][];
        invDen = new double[groups][];
        coupleUp = new double[groups][];
        surfaceSlope = new double[groups];
        tempRows = new double[groups][][];
        scratchRows = new double[groups][][];
        for (int g = 0; g < groups; g++) {
            ColumnGrid grid = gridOfGroup[g];
            int n = grid.nodes();
            int m = groupSlotStart[g + 1] - groupSlotStart[g];
            tempRows[g] = new double[n][m];
            scratchRows[g] = new double[n][m];
            groupNodes[g] = n;
            groupBottomFixed[g] = grid.bottomFixed;
            capacityJm2K[g] = grid.capacityJm2K.clone();
            conductanceDownWm2K[g] = grid.conductanceDownWm2K.clone();
            depthM[g] = grid.depthM.clone();
            capOverDt[g] = new double[n];
            invDen[g] = new double[n];
            coupleUp[g] = new double[n];
        }
        slotOfCell = new int[cells];
        cellOfSlot = new int[cells];
        indexInGroup = new int[cells];
        int[] next = Arrays.copyOf(groupSlotStart, groups);
        boolean identity = true;
        for (int c = 0; c < cells; c++) {
            int g = groupOfCell[c];
            int slot = next[g]++;
            slotOfCell[c] = slot;
            cellOfSlot[slot] = c;
            indexInGroup[c] = slot - groupSlotStart[g];
            identity &= slot == c;
        }
        identityOrder = identity;
        absorptance = new double[cells];
        emissivity = new double[cells];
        moisture = new double[cells];
        anthropogenicWm2 = new double[cells];
        bottomTempK = new double[cells];
        scratchT0 = new double[cells];
        scratchNet = new double[cells];
        scratchGross = new double[cells];
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
        return groupNodes[groupOfCell[c]];
    }

    /** Surface temperature of cell {@code c} [K]. */
    public double surfaceTempK(int c) {
        return tempRows[groupOfCell[c]][0][indexInGroup[c]];
    }

    /** Temperature of node {@code j} (0 = surface) of cell {@code c} [K]. */
    public double nodeTempK(int c, int j) {
        return tempRows[groupOfCell[c]][j][indexInGroup[c]];
    }

    /** Depth of node {@code j} of cell {@code c} [m]. */
    public double nodeDepthM(int c, int j) {
        return depthM[groupOfCell[c]][j];
    }

    /** A recorded flux of cell {@code c} [W m⁻²] (the hour's mean after each hour). */
    public double flux(Flux f, int c) {
        if (!recordFluxes) {
            throw new IllegalStateException("this block was built without flux recording");
        }
        return flux[f.ordinal()][slotOfCell[c]];
    }

    /** Column heat content Σ C_j T_j of cell {@code c} [J m⁻²] (summed from the surface down). */
    public double heatContentJm2(int c) {
        int g = groupOfCell[c];
        double[] cap = capacityJm2K[g];
        double[][] rows = tempRows[g];
        int i = indexInGroup[c];
        double s = 0;
        for (int j = 0; j < cap.length; j++) {
            s += cap[j] * rows[j][i];
        }
        return s;
    }

    /**
     * Energy-closure residual of cell {@code c} since {@link #initialise}: (energy in through the
     * surface and bottom) − (change of heat content), as a fraction of the gross energy moved by
     * every flux term. Zero for an exact implicit solve.
     */
    public double closureResidualFraction(int c) {
        int slot = slotOfCell[c];
        double gross = energyGrossJm2[slot];
        if (gross == 0) {
            return 0;
        }
        return (energyInJm2[slot] - (heatContentJm2(c) - heatContentStartJm2[slot])) / gross;
    }

    /** Cells of group {@code g}. */
    int groupCells(int g) {
        return groupSlotStart[g + 1] - groupSlotStart[g];
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
        this.skyViewFactor = new double[cells];
        toSlots(skyViewFactor, this.skyViewFactor);
        this.wallEmissivity = wallEmissivity;
        beamFactorStart = new double[cells];
        beamFactorEnd = new double[cells];
        Arrays.fill(beamFactorStart, 1.0);
        Arrays.fill(beamFactorEnd, 1.0);
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
        toSlots(atHourStart, beamFactorStart);
        toSlots(atHourEnd, beamFactorEnd);
    }

    /** Sky view factor Ψ of cell {@code c} [–] (1 without geometry). */
    public double skyViewFactor(int c) {
        return skyViewFactor == null ? 1.0 : skyViewFactor[slotOfCell[c]];
    }

    /** Copies per-cell values into slot order. */
    private void toSlots(double[] byCell, double[] bySlot) {
        if (identityOrder) {
            System.arraycopy(byCell, 0, bySlot, 0, cells);
        } else {
            for (int s = 0; s < cells; s++) {
                bySlot[s] = byCell[cellOfSlot[s]];
            }
        }
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

    /**
     * Sets the implicit-step coefficients for sub-step {@code dt} [s]; the grids do not change.
     * Per node j ≥ 1, bottom-up: den_j = C_j/Δt + K_{j−1} + K_j − K_j Q_{j+1}, Q_j = K_{j−1}/den_j
     * (the Thomas algorithm run in reverse; Patankar 1980, §4.2).
     */
    public void prepare(double dt) {
        if (!(dt > 0)) {
            throw new IllegalArgumentException("sub-step must be > 0 s");
        }
        dtSeconds = dt;
        for (int g = 0; g < groups; g++) {
            double[] cap = capacityJm2K[g];
            double[] cond = conductanceDownWm2K[g];
            double[] cdt = capOverDt[g];
            int n = groupNodes[g];
            double qNext = 0;
            for (int j = n - 1; j >= 0; j--) {
                cdt[j] = cap[j] / dt;
                double down = cond[j];
                if (j > 0) {
                    double up = cond[j - 1];
                    double inv = 1.0 / (cdt[j] + up + down - down * qNext);
                    invDen[g][j] = inv;
                    coupleUp[g][j] = up * inv;
                    qNext = coupleUp[g][j];
                } else {
                    surfaceSlope[g] = cdt[j] + down * (1.0 - qNext);
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
            int g = groupOfCell[c];
            int slot = slotOfCell[c];
            int n = groupNodes[g];
            double[][] rows = tempRows[g];
            int i = indexInGroup[c];
            double[] depth = depthM[g];
            double bottomDepth = depth[n - 1];
            boolean fixed = groupBottomFixed[g];
            for (int j = 0; j < n; j++) {
                double f = (fixed && bottomDepth > 0) ? depth[j] / bottomDepth : 0;
                rows[j][i] = surfaceTempK + f * (bottomTempK[slot] - surfaceTempK);
            }
            energyInJm2[slot] = 0;
            energyGrossJm2[slot] = 0;
            heatContentStartJm2[slot] = heatContentJm2(c);
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
        private final ColumnSpacing spacing;

        /** A builder with the standard conduction grid spacing. */
        public Builder(int cells, boolean recordFluxes) {
            this(cells, recordFluxes, ColumnSpacing.STANDARD);
        }

        /** A builder with one growth all the way down (see {@link ColumnGrid#of(Material, double, double)}). */
        public Builder(int cells, boolean recordFluxes, double firstSegmentM, double growth) {
            this(cells, recordFluxes, ColumnSpacing.uniform(firstSegmentM, growth));
        }

        /** A builder with a given conduction grid spacing (see {@link ColumnGrid#of(Material, ColumnSpacing)}). */
        public Builder(int cells, boolean recordFluxes, ColumnSpacing spacing) {
            if (cells <= 0) {
                throw new IllegalArgumentException("a block needs at least one cell");
            }
            this.cells = cells;
            this.recordFluxes = recordFluxes;
            this.material = new Material[cells];
            this.grid = new ColumnGrid[cells];
            this.bottomTemp = new double[cells];
            this.spacing = java.util.Objects.requireNonNull(spacing, "spacing");
        }

        /**
         * Sets cell {@code c}'s material; {@code defaultBottomTempK} is used when the material's
         * bottom temperature is NaN (deep ground at the run's default).
         */
        public Builder cell(int c, Material m, double defaultBottomTempK) {
            material[c] = m;
            grid[c] = grids.computeIfAbsent(List.of(m.layers(), m.bottom(), m.slabHeatCapacityJm2K()),
                    k -> ColumnGrid.of(m, spacing));
            double t = m.bottom().temperatureK();
            // An adiabatic bottom has no temperature; 0 keeps the kernel's 0·T_b term finite.
            bottomTemp[c] = !grid[c].bottomFixed ? 0.0 : Double.isNaN(t) ? defaultBottomTempK : t;
            return this;
        }

        public SurfaceBlock build() {
            Map<ColumnGrid, Integer> groupOf = new IdentityHashMap<>();
            List<ColumnGrid> gridOfGroup = new ArrayList<>();
            int[] groupOfCell = new int[cells];
            for (int c = 0; c < cells; c++) {
                Material m = material[c];
                if (m == null) {
                    throw new IllegalStateException("cell " + c + " has no material");
                }
                if (grid[c].bottomFixed && !Double.isFinite(bottomTemp[c])) {
                    throw new IllegalArgumentException("material '" + m.id()
                            + "' needs a bottom temperature and no default was given");
                }
                Integer g = groupOf.get(grid[c]);
                if (g == null) {
                    g = gridOfGroup.size();
                    groupOf.put(grid[c], g);
                    gridOfGroup.add(grid[c]);
                }
                groupOfCell[c] = g;
            }
            SurfaceBlock b = new SurfaceBlock(cells, gridOfGroup.toArray(new ColumnGrid[0]), groupOfCell,
                    recordFluxes);
            for (int c = 0; c < cells; c++) {
                Material m = material[c];
                int s = b.slotOfCell[c];
                b.absorptance[s] = 1.0 - m.albedo();
                b.emissivity[s] = m.emissivity();
                b.moisture[s] = m.moistureAvailability();
                b.anthropogenicWm2[s] = m.anthropogenicHeatWm2();
                b.bottomTempK[s] = bottomTemp[c];
            }
            return b;
        }
    }

}
