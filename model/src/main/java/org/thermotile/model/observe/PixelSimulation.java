package org.thermotile.model.observe;

import java.util.Arrays;
import java.util.List;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.materials.Material;
import org.thermotile.model.tile.TileSimulation;

/**
 * Simulated surface temperature of observed pixels at the observations' times, for one candidate
 * palette: each pixel's cells ({@link PixelCells}) through the city job's tile kernel
 * ({@link TileSimulation#run}, the same forcing and settings as the run), then per observation time
 * the cells' temperatures interpolated linearly between the two bracketing hours and averaged with
 * the footprint's overlap areas, {@code s̄ = Σ_c A_c s_c / Σ_c A_c} over cells with a material —
 * exactly what the comparison with the image does with the run's own hourly table.
 *
 * <p>The forcing is cut after the last hour an observation needs (the kernel is causal, so the
 * hours kept are unchanged). Pixels without geometry are concatenated into one kernel run (cells
 * do not interact without geometry); a pixel with geometry is one run of its own window.
 * Serializable: a Spark job ships it once per calibration.
 */
public final class PixelSimulation implements java.io.Serializable {
    private static final long serialVersionUID = 1L;

    private final Forcing forcing;
    private final TileSimulation.Settings settings;
    /** Per observation, the weight of the later of its two hours (hourly outputs 2k and 2k + 1). */
    private final double[] weight1;

    /**
     * @param forcing  the run's forcing
     * @param settings the run's kernel settings (its hourly output hours are replaced)
     * @param hours    each observation's time as a fractional forcing-hour index
     * @throws IllegalArgumentException when an observation lies before the first sampled hour
     *                                  (spin-up) or after the forcing
     */
    public PixelSimulation(Forcing forcing, TileSimulation.Settings settings, double[] hours) {
        if (hours.length == 0) {
            throw new IllegalArgumentException("need one or more observations, each with its hour");
        }
        int n = hours.length;
        int[] outHours = new int[2 * n];
        weight1 = new double[n];
        int last = 0;
        for (int k = 0; k < n; k++) {
            double h = hours[k];
            if (!(h >= settings.firstSampleHour() && h <= forcing.hours() - 1)) {
                throw new IllegalArgumentException("observation hour " + h + " is outside the sampled hours "
                        + settings.firstSampleHour() + " … " + (forcing.hours() - 1) + " of the forcing (spin-up excluded)");
            }
            int h0 = (int) Math.min(Math.floor(h), forcing.hours() - 1);
            outHours[2 * k] = h0;
            outHours[2 * k + 1] = Math.min(h0 + 1, forcing.hours() - 1);
            weight1[k] = h - h0;
            last = Math.max(last, outHours[2 * k + 1]);
        }
        this.forcing = truncate(forcing, last + 1);
        this.settings = new TileSimulation.Settings(settings.substepMinutes(), settings.convection(),
                settings.deepGroundK(), settings.firstSampleHour(), settings.thresholdK(), outHours,
                settings.columnSpacing());
    }

    /** Number of observations. */
    public int observations() {
        return weight1.length;
    }

    /** Forcing hours each kernel run steps through (spin-up included). */
    public int hours() {
        return forcing.hours();
    }

    /**
     * Simulated pixel temperatures [K]: {@code [pixel][observation]}, NaN for a pixel with no
     * material under it.
     */
    public double[][] simulate(Material[] palette, List<PixelCells> pixels) {
        double[][] out = new double[pixels.size()][];
        // Pixels without geometry: one kernel run over all their cells.
        int flatCells = 0;
        for (PixelCells p : pixels) {
            if (p.geometry() == null) {
                flatCells += p.materialIndex().length;
            }
        }
        if (flatCells > 0) {
            int[] idx = new int[flatCells];
            int at = 0;
            for (PixelCells p : pixels) {
                if (p.geometry() == null) {
                    System.arraycopy(p.materialIndex(), 0, idx, at, p.materialIndex().length);
                    at += p.materialIndex().length;
                }
            }
            TileSimulation.Result res = TileSimulation.run(palette, idx, null, 0, forcing, settings, null);
            at = 0;
            for (int i = 0; i < pixels.size(); i++) {
                PixelCells p = pixels.get(i);
                if (p.geometry() == null) {
                    out[i] = pixelMeans(res, at, p);
                    at += p.materialIndex().length;
                }
            }
        }
        for (int i = 0; i < pixels.size(); i++) {
            PixelCells p = pixels.get(i);
            if (p.geometry() != null) {
                TileSimulation.Result res = TileSimulation.run(palette, p.materialIndex(), null, 0, forcing, settings,
                        p.geometry());
                out[i] = pixelMeans(res, 0, p);
            }
        }
        return out;
    }

    /** Per observation, Σ A_c s_c / Σ A_c over the pixel's cells with a value (cells from {@code offset}). */
    private double[] pixelMeans(TileSimulation.Result res, int offset, PixelCells p) {
        double[] v = new double[weight1.length];
        for (int k = 0; k < weight1.length; k++) {
            float[] t0 = res.hourlyC[2 * k];
            float[] t1 = res.hourlyC[2 * k + 1];
            double num = 0;
            double den = 0;
            for (int c = 0; c < p.materialIndex().length; c++) {
                double area = p.areasM2()[c];
                float a = t0[offset + c];
                if (area > 0 && !Float.isNaN(a)) {
                    // As the comparison reads the hourly table: stored °C (float) back to K.
                    double ak = a + Physical.ZERO_CELSIUS_K;
                    double bk = t1[offset + c] + Physical.ZERO_CELSIUS_K;
                    num += area * (ak + weight1[k] * (bk - ak));
                    den += area;
                }
            }
            v[k] = den > 0 ? num / den : Double.NaN;
        }
        return v;
    }

    /** The first {@code hours} hours of {@code f}. */
    static Forcing truncate(Forcing f, int hours) {
        if (hours >= f.hours()) {
            return f;
        }
        return new Forcing(f.site, Arrays.copyOf(f.epochSecond, hours), f.utcOffsetSeconds,
                Arrays.copyOf(f.airTempK, hours), Arrays.copyOf(f.specificHumidity, hours),
                Arrays.copyOf(f.windMs, hours), Arrays.copyOf(f.pressurePa, hours), Arrays.copyOf(f.ghiWm2, hours),
                Arrays.copyOf(f.beamHorizontalWm2, hours), Arrays.copyOf(f.diffuseHorizontalWm2, hours),
                Arrays.copyOf(f.skyLongwaveWm2, hours), Arrays.copyOf(f.sunZenithDeg, hours),
                Arrays.copyOf(f.sunAzimuthDeg, hours));
    }
}
