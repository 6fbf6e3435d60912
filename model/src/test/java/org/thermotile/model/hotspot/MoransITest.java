package org.thermotile.model.hotspot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class MoransITest {

    /**
     * Analytic: on a checkerboard of ±1 with rook neighbours (band = one cell) every neighbour
     * pair has z_i z_j = −1 and z_i² = 1, so I = (n/S₀)·(−S₀)/n = −1 exactly (Moran 1950's
     * perfect negative association).
     */
    @Test
    void checkerboardIsMinusOne() {
        int w = 8, h = 6;
        double[] v = new double[w * h];
        for (int r = 0; r < h; r++) {
            for (int c = 0; c < w; c++) {
                v[r * w + c] = (r + c) % 2 == 0 ? 1 : -1;
            }
        }
        MoransI.Result r = MoransI.of(v, w, h, 10, 10, 10);
        assertEquals(-1.0, r.i(), 1e-12);
        assertEquals(-1.0 / 47, r.expected(), 1e-15);
        assertTrue(r.z() < -5, "z " + r.z());
    }

    /**
     * E[I] and Var[I] of Cliff & Ord (1981) against the permutation distribution of a normal
     * field (for normal data the randomisation and normality variances agree to O(1/n); Cliff &
     * Ord 1981 ch. 1). 2000 seeded permutations on 12 × 12 cells: the mean of I within 4 standard
     * errors of E[I], the sample variance within 15 % of Var[I] (sampling error of a variance
     * from 2000 draws ≈ 3 %, plus the O(1/n) difference).
     */
    @Test
    void expectationAndVarianceAgreeWithPermutations() {
        SplittableRandom rnd = new SplittableRandom(1981);
        int w = 12, h = 12, n = w * h;
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            v[i] = normal(rnd);
        }
        MoransI.Result ref = MoransI.of(v, w, h, 1, 1, 1.5);
        int perms = 2000;
        double s = 0, s2 = 0;
        for (int k = 0; k < perms; k++) {
            for (int i = n - 1; i > 0; i--) {
                int j = rnd.nextInt(i + 1);
                double t = v[i];
                v[i] = v[j];
                v[j] = t;
            }
            double i = MoransI.of(v, w, h, 1, 1, 1.5).i();
            s += i;
            s2 += i * i;
        }
        double mean = s / perms, var = s2 / perms - mean * mean;
        assertEquals(ref.expected(), mean, 4 * Math.sqrt(ref.variance() / perms));
        assertEquals(ref.variance(), var, 0.15 * ref.variance());
    }

    /**
     * A field with a known correlation range: a mosaic of independent N(0, 1) square patches of
     * L = 5 cells, plus N(0, 0.3²) noise. Cells closer than L are often in the same patch (ρ up to
     * 1/(1 + 0.09)), cells farther than √2 L never are (ρ = 0). The z-score of I peaks where the
     * band still lies mostly within patches: we accept a peak between L/2 and 2L (our tolerance;
     * z keeps growing with the number of pairs while ρ > 0 and falls once the band holds mostly
     * uncorrelated pairs).
     */
    @Test
    void peakDistanceFollowsTheCorrelationRange() {
        SplittableRandom rnd = new SplittableRandom(5);
        int w = 60, h = 60, patch = 5;
        double[] level = new double[(w / patch) * (h / patch)];
        for (int i = 0; i < level.length; i++) {
            level[i] = normal(rnd);
        }
        double[] v = new double[w * h];
        for (int r = 0; r < h; r++) {
            for (int c = 0; c < w; c++) {
                v[r * w + c] = level[(r / patch) * (w / patch) + c / patch] + 0.3 * normal(rnd);
            }
        }
        MoransI.Result[] scan = MoransI.scan(v, w, h, 1.0, 15);
        double peak = MoransI.peak(scan);
        assertTrue(peak >= patch / 2.0 && peak <= 2.0 * patch, "peak at " + peak + " cells");
        assertTrue(scan[0].z() > 10, "neighbours within a patch are correlated: z " + scan[0].z());
        assertTrue(scan[14].z() < scan[(int) peak - 1].z());
    }

    private static double normal(SplittableRandom r) {
        return Math.sqrt(-2 * Math.log(1 - r.nextDouble())) * Math.cos(2 * Math.PI * r.nextDouble());
    }
}
