package org.thermotile.model.sun;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class SkyLongwaveTest {

    /**
     * Brutsaert (1975) ε = 1.24 (e_a/T_a)^(1/7), e_a in hPa: independent hand computation with an
     * arbitrary-precision calculator: e_a = 10 hPa, T_a = 283.15 K → 0.769114054;
     * e_a = 20 hPa, T_a = 298.15 K → 0.842931775.
     */
    @Test
    void brutsaertHandValues() {
        assertEquals(0.769114054, SkyLongwave.brutsaertClearEmissivity(1000, 283.15), 1e-9);
        assertEquals(0.842931775, SkyLongwave.brutsaertClearEmissivity(2000, 298.15), 1e-9);
    }

    /** Emissivity rises with vapour pressure at fixed temperature (Brutsaert 1975, form of the law). */
    @Test
    void monotonicInVapourPressure() {
        double prev = -1;
        for (double e = 0; e <= 5000; e += 50) {
            double eps = SkyLongwave.brutsaertClearEmissivity(e, 293.15);
            assertTrue(eps > prev, "not increasing at " + e + " Pa");
            assertTrue(eps < 1.0);
            prev = eps;
        }
    }

    /** Crawford &amp; Duchon (1999): ε = c + (1 − c) ε_clr is ε_clr at c = 0 and 1 (black body) at c = 1. */
    @Test
    void cloudCorrectionLimits() {
        double clr = 0.77;
        assertEquals(clr, SkyLongwave.cloudyEmissivity(clr, 0), 0.0);
        assertEquals(1.0, SkyLongwave.cloudyEmissivity(clr, 1), 0.0);
        assertEquals(0.5 + 0.5 * clr, SkyLongwave.cloudyEmissivity(clr, 0.5), 1e-15);
        assertEquals(0.4, SkyLongwave.cloudFractionFromSolarRatio(300, 500), 1e-12);
        assertEquals(0.0, SkyLongwave.cloudFractionFromSolarRatio(600, 500), 0.0);
        assertTrue(Double.isNaN(SkyLongwave.cloudFractionFromSolarRatio(0, 0)));
    }

    /**
     * L↓ = ε σ T⁴: hand computation with σ = 5.670374419e-8 (CODATA 2018): ε = 0.75, T = 283.15 K
     * → 273.362705 W m⁻².
     */
    @Test
    void downwellingHandValue() {
        assertEquals(273.362705, SkyLongwave.downwellingWm2(0.75, 283.15), 1e-6);
    }
}
