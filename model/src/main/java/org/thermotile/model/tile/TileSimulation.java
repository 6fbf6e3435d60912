package org.thermotile.model.tile;

import java.util.Arrays;
import org.thermotile.model.balance.BlockSimulation;
import org.thermotile.model.balance.ColumnSpacing;
import org.thermotile.model.balance.Convection;
import org.thermotile.model.balance.SubstepForcing;
import org.thermotile.model.balance.SurfaceBlock;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.geometry.GeometryFactors;
import org.thermotile.model.geometry.Shadows;
import org.thermotile.model.geometry.SkyViewFactor;
import org.thermotile.model.materials.Material;
import org.thermotile.model.stats.CellStatistics;
import org.thermotile.model.stats.GroupHourStats;

/**
 * One tile through a period: cells given as indices into a palette of materials (a tile has few
 * distinct materials), nodata cells skipped. Plain Java; the Spark job calls exactly this.
 */
public final class TileSimulation {
    private TileSimulation() {}

    /** Marks a cell with no material (nodata in the land cover). */
    public static final int NO_MATERIAL = -1;

    /**
     * What a tile run needs besides its cells; {@code columnSpacing} spaces the conduction nodes
     * of every construction ({@link ColumnSpacing#STANDARD} unless a run names another).
     */
    public record Settings(int substepMinutes, Convection convection, double deepGroundK,
            int firstSampleHour, double thresholdK, int[] hourlyOutputHours, ColumnSpacing columnSpacing)
            implements java.io.Serializable {
        public Settings {
            hourlyOutputHours = hourlyOutputHours == null ? new int[0] : hourlyOutputHours.clone();
            java.util.Objects.requireNonNull(columnSpacing, "columnSpacing");
        }

        /** Settings with the standard column spacing. */
        public Settings(int substepMinutes, Convection convection, double deepGroundK,
                int firstSampleHour, double thresholdK, int[] hourlyOutputHours) {
            this(substepMinutes, convection, deepGroundK, firstSampleHour, thresholdK, hourlyOutputHours,
                    ColumnSpacing.STANDARD);
        }
    }

    /**
     * A tile's urban geometry: its heights window with a halo of {@code haloCells} on every side
     * (the tile's cells are the window's interior, row-major, the same order as the material
     * indices), and the settings of the sky view factor and the shadows.
     *
     * <p>For exact tile edges the halo must be at least ⌈R / cell⌉ (the sky view search) and
     * {@link Shadows#haloCells} of the <em>city's</em> tallest height and {@code minSunElevationDeg};
     * cells of the window outside the city are 0 m (open ground). Only the first condition and the
     * second for the window's own tallest height can be checked here: the planner must size the
     * halo from the whole heights raster.
     *
     * @param heightsM             buildings' heights above ground [m], window row-major
     * @param treeHeightsM         tree-canopy heights above ground [m] on the same window, or null
     * @param windowCols           window width, tile width + 2 × halo
     * @param windowRows           window height, tile height + 2 × halo
     * @param haloCells            halo on every side [cells]
     * @param cellM                cell size [m]
     * @param searchRadiusM        sky view factor search radius [m]
     * @param directions           sky view factor azimuth directions (e.g. {@link SkyViewFactor#DEFAULT_DIRECTIONS})
     * @param canopyTransmissivity τ for beam sunlight through tree crowns [–]
     * @param minSunElevationDeg   lowest sun elevation whose shadows are cast [°]; below it the beam
     *                             counts as diffuse ({@link GeometryFactors#beamFactors})
     * @param wallEmissivity       ε_w of the walls (e.g. {@link GeometryFactors#DEFAULT_WALL_EMISSIVITY})
     */
    public record Geometry(float[] heightsM, float[] treeHeightsM, int windowCols, int windowRows, int haloCells,
            double cellM, double searchRadiusM, int directions, double canopyTransmissivity,
            double minSunElevationDeg, double wallEmissivity) implements java.io.Serializable {
        public Geometry {
            if (windowCols <= 2 * haloCells || windowRows <= 2 * haloCells || haloCells < 0) {
                throw new IllegalArgumentException("geometry window " + windowCols + " × " + windowRows
                        + " has no interior inside a halo of " + haloCells + " cells");
            }
        }

        /** Tile width [cells]. */
        public int tileCols() {
            return windowCols - 2 * haloCells;
        }

        /** Tile height [cells]. */
        public int tileRows() {
            return windowRows - 2 * haloCells;
        }
    }

