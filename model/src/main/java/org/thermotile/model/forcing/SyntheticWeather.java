package org.thermotile.model.forcing;

import java.time.LocalDate;
import java.time.ZoneOffset;
import java.util.Objects;
import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.sun.ClearSky;
import org.thermotile.model.sun.Extraterrestrial;
import org.thermotile.model.sun.SolarPosition;

/**
 * Clear-sky synthetic weather: a run of identical cloudless days for tests, demos and rating-style
 * runs when no weather file is at hand.
 *
 * <ul>
 * <li>Irradiance: GHI, DNI and DHI from the Bird &amp; Hulstrom (1981) clear-sky model
 *     ({@link ClearSky#bird}) with the SPA sun position and E₀ₙ = S/R² (R the SPA radius vector).</li>
 * <li>Air temperature: the daily minimum at sunrise and the maximum at 14:00 mean solar time
 *     (solar noon taken as 12:00 − longitude/15° h UTC, the equation of time, at most ±16 min,
 *     neglected), joined by half-cosines: between two extremes (t_a, T_a) and (t_b, T_b),
 *     T(t) = T_a + (T_b − T_a)·(1 − cos(π (t − t_a)/(t_b − t_a)))/2 (common practice). Sunrise is
 *     where the SPA refraction-corrected zenith crosses 90°; on days without sunrise or sunset
 *     (polar day or night) the minimum is put at 06:00 mean solar time.</li>
 * <li>Humidity: a constant relative humidity, or a constant dew point (RH = e_w(T_d)/e_w(T), capped
 *     at 1; Magnus form, {@link Psychrometrics}).</li>
 * <li>Wind: constant. Pressure: ICAO standard atmosphere at the site elevation. Cloud fraction 0;
 *     sky longwave left empty for {@link ForcingPreparer} to estimate.</li>
 * </ul>
 * Time stamps are on the local clock's hours, from local midnight of the start date.
 */
public final class SyntheticWeather {
    private SyntheticWeather() {}

    /** Hour of the daily maximum [h, mean solar time] (common practice: mid-afternoon). */
    public static final double MAX_TEMP_SOLAR_HOUR = 14.0;
    /** Hour of the daily minimum [h, mean solar time] on days without a sunrise. */
    public static final double NO_SUNRISE_MIN_TEMP_SOLAR_HOUR = 6.0;

    /**
     * What to generate. Give either {@code relHumidity} or {@code dewPointC}, the other NaN.
     *
     * @param startDate        first local date
     * @param days             number of days, 1…3660
     * @param utcOffsetSeconds local clock offset from UTC [s], −18 h…+18 h
     * @param minAirTempC      daily minimum air temperature [°C]
     * @param maxAirTempC      daily maximum air temperature [°C], ≥ minimum
     * @param relHumidity      constant relative humidity [0…1], or NaN
     * @param dewPointC        constant dew point [°C], or NaN
     * @param windMs           constant wind speed [m s⁻¹], ≥ 0
     * @param atmosphere       clear-sky atmosphere ({@link ClearSky#DEFAULT} for a typical clean sky)
     */
    public record Spec(LocalDate startDate, int days, int utcOffsetSeconds, double minAirTempC,
            double maxAirTempC, double relHumidity, double dewPointC, double windMs,
            ClearSky.Atmosphere atmosphere) {
        public Spec {
            Objects.requireNonNull(startDate, "startDate");
            Objects.requireNonNull(atmosphere, "atmosphere");
            if (days < 1 || days > 3660) {
                throw new IllegalArgumentException("synthetic weather: days = " + days + " must be 1…3660");
            }
            if (Math.abs(utcOffsetSeconds) > 18 * 3600) {
                throw new IllegalArgumentException("synthetic weather: UTC offset " + utcOffsetSeconds
                        + " s is outside ±18 h");
            }
            if (!(minAirTempC >= -80 && maxAirTempC <= 60 && minAirTempC <= maxAirTempC)) {
                throw new IllegalArgumentException("synthetic weather: daily minimum " + minAirTempC
                        + " °C and maximum " + maxAirTempC + " °C must satisfy −80 ≤ min ≤ max ≤ 60 °C");
            }
            boolean hasRh = !Double.isNaN(relHumidity);
            boolean hasDew = !Double.isNaN(dewPointC);
            if (hasRh == hasDew) {
                throw new IllegalArgumentException("synthetic weather: give either a relative humidity "
                        + "or a dew point (the other NaN), got " + relHumidity + " and " + dewPointC + " °C");
            }
            if (hasRh && !(relHumidity >= 0 && relHumidity <= 1)) {
                throw new IllegalArgumentException("synthetic weather: relative humidity " + relHumidity
                        + " must be a fraction 0…1");
            }
            if (hasDew && !(dewPointC >= -80 && dewPointC <= 40)) {
                throw new IllegalArgumentException("synthetic weather: dew point " + dewPointC
                        + " °C is outside −80…40 °C");
            }
            if (!(windMs >= 0 && windMs < 100)) {
                throw new IllegalArgumentException("synthetic weather: wind " + windMs + " m/s must be 0…100");
            }
        }

        /** A spec with constant relative humidity and the default clear-sky atmosphere. */
        public static Spec withRelativeHumidity(LocalDate startDate, int days, int utcOffsetSeconds,
                double minAirTempC, double maxAirTempC, double relHumidity, double windMs) {
            return new Spec(startDate, days, utcOffsetSeconds, minAirTempC, maxAirTempC, relHumidity,
                    Double.NaN, windMs, ClearSky.DEFAULT);
        }

        /** A spec with constant dew point and the default clear-sky atmosphere. */
        public static Spec withDewPoint(LocalDate startDate, int days, int utcOffsetSeconds,
                double minAirTempC, double maxAirTempC, double dewPointC, double windMs) {
            return new Spec(startDate, days, utcOffsetSeconds, minAirTempC, maxAirTempC, Double.NaN,
                    dewPointC, windMs, ClearSky.DEFAULT);
        }
    }

