package org.thermotile.model.balance;

import java.util.Arrays;

/**
 * Runs a block through a period hour by hour: the time loop outside, every cell of the block
 * inside ({@link BalanceKernel#step}), forcing precomputed per sub-step.
 *
 * <p>Hour {@code k} (k ≥ 1) integrates the interval between forcing hours k−1 and k; the state
 * after it is the state at forcing hour k. Forcing hour 0 is the initial state. With flux
 * recording on, each recorded flux holds the hour's mean after the hour.
 */
public final class BlockSimulation {
    private BlockSimulation() {}

    /** Slots stepped together through an hour: their node rows (T and P) stay within a core's L2 cache. */
    static final int CHUNK_CELLS = 256;

    /** Told after each simulated hour. */
    @FunctionalInterface
    public interface HourObserver {
        /** Called with the state at forcing hour {@code hour} (1 ≤ hour &lt; hours). */
        void afterHour(int hour, SurfaceBlock block);
    }

    /**
     * Prepares {@code block} for the forcing's step, initialises it at the first hour's air
     * temperature, and runs every hour, telling {@code observer} after each.
     */
    public static void run(SurfaceBlock block, SubstepForcing sf, HourObserver observer) {
        run(new SurfaceBlock[] {block}, sf, hour -> observer.afterHour(hour, block));
    }

    /**
     * Runs several blocks through the same forcing side by side: each hour steps every block in
     * turn, then tells {@code afterHour} (with the state at that forcing hour in every block).
     * Cells are independent, so each block's bits are those of a run of its own.
     */
    public static void run(SurfaceBlock[] blocks, SubstepForcing sf, java.util.function.IntConsumer afterHour) {
        for (SurfaceBlock block : blocks) {
            block.prepare(sf.dtSeconds);
            block.initialise(sf.substeps > 0 ? initialSurfaceTemp(sf) : 0);
        }
        int n = sf.substepsPerHour;
        int hours = sf.substeps / n;
        for (int k = 1; k <= hours; k++) {
            for (SurfaceBlock block : blocks) {
                stepHour(block, sf, k);
            }
            afterHour.accept(k);
        }
    }

    /** Hour {@code k} of one block: every sub-step, a cache-sized range of slots at a time. */
    private static void stepHour(SurfaceBlock block, SubstepForcing sf, int k) {
        int n = sf.substepsPerHour;
        if (block.recordFluxes) {
            for (double[] f : block.flux) {
                Arrays.fill(f, 0.0);
            }
        }
        int m0 = (k - 1) * n;
        // Each range of slots goes through all the hour's sub-steps while its node rows
        // (T and P, 16 B per cell and node) are still in cache.
        for (int c0 = 0; c0 < block.cells; c0 += CHUNK_CELLS) {
            int c1 = Math.min(block.cells, c0 + CHUNK_CELLS);
            for (int s = 0; s < n; s++) {
                BalanceKernel.step(block, sf, m0 + s, c0, c1);
            }
        }
        if (block.recordFluxes) {
            double inv = 1.0 / n;
            for (double[] f : block.flux) {
                for (int c = 0; c < f.length; c++) {
                    f[c] *= inv;
                }
            }
        }
    }

    /** The air temperature at the start (extrapolated back from the first sub-step). */
    private static double initialSurfaceTemp(SubstepForcing sf) {
        return sf.airTempK[0];
    }
}
