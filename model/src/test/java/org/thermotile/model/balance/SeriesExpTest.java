package org.thermotile.model.balance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * The kernel's series exponential against the JDK's {@link Math#exp} (itself within 1 ulp of
 * e^x by its specification, Java SE API, java.lang.Math) over the Magnus exponent's range.
 */
class SeriesExpTest {

    @Test
    void withinFourTimesTenToTheMinusFifteenOfMathExpOverTheRange() {
        double worst = 0;
        int n = 2_000_001;
        for (int i = 0; i < n; i++) {
            double x = -SeriesExp.MAX_ABS_X + 2 * SeriesExp.MAX_ABS_X * i / (n - 1);
            double ref = Math.exp(x);
            worst = Math.max(worst, Math.abs(SeriesExp.exp(x) - ref) / ref);
        }
        assertTrue(worst < 4e-15, "largest relative error " + worst);
        assertTrue(worst > 0, "a different computation, so not every value is the JDK's");
    }

    @Test
    void exactPointsAndTheMagnusRange() {
        assertEquals(1.0, SeriesExp.exp(0.0), 0.0);
        // e by its decimal expansion (to 17 digits).
        assertEquals(2.7182818284590452, SeriesExp.exp(1.0), 4e-15 * 2.72);
        // The Magnus exponent b t / (c + t) at the clamp edges −60 °C and 80 °C (WMO-No. 8, 2018,
        // Annex 4.B coefficients) lies inside the range the error is stated for.
        double low = 17.62 * -60 / (243.12 - 60);
        double high = 17.62 * 80 / (243.12 + 80);
        assertTrue(Math.abs(low) <= SeriesExp.MAX_ABS_X && Math.abs(high) <= SeriesExp.MAX_ABS_X,
                low + ", " + high);
    }
}
