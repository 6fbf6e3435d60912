package org.thermotile.model.hotspot;

import java.util.Arrays;

/**
 * False-discovery-rate control over m tests: Benjamini–Hochberg (BH) or Benjamini–Yekutieli (BY),
 * as thresholds and as adjusted p-values (q-values).
 *
 * <ul>
 *   <li>BH (Benjamini & Hochberg 1995, J. R. Statist. Soc. B 57(1) 289–300): reject p₍₁₎ … p₍ₖ₎
 *       with k the largest i such that p₍ᵢ₎ ≤ (i/m)·q ({@link BenjaminiHochberg}). Valid for
 *       independent tests and under positive regression dependency (Benjamini & Yekutieli 2001).</li>
 *   <li>BY (Benjamini & Yekutieli 2001, "The control of the false discovery rate in multiple
 *       testing under dependency", Ann. Statist. 29(4) 1165–1188, theorem 1.3): BH at level
 *       q / c(m), c(m) = Σ_{i=1}^{m} 1/i, which controls the FDR at q under any dependence — the
 *       case of overlapping Gi* neighbourhoods.</li>
 * </ul>
 * The adjusted p-value of the i-th smallest p is
 * <pre>  q₍ᵢ₎ = min(1, min_{j ≥ i} c · m · p₍ⱼ₎ / j),   c = 1 (BH) or c(m) (BY)</pre>
 * so a test is rejected at level q exactly when its q-value ≤ q (Benjamini & Hochberg 1995,
 * section 3; the adjusted form as in Yekutieli & Benjamini 1999, J. Statist. Plann. Inference 82).
 */
public enum FalseDiscovery {
    /** Benjamini–Hochberg 1995. */
    BH("bh"),
    /** Benjamini–Yekutieli 2001. */
    BY("by");

    private final String key;

    FalseDiscovery(String key) {
        this.key = key;
    }

    /** The name users write ("bh", "by"). */
    public String key() {
        return key;
    }

    /** The method of a user's name, or null. */
    public static FalseDiscovery ofKey(String key) {
        for (FalseDiscovery f : values()) {
            if (f.key.equals(key)) {
                return f;
            }
        }
        return null;
    }

    /** c(m) = Σ_{i=1}^{m} 1/i, the harmonic number (1 for m = 0). */
    public static double harmonic(int m) {
        double s = 0;
        for (int i = m; i >= 1; i--) {
            s += 1.0 / i;                 // smallest terms first
        }
        return m == 0 ? 1 : s;
    }

    /** The factor c: 1 for BH, c(m) for BY. */
    public double factor(int m) {
        return this == BH ? 1.0 : harmonic(m);
    }

    /**
     * The rejection threshold at level q over sorted p-values: a test is rejected when its p ≤ the
     * threshold; {@link BenjaminiHochberg#NONE} when nothing is rejected.
     */
    public double threshold(double[] sortedP, double q) {
        return BenjaminiHochberg.threshold(sortedP, q / factor(sortedP.length));
    }

    /**
     * The q-values of {@code p} (NaN stays NaN; m counts the valid p-values), same order as given.
     */
    public double[] qValues(double[] p) {
        int m = 0;
        for (double v : p) {
            if (!Double.isNaN(v)) {
                m++;
            }
        }
        Integer[] idx = new Integer[m];
        int k = 0;
        for (int i = 0; i < p.length; i++) {
            if (!Double.isNaN(p[i])) {
                idx[k++] = i;
            }
        }
        Arrays.sort(idx, (a, b) -> {
            int c = Double.compare(p[a], p[b]);
            return c != 0 ? c : Integer.compare(a, b);
        });
        double c = factor(m);
        double[] q = new double[p.length];
        Arrays.fill(q, Double.NaN);
        double running = 1.0;
        for (int j = m; j >= 1; j--) {
            int i = idx[j - 1];
            running = Math.min(running, c * m * p[i] / j);
            q[i] = running;
        }
        return q;
    }
}
