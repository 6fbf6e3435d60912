package org.thermotile.model.balance;

import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.materials.Material;
import org.thermotile.model.stats.CellStatistics;

/**
 * One surface through a period, every flux of every hour kept: the engine of the single-surface
 * command. It runs the same kernel the city job runs, on a block of one cell.
 */
public final class SingleSurface {
    private SingleSurface() {}

    /** The hourly results of a single-surface run, from the first hour after spin-up. */
    public static final class Result {
        /** Time of each reported hour [s since 1970-01-01T00:00Z]. */
        public final long[] epochSecond;
        /** Surface temperature at each reported hour [K]. */
        public final double[] surfaceTempK;
        /** Mean of each {@link SurfaceBlock.Flux} over the hour ending at each reported hour [W m⁻²]. */
        public final double[][] fluxWm2;
        /**
         * Heat content of the construction Σ_j C_j T_j at each reported hour [J m⁻²], and at
         * index 0 of {@link #heatContentBeforeJm2} the hour before the first: the storage flux of
         * hour i is (heat content i − heat content i−1) / 3600 s.
         */
        public final double[] heatContentJm2;
        /** Heat content at the end of the hour before the first reported hour [J m⁻²]; NaN when reporting starts at hour 1. */
        public final double heatContentBeforeJm2;
        /** Statistics over the reported hours. */
        public final CellStatistics statistics;
        /** Energy-closure residual over the whole run, spin-up included, as a fraction of the gross flux. */
        public final double closureResidualFraction;

        Result(long[] t, double[] temp, double[][] flux, double[] heat, double heatBefore, CellStatistics st,
                double closure) {
            epochSecond = t;
            heatContentJm2 = heat;
            heatContentBeforeJm2 = heatBefore;
            surfaceTempK = temp;
            fluxWm2 = flux;
            statistics = st;
            closureResidualFraction = closure;
        }

        public int hours() {
            return epochSecond.length;
        }
    }

    /**
     * Runs {@code material} through {@code forcing}.
     *
     * @param firstReportedHour first forcing hour reported (≥ 1; the hours before it are spin-up)
     * @param deepGroundK       deep-ground temperature used when the material gives none [K]
     * @param thresholdK        threshold for hours and degree-hours above [K]
     */
    public static Result run(Material material, Forcing forcing, int substepMinutes,
            Convection convection, double deepGroundK, int firstReportedHour, double thresholdK) {
        return run(material, forcing, substepMinutes, convection, deepGroundK, firstReportedHour, thresholdK,
                ColumnSpacing.STANDARD);
    }

    /** As {@link #run(Material, Forcing, int, Convection, double, int, double)} with the conduction nodes spaced by {@code spacing}. */
    public static Result run(Material material, Forcing forcing, int substepMinutes,
            Convection convection, double deepGroundK, int firstReportedHour, double thresholdK,
            ColumnSpacing spacing) {
        if (firstReportedHour < 1 || firstReportedHour >= forcing.hours()) {
            throw new IllegalArgumentException("the period after spin-up is empty: the weather has "
                    + forcing.hours() + " hours and reporting would start at hour " + firstReportedHour);
        }
        SurfaceBlock block = new SurfaceBlock.Builder(1, true, spacing).cell(0, material, deepGroundK).build();
        SubstepForcing sf = SubstepForcing.of(forcing, substepMinutes, convection);
        int n = forcing.hours() - firstReportedHour;
        long[] t = new long[n];
        double[] temp = new double[n];
        double[][] flux = new double[SurfaceBlock.Flux.COUNT][n];
        double[] heat = new double[n];
        double[] heatBefore = {Double.NaN};
        CellStatistics st = new CellStatistics(1, thresholdK);
        BlockSimulation.run(block, sf, (hour, b) -> {
            if (hour < firstReportedHour) {
                heatBefore[0] = b.heatContentJm2(0);
                return;
            }
            int i = hour - firstReportedHour;
            t[i] = forcing.epochSecond[hour];
            temp[i] = b.surfaceTempK(0);
            heat[i] = b.heatContentJm2(0);
            for (SurfaceBlock.Flux f : SurfaceBlock.Flux.values()) {
                flux[f.ordinal()][i] = b.flux(f, 0);
            }
            st.sample(b, forcing.localHourOfDay(hour), forcing.isNight(hour));
        });
        return new Result(t, temp, flux, heat, heatBefore[0], st, block.closureResidualFraction(0));
    }
}
