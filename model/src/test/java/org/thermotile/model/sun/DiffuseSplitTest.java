package org.thermotile.model.sun;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/** Erbs, Klein &amp; Duffie (1982), Solar Energy 28(4), 293–302, hourly correlation. */
class DiffuseSplitTest {

    /** The published pieces: 1 − 0.09 k_t up to 0.22, the quartic up to 0.80, 0.165 above. */
    @Test
    void publishedBreakpointsAndPieces() {
        assertEquals(1.0, DiffuseSplit.erbsDiffuseFraction(0.0), 0.0);
        assertEquals(1.0 - 0.09 * 0.22, DiffuseSplit.erbsDiffuseFraction(0.22), 1e-15);
        assertEquals(0.165, DiffuseSplit.erbsDiffuseFraction(0.8000001), 0.0);
        assertEquals(0.165, DiffuseSplit.erbsDiffuseFraction(0.95), 0.0);
        // Quartic at k_t = 0.5 by hand: 0.9511 − 0.0802 + 1.097 − 2.07975 + 0.771 = 0.65915.
        assertEquals(0.65915, DiffuseSplit.erbsDiffuseFraction(0.5), 1e-12);
    }

    /** The rounded published coefficients make the pieces meet within 0.001 at 0.22 and 0.80. */
    @Test
    void continuousAtBreakpointsWithinRounding() {
        double e = 1e-9;
        assertEquals(DiffuseSplit.erbsDiffuseFraction(0.22), DiffuseSplit.erbsDiffuseFraction(0.22 + e), 1e-3);
        assertEquals(DiffuseSplit.erbsDiffuseFraction(0.80), DiffuseSplit.erbsDiffuseFraction(0.80 + e), 1e-3);
        // and decreasing in k_t over the range the correlation was fitted (0…0.8)
        double prev = 2;
        for (double kt = 0; kt <= 0.8; kt += 0.01) {
            double kd = DiffuseSplit.erbsDiffuseFraction(kt);
            assertTrue(kd <= prev + 1e-3, "k_d rises at k_t = " + kt);
            prev = kd;
        }
    }

    /** Beam + diffuse = GHI always; all diffuse at low sun; implied DNI never above E₀ₙ. */
    @Test
    void splitConservesGlobal() {
        double[] out = new double[2];
        double e0n = 1361;
        for (double z = 0; z < 90; z += 1.5) {
            for (double ghi = 0; ghi <= 1200; ghi += 37) {
                DiffuseSplit.split(ghi, z, e0n, out);
                assertEquals(ghi, out[0] + out[1], 1e-9);
                assertTrue(out[0] >= 0 && out[1] >= 0);
                if (z > 87) {
                    assertEquals(0.0, out[0], 0.0);
                }
                assertTrue(out[0] <= e0n * Math.cos(Math.toRadians(z)) + 1e-9);
            }
        }
        DiffuseSplit.split(-3, 40, e0n, out);
        assertEquals(0.0, out[0] + out[1], 0.0);
        // k_t = 0.5 at zenith 60°: G = 0.5 × 1361 × 0.5 = 340.25, D = 0.65915 G
        DiffuseSplit.split(340.25, 60, e0n, out);
        assertEquals(0.65915 * 340.25, out[1], 1e-6);
    }
}
