package org.thermotile.model.forcing;

import java.util.Arrays;

/**
 * Hourly weather as given by a user (a weather file or a synthetic generator), in SI units, one
 * array element per hour, hours consecutive and evenly spaced by 3600 s.
 *
 * <p>Optional series hold {@code NaN} where the source gave nothing; {@link ForcingPreparer#prepare}
 * fills them from published models. Values are taken as instantaneous at their time stamp and
 * interpolated linearly in between.
 */
public final class HourlyWeather {
    /** Time of each hour [s since 1970-01-01T00:00Z]. */
    public final long[] epochSecond;
    /** Offset of the source's local clock from UTC [s]; local hours for statistics use it. */
    public final int utcOffsetSeconds;
    /** Air temperature [K]. */
    public final double[] airTempK;
    /** Relative humidity as a fraction [0…1]. */
    public final double[] relHumidity;
    /** Wind speed [m s⁻¹]. */
    public final double[] windMs;
    /** Global horizontal irradiance [W m⁻²]. */
    public final double[] ghiWm2;
    /** Direct normal irradiance [W m⁻²], NaN if not given. */
    public final double[] dniWm2;
    /** Diffuse horizontal irradiance [W m⁻²], NaN if not given. */
    public final double[] dhiWm2;
    /** Downwelling sky longwave irradiance [W m⁻²], NaN if not given. */
    public final double[] skyLongwaveWm2;
    /** Cloud fraction [0…1], NaN if not given. */
    public final double[] cloudFraction;
    /** Station pressure [Pa], NaN if not given. */
    public final double[] pressurePa;

    public HourlyWeather(long[] epochSecond, int utcOffsetSeconds, double[] airTempK,
            double[] relHumidity, double[] windMs, double[] ghiWm2, double[] dniWm2,
            double[] dhiWm2, double[] skyLongwaveWm2, double[] cloudFraction, double[] pressurePa) {
        int n = epochSecond.length;
        for (double[] a : new double[][] {airTempK, relHumidity, windMs, ghiWm2, dniWm2, dhiWm2,
                skyLongwaveWm2, cloudFraction, pressurePa}) {
            if (a.length != n) {
                throw new IllegalArgumentException("all weather series must have " + n + " hours");
            }
        }
        for (int i = 1; i < n; i++) {
            if (epochSecond[i] - epochSecond[i - 1] != 3600) {
                throw new IllegalArgumentException("weather hours must be consecutive: hour " + i
                        + " is " + (epochSecond[i] - epochSecond[i - 1]) + " s after the previous one");
            }
        }
        this.epochSecond = epochSecond;
        this.utcOffsetSeconds = utcOffsetSeconds;
        this.airTempK = airTempK;
        this.relHumidity = relHumidity;
        this.windMs = windMs;
        this.ghiWm2 = ghiWm2;
        this.dniWm2 = dniWm2;
        this.dhiWm2 = dhiWm2;
        this.skyLongwaveWm2 = skyLongwaveWm2;
        this.cloudFraction = cloudFraction;
        this.pressurePa = pressurePa;
    }

    /** Number of hours. */
    public int hours() {
        return epochSecond.length;
    }

    /** An array of {@code n} NaNs, for optional series that a source does not give. */
    public static double[] absent(int n) {
        double[] a = new double[n];
        Arrays.fill(a, Double.NaN);
        return a;
    }

    /** The hours {@code [from, to)} as a new weather series. */
    public HourlyWeather slice(int from, int to) {
        return new HourlyWeather(Arrays.copyOfRange(epochSecond, from, to), utcOffsetSeconds,
                Arrays.copyOfRange(airTempK, from, to), Arrays.copyOfRange(relHumidity, from, to),
                Arrays.copyOfRange(windMs, from, to), Arrays.copyOfRange(ghiWm2, from, to),
                Arrays.copyOfRange(dniWm2, from, to), Arrays.copyOfRange(dhiWm2, from, to),
                Arrays.copyOfRange(skyLongwaveWm2, from, to),
                Arrays.copyOfRange(cloudFraction, from, to), Arrays.copyOfRange(pressurePa, from, to));
    }
}
