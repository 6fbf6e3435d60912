package org.thermotile.model.hotspot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.junit.jupiter.api.Test;

class BenjaminiHochbergTest {

    /**
     * The worked example of Benjamini & Hochberg (1995), section 4: the 15 p-values of one family
     * of hypotheses of the thrombolysis trial of Neuhaus et al. (1992), sorted (as reproduced in
     * the SciPy documentation of scipy.stats.false_discovery_control, which follows the paper).
     * At q = 0.05 the paper rejects the four smallest (p ≤ 0.0095); Bonferroni (0.05/15 =
     * 0.00333) rejects three.
     */
    static final double[] NEUHAUS = {0.0001, 0.0004, 0.0019, 0.0095, 0.0201, 0.0278, 0.0298, 0.0344,
        0.0459, 0.3240, 0.4262, 0.5719, 0.6528, 0.7590, 1.000};

    @Test
    void paperExampleRejectsFourAtFivePercent() {
        // i·q/m for i = 4, 5: 0.01333 ≥ 0.0095 (reject), 0.01667 < 0.0201; no larger i passes
        // (e.g. i = 9: 0.03 < 0.0459).
        assertEquals(4, BenjaminiHochberg.rejections(NEUHAUS, 0.05));
        assertEquals(0.0095, BenjaminiHochberg.threshold(NEUHAUS, 0.05));
    }

    @Test
    void sameExampleAtTenAndOnePercentByHand() {
        // q = 0.10: i·q/m = i/150; i = 9: 0.0600 ≥ 0.0459; i = 10: 0.0667 < 0.3240, and every
        // larger i fails too (p₍ᵢ₎ ≥ 0.3240 > 0.1).
        assertEquals(9, BenjaminiHochberg.rejections(NEUHAUS, 0.10));
        assertEquals(0.0459, BenjaminiHochberg.threshold(NEUHAUS, 0.10));
        // q = 0.01: i/1500; i = 3: 0.0020 ≥ 0.0019; i = 4: 0.00267 < 0.0095.
        assertEquals(3, BenjaminiHochberg.rejections(NEUHAUS, 0.01));
        // Step-up, not step-down: p₍₁₎ fails but p₍₂₎ passes, so both are rejected.
        assertEquals(2, BenjaminiHochberg.rejections(new double[] {0.04, 0.045, 0.9}, 0.1));
        assertEquals(BenjaminiHochberg.NONE, BenjaminiHochberg.threshold(new double[] {0.5, 0.9}, 0.1));
    }

    @Test
    void qValuesOfTheExampleByHand() {
        // q₍₄₎ = min_{j ≥ 4} 15 p₍ⱼ₎ / j = 15 · 0.0095 / 4 = 0.035625 (j = 5 gives 0.0603, larger);
        // q₍₅₎ = min(15·0.0201/5, 15·0.0278/6, 15·0.0298/7, …) = 0.0603 > 0.05: four pass at 0.05.
        double[] q = FalseDiscovery.BH.qValues(NEUHAUS);
        assertEquals(0.035625, q[3], 1e-12);
        assertEquals(0.0603, q[4], 1e-12);
        assertThrows(IllegalArgumentException.class, () -> BenjaminiHochberg.rejections(NEUHAUS, 1.5));
    }

    @Test
    void sortedValidDropsNoData() {
        double[] s = BenjaminiHochberg.sortedValid(new double[] {0.3, Double.NaN, 0.1});
        assertEquals(2, s.length);
        assertEquals(0.1, s[0]);
    }
}
