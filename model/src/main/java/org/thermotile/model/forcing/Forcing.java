package org.thermotile.model.forcing;

/**
 * Complete hourly forcing for one site: every series the balance needs, filled in SI units.
 *
 * <p>Built from {@link HourlyWeather} by {@link ForcingPreparer#prepare}: missing beam/diffuse
 * split, sky longwave and pressure are derived there from published models. The same forcing
 * serves every cell of a tile (and is broadcast to every Spark task).
 */
public final class Forcing implements java.io.Serializable {
    private static final long serialVersionUID = 1L;

    public final Site site;
    /** Time of each hour [s since 1970-01-01T00:00Z]. */
    public final long[] epochSecond;
    /** Offset of the local clock from UTC [s]. */
    public final int utcOffsetSeconds;
    /** Air temperature [K]. */
    public final double[] airTempK;
    /** Specific humidity of the air [kg kg⁻¹]. */
    public final double[] specificHumidity;
    /** Wind speed [m s⁻¹]. */
    public final double[] windMs;
    /** Station pressure [Pa]. */
    public final double[] pressurePa;
    /** Global horizontal irradiance [W m⁻²]. */
    public final double[] ghiWm2;
    /** Beam (direct) irradiance on a horizontal plane [W m⁻²]. */
    public final double[] beamHorizontalWm2;
    /** Diffuse horizontal irradiance [W m⁻²]. */
    public final double[] diffuseHorizontalWm2;
    /** Downwelling sky longwave irradiance [W m⁻²]. */
    public final double[] skyLongwaveWm2;
    /** Solar zenith angle at the hour [°] (topocentric, refraction-corrected). */
    public final double[] sunZenithDeg;
    /** Solar azimuth at the hour [°], eastward from north. */
    public final double[] sunAzimuthDeg;

    public Forcing(Site site, long[] epochSecond, int utcOffsetSeconds, double[] airTempK,
            double[] specificHumidity, double[] windMs, double[] pressurePa, double[] ghiWm2,
            double[] beamHorizontalWm2, double[] diffuseHorizontalWm2, double[] skyLongwaveWm2,
            double[] sunZenithDeg, double[] sunAzimuthDeg) {
        int n = epochSecond.length;
        for (double[] a : new double[][] {airTempK, specificHumidity, windMs, pressurePa, ghiWm2,
                beamHorizontalWm2, diffuseHorizontalWm2, skyLongwaveWm2, sunZenithDeg, sunAzimuthDeg}) {
            if (a.length != n) {
                throw new IllegalArgumentException("all forcing series must have " + n + " hours");
            }
            for (int i = 0; i < n; i++) {
                if (!Double.isFinite(a[i])) {
                    throw new IllegalArgumentException("forcing value at hour " + i + " is not finite");
                }
            }
        }
        this.site = site;
        this.epochSecond = epochSecond;
        this.utcOffsetSeconds = utcOffsetSeconds;
        this.airTempK = airTempK;
        this.specificHumidity = specificHumidity;
        this.windMs = windMs;
        this.pressurePa = pressurePa;
        this.ghiWm2 = ghiWm2;
        this.beamHorizontalWm2 = beamHorizontalWm2;
        this.diffuseHorizontalWm2 = diffuseHorizontalWm2;
        this.skyLongwaveWm2 = skyLongwaveWm2;
        this.sunZenithDeg = sunZenithDeg;
        this.sunAzimuthDeg = sunAzimuthDeg;
    }

    /** Number of hours. */
    public int hours() {
        return epochSecond.length;
    }

    /** Local clock hour of day (0…23) of hour {@code h}, from the source's UTC offset. */
    public int localHourOfDay(int h) {
        long local = epochSecond[h] + utcOffsetSeconds;
        return (int) Math.floorMod(local / 3600, 24L);
    }

    /** True when the sun is below the horizon at hour {@code h}. */
    public boolean isNight(int h) {
        return sunZenithDeg[h] >= 90.0;
    }
}