    /** Per-cell statistics of a tile (°C, hours, K h), NaN where the cell has no material. */
    public static final class Result implements java.io.Serializable {
        private static final long serialVersionUID = 2L;
        public final int cells;
        public final double[] peakC;
        public final double[] meanC;
        public final double[] nightMinC;
        public final double[] peakHour;
        public final double[] hoursAbove;
        public final double[] degreeHoursAbove;
        /** Surface temperature [°C] at each requested hourly output hour: [hour][cell]. */
        public final float[][] hourlyC;
        /** Per palette entry and sampled hour: mean and histogram of surface temperature. */
        public final GroupHourStats materialHours;
        /** Per district and sampled hour (null without districts). */
        public final GroupHourStats districtHours;
        /** Cells per palette entry. */
        public final long[] paletteCells;
        /** Largest |closure residual| of any cell, as a fraction of its gross flux. */
        public final double maxClosureResidual;
        /** Cell-hours simulated (cells with a material × hours, spin-up included). */
        public final long cellHours;
        /**
         * Cell-hours this result's own pass stepped: {@link #cellHours} for a tile run alone; for
         * a variant run beside a reference ({@link #runVariants}), only its changed cells'.
         */
        public final long steppedCellHours;
        /** Sky view factor per cell [–] (NaN where no material); null without geometry. */
        public final double[] skyViewFactor;
        /**
         * Per cell, the sampled hours with the sun at or above the geometry's lowest shadow
         * elevation in which the cell lay in a cast shadow (beam factor below 1 at the hour:
         * building or tree shade) [h]; NaN where no material; null without geometry.
         */
        public final double[] shadedHours;

        Result(int cells, int hourly, int palette, int districts, int sampled, boolean geometry) {
            this.cells = cells;
            skyViewFactor = geometry ? nanDoubles(cells) : null;
            shadedHours = geometry ? nanDoubles(cells) : null;
            peakC = nanDoubles(cells);
            meanC = nanDoubles(cells);
            nightMinC = nanDoubles(cells);
            peakHour = nanDoubles(cells);
            hoursAbove = nanDoubles(cells);
            degreeHoursAbove = nanDoubles(cells);
            hourlyC = new float[hourly][];
            for (int i = 0; i < hourly; i++) {
                hourlyC[i] = nanArray(cells);
            }
            materialHours = new GroupHourStats(palette, sampled);
            districtHours = districts > 0 ? new GroupHourStats(districts, sampled) : null;
            paletteCells = new long[palette];
            maxClosureResidual = 0;
            cellHours = 0;
            steppedCellHours = 0;
        }

        private Result(Result r, double closure, long cellHours, long steppedCellHours) {
            cells = r.cells;
            peakC = r.peakC;
            meanC = r.meanC;
            nightMinC = r.nightMinC;
            peakHour = r.peakHour;
            hoursAbove = r.hoursAbove;
            degreeHoursAbove = r.degreeHoursAbove;
            hourlyC = r.hourlyC;
            materialHours = r.materialHours;
            districtHours = r.districtHours;
            paletteCells = r.paletteCells;
            maxClosureResidual = closure;
            this.cellHours = cellHours;
            this.steppedCellHours = steppedCellHours;
            skyViewFactor = r.skyViewFactor;
            shadedHours = r.shadedHours;
        }

        private static double[] nanDoubles(int n) {
            double[] a = new double[n];
            Arrays.fill(a, Double.NaN);
            return a;
        }

        private static float[] nanArray(int n) {
            float[] a = new float[n];
            Arrays.fill(a, Float.NaN);
            return a;
        }
    }

