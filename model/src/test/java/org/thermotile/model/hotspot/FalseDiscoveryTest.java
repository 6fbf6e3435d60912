package org.thermotile.model.hotspot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class FalseDiscoveryTest {

    /** H₁₅ = 1195757 / 360360 (exact harmonic number, by hand). */
    @Test
    void harmonicNumber() {
        assertEquals(1195757.0 / 360360.0, FalseDiscovery.harmonic(15), 1e-15);
        assertEquals(1.0, FalseDiscovery.harmonic(1), 0.0);
    }

    /**
     * BY on the Benjamini & Hochberg (1995) section-4 example at q = 0.05, by hand: q/c(15) =
     * 0.015068, so i·0.015068/15 = 0.0010045 i; i = 3: 0.0030 ≥ 0.0019 (reject), i = 4: 0.0040 &lt;
     * 0.0095, no larger i passes; three rejections where BH makes four.
     */
    @Test
    void paperExampleUnderBy() {
        double[] p = BenjaminiHochbergTest.NEUHAUS;
        assertEquals(0.0019, FalseDiscovery.BY.threshold(p, 0.05), 0.0);
        assertEquals(0.0095, FalseDiscovery.BH.threshold(p, 0.05), 0.0);
    }

    /**
     * Property over 400 seeded random p-value sets (mixtures of uniform nulls and small
     * alternatives, m from 1 to 300): BY never rejects more than BH, and its q-values are never
     * smaller (Benjamini & Yekutieli 2001: BY is BH at q / c(m), c(m) ≥ 1). Rejection at q is
     * exactly q-value ≤ q for both.
     */
    @Test
    void byIsNeverLessConservativeThanBh() {
        SplittableRandom rnd = new SplittableRandom(2001);
        for (int set = 0; set < 400; set++) {
            int m = 1 + rnd.nextInt(300);
            double alt = rnd.nextDouble();
            double[] p = new double[m];
            for (int i = 0; i < m; i++) {
                p[i] = rnd.nextDouble() < alt ? Math.pow(rnd.nextDouble(), 6) : rnd.nextDouble();
            }
            double[] sorted = p.clone();
            Arrays.sort(sorted);
            double q = 0.01 + 0.2 * rnd.nextDouble();
            double tBh = FalseDiscovery.BH.threshold(sorted, q), tBy = FalseDiscovery.BY.threshold(sorted, q);
            assertTrue(tBy <= tBh, "set " + set);
            double[] qBh = FalseDiscovery.BH.qValues(p), qBy = FalseDiscovery.BY.qValues(p);
            for (int i = 0; i < m; i++) {
                assertTrue(qBy[i] >= qBh[i], "set " + set + " cell " + i);
                assertEquals(p[i] <= tBh, qBh[i] <= q, "BH set " + set + " cell " + i);
                assertEquals(p[i] <= tBy, qBy[i] <= q, "BY set " + set + " cell " + i);
            }
        }
    }

    /** q-values by hand from the definition: p = (0.01, 0.04, 0.03), m = 3 → BH (0.03, 0.04, 0.04). */
    @Test
    void qValuesByHand() {
        double[] q = FalseDiscovery.BH.qValues(new double[] {0.01, 0.04, 0.03, Double.NaN});
        assertEquals(0.03, q[0], 1e-15);
        assertEquals(0.04, q[1], 1e-15);
        assertEquals(0.04, q[2], 1e-15);
        assertTrue(Double.isNaN(q[3]));
    }
}
