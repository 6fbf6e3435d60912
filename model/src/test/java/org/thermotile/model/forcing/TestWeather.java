package org.thermotile.model.forcing;

import java.time.LocalDate;

/**
 * The tests' invented weather: clear July days at an invented site at 45.3° N, 9.9° E, 100 m,
 * 2-hour weather rows from local midnight of 13 July 2026, air 20…34 °C, relative humidity 0.45,
 * wind 2 m/s. Not a place's climate: a fixed, reproducible forcing for comparisons.
 */
public final class TestWeather {
    private TestWeather() {}

    /** {@code days} clear July days, prepared for the kernel. */
    public static Forcing clearJuly(int days) {
        Site site = new Site(45.3, 9.9, 100);
        return ForcingPreparer.prepare(SyntheticWeather.clearSky(site,
                SyntheticWeather.Spec.withRelativeHumidity(LocalDate.of(2026, 7, 13), days, 7200, 20, 34, 0.45, 2.0)),
                site);
    }
}