    /**
     * Runs the cells of one tile.
     *
     * @param palette       the distinct materials of the tile
     * @param materialIndex per cell, an index into {@code palette} or {@link #NO_MATERIAL}
     */
    public static Result run(Material[] palette, int[] materialIndex, Forcing forcing, Settings s) {
        return run(palette, materialIndex, null, 0, forcing, s);
    }

    /**
     * Runs the cells of one tile, also gathering hourly statistics per district.
     *
     * @param districtIndex per cell, a district index in {@code [0, districts)} or −1; null for none
     */
    public static Result run(Material[] palette, int[] materialIndex, int[] districtIndex, int districts,
            Forcing forcing, Settings s) {
        return run(palette, materialIndex, districtIndex, districts, forcing, s, null);
    }

    /**
     * Runs the cells of one tile with its urban geometry (cast shadows, sky view factor, wall
     * longwave; see {@link GeometryFactors}), or without when {@code geometry} is null (then
     * exactly as {@link #run(Material[], int[], int[], int, Forcing, Settings)}).
     *
     * <p>The sky view factor is computed once; the beam factors at every forcing hour from its
     * sun position, and interpolated linearly within the hour by the kernel.
     */
    public static Result run(Material[] palette, int[] materialIndex, int[] districtIndex, int districts,
            Forcing forcing, Settings s, Geometry geometry) {
        return runVariants(new Material[][] {palette}, new int[][] {materialIndex}, districtIndex, districts,
                forcing, s, geometry)[0];
    }

