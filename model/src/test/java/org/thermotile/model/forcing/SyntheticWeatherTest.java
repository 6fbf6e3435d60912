package org.thermotile.model.forcing;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.LocalDate;
import org.junit.jupiter.api.Test;
import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.constants.Physical;

class SyntheticWeatherTest {
    private static final Site SITE = new Site(47.3, 8.6, 420.0);

    /**
     * Diurnal cycle (common practice: minimum at sunrise, maximum at 14:00 solar time): the hourly
     * series stays within [Tmin, Tmax], is coldest at the hour nearest sunrise (about 04:40 on a
     * UTC+1 clock at 47.3° N, 8.6° E in mid-July: solar noon ≈ 12:25, day ≈ 15.5 h) and warmest at
     * 14:00 or 15:00 (14:00 solar ≈ 14:25 on that clock).
     */
    @Test
    void diurnalTemperatureShape() {
        HourlyWeather w = SyntheticWeather.clearSky(SITE, SyntheticWeather.Spec.withRelativeHumidity(
                LocalDate.of(2025, 7, 15), 3, 3600, 17.0, 31.0, 0.5, 2.0));
        double lo = 17.0 + Physical.ZERO_CELSIUS_K;
        double hi = 31.0 + Physical.ZERO_CELSIUS_K;
        int coldest = 24;
        int warmest = 24;
        for (int h = 24; h < 48; h++) {
            assertTrue(w.airTempK[h] >= lo - 1e-9 && w.airTempK[h] <= hi + 1e-9);
            if (w.airTempK[h] < w.airTempK[coldest]) {
                coldest = h;
            }
            if (w.airTempK[h] > w.airTempK[warmest]) {
                warmest = h;
            }
        }
        int coldLocal = coldest - 24;
        int warmLocal = warmest - 24;
        assertTrue(coldLocal >= 4 && coldLocal <= 5, "coldest local hour " + coldLocal);
        assertTrue(warmLocal >= 14 && warmLocal <= 15, "warmest local hour " + warmLocal);
        // The extremes are nearly reached on the hour (within the cosine's curvature over ±30 min).
        assertTrue(w.airTempK[coldest] - lo < 0.2);
        assertTrue(hi - w.airTempK[warmest] < 0.2);
        // Days repeat: same hour on day 2 and day 3.
        assertEquals(w.airTempK[30], w.airTempK[54], 0.05);
        // Continuous, also across midnight: no hourly step above the half-cosine's steepest slope,
        // 14 K × π / (2 × 9.75 h) = 2.26 K/h on the morning rise (04:40 → 14:25).
        for (int h = 1; h < w.hours(); h++) {
            assertTrue(Math.abs(w.airTempK[h] - w.airTempK[h - 1]) < 2.3, "step at hour " + h);
        }
    }

    /** A constant dew point gives RH = e_w(T_d)/e_w(T): 1 at T = T_d, lower in the afternoon. */
    @Test
    void dewPointHumidity() {
        HourlyWeather w = SyntheticWeather.clearSky(SITE, SyntheticWeather.Spec.withDewPoint(
                LocalDate.of(2025, 7, 15), 1, 3600, 17.0, 31.0, 14.0, 2.0));
        for (int h = 0; h < 24; h++) {
            double expected = Psychrometrics.saturationVapourPressurePa(14.0 + Physical.ZERO_CELSIUS_K)
                    / Psychrometrics.saturationVapourPressurePa(w.airTempK[h]);
            assertEquals(expected, w.relHumidity[h], 1e-12);
            assertTrue(w.relHumidity[h] <= 1.0);
        }
        assertEquals(1.0, SyntheticWeather.clearSky(SITE, SyntheticWeather.Spec.withDewPoint(
                LocalDate.of(2025, 7, 15), 1, 3600, 10.0, 20.0, 25.0, 2.0)).relHumidity[3], 0.0);
    }

    /** Polar night and midnight sun still give a full, finite series. */
    @Test
    void polarDaysWork() {
        Site arctic = new Site(78.2, 15.6, 10.0);
        for (LocalDate d : new LocalDate[] {LocalDate.of(2025, 1, 10), LocalDate.of(2025, 6, 21)}) {
            Forcing f = ForcingPreparer.prepare(SyntheticWeather.clearSky(arctic,
                    SyntheticWeather.Spec.withRelativeHumidity(d, 2, 3600, -5.0, 3.0, 0.8, 4.0)), arctic);
            assertEquals(48, f.hours());
        }
    }

    @Test
    void rejectsBadSpecs() {
        LocalDate d = LocalDate.of(2025, 7, 15);
        assertThrows(IllegalArgumentException.class,
                () -> SyntheticWeather.Spec.withRelativeHumidity(d, 1, 0, 30, 20, 0.5, 2));
        assertThrows(IllegalArgumentException.class,
                () -> SyntheticWeather.Spec.withRelativeHumidity(d, 1, 0, 20, 30, 50, 2));
        assertThrows(IllegalArgumentException.class, () -> new SyntheticWeather.Spec(d, 1, 0, 20, 30,
                0.5, 10, 2, org.thermotile.model.sun.ClearSky.DEFAULT));
        assertThrows(IllegalArgumentException.class,
                () -> SyntheticWeather.Spec.withRelativeHumidity(d, 0, 0, 20, 30, 0.5, 2));
    }
}