    /**
     * Generates {@code 24 × days} hours of clear-sky weather at {@code site} (see the class comment).
     *
     * @return hourly weather in SI units, DNI and DHI filled, sky longwave NaN, cloud fraction 0
     */
    public static HourlyWeather clearSky(Site site, Spec spec) {
        int n = 24 * spec.days();
        long start = spec.startDate().atStartOfDay().toEpochSecond(ZoneOffset.ofTotalSeconds(spec.utcOffsetSeconds()));
        double pressurePa = Psychrometrics.standardPressurePa(site.elevationM());
        double meanTempK = Physical.ZERO_CELSIUS_K + 0.5 * (spec.minAirTempC() + spec.maxAirTempC());

        // Temperature anchors: (sunrise, Tmin) and (14:00 solar, Tmax) of each day from the day
        // before the first to the day after the last.
        int anchorDays = spec.days() + 2;
        double[] anchorT = new double[2 * anchorDays];
        double[] anchorTempK = new double[2 * anchorDays];
        double tMinK = spec.minAirTempC() + Physical.ZERO_CELSIUS_K;
        double tMaxK = spec.maxAirTempC() + Physical.ZERO_CELSIUS_K;
        double[] sun = new double[3];
        for (int d = 0; d < anchorDays; d++) {
            LocalDate date = spec.startDate().plusDays(d - 1L);
            double noon = date.atStartOfDay().toEpochSecond(ZoneOffset.UTC) + 43_200.0
                    - site.longitudeDeg() * 240.0;
            anchorT[2 * d] = sunrise(site, noon, pressurePa, meanTempK, sun);
            anchorTempK[2 * d] = tMinK;
            anchorT[2 * d + 1] = noon + (MAX_TEMP_SOLAR_HOUR - 12.0) * 3600.0;
            anchorTempK[2 * d + 1] = tMaxK;
        }

        long[] epoch = new long[n];
        double[] temp = new double[n];
        double[] rh = new double[n];
        double[] wind = new double[n];
        double[] ghi = new double[n];
        double[] dni = new double[n];
        double[] dhi = new double[n];
        double[] pressure = new double[n];
        double[] cloud = new double[n];
        double[] clear = new double[3];
        int k = 0;
        for (int h = 0; h < n; h++) {
            long t = start + 3600L * h;
            epoch[h] = t;
            while (k + 2 < anchorT.length && anchorT[k + 1] <= t) {
                k++;
            }
            double s = (t - anchorT[k]) / (anchorT[k + 1] - anchorT[k]);
            s = Math.max(0.0, Math.min(1.0, s));
            temp[h] = anchorTempK[k] + (anchorTempK[k + 1] - anchorTempK[k]) * 0.5 * (1.0 - Math.cos(Math.PI * s));
            rh[h] = Double.isNaN(spec.relHumidity())
                    ? Math.min(1.0, Psychrometrics.saturationVapourPressurePa(spec.dewPointC() + Physical.ZERO_CELSIUS_K)
                            / Psychrometrics.saturationVapourPressurePa(temp[h]))
                    : spec.relHumidity();
            wind[h] = spec.windMs();
            pressure[h] = pressurePa;
            SolarPosition.compute(t, site.latitudeDeg(), site.longitudeDeg(), site.elevationM(), pressurePa,
                    temp[h], SolarPosition.DEFAULT_DELTA_T_S, sun);
            double e0n = Extraterrestrial.normalIrradianceFromRadiusWm2(sun[SolarPosition.RADIUS]);
            ClearSky.bird(sun[SolarPosition.ZENITH], e0n, pressurePa, spec.atmosphere(), clear);
            ghi[h] = clear[ClearSky.GHI];
            dni[h] = clear[ClearSky.DNI];
            dhi[h] = clear[ClearSky.DHI];
            cloud[h] = 0.0;
        }
        return new HourlyWeather(epoch, spec.utcOffsetSeconds(), temp, rh, wind, ghi, dni, dhi,
                HourlyWeather.absent(n), cloud, pressure);
    }

    /**
     * Sunrise [s since epoch] before the solar noon {@code noon}: where the SPA zenith crosses 90°,
     * found by bisection to 1 s on [noon − 12 h, noon]; without a crossing (polar day or night),
     * {@link #NO_SUNRISE_MIN_TEMP_SOLAR_HOUR} mean solar time.
     */
    static double sunrise(Site site, double noon, double pressurePa, double tempK, double[] sun) {
        double lo = noon - 43_200.0;
        double hi = noon;
        if (zenith(site, lo, pressurePa, tempK, sun) < 90.0 || zenith(site, hi, pressurePa, tempK, sun) >= 90.0) {
            return noon - (12.0 - NO_SUNRISE_MIN_TEMP_SOLAR_HOUR) * 3600.0;
        }
        while (hi - lo > 1.0) {
            double mid = 0.5 * (lo + hi);
            if (zenith(site, mid, pressurePa, tempK, sun) >= 90.0) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return 0.5 * (lo + hi);
    }

    private static double zenith(Site site, double t, double pressurePa, double tempK, double[] sun) {
        SolarPosition.compute(t, site.latitudeDeg(), site.longitudeDeg(), site.elevationM(), pressurePa,
                tempK, SolarPosition.DEFAULT_DELTA_T_S, sun);
        return sun[SolarPosition.ZENITH];
    }
}