    /**
     * Runs several variants of one tile (the baseline and programmes that change some cells'
     * materials) in one pass. Variant 0 is the reference: all its cells are stepped. Every other
     * variant steps only its cells whose material differs from the reference's (or that have no
     * material in the reference); its other cells take the reference's temperatures. Cells are
     * independent and share the tile's geometry and forcing, so each variant's result is, bit for
     * bit, that of {@link #run(Material[], int[], int[], int, Forcing, Settings, Geometry)} on it
     * alone, at the cost of the reference plus the changed cells.
     *
     * @param palettes      per variant, its materials
     * @param materialIndex per variant and cell, an index into that variant's palette or {@link #NO_MATERIAL}
     * @return one result per variant, in order
     */
    public static Result[] runVariants(Material[][] palettes, int[][] materialIndex, int[] districtIndex,
            int districts, Forcing forcing, Settings s, Geometry geometry) {
        int variants = palettes.length;
        if (variants == 0 || materialIndex.length != variants) {
            throw new IllegalArgumentException(variants + " palettes for " + materialIndex.length
                    + " material-index arrays: give one of each per variant, at least one");
        }
        int cells = materialIndex[0].length;
        for (int[] idx : materialIndex) {
            if (idx.length != cells) {
                throw new IllegalArgumentException("variants of one tile with " + cells + " and " + idx.length
                        + " cells: every variant covers the same cells");
            }
        }
        if (geometry != null && geometry.tileCols() * geometry.tileRows() != cells) {
            throw new IllegalArgumentException("geometry window interior of " + geometry.tileCols() + " × "
                    + geometry.tileRows() + " cells does not match the tile's " + cells + " cells");
        }
        int sampled = Math.max(0, forcing.hours() - s.firstSampleHour());
        Result[] out = new Result[variants];
        for (int v = 0; v < variants; v++) {
            out[v] = new Result(cells, s.hourlyOutputHours().length, palettes[v].length,
                    districtIndex == null ? 0 : districts, sampled, geometry != null);
        }
        VariantCells vc = new VariantCells(palettes, materialIndex);
        // The blocks that are stepped: the reference's, then each variant with changed cells.
        SurfaceBlock[] blocks = new SurfaceBlock[vc.blocks];
        CellStatistics[] stats = new CellStatistics[vc.blocks];
        int[][] cellOf = new int[vc.blocks][];
        for (int v = 0; v < variants; v++) {
            int b = vc.blockOfVariant[v];
            if (b < 0) {
                continue;
            }
            int[] mine = vc.stepped[v];
            cellOf[b] = mine;
            SurfaceBlock.Builder builder = new SurfaceBlock.Builder(mine.length, false, s.columnSpacing());
            for (int a = 0; a < mine.length; a++) {
                builder.cell(a, palettes[v][materialIndex[v][mine[a]]], s.deepGroundK());
            }
            blocks[b] = builder.build();
            stats[b] = new CellStatistics(mine.length, s.thresholdK());
        }
        for (int v = 0; v < variants; v++) {
            for (int c : vc.active[v]) {
                out[v].paletteCells[materialIndex[v][c]]++;
            }
        }
        if (blocks.length == 0) {
            return out;
        }
        SubstepForcing sf = SubstepForcing.of(forcing, s.substepMinutes(), s.convection());
        int[] hourly = s.hourlyOutputHours();
        TileShading shading = geometry == null ? null : new TileShading(geometry, forcing, blocks, cellOf);
        double[] shaded = geometry == null ? null : new double[cells];
        BlockSimulation.run(blocks, sf, hour -> {
            if (shading != null) {
                // The blocks hold the state at forcing hour `hour`; set the next hour's beam
                // factors before BlockSimulation steps it, and count this hour's cast shadow.
                if (hour >= s.firstSampleHour()) {
                    shading.countShaded(hour, shaded);
                }
                shading.prepareHour(hour + 1);
            }
            if (hour < s.firstSampleHour()) {
                return;
            }
            int local = forcing.localHourOfDay(hour);
            boolean night = forcing.isNight(hour);
            for (int b = 0; b < blocks.length; b++) {
                stats[b].sample(blocks[b], local, night);
            }
            int hi = hour - s.firstSampleHour();
            for (int v = 0; v < variants; v++) {
                GroupHourStats mh = out[v].materialHours;
                GroupHourStats dh = out[v].districtHours;
                int[] idx = materialIndex[v];
                int[] act = vc.active[v];
                int[] block = vc.blockOfCell[v];
                int[] slot = vc.slotInBlock[v];
                // Cells in ascending order, as a run of the variant alone adds them.
                for (int c : act) {
                    double tc = blocks[block[c]].surfaceTempK(slot[c]) - Physical.ZERO_CELSIUS_K;
                    mh.add(idx[c], hi, tc);
                    if (dh != null && districtIndex[c] >= 0) {
                        dh.add(districtIndex[c], hi, tc);
                    }
                }
                for (int i = 0; i < hourly.length; i++) {
                    if (hourly[i] == hour) {
                        float[] dst = out[v].hourlyC[i];
                        for (int c : act) {
                            dst[c] = (float) (blocks[block[c]].surfaceTempK(slot[c]) - Physical.ZERO_CELSIUS_K);
                        }
                    }
                }
            }
        });
        for (int v = 0; v < variants; v++) {
            Result r = out[v];
            double maxClosure = 0;
            for (int c : vc.active[v]) {
                int b = vc.blockOfCell[v][c];
                int a = vc.slotInBlock[v][c];
                CellStatistics st = stats[b];
                r.peakC[c] = st.peakK(a) - Physical.ZERO_CELSIUS_K;
                r.meanC[c] = st.meanK(a) - Physical.ZERO_CELSIUS_K;
                r.nightMinC[c] = st.nightMinK(a) - Physical.ZERO_CELSIUS_K;
                r.peakHour[c] = st.peakLocalHour(a);
                r.hoursAbove[c] = st.hoursAbove(a);
                r.degreeHoursAbove[c] = st.degreeHoursAbove(a);
                maxClosure = Math.max(maxClosure, Math.abs(blocks[b].closureResidualFraction(a)));
                if (shaded != null) {
                    r.shadedHours[c] = shaded[c];
                    r.skyViewFactor[c] = shading.tileSvf[c];
                }
            }
            long hours = Math.max(0, forcing.hours() - 1);
            out[v] = new Result(r, maxClosure, (long) vc.active[v].length * hours,
                    (long) vc.stepped[v].length * hours);
        }
        return out;
    }

