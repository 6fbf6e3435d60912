package org.thermotile.model.geometry;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;
import org.thermotile.model.constants.Physical;

class GeometryFactorsTest {

    /** Open ground in sunshine: b = 1, Ψ = 1 gives beam + diffuse, the global horizontal. */
    @Test
    void openGroundGetsTheGlobalHorizontal() {
        assertEquals(800.0 + 120.0, GeometryFactors.shortwaveDownWm2(800, 120, 1, 1), 1e-12);
        assertEquals((1 - 0.3) * 920.0, GeometryFactors.absorbedShortwaveWm2(0.3, 800, 120, 1, 1), 1e-12);
        // building shadow at the foot of a canyon wall: only the diffuse seen through Ψ = 0.45
        assertEquals(0.45 * 120.0, GeometryFactors.shortwaveDownWm2(800, 120, 0, 0.45), 1e-12);
        // tree shade with τ = 0.3
        assertEquals(0.3 * 800.0 + 0.45 * 120.0, GeometryFactors.shortwaveDownWm2(800, 120, 0.3, 0.45), 1e-12);
    }

    /**
     * Stefan–Boltzmann with CODATA 2018 σ = 5.670374419e-8 W m⁻² K⁻⁴: a black wall at 300 K emits
     * 5.670374419e-8 × 300⁴ = 459.300328 W m⁻² (by hand).
     */
    @Test
    void wallEmissionIsStefanBoltzmann() {
        assertEquals(459.300328, GeometryFactors.wallEmittedWm2(1.0, 300.0), 1e-6);
        assertEquals(0.9 * 459.300328, GeometryFactors.wallEmittedWm2(0.9, 300.0), 1e-6);
        assertEquals(0.4 * 0.9 * 459.300328, GeometryFactors.wallLongwaveWm2(0.6, 0.9, 300.0), 1e-6);
        assertEquals(303.2, GeometryFactors.wallTempK(303.2), 0.0);
    }

    /**
     * Kirchhoff's cavity: a floor inside an isothermal black enclosure (sky and walls both at T)
     * receives σT⁴ whatever its sky view factor.
     */
    @Test
    void isothermalEnclosureReceivesBlackbodyWhateverTheView() {
        double t = 295.0;
        double black = Physical.STEFAN_BOLTZMANN * t * t * t * t;
        double walls = GeometryFactors.wallEmittedWm2(1.0, t);
        for (double psi = 0; psi <= 1.0; psi += 0.125) {
            assertEquals(black, GeometryFactors.longwaveDownWm2(psi, black, walls), 1e-9);
        }
        // Open ground sees only the sky; a closed pit only the walls.
        assertEquals(330.0, GeometryFactors.longwaveDownWm2(1.0, 330.0, 420.0), 0.0);
        assertEquals(420.0, GeometryFactors.longwaveDownWm2(0.0, 330.0, 420.0), 0.0);
    }

    /** The low-sun policy: no beam at night, beam as diffuse (b = Ψ) below e_min, shadows above. */
    @Test
    void lowSunCountsBeamAsDiffuse() {
        int n = 20;
        float[] h = new float[n * n];
        for (int c = 0; c < n; c++) {
            h[10 * n + c] = 10f; // an east–west wall on row 10
        }
        double[] svf = new SkyViewFactor(1.0, 15.0).all(h, n, n);
        Shadows sh = new Shadows(1.0, Shadows.haloCells(10, 5, 1.0));
        double[] out = new double[n * n];
        GeometryFactors.beamFactors(sh, 5, h, null, 0, n, n, 0, 0, n, n, 3, 180, svf, out);
        assertEquals(svf[12 * n + 5], out[12 * n + 5], 0.0);
        GeometryFactors.beamFactors(sh, 5, h, null, 0, n, n, 0, 0, n, n, -1, 180, svf, out);
        assertEquals(0.0, out[12 * n + 5], 0.0);
        GeometryFactors.beamFactors(sh, 5, h, null, 0, n, n, 0, 0, n, n, 45, 180, svf, out);
        assertEquals(0.0, out[8 * n + 5], 0.0, "north of the wall, in its shadow");
        assertEquals(1.0, out[12 * n + 5], 0.0, "south of the wall, sunlit");
    }
}
