package org.thermotile.bench;

import java.time.LocalDate;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.thermotile.model.balance.BalanceKernel;
import org.thermotile.model.balance.CellMajorKernel;
import org.thermotile.model.balance.ColumnSpacing;
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
 * Kernel throughput: one simulated hour (6 sub-steps of 10 min) of a block of 65,536 cells of one
 * material, single-threaded. Score: cell-hours per second per core (ops/s with one op = one
 * cell-hour).
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class KernelBenchmark {
    static final int CELLS = 65_536;

    /** water = slab; asphalt_aged = layered pavement; roof_membrane_white = layered roof. */
    @Param({"water", "asphalt_aged", "roof_membrane_white", "grass_irrigated"})
    public String material;

    /** Cells stepped together through an hour; 0 = the whole block per sub-step. */
    @Param({"256", "1024", "0"})
    public int chunk;

    /** node = the kernel (node-major layout); cell = the former cell-major path, for comparison. */
    @Param({"node", "cell"})
    public String layout;

    /** Conduction-node spacing by its run-file name (standard | coarse); {@code -p spacing=coarse} for the other. */
    @Param({"standard"})
    public String spacing = "standard";

    SurfaceBlock block;
    CellMajorKernel cellMajor;
    SubstepForcing sf;
    int hour;

    @Setup(Level.Trial)
    public void setUp() {
        Site site = new Site(45.3, 9.9, 100);
        Forcing f = ForcingPreparer.prepare(SyntheticWeather.clearSky(site, SyntheticWeather.Spec.withRelativeHumidity(
                LocalDate.of(2026, 7, 1), 30, 7200, 20, 33, 0.45, 2.0)), site);
        sf = SubstepForcing.of(f, 10, Convection.mcAdams());
        Material m = MaterialLibrary.get(material);
        ColumnSpacing columnSpacing = ColumnSpacing.named(spacing);
        if (columnSpacing == null) {
            throw new IllegalArgumentException("spacing '" + spacing + "': use one of " + ColumnSpacing.names());
        }
        SurfaceBlock.Builder b = new SurfaceBlock.Builder(CELLS, false, columnSpacing);
        for (int c = 0; c < CELLS; c++) {
            b.cell(c, m, 299.15);
        }
        block = b.build();
        block.prepare(sf.dtSeconds);
        block.initialise(299.15);
        cellMajor = new CellMajorKernel(block);
        cellMajor.prepare(sf.dtSeconds);
        cellMajor.initialise(299.15);
        hour = 0;
    }

    @Benchmark
    @OperationsPerInvocation(CELLS)
    public double oneHour() {
        int n = sf.substepsPerHour;
        int m0 = (hour % (sf.substeps / n)) * n;
        if (layout.equals("cell")) {
            int step = chunk == 0 ? CELLS : chunk;
            for (int c0 = 0; c0 < CELLS; c0 += step) {
                for (int s = 0; s < n; s++) {
                    cellMajor.step(sf, m0 + s, c0, Math.min(CELLS, c0 + step));
                }
            }
            hour++;
            return cellMajor.surfaceTempK(0);
        }
        if (chunk == 0) {
            for (int s = 0; s < n; s++) {
                BalanceKernel.step(block, sf, m0 + s);
            }
        } else {
            for (int c0 = 0; c0 < CELLS; c0 += chunk) {
                for (int s = 0; s < n; s++) {
                    BalanceKernel.step(block, sf, m0 + s, c0, Math.min(CELLS, c0 + chunk));
                }
            }
        }
        hour++;
        return block.surfaceTempK(0);
    }
}