    /**
     * Which cells each variant has and which it steps itself. The reference (variant 0) steps all
     * its cells in block 0; variant v steps, in a block of its own, the cells whose material is
     * not the reference's, and reads the others from block 0.
     */
    private static final class VariantCells {
        /** Per variant, its cells with a material, ascending. */
        final int[][] active;
        /** Per variant, the cells it steps itself, ascending (all its cells for the reference). */
        final int[][] stepped;
        /** Per variant, its block, or −1 when it steps no cell of its own. */
        final int[] blockOfVariant;
        /** Per variant and cell: the block that steps it (the variant's own, or the reference's 0). */
        final int[][] blockOfCell;
        /** Per variant and cell: its index in the block that steps it. */
        final int[][] slotInBlock;
        final int blocks;

        VariantCells(Material[][] palettes, int[][] materialIndex) {
            int variants = palettes.length;
            int cells = materialIndex[0].length;
            active = new int[variants][];
            stepped = new int[variants][];
            blockOfVariant = new int[variants];
            blockOfCell = new int[variants][cells];
            slotInBlock = new int[variants][cells];
            int[] ref = materialIndex[0];
            int nb = 0;
            for (int v = 0; v < variants; v++) {
                int[] idx = materialIndex[v];
                // same[i][j]: entry i of this variant's palette is the reference's entry j.
                boolean[][] same = new boolean[palettes[v].length][palettes[0].length];
                for (int i = 0; i < same.length; i++) {
                    for (int j = 0; j < same[i].length; j++) {
                        same[i][j] = palettes[v][i].equals(palettes[0][j]);
                    }
                }
                boolean[] own = new boolean[cells];
                int nActive = 0;
                int nOwn = 0;
                for (int c = 0; c < cells; c++) {
                    if (idx[c] == NO_MATERIAL) {
                        continue;
                    }
                    nActive++;
                    own[c] = v == 0 || ref[c] == NO_MATERIAL || !same[idx[c]][ref[c]];
                    nOwn += own[c] ? 1 : 0;
                }
                blockOfVariant[v] = nOwn > 0 ? nb++ : -1;
                active[v] = new int[nActive];
                stepped[v] = new int[nOwn];
                int a = 0;
                int o = 0;
                for (int c = 0; c < cells; c++) {
                    if (idx[c] == NO_MATERIAL) {
                        continue;
                    }
                    active[v][a++] = c;
                    if (own[c]) {
                        blockOfCell[v][c] = blockOfVariant[v];
                        slotInBlock[v][c] = o;
                        stepped[v][o++] = c;
                    } else {
                        // Read from the reference (block 0), at the reference's index of the cell.
                        blockOfCell[v][c] = 0;
                        slotInBlock[v][c] = slotInBlock[0][c];
                    }
                }
            }
            blocks = nb;
        }
    }

    /**
     * A tile's geometry in the kernel's terms: sky view factors once, then per forcing hour the
     * beam factors of the tile's cells, handed to each block for its own cells (scratch allocated
     * once per tile).
     */
    private static final class TileShading {
        private final Geometry g;
        private final Forcing forcing;
        private final SurfaceBlock[] blocks;
        private final int[][] cellOf;
        private final Shadows shadows;
        final double[] tileSvf;
        /** Beam factors of the tile's cells at the start and the end of the hour to be stepped. */
        private double[] start;
        private double[] end;
        /** Per block, its cells' beam factors at the start and the end of that hour. */
        private final double[][] blockStart;
        private final double[][] blockEnd;
        private int endHour = -1;

