package org.thermotile.bench;

import java.time.LocalDate;
import org.thermotile.model.balance.BalanceKernel;
import org.thermotile.model.balance.CellMajorKernel;
import org.thermotile.model.balance.Convection;
import org.thermotile.model.balance.SubstepForcing;
import org.thermotile.model.balance.SurfaceBlock;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.ForcingPreparer;
import org.thermotile.model.forcing.Site;
import org.thermotile.model.forcing.SyntheticWeather;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;

/**
 * A plain loop over the kernel for profiling (run it under Java Flight Recorder) and the
 * accuracy guard: the node-major, cache-blocked kernel against the cell-major reference path
 * ({@link CellMajorKernel}, the kernel before the node-major layout) on the same cells, printing
 * the largest surface-temperature difference and each path's throughput, timed side by side
 * hour by hour.
 *
 * <pre>java -XX:StartFlightRecording=filename=kernel.jfr -cp … org.thermotile.bench.KernelProfile [hours] [material]</pre>
 */
public final class KernelProfile {
    private KernelProfile() {}

    public static void main(String[] args) {
        int hours = args.length > 0 ? Integer.parseInt(args[0]) : 240;
        String id = args.length > 1 ? args[1] : "asphalt_aged";
        int cells = 65_536;
        Site site = new Site(45.3, 9.9, 100);
        Forcing f = ForcingPreparer.prepare(SyntheticWeather.clearSky(site, SyntheticWeather.Spec.withRelativeHumidity(
                LocalDate.of(2026, 7, 1), hours / 24 + 2, 7200, 20, 33, 0.45, 2.0)), site);
        SubstepForcing sf = SubstepForcing.of(f, 10, Convection.mcAdams());
        Material m = MaterialLibrary.get(id);
        SurfaceBlock blocked = block(m, cells, sf);
        CellMajorKernel reference = new CellMajorKernel(blocked);
        reference.prepare(sf.dtSeconds);
        reference.initialise(299.15);
        int n = sf.substepsPerHour;
        long tRef = 0;
        long tBlk = 0;
        for (int h = 0; h < hours; h++) {
            long t0 = System.nanoTime();
            for (int c0 = 0; c0 < cells; c0 += 256) {
                for (int s = 0; s < n; s++) {
                    reference.step(sf, h * n + s, c0, Math.min(cells, c0 + 256));
                }
            }
            long t1 = System.nanoTime();
            for (int c0 = 0; c0 < cells; c0 += 256) {
                for (int s = 0; s < n; s++) {
                    BalanceKernel.step(blocked, sf, h * n + s, c0, Math.min(cells, c0 + 256));
                }
            }
            long t2 = System.nanoTime();
            tRef += t1 - t0;
            tBlk += t2 - t1;
        }
        double maxDiff = 0;
        for (int c = 0; c < cells; c++) {
            maxDiff = Math.max(maxDiff, Math.abs(reference.surfaceTempK(c) - blocked.surfaceTempK(c)));
        }
        System.out.printf("%s, %d cells × %d h: cell-major reference %.3g cell-hours/s, node-major %.3g cell-hours/s, "
                + "largest |ΔT| %.3g K%n", id, cells, hours, (double) cells * hours / (tRef / 1e9),
                (double) cells * hours / (tBlk / 1e9), maxDiff);
    }

    static SurfaceBlock block(Material m, int cells, SubstepForcing sf) {
        SurfaceBlock.Builder b = new SurfaceBlock.Builder(cells, false);
        for (int c = 0; c < cells; c++) {
            b.cell(c, m, 299.15);
        }
        SurfaceBlock block = b.build();
        block.prepare(sf.dtSeconds);
        block.initialise(299.15);
        return block;
    }
}
