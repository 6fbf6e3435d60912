package org.thermotile.model.balance;

import java.util.Arrays;
import java.util.function.IntToDoubleFunction;
import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.Site;

/** Hand-built forcings for kernel tests (fixtures, not physics references). */
final class TestForcings {
    private TestForcings() {}

    static final long START = 1_783_900_800L; // 2026-07-13T00:00Z

    /** Forcing with every series given per hour by a function of the hour index. */
    static Forcing of(int hours, IntToDoubleFunction airTempK, IntToDoubleFunction ghi,
            IntToDoubleFunction skyLw, double rh, double windMs) {
        long[] t = new long[hours];
        double[] ta = new double[hours], q = new double[hours], w = new double[hours],
                p = new double[hours], g = new double[hours], beam = new double[hours],
                dif = new double[hours], lw = new double[hours], zen = new double[hours],
                az = new double[hours];
        for (int h = 0; h < hours; h++) {
            t[h] = START + 3600L * h;
            ta[h] = airTempK.applyAsDouble(h);
            p[h] = 101_325;
            q[h] = Psychrometrics.specificHumidityFromRelative(ta[h], rh, p[h]);
            w[h] = windMs;
            g[h] = ghi.applyAsDouble(h);
            beam[h] = 0.8 * g[h];
            dif[h] = 0.2 * g[h];
            lw[h] = skyLw.applyAsDouble(h);
            int hod = h % 24;
            zen[h] = (hod >= 6 && hod < 18) ? 40 : 100;
            az[h] = 180;
        }
        return new Forcing(new Site(45, 7, 0), t, 0, ta, q, w, p, g, beam, dif, lw, zen, az);
    }

    /** A clear summer-like day repeated: air 20…32 °C, GHI half-sine peaking at 850 W m⁻². */
    static Forcing summerDays(int days) {
        return of(days * 24 + 1,
                h -> 299.15 + 6 * Math.sin(2 * Math.PI * ((h % 24) - 9) / 24.0),
                h -> {
                    double x = ((h % 24) - 6) / 12.0;
                    return x > 0 && x < 1 ? 850 * Math.sin(Math.PI * x) : 0;
                },
                h -> 360.0, 0.5, 2.0);
    }

    static double[] constant(int n, double v) {
        double[] a = new double[n];
        Arrays.fill(a, v);
        return a;
    }
}