        TileShading(Geometry g, Forcing forcing, SurfaceBlock[] blocks, int[][] cellOf) {
            this.g = g;
            this.forcing = forcing;
            this.blocks = blocks;
            this.cellOf = cellOf;
            SkyViewFactor svf = new SkyViewFactor(g.cellM(), g.searchRadiusM(), g.directions());
            int tc = g.tileCols();
            int tr = g.tileRows();
            tileSvf = new double[tc * tr];
            // Checks every height (naming its row and column) before the halo checks use them.
            svf.window(g.heightsM(), g.windowCols(), g.windowRows(), g.haloCells(), g.haloCells(), tc, tr, tileSvf);
            if (g.haloCells() < svf.haloCells()) {
                throw new IllegalArgumentException("geometry halo of " + g.haloCells() + " cells is less than "
                        + "the sky view search radius needs (" + svf.haloCells() + " cells for "
                        + g.searchRadiusM() + " m at " + g.cellM() + " m cells)");
            }
            double tallest = 0;
            for (float h : g.heightsM()) {
                tallest = Math.max(tallest, h);
            }
            if (g.treeHeightsM() != null) {
                for (float h : g.treeHeightsM()) {
                    tallest = Math.max(tallest, h);
                }
            }
            int need = Shadows.haloCells(tallest, g.minSunElevationDeg(), g.cellM());
            if (g.haloCells() < need) {
                throw new IllegalArgumentException("geometry halo of " + g.haloCells() + " cells is less than "
                        + "the shadows of this window's tallest height need (" + need + " cells for "
                        + tallest + " m with the sun down to " + g.minSunElevationDeg() + "°)");
            }
            shadows = new Shadows(g.cellM(), g.haloCells());
            blockStart = new double[blocks.length][];
            blockEnd = new double[blocks.length][];
            for (int b = 0; b < blocks.length; b++) {
                blocks[b].useGeometry(gather(tileSvf, cellOf[b], new double[cellOf[b].length]), g.wallEmissivity());
                blockStart[b] = new double[cellOf[b].length];
                blockEnd[b] = new double[cellOf[b].length];
            }
            start = new double[tc * tr];
            end = new double[tc * tr];
            if (forcing.hours() > 1) {
                beamAt(0, end);
                prepareHour(1);
            }
        }

        private static double[] gather(double[] tile, int[] cells, double[] out) {
            for (int a = 0; a < cells.length; a++) {
                out[a] = tile[cells[a]];
            }
            return out;
        }

        /** Sets every block's beam factors for the hour ending at forcing hour {@code k}. */
        void prepareHour(int k) {
            if (k >= forcing.hours()) {
                return;
            }
            double[] t = start;
            start = end;
            end = t;
            beamAt(k, end);
            // No beam with the sun down: across sunrise and sunset hold the sunlit end's factors,
            // so that the kernel's interpolated factor does not dim the interpolated beam.
            boolean upStart = forcing.sunZenithDeg[k - 1] < 90.0;
            boolean upEnd = forcing.sunZenithDeg[k] < 90.0;
            if (upStart && !upEnd) {
                System.arraycopy(start, 0, end, 0, end.length);
            } else if (!upStart && upEnd) {
                System.arraycopy(end, 0, start, 0, start.length);
            }
            endHour = k;
            for (int b = 0; b < blocks.length; b++) {
                blocks[b].beamFactors(gather(start, cellOf[b], blockStart[b]), gather(end, cellOf[b], blockEnd[b]));
            }
        }

        /** Adds one to each tile cell in a cast shadow at forcing hour {@code k} (the sun high enough). */
        void countShaded(int k, double[] shaded) {
            double elevation = 90.0 - forcing.sunZenithDeg[k];
            if (elevation < g.minSunElevationDeg()) {
                return;
            }
            if (k != endHour) {
                throw new IllegalStateException("beam factors of hour " + k + " are not at hand");
            }
            for (int c = 0; c < shaded.length; c++) {
                if (end[c] < 1.0) {
                    shaded[c] += 1.0;
                }
            }
        }

        private void beamAt(int k, double[] tileOut) {
            double elevation = 90.0 - forcing.sunZenithDeg[k];
            GeometryFactors.beamFactors(shadows, g.minSunElevationDeg(), g.heightsM(), g.treeHeightsM(),
                    g.canopyTransmissivity(), g.windowCols(), g.windowRows(), g.haloCells(), g.haloCells(),
                    g.tileCols(), g.tileRows(), elevation, forcing.sunAzimuthDeg[k], tileSvf, tileOut);
        }
    }
}
