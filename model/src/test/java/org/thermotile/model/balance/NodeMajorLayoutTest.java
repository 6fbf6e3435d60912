package org.thermotile.model.balance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;

/**
 * The accuracy guard: the node-major kernel against the former cell-major path
 * ({@link CellMajorKernel}), the reference the physics checks of {@link BalanceKernelTest} were
 * made with. Cells that do not evaporate take the same operations in the same order, so every
 * temperature, energy account and recorded flux must agree to the bit. Cells that evaporate
 * solve their surface equation with the vectorised Magnus form (a series e^x, three divisions
 * instead of five), so they may differ in the last bits: within 1e-9 K at every node and hour
 * (the guard), their fluxes within 1e-7 W m⁻² and energy accounts within 1e-12 of the gross.
 * Independence of layout and of the arithmetic's rounding; no external source needed.
 */
class NodeMajorLayoutTest {

    @Test
    void interleavedConstructionsWithGeometryAndFluxesStayWithinTheGuard() {
        String[] ids = {"asphalt_aged", "roof_membrane_white", "grass_irrigated", "water", "concrete", "metal_roof_bare", "green_roof"};
        Material[] mats = new Material[ids.length];
        for (int i = 0; i < ids.length; i++) {
            mats[i] = MaterialLibrary.get(ids[i]);
        }
        int cells = 1_000; // not a multiple of the 256-slot chunk nor of a vector
        Random rnd = new Random(7);
        SurfaceBlock.Builder bld = new SurfaceBlock.Builder(cells, true);
        for (int c = 0; c < cells; c++) {
            bld.cell(c, mats[rnd.nextInt(mats.length)], 295.15 + rnd.nextInt(3));
        }
        SurfaceBlock block = bld.build();
        assertTrue(!block.identityOrder && block.groups >= 4, "cells of several constructions interleaved");
        double[] svf = new double[cells];
        for (int c = 0; c < cells; c++) {
            svf[c] = 0.3 + 0.7 * rnd.nextDouble();
        }
        block.useGeometry(svf, 0.9);
        Forcing f = TestForcings.of(49, h -> 295 + 8 * Math.sin(2 * Math.PI * (h - 9) / 24.0),
                h -> Math.max(0, 850 * Math.sin(Math.PI * ((h % 24) - 6) / 12.0)), h -> 360, 0.45, 2.0);
        SubstepForcing sf = SubstepForcing.of(f, 10, Convection.mcAdams());
        CellMajorKernel ref = startBoth(block, sf, 296.0);
        double[] start = new double[cells];
        double[] end = new double[cells];
        int n = sf.substepsPerHour;
        for (int k = 1; k < f.hours(); k++) {
            for (int c = 0; c < cells; c++) {
                start[c] = end[c];
                end[c] = (k % 24 >= 7 && k % 24 <= 17) ? rnd.nextDouble() : 1.0;
            }
            block.beamFactors(start, end);
            ref.beamFactors(start, end);
            for (double[] fl : block.flux) {
                java.util.Arrays.fill(fl, 0.0);
            }
            ref.clearFluxes();
            for (int c0 = 0; c0 < cells; c0 += BlockSimulation.CHUNK_CELLS) {
                for (int s = 0; s < n; s++) {
                    BalanceKernel.step(block, sf, (k - 1) * n + s, c0, Math.min(cells, c0 + BlockSimulation.CHUNK_CELLS));
                }
            }
            for (int s = 0; s < n; s++) {
                ref.step(sf, (k - 1) * n + s);
            }
        }
        double worst = compare(block, ref, cells);
        assertTrue(worst <= 1e-9, "evaporating cells within 1e-9 K: " + worst);
    }

