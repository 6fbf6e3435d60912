package org.thermotile.model.hotspot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class GiStarLocalMeanTest {

    /** The band's local mean against a direct O(n²) sum over all cell pairs (definition). */
    @Test
    void localMeanMatchesDirectSum() {
        SplittableRandom rnd = new SplittableRandom(3);
        int w = 9, h = 7;
        DistanceBand band = DistanceBand.of(2.5, 1, 1, DistanceBand.Weights.INVERSE_DISTANCE);
        int rc = band.radiusCols(), rr = band.radiusRows();
        int ww = w + 2 * rc, wh = h + 2 * rr;
        double[] win = new double[ww * wh];
        java.util.Arrays.fill(win, Double.NaN);
        double[] v = new double[w * h];
        GlobalMoments g = new GlobalMoments();
        for (int i = 0; i < v.length; i++) {
            v[i] = rnd.nextDouble() < 0.1 ? Double.NaN : rnd.nextDouble() * 10;
            win[(i / w + rr) * ww + i % w + rc] = v[i];
            g.add(v[i]);
        }
        double[] z = new double[w * h], m = new double[w * h];
        GiStar.zScores(win, w, h, band, g, z, m);
        for (int i = 0; i < v.length; i++) {
            if (Double.isNaN(v[i])) {
                assertTrue(Double.isNaN(m[i]));
                continue;
            }
            double sw = 0, swx = 0;
            for (int j = 0; j < v.length; j++) {
                double d = Math.hypot(i % w - j % w, i / w - j / w);
                if (Double.isNaN(v[j]) || d > 2.5) {
                    continue;
                }
                double wt = d == 0 ? 1 : 1 / d;
                sw += wt;
                swx += wt * v[j];
            }
            assertEquals(swx / sw, m[i], 1e-12);
        }
    }
}
