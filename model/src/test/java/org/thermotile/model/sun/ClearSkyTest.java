package org.thermotile.model.sun;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * Bird &amp; Hulstrom (1981), SERI/TR-642-761, checked against NREL's spreadsheet implementation
 * Bird_08_16_2012 (rows as tabulated in pvlib's test data file BIRD_08_16_2012_patm.csv: latitude
 * 40°, pressure 1013.25 mbar, ozone 0.3 cm, water 1.5 cm, AOD 0.15 @ 380 nm and 0.1 @ 500 nm,
 * B_a 0.85, albedo 0.2, ETR on day 1 = 1414.91335 W m⁻²). Relative tolerance 1e-4.
 */
class ClearSkyTest {
    private static final double ETR_DAY1 = 1414.91335;

    @Test
    void reproducesSpreadsheetRows() {
        // {zenith, air mass, DNI, direct horizontal, GHI, DHI}: day 1, hours 12, 9, 10, 16 (hour 17,
        // air mass 22.5, lies beyond our air-mass cap ClearSky.MAX_AIR_MASS and is not compared)
        double[][] rows = {
            {63.52421726, 2.232516123, 785.1931027, 350.055063, 445.238724, 95.18366105},
            {80.20294173, 5.686327629, 471.3212064, 80.20004964, 133.8416817, 53.64163209},
            {72.42741639, 3.276939815, 663.3221901, 200.2667641, 279.163603, 78.89683889},
            {79.37350428, 5.271396127, 498.0092659, 91.83640828, 149.0503955, 57.2139872},
        };
        double[] out = new double[3];
        for (double[] r : rows) {
            assertEquals(r[1], ClearSky.relativeAirMass(r[0]), 1e-4 * r[1], "air mass at " + r[0]);
            ClearSky.bird(r[0], ETR_DAY1, 101_325.0, ClearSky.DEFAULT, out);
            assertEquals(r[2], out[ClearSky.DNI], 1e-4 * r[2], "DNI at " + r[0]);
            assertEquals(r[4], out[ClearSky.GHI], 1e-4 * r[4], "GHI at " + r[0]);
            assertEquals(r[5], out[ClearSky.DHI], 1e-4 * r[5], "DHI at " + r[0]);
            assertEquals(r[3], out[ClearSky.DNI] * Math.cos(Math.toRadians(r[0])), 1e-4 * r[3]);
        }
        assertEquals(0.07637, ClearSky.broadbandAerosolOpticalDepth(0.15, 0.1), 1e-12);
    }

    /**
     * Physical bounds: GHI ≤ E₀ₙ cos θ, DNI ≤ E₀ₙ, DHI ≥ 0, zero below the horizon, and GHI and DNI
     * never rising as the sun sinks (also beyond the fitted air-mass range, thanks to the cap).
     */
    @Test
    void staysWithinPhysicalBounds() {
        ClearSky.Atmosphere[] atms = {
            ClearSky.DEFAULT,
            new ClearSky.Atmosphere(0, 0, 0, 0, 0.85, 0.3),
            new ClearSky.Atmosphere(0.45, 5, 1.0, 0.8, 0.85, 0.1),
        };
        double[] out = new double[3];
        double e0n = 1361 * 1.0335;
        for (ClearSky.Atmosphere a : atms) {
            double prevGhi = Double.MAX_VALUE;
            double prevDni = Double.MAX_VALUE;
            for (double z = 0; z < 90; z += 0.5) {
                ClearSky.bird(z, e0n, 101_325, a, out);
                double top = e0n * Math.cos(Math.toRadians(z));
                assertTrue(out[ClearSky.GHI] <= top, "GHI above top of atmosphere at " + z);
                assertTrue(out[ClearSky.DNI] <= e0n);
                assertTrue(out[ClearSky.DHI] >= 0);
                assertTrue(out[ClearSky.GHI] <= prevGhi, "GHI should fall as the sun sinks");
                assertTrue(out[ClearSky.DNI] <= prevDni + 1e-9, "DNI should fall as the sun sinks");
                prevGhi = out[ClearSky.GHI];
                prevDni = out[ClearSky.DNI];
            }
            ClearSky.bird(90.0, e0n, 101_325, a, out);
            assertEquals(0.0, out[0] + out[1] + out[2], 0.0);
        }
        // Less air above a high site lets more beam through.
        double[] high = new double[3];
        ClearSky.bird(30, e0n, 101_325, ClearSky.DEFAULT, out);
        ClearSky.bird(30, e0n, 80_000, ClearSky.DEFAULT, high);
        assertTrue(high[ClearSky.DNI] > out[ClearSky.DNI]);
        assertThrows(IllegalArgumentException.class, () -> new ClearSky.Atmosphere(0.3, -1, 0.1, 0.1, 0.85, 0.2));
    }
}
