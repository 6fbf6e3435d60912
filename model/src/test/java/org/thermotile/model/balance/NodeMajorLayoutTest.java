package org.thermotile.model.balance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;

/**
 * The node-major kernel against the former cell-major path ({@link CellMajorKernel}), the
 * reference of the accuracy guard: same operations per cell, so every temperature, energy account
 * and recorded flux must agree to the bit (independence of layout; no external source needed: the
 * reference is the kernel the physics checks of {@link BalanceKernelTest} were made with).
 */
class NodeMajorLayoutTest {

    @Test
    void interleavedConstructionsWithGeometryAndFluxesGiveTheCellMajorBits() {
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
        block.prepare(sf.dtSeconds);
        block.initialise(296.0);
        CellMajorKernel ref = new CellMajorKernel(block);
        ref.prepare(sf.dtSeconds);
        ref.initialise(296.0);
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
        for (int c = 0; c < cells; c++) {
            int slot = block.slotOfCell[c];
            for (int j = 0; j < block.nodes(c); j++) {
                assertEquals(ref.nodeTempK(c, j), block.nodeTempK(c, j), 0.0, "cell " + c + " node " + j);
            }
            assertEquals(ref.energyInJm2(c), block.energyInJm2[slot], 0.0, "energy in, cell " + c);
            assertEquals(ref.energyGrossJm2(c), block.energyGrossJm2[slot], 0.0, "gross energy, cell " + c);
            assertEquals(ref.heatContentJm2(c), block.heatContentJm2(c), 0.0, "heat content, cell " + c);
            for (SurfaceBlock.Flux fx : SurfaceBlock.Flux.values()) {
                assertEquals(ref.fluxSum(fx, c), block.flux(fx, c), 0.0, fx + ", cell " + c);
            }
        }
    }
}
