package org.thermotile.model.observe;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.apache.commons.math3.stat.correlation.PearsonsCorrelation;
import org.junit.jupiter.api.Test;

class AgreementTest {
    /** Hand-computed: s = {1,2,3,4}, o = {2,2,2,6}: d = {−1,0,1,−2}: bias −0.5, RMSE √1.5, MAE 1. */
    @Test
    void smallSetByHand() {
        Agreement a = new Agreement();
        double[] s = {1, 2, 3, 4};
        double[] o = {2, 2, 2, 6};
        for (int i = 0; i < 4; i++) {
            a.add(s[i], o[i]);
        }
        a.add(Double.NaN, 3); // skipped
        assertEquals(4, a.count());
        assertEquals(-0.5, a.bias(), 1e-15);
        assertEquals(Math.sqrt(1.5), a.rmse(), 1e-15);
        assertEquals(1.0, a.mae(), 1e-15);
        // r by hand: s̄ = 2.5, ō = 3; Σ(s−s̄)(o−ō) = (−1.5)(−1)+(−.5)(−1)+(.5)(−1)+(1.5)(3) = 6;
        // Σ(s−s̄)² = 5, Σ(o−ō)² = 12 → r = 6/√60
        assertEquals(6 / Math.sqrt(60), a.pearson(), 1e-14);
    }

    /** Merging partial accumulators equals one pass; r equals commons-math PearsonsCorrelation. */
    @Test
    void mergeEqualsOnePassAndPearsonMatchesCommonsMath() {
        Random rnd = new Random(7);
        int n = 1000;
        double[] s = new double[n];
        double[] o = new double[n];
        Agreement whole = new Agreement();
        Agreement[] parts = {new Agreement(), new Agreement(), new Agreement()};
        for (int i = 0; i < n; i++) {
            o[i] = 300 + 10 * rnd.nextGaussian();
            s[i] = o[i] + 0.7 + rnd.nextGaussian();
            whole.add(s[i], o[i]);
            parts[i % 7 == 0 ? 0 : (i < 600 ? 1 : 2)].add(s[i], o[i]);
        }
        Agreement merged = new Agreement().merge(parts[0]).merge(parts[1]).merge(parts[2]);
        assertEquals(whole.count(), merged.count());
        assertEquals(whole.bias(), merged.bias(), 1e-12);
        assertEquals(whole.rmse(), merged.rmse(), 1e-12);
        assertEquals(whole.mae(), merged.mae(), 1e-12);
        double ref = new PearsonsCorrelation().correlation(s, o);
        assertEquals(ref, whole.pearson(), 1e-12);
        assertEquals(ref, merged.pearson(), 1e-12);
        assertTrue(Double.isNaN(new Agreement().rmse()));
    }
}
