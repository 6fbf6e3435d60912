package org.thermotile.model.tile;

import java.util.Arrays;
import org.thermotile.model.balance.BlockSimulation;
import org.thermotile.model.balance.Convection;
import org.thermotile.model.balance.SubstepForcing;
import org.thermotile.model.balance.SurfaceBlock;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
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

    /** What a tile run needs besides its cells. */
    public record Settings(int substepMinutes, Convection convection, double deepGroundK,
            int firstSampleHour, double thresholdK, int[] hourlyOutputHours)
            implements java.io.Serializable {
        public Settings {
            hourlyOutputHours = hourlyOutputHours == null ? new int[0] : hourlyOutputHours.clone();
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

        Result(int cells, int hourly, int palette, int districts, int sampled) {
            this.cells = cells;
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
        int cells = materialIndex.length;
        int count = 0;
        for (int idx : materialIndex) {
            if (idx != NO_MATERIAL) {
                count++;
            }
        }
        final int active = count;
        int sampled = Math.max(0, forcing.hours() - s.firstSampleHour());
        Result out = new Result(cells, s.hourlyOutputHours().length, palette.length,
                districtIndex == null ? 0 : districts, sampled);
        if (active == 0) {
            return out;
        }
        int[] cellOf = new int[active];
        SurfaceBlock.Builder builder = new SurfaceBlock.Builder(active, false);
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
        BlockSimulation.run(block, sf, (hour, b) -> {
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
        }
        long cellHours = (long) active * Math.max(0, forcing.hours() - 1);
        return new Result(out, maxClosure, cellHours);
    }
}
