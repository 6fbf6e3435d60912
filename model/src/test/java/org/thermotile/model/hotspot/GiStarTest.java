package org.thermotile.model.hotspot;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.Random;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.junit.jupiter.api.Test;
import org.thermotile.model.hotspot.DistanceBand.Weights;

/**
 * Gi* against a straightforward O(n²) implementation written here from the definition (Getis &
 * Ord 1992; standardised form of Ord & Getis 1995, written from memory):
 * Gi* = (Σ_j w_ij x_j − x̄ Σ_j w_ij) / (S √((n Σ_j w_ij² − (Σ_j w_ij)²)/(n − 1))),
 * x̄ = Σx/n, S² = Σx²/n − x̄², j over every valid cell with d_ij ≤ D, j = i included.
 */
class GiStarTest {

    static final int W = 40, H = 30;
    static final double A = 2.0, B = 3.0;       // cells 2 m wide, 3 m high: anisotropic on purpose
    /** 7.3 m: no centre distance √((2Δc)² + (3Δr)²) lies near it (d² is an integer, 7.3² = 53.29). */
    static final double D = 7.3;

    /** Seeded random field with structure, a rectangular hole and scattered no-data cells. */
    static double[] field(long seed) {
        Random rnd = new Random(seed);
        double[] x = new double[W * H];
        for (int r = 0; r < H; r++) {
            for (int c = 0; c < W; c++) {
                double v = 30 + 4 * Math.sin(c / 6.0) * Math.cos(r / 5.0) + rnd.nextGaussian();
                boolean hole = (c >= 12 && c < 17 && r >= 8 && r < 12) || rnd.nextDouble() < 0.08;
                x[r * W + c] = hole ? Double.NaN : v;
            }
        }
        return x;
    }

    /** The O(n²) reference: every pair of valid cells. */
    static double[] reference(double[] x, Weights weights) {
        int n = 0;
        double sum = 0, sum2 = 0;
        for (double v : x) {
            if (!Double.isNaN(v)) {
                n++;
                sum += v;
                sum2 += v * v;
            }
        }
        double mean = sum / n;
        double s = Math.sqrt(sum2 / n - mean * mean);
        double d0 = Math.min(A, B);
        double[] z = new double[x.length];
        for (int i = 0; i < x.length; i++) {
            if (Double.isNaN(x[i])) {
                z[i] = Double.NaN;
                continue;
            }
            double xi = (i % W + 0.5) * A, yi = (i / W + 0.5) * B;
            double swx = 0, sw = 0, sw2 = 0;
            for (int j = 0; j < x.length; j++) {
                if (Double.isNaN(x[j])) {
                    continue;
                }
                double dx = (j % W + 0.5) * A - xi, dy = (j / W + 0.5) * B - yi;
                double d = Math.sqrt(dx * dx + dy * dy);
                if (d > D) {
                    continue;
                }
                double w = weights == Weights.BINARY ? 1 : (j == i ? 1 : d0 / d);
                swx += w * x[j];
                sw += w;
                sw2 += w * w;
            }
            z[i] = (swx - mean * sw) / (s * Math.sqrt((n * sw2 - sw * sw) / (n - 1)));
        }
        return z;
    }

    /** Gi* of the whole grid as one core, the halo padded with NaN. */
    static double[] giStar(double[] x, DistanceBand band) {
        return tiled(x, band, W, H);
    }

    /** Gi* computed tile by tile, each with its own halo window. */
    static double[] tiled(double[] x, DistanceBand band, int tw, int th) {
        GlobalMoments g = new GlobalMoments();
        for (double v : x) {
            g.add(v);
        }
        int rc = band.radiusCols(), rr = band.radiusRows();
        double[] out = new double[x.length];
        for (int r0 = 0; r0 < H; r0 += th) {
            for (int c0 = 0; c0 < W; c0 += tw) {
                int cw = Math.min(tw, W - c0), ch = Math.min(th, H - r0);
                int ww = cw + 2 * rc, wh = ch + 2 * rr;
                double[] win = new double[ww * wh];
                for (int r = 0; r < wh; r++) {
                    for (int c = 0; c < ww; c++) {
                        int gr = r0 - rr + r, gc = c0 - rc + c;
                        boolean inside = gr >= 0 && gr < H && gc >= 0 && gc < W;
                        win[r * ww + c] = inside ? x[gr * W + gc] : Double.NaN;
                    }
                }
                double[] z = new double[cw * ch];
                GiStar.zScores(win, cw, ch, band, g, z);
                for (int r = 0; r < ch; r++) {
                    System.arraycopy(z, r * cw, out, (r0 + r) * W + c0, cw);
                }
            }
        }
        return out;
    }

