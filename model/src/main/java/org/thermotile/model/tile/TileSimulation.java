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
        private static final long serialVersionUID = 1L;
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
        }

        private Result(Result r, double closure, long cellHours) {
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
        int cells = materialIndex.length;
        if (geometry != null && geometry.tileCols() * geometry.tileRows() != cells) {
            throw new IllegalArgumentException("geometry window interior of " + geometry.tileCols() + " × "
                    + geometry.tileRows() + " cells does not match the tile's " + cells + " cells");
        }
        int count = 0;
        for (int idx : materialIndex) {
            if (idx != NO_MATERIAL) {
                count++;
            }
        }
        final int active = count;
        int sampled = Math.max(0, forcing.hours() - s.firstSampleHour());
        Result out = new Result(cells, s.hourlyOutputHours().length, palette.length,
                districtIndex == null ? 0 : districts, sampled, geometry != null);
        if (active == 0) {
            return out;
        }
        int[] cellOf = new int[active];
        SurfaceBlock.Builder builder = new SurfaceBlock.Builder(active, false, s.columnSpacing());
        for (int c = 0, a = 0; c < cells; c++) {
            int idx = materialIndex[c];
            if (idx != NO_MATERIAL) {
                builder.cell(a, palette[idx], s.deepGroundK());
                cellOf[a++] = c;
                out.paletteCells[idx]++;
            }
        }
        SurfaceBlock block = builder.build();
        SubstepForcing sf = SubstepForcing.of(forcing, s.substepMinutes(), s.convection());
        CellStatistics st = new CellStatistics(active, s.thresholdK());
        int[] hourly = s.hourlyOutputHours();
        int[] activeIdx = new int[active];
        int[] activeDistrict = new int[active];
        for (int a = 0; a < active; a++) {
            activeIdx[a] = materialIndex[cellOf[a]];
            activeDistrict[a] = districtIndex == null ? -1 : districtIndex[cellOf[a]];
        }
        TileShading shading = geometry == null ? null
                : new TileShading(geometry, forcing, block, cellOf, out.skyViewFactor);
        double[] shaded = geometry == null ? null : new double[active];
        BlockSimulation.run(block, sf, (hour, b) -> {
            if (shading != null) {
                // b holds the state at forcing hour `hour`; set the next hour's beam factors
                // before BlockSimulation steps it, and count this hour's cast shadow.
                if (hour >= s.firstSampleHour()) {
                    shading.countShaded(hour, shaded);
                }
                shading.prepareHour(hour + 1);
            }
            if (hour < s.firstSampleHour()) {
                return;
            }
            st.sample(b, forcing.localHourOfDay(hour), forcing.isNight(hour));
            int hi = hour - s.firstSampleHour();
            GroupHourStats mh = out.materialHours;
            GroupHourStats dh = out.districtHours;
            for (int a = 0; a < active; a++) {
                double tc = b.surfaceTempK(a) - Physical.ZERO_CELSIUS_K;
                mh.add(activeIdx[a], hi, tc);
                if (dh != null && activeDistrict[a] >= 0) {
                    dh.add(activeDistrict[a], hi, tc);
                }
            }
            for (int i = 0; i < hourly.length; i++) {
                if (hourly[i] == hour) {
                    float[] dst = out.hourlyC[i];
                    for (int a = 0; a < active; a++) {
                        dst[cellOf[a]] = (float) (b.surfaceTempK(a) - Physical.ZERO_CELSIUS_K);
                    }
                }
            }
        });
        double maxClosure = 0;
        for (int a = 0; a < active; a++) {
            int c = cellOf[a];
            out.peakC[c] = st.peakK(a) - Physical.ZERO_CELSIUS_K;
            out.meanC[c] = st.meanK(a) - Physical.ZERO_CELSIUS_K;
            out.nightMinC[c] = st.nightMinK(a) - Physical.ZERO_CELSIUS_K;
            out.peakHour[c] = st.peakLocalHour(a);
            out.hoursAbove[c] = st.hoursAbove(a);
            out.degreeHoursAbove[c] = st.degreeHoursAbove(a);
            maxClosure = Math.max(maxClosure, Math.abs(block.closureResidualFraction(a)));
            if (shaded != null) {
                out.shadedHours[c] = shaded[a];
            }
        }
        long cellHours = (long) active * Math.max(0, forcing.hours() - 1);
        return new Result(out, maxClosure, cellHours);
    }

    /**
     * A tile's geometry in the kernel's terms: sky view factors once, then per forcing hour the
     * beam factors of the active cells (scratch allocated once per tile).
     */
    private static final class TileShading {
        private final Geometry g;
        private final Forcing forcing;
        private final SurfaceBlock block;
        private final int[] cellOf;
        private final Shadows shadows;
        private final double[] tileSvf;
        private final double[] tileBeam;
        private double[] start;
        private double[] end;
        private int endHour = -1;

        TileShading(Geometry g, Forcing forcing, SurfaceBlock block, int[] cellOf, double[] svfOut) {
            this.g = g;
            this.forcing = forcing;
            this.block = block;
            this.cellOf = cellOf;
            SkyViewFactor svf = new SkyViewFactor(g.cellM(), g.searchRadiusM(), g.directions());
            int tc = g.tileCols();
            int tr = g.tileRows();
            tileSvf = new double[tc * tr];
            tileBeam = new double[tc * tr];
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
            double[] activeSvf = new double[cellOf.length];
            for (int a = 0; a < cellOf.length; a++) {
                activeSvf[a] = tileSvf[cellOf[a]];
                svfOut[cellOf[a]] = tileSvf[cellOf[a]];
            }
            block.useGeometry(activeSvf, g.wallEmissivity());
            start = new double[cellOf.length];
            end = new double[cellOf.length];
            if (forcing.hours() > 1) {
                beamAt(0, end);
                prepareHour(1);
            }
        }

        /** Sets the block's beam factors for the hour ending at forcing hour {@code k}. */
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
            block.beamFactors(start, end);
        }

        /** Adds one to each active cell in a cast shadow at forcing hour {@code k} (the sun high enough). */
        void countShaded(int k, double[] shaded) {
            double elevation = 90.0 - forcing.sunZenithDeg[k];
            if (elevation < g.minSunElevationDeg()) {
                return;
            }
            double[] b = k == endHour ? end : null;
            if (b == null) {
                throw new IllegalStateException("beam factors of hour " + k + " are not at hand");
            }
            for (int a = 0; a < shaded.length; a++) {
                if (b[a] < 1.0) {
                    shaded[a] += 1.0;
                }
            }
        }

        private void beamAt(int k, double[] activeOut) {
            double elevation = 90.0 - forcing.sunZenithDeg[k];
            GeometryFactors.beamFactors(shadows, g.minSunElevationDeg(), g.heightsM(), g.treeHeightsM(),
                    g.canopyTransmissivity(), g.windowCols(), g.windowRows(), g.haloCells(), g.haloCells(),
                    g.tileCols(), g.tileRows(), elevation, forcing.sunAzimuthDeg[k], tileSvf, tileBeam);
            for (int a = 0; a < cellOf.length; a++) {
                activeOut[a] = tileBeam[cellOf[a]];
            }
        }
    }
}