    /**
     * Every material of the library, a July month of clear days: every hour, dry cells' surface
     * temperatures bit for bit and evaporating cells' within 1e-9 K, and at the end the full
     * comparison of {@link #compare}.
     */
    @Test
    void everyLibraryMaterialStaysWithinTheGuardOverASummerMonth() {
        java.util.List<Material> lib = MaterialLibrary.all();
        int per = 5;
        int cells = lib.size() * per;
        SurfaceBlock.Builder bld = new SurfaceBlock.Builder(cells, true);
        for (int c = 0; c < cells; c++) {
            bld.cell(c, lib.get(c % lib.size()), 296.15);
        }
        SurfaceBlock block = bld.build();
        Forcing f = TestForcings.of(31 * 24 + 1, h -> 297 + 7 * Math.sin(2 * Math.PI * (h - 9) / 24.0),
                h -> Math.max(0, 880 * Math.sin(Math.PI * ((h % 24) - 6) / 12.0)), h -> 350, 0.5, 1.5);
        SubstepForcing sf = SubstepForcing.of(f, 10, Convection.mcAdams());
        CellMajorKernel ref = startBoth(block, sf, 297.0);
        int n = sf.substepsPerHour;
        double worst = 0;
        int evaporating = 0;
        for (int c = 0; c < cells; c++) {
            evaporating += block.moisture[block.slotOfCell[c]] > 0 ? 1 : 0;
        }
        assertTrue(evaporating > 0 && evaporating < cells, "both kinds of cell: " + evaporating + " of " + cells);
        for (int k = 1; k < f.hours(); k++) {
            for (double[] fl : block.flux) {
                java.util.Arrays.fill(fl, 0.0);
            }
            ref.clearFluxes();
            for (int s = 0; s < n; s++) {
                BalanceKernel.step(block, sf, (k - 1) * n + s);
                ref.step(sf, (k - 1) * n + s);
            }
            for (int c = 0; c < cells; c++) {
                double d = Math.abs(block.surfaceTempK(c) - ref.surfaceTempK(c));
                if (block.moisture[block.slotOfCell[c]] > 0) {
                    worst = Math.max(worst, d);
                } else {
                    assertEquals(ref.surfaceTempK(c), block.surfaceTempK(c), 0.0, "dry cell " + c + " hour " + k);
                }
            }
        }
        assertTrue(worst <= 1e-9, "evaporating cells' surface within 1e-9 K every hour: " + worst);
        assertTrue(compare(block, ref, cells) <= 1e-9);
    }

    /** Prepares and initialises {@code block} and a cell-major reference copy of it alike. */
    private static CellMajorKernel startBoth(SurfaceBlock block, SubstepForcing sf, double startK) {
        block.prepare(sf.dtSeconds);
        block.initialise(startK);
        CellMajorKernel ref = new CellMajorKernel(block);
        ref.prepare(sf.dtSeconds);
        ref.initialise(startK);
        return ref;
    }

    /**
     * Every node, energy account and flux of every cell: dry cells bit for bit, evaporating cells
     * within the guard's tolerances. Returns the largest node temperature difference of an
     * evaporating cell [K].
     */
    private static double compare(SurfaceBlock block, CellMajorKernel ref, int cells) {
        double worst = 0;
        for (int c = 0; c < cells; c++) {
            int slot = block.slotOfCell[c];
            boolean wet = block.moisture[slot] > 0;
            double tolK = wet ? 1e-9 : 0.0;
            double tolJ = wet ? 1e-12 * Math.abs(ref.energyGrossJm2(c)) : 0.0;
            double tolW = wet ? 1e-7 : 0.0;
            for (int j = 0; j < block.nodes(c); j++) {
                assertEquals(ref.nodeTempK(c, j), block.nodeTempK(c, j), tolK, "cell " + c + " node " + j);
                if (wet) {
                    worst = Math.max(worst, Math.abs(ref.nodeTempK(c, j) - block.nodeTempK(c, j)));
                }
            }
            assertEquals(ref.energyInJm2(c), block.energyInJm2[slot], tolJ, "energy in, cell " + c);
            assertEquals(ref.energyGrossJm2(c), block.energyGrossJm2[slot], tolJ, "gross energy, cell " + c);
            assertEquals(ref.heatContentJm2(c), block.heatContentJm2(c), tolJ, "heat content, cell " + c);
            for (SurfaceBlock.Flux fx : SurfaceBlock.Flux.values()) {
                assertEquals(ref.fluxSum(fx, c), block.flux(fx, c), tolW, fx + ", cell " + c);
            }
        }
        return worst;
    }
}