    @ParameterizedTest
    @EnumSource(Weights.class)
    void equalsTheQuadraticReferenceTo1e9(Weights weights) {
        double[] x = field(20261202L);
        double[] ref = reference(x, weights);
        double[] z = giStar(x, DistanceBand.of(D, A, B, weights));
        int checked = 0;
        double maxAbs = 0;
        for (int i = 0; i < x.length; i++) {
            if (Double.isNaN(ref[i])) {
                assertTrue(Double.isNaN(z[i]), "no-data cell " + i + " has a z-score");
                continue;
            }
            assertEquals(ref[i], z[i], 1e-9, "cell " + i);
            maxAbs = Math.max(maxAbs, Math.abs(z[i]));
            checked++;
        }
        assertTrue(checked > 1000, "most cells are valid: " + checked);
        assertTrue(maxAbs > 3, "the structured field has strong hot and cold spots: max |z| " + maxAbs);
    }

    @ParameterizedTest
    @EnumSource(Weights.class)
    void tileSizesGiIdenticalBits(Weights weights) {
        double[] x = field(7L);
        DistanceBand band = DistanceBand.of(D, A, B, weights);
        double[] whole = giStar(x, band);
        assertArrayEquals(whole, tiled(x, band, 7, 5));
        assertArrayEquals(whole, tiled(x, band, 16, 16));
        assertArrayEquals(whole, tiled(x, band, 1, 30));
    }

    @Test
    void uniformFieldHasZeroEverywhere() {
        double[] x = field(3L);
        for (int i = 0; i < x.length; i++) {
            if (!Double.isNaN(x[i])) {
                x[i] = 31.7;
            }
        }
        double[] z = giStar(x, DistanceBand.of(D, A, B, Weights.BINARY));
        for (int i = 0; i < x.length; i++) {
            if (!Double.isNaN(x[i])) {
                assertEquals(0.0, z[i], "cell " + i);
            }
        }
    }

    @Test
    void bandHoldsTheCellsWithinTheDistance() {
        // 1 m cells, D = 1.5 m: the cell, 4 edge neighbours (1 m) and 4 diagonal ones (√2 m).
        DistanceBand b = DistanceBand.of(1.5, 1, 1, Weights.INVERSE_DISTANCE);
        assertEquals(9, b.size());
        assertEquals(1, b.radiusCols());
        double sum = 0;
        for (int k = 0; k < b.size(); k++) {
            sum += b.weight(k);
        }
        assertEquals(1 + 4 * 1 + 4 / Math.sqrt(2), sum, 1e-12);
        // A neighbour exactly on the band edge is in: D = 2 m holds (±2, 0) and (0, ±2).
        assertEquals(13, DistanceBand.of(2, 1, 1, Weights.BINARY).size());
    }

    @Test
    void distanceSmallerThanOneCellIsRefused() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> DistanceBand.of(4, 5, 5, Weights.BINARY));
        assertTrue(e.getMessage().contains("smaller than one cell"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> DistanceBand.of(Double.NaN, 5, 5, Weights.BINARY));
    }

    /** Welford + Chan et al. merging against the plain two-pass mean and S. */
    @Test
    void mergedMomentsMatchTwoPass() {
        double[] x = field(11L);
        GlobalMoments all = new GlobalMoments();
        GlobalMoments[] parts = {new GlobalMoments(), new GlobalMoments(), new GlobalMoments()};
        for (int i = 0; i < x.length; i++) {
            parts[i * 3 / x.length].add(x[i]);
        }
        for (GlobalMoments p : parts) {
            all.merge(p);
        }
        double[] v = Arrays.stream(x).filter(d -> !Double.isNaN(d)).toArray();
        double mean = Arrays.stream(v).average().orElseThrow();
        double ss = Arrays.stream(v).map(d -> (d - mean) * (d - mean)).sum();
        assertEquals(v.length, all.count());
        assertEquals(mean, all.mean(), 1e-12);
        assertEquals(Math.sqrt(ss / v.length), all.sd(), 1e-12);
        assertFalse(all.sd() == 0);
    }
}
