package org.thermotile.jobs.demo;

import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.ZoneOffset;
import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.HourlyWeather;
import org.thermotile.model.forcing.Site;
import org.thermotile.model.forcing.SyntheticWeather;

/**
 * The invented hot week of the demo city: clear-sky irradiance from
 * {@link SyntheticWeather#clearSky} (Bird &amp; Hulstrom 1981 with the SPA sun position), a daily
 * temperature cycle whose extremes rise through the week, and one cloudier afternoon.
 * Every number here is invented demo data, chosen to look like a summer heat wave at
 * mid-latitudes; none is measured.
 *
 * <p>Air temperature: the clear-sky generator's half-cosine daily cycle, run between 20 and 30 °C,
 * gives a shape s(t) = (T(t) − 20 °C)/(10 K) in [0, 1]; the demo temperature is
 * T(t) = T_min(t) + s(t)·(T_max(t) − T_min(t)) with T_max rising linearly from
 * {@value #MAX_FIRST_C} to {@value #MAX_LAST_C} °C and T_min from {@value #MIN_FIRST_C} to
 * {@value #MIN_LAST_C} °C between noon of the first and noon of the last day, so the curve stays
 * continuous across midnights. Humidity: a constant dew point of {@value #DEW_POINT_C} °C,
 * RH = min(1, e_w(T_d)/e_w(T)) (Magnus form, WMO-No. 8 2018, {@link Psychrometrics}). Wind:
 * 1.5 + 1.5·s(t) m s⁻¹ (calm nights, breezier afternoons).
 *
 * <p>The cloudier afternoon, {@link #CLOUDY_DAY} from 11:00 to 20:00 local time: a factor
 * f(h) = 1 − {@value #CLOUD_DEPTH}·sin²(π (h − 11)/9) of the local hour h scales global
 * irradiance by f and the beam by f² (clouds dim the beam more than the global light); the
 * diffuse part takes the rest, DHI = f·GHI − f²·DNI·cos θ, where DNI·cos θ = GHI − DHI of the
 * clear sky, so GHI = DNI·cos θ + DHI still holds. Cloud fraction there is 0.8·(1 − f)/{@value
 * #CLOUD_DEPTH}, 0 elsewhere.
 */
final class RiversideWeather {
    /** Local clock offset, central European summer time [s]. */
    static final int UTC_OFFSET_S = 2 * 3600;
    /** First day of the weather (spin-up starts here) and the number of hours. */
    static final LocalDate FIRST_DAY = LocalDate.of(2026, 7, 11);
    static final LocalDate LAST_DAY = LocalDate.of(2026, 7, 19);
    /** From FIRST_DAY 00:00 to the midnight after LAST_DAY, both included [h]. */
    static final int HOURS = 9 * 24 + 1;
    static final double MAX_FIRST_C = 31, MAX_LAST_C = 36;
    static final double MIN_FIRST_C = 19, MIN_LAST_C = 23;
    static final double DEW_POINT_C = 16;
    static final LocalDate CLOUDY_DAY = LocalDate.of(2026, 7, 15);
    static final double CLOUD_DEPTH = 0.55;

    private static final double SHAPE_MIN_C = 20, SHAPE_MAX_C = 30;

    private RiversideWeather() { }

    /** The demo week at {@code site} (see the class comment), {@value #HOURS} hours. */
    static HourlyWeather build(Site site) {
        int days = (int) (LAST_DAY.toEpochDay() - FIRST_DAY.toEpochDay()) + 2;
        HourlyWeather clear = SyntheticWeather.clearSky(site, SyntheticWeather.Spec.withRelativeHumidity(
                FIRST_DAY, days, UTC_OFFSET_S, SHAPE_MIN_C, SHAPE_MAX_C, 0.5, 0.0)).slice(0, HOURS);
        int n = clear.hours();
        double[] temp = new double[n];
        double[] rh = new double[n];
        double[] wind = new double[n];
        double[] ghi = clear.ghiWm2.clone();
        double[] dni = clear.dniWm2.clone();
        double[] dhi = clear.dhiWm2.clone();
        double[] cloud = new double[n];
        double dewVapourPa = Psychrometrics.saturationVapourPressurePa(DEW_POINT_C + Physical.ZERO_CELSIUS_K);
        long firstNoon = FIRST_DAY.atTime(12, 0).toEpochSecond(ZoneOffset.ofTotalSeconds(UTC_OFFSET_S));
        long lastNoon = LAST_DAY.atTime(12, 0).toEpochSecond(ZoneOffset.ofTotalSeconds(UTC_OFFSET_S));
        for (int h = 0; h < n; h++) {
            double s = (clear.airTempK[h] - Physical.ZERO_CELSIUS_K - SHAPE_MIN_C) / (SHAPE_MAX_C - SHAPE_MIN_C);
            double ramp = Math.max(0, Math.min(1, (clear.epochSecond[h] - firstNoon) / (double) (lastNoon - firstNoon)));
            double tMax = MAX_FIRST_C + ramp * (MAX_LAST_C - MAX_FIRST_C);
            double tMin = MIN_FIRST_C + ramp * (MIN_LAST_C - MIN_FIRST_C);
            temp[h] = Physical.ZERO_CELSIUS_K + tMin + s * (tMax - tMin);
            rh[h] = Math.min(1.0, dewVapourPa / Psychrometrics.saturationVapourPressurePa(temp[h]));
            wind[h] = 1.5 + 1.5 * s;
            LocalDateTime local = LocalDateTime.ofEpochSecond(clear.epochSecond[h], 0,
                    ZoneOffset.ofTotalSeconds(UTC_OFFSET_S));
            double hour = local.getHour() + local.getMinute() / 60.0;
            if (local.toLocalDate().equals(CLOUDY_DAY) && hour > 11 && hour < 20) {
                double sin = Math.sin(Math.PI * (hour - 11) / 9);
                double f = 1 - CLOUD_DEPTH * sin * sin;
                double beamHorizontal = clear.ghiWm2[h] - clear.dhiWm2[h];
                ghi[h] = f * clear.ghiWm2[h];
                dni[h] = f * f * clear.dniWm2[h];
                dhi[h] = ghi[h] - f * f * beamHorizontal;
                cloud[h] = 0.8 * (1 - f) / CLOUD_DEPTH;
            }
        }
        return new HourlyWeather(clear.epochSecond, UTC_OFFSET_S, temp, rh, wind, ghi, dni, dhi,
                HourlyWeather.absent(n), cloud, clear.pressurePa);
    }
}
