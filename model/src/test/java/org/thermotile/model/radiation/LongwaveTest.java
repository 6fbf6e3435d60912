package org.thermotile.model.radiation;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

class LongwaveTest {

    private static final double SIGMA_CODATA_2018 = 5.670374419e-8;

    /**
     * A blackbody at 200 °C emits (473.15/373.15)⁴ ≈ 2.585 times what it emits at 100 °C (the
     * Stefan–Boltzmann law); "about 2.6 times" is the usual rule (common practice).
     */
    @Test
    void emissionAt200CIsAbout2point6TimesThatAt100C() {
        double ratio = Longwave.emittedWm2(1.0, 473.15) / Longwave.emittedWm2(1.0, 373.15);
        assertEquals(Math.pow(473.15 / 373.15, 4), ratio, 1e-12);
        assertEquals(2.585, ratio, 0.001);
        assertEquals(2.6, ratio, 0.05);
    }

    /** εσT⁴ against σ = 5.670374419e-8 W m⁻² K⁻⁴ (CODATA 2018): 0.95 σ 300⁴ = 436.3 W m⁻². */
    @Test
    void emittedIsGreyStefanBoltzmann() {
        assertEquals(0.95 * SIGMA_CODATA_2018 * 8.1e9, Longwave.emittedWm2(0.95, 300.0), 1e-9);
        assertEquals(436.3, Longwave.emittedWm2(0.95, 300.0), 0.05);
    }

    /**
     * A blackbody near ambient temperature "emits about 6.1 W m⁻² for each °C above ambient"
     * (LBNL Heat Island Group, cool-roof "Definitions and Terms" page, archived 2015): 4σT³ at
     * 298–300 K is 6.0–6.1 W m⁻² K⁻¹.
     */
    @Test
    void emissionSlopeNearAmbientIsAbout6WPerKelvin() {
        assertEquals(6.1, Longwave.emittedSlopeWm2K(1.0, 300.0), 0.05);
        // The slope is the derivative of εσT⁴ (central difference, 1e-3 K).
        double d = (Longwave.emittedWm2(0.9, 300.001) - Longwave.emittedWm2(0.9, 299.999)) / 0.002;
        assertEquals(d, Longwave.emittedSlopeWm2K(0.9, 300.0), 1e-6);
    }

    /** Kirchhoff: absorbed εL↓ plus reflected (1−ε)L↓ is all of L↓. */
    @Test
    void absorbedPlusReflectedSkyIsIncoming() {
        double sky = 380.0;
        assertEquals(0.92 * sky, Longwave.absorbedSkyWm2(0.92, sky), 1e-12);
        assertEquals(0.08 * sky, Longwave.reflectedSkyWm2(0.92, sky), 1e-12);
        assertEquals(sky, Longwave.absorbedSkyWm2(0.92, sky) + Longwave.reflectedSkyWm2(0.92, sky), 1e-12);
    }

    @Test
    void blackbodyTempInvertsEmission() {
        assertEquals(300.0, Longwave.blackbodyTempK(SIGMA_CODATA_2018 * 8.1e9), 1e-9);
    }
}
