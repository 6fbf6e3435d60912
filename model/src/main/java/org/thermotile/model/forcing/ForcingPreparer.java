package org.thermotile.model.forcing;

import java.time.Instant;
import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.sun.ClearSky;
import org.thermotile.model.sun.DiffuseSplit;
import org.thermotile.model.sun.Extraterrestrial;
import org.thermotile.model.sun.SkyLongwave;
import org.thermotile.model.sun.SolarPosition;

/**
 * Fills the series a weather source leaves out and checks the rest; see {@link #prepare}.
 *
 * <p>Methods, per hour:
 * <ul>
 * <li>Sun zenith and azimuth: NREL SPA ({@link SolarPosition}, Reda &amp; Andreas 2004) with the
 *     hour's pressure and air temperature for refraction and ΔT = {@link SolarPosition#DEFAULT_DELTA_T_S}.</li>
 * <li>Pressure, when not given: ICAO standard atmosphere at the site elevation
 *     ({@link Psychrometrics#standardPressurePa}).</li>
 * <li>Specific humidity from relative humidity, air temperature and pressure (Magnus form, WMO-No. 8).</li>
 * <li>Beam and diffuse horizontal irradiance: from DNI and DHI when both are given
 *     (beam = DNI·cos θ, GHI = beam + DHI); from GHI with DNI (diffuse = GHI − DNI·cos θ) or with DHI
 *     (beam = GHI − DHI); from GHI alone by Erbs et al. (1982) ({@link DiffuseSplit}).</li>
 * <li>Sky longwave, when not given: Brutsaert (1975) clear-sky emissivity with the Crawford &amp;
 *     Duchon (1999) cloud correction ({@link SkyLongwave}); the cloud fraction is the given one, else
 *     1 − GHI/GHI_clear in daylight (zenith below {@link #CLOUD_ESTIMATE_MAX_ZENITH_DEG}, clear sky by
 *     {@link ClearSky#bird} with {@link ClearSky#DEFAULT}), carried unchanged through low sun and night
 *     from the last such hour; before the first such hour the sky is taken as clear.</li>
 * </ul>
 *
 * <p>Clamping: irradiance between {@link #NEGATIVE_IRRADIANCE_LIMIT_WM2} and 0 (sensor offsets, at
 * night above all) is set to 0; with the sun below the horizon the beam is 0 and any twilight GHI is
 * diffuse. Impossible values are errors naming the hour index and its UTC time; a weather reader
 * should add its file name and line.
 */
public final class ForcingPreparer {
    private ForcingPreparer() {}

    /** Irradiance below this [W m⁻²] is an error, not a sensor offset to clamp. */
    public static final double NEGATIVE_IRRADIANCE_LIMIT_WM2 = -50.0;
    /**
     * Zenith angle [°] below which GHI is used to estimate the cloud fraction; nearer the horizon the
     * ratio to clear sky is dominated by timing and model error (our choice).
     */
    public static final double CLOUD_ESTIMATE_MAX_ZENITH_DEG = 85.0;
    /**
     * Plausibility margin [W m⁻²] above the extraterrestrial horizontal irradiance (times 1.1, for
     * cloud enhancement and hour-averaged data) that measured GHI may reach before it is an error;
     * typically the sign of a wrong UTC offset or of values not in W m⁻² (our choice).
     */
    public static final double GHI_MARGIN_WM2 = 100.0;
    /** DNI [W m⁻²] above which a sun below the horizon is an error (our choice). */
    public static final double DNI_NIGHT_LIMIT_WM2 = 20.0;

    /**
     * Builds complete forcing from hourly weather: sun position per hour, beam/diffuse split,
     * specific humidity, sky longwave and pressure when not given (see the class comment).
     *
     * @param weather hourly weather; air temperature, relative humidity and wind are required every
     *                hour, and GHI, or DNI together with DHI
     * @param site    the site (latitude, longitude, elevation)
     * @return forcing with every series finite
     * @throws IllegalArgumentException naming the hour, its UTC time, the value and the fix, for a
     *                                  missing required value or an impossible combination
     */
    public static Forcing prepare(HourlyWeather weather, Site site) {
        int n = weather.hours();
        if (n == 0) {
            throw new IllegalArgumentException("weather has no hours: give at least one hour");
        }
        double[] pressure = new double[n];
        double[] q = new double[n];
        double[] ghiOut = new double[n];
        double[] beamOut = new double[n];
        double[] diffuseOut = new double[n];
        double[] skyLw = new double[n];
        double[] zenith = new double[n];
        double[] azimuth = new double[n];
        double[] wind = weather.windMs.clone();
        double[] temp = weather.airTempK.clone();

        double[] sun = new double[3];
        double[] split = new double[2];
        double[] clear = new double[3];
        double standardPressure = Psychrometrics.standardPressurePa(site.elevationM());
        double carriedCloud = Double.NaN;

        for (int h = 0; h < n; h++) {
            long t = weather.epochSecond[h];
            double tK = temp[h];
            if (!(tK > 180 && tK < 340)) {
                throw bad(h, t, "air temperature " + tK + " K is missing or outside 180…340 K; give "
                        + "kelvin (°C + 273.15)");
            }
            double rh = weather.relHumidity[h];
            if (!(rh >= 0 && rh <= 1.0)) {
                String hint = (rh > 1 && rh <= 100) ? "; it looks like a percentage: give a fraction 0…1"
                        : "; give a fraction 0…1";
                throw bad(h, t, "relative humidity " + rh + " is missing or outside 0…1" + hint);
            }
            if (!(wind[h] >= 0 && wind[h] < 100)) {
                throw bad(h, t, "wind speed " + wind[h] + " m/s is missing or outside 0…100 m/s");
            }
            double p = weather.pressurePa[h];
            if (Double.isNaN(p)) {
                p = standardPressure;
            } else if (!(p > 30_000 && p < 110_000)) {
                throw bad(h, t, "pressure " + p + " Pa is outside 30000…110000 Pa; give pascal "
                        + "(hPa × 100) or leave it empty to use the standard atmosphere");
            }
            pressure[h] = p;
            q[h] = Psychrometrics.specificHumidityFromRelative(tK, rh, p);

            SolarPosition.compute(t, site.latitudeDeg(), site.longitudeDeg(), site.elevationM(), p, tK,
                    SolarPosition.DEFAULT_DELTA_T_S, sun);
            double z = sun[SolarPosition.ZENITH];
            zenith[h] = z;
            azimuth[h] = sun[SolarPosition.AZIMUTH];
            double e0n = Extraterrestrial.normalIrradianceFromRadiusWm2(sun[SolarPosition.RADIUS]);
            double cosZ = Math.cos(Math.toRadians(z));
            boolean up = z < 90.0;

            double ghi = irradiance(weather.ghiWm2[h], "GHI", h, t);
            double dni = irradiance(weather.dniWm2[h], "DNI", h, t);
            double dhi = irradiance(weather.dhiWm2[h], "DHI", h, t);
            if (!Double.isNaN(dni)) {
                if (!up && dni > DNI_NIGHT_LIMIT_WM2) {
                    throw bad(h, t, "DNI " + dni + " W/m² while the sun is " + round1(z - 90)
                            + "° below the horizon; check the time stamps' UTC offset");
                }
                if (dni > 1.05 * e0n) {
                    throw bad(h, t, "DNI " + dni + " W/m² exceeds the extraterrestrial irradiance "
                            + round1(e0n) + " W/m²; check the units (W/m²)");
                }
            }
            double beam;
            double diffuse;
            if (!Double.isNaN(dni) && !Double.isNaN(dhi)) {
                beam = up ? dni * cosZ : 0.0;
                diffuse = dhi;
                ghi = beam + diffuse;
            } else if (!Double.isNaN(ghi)) {
                if (!up) {
                    beam = 0.0;
                } else if (!Double.isNaN(dni)) {
                    beam = Math.min(dni * cosZ, ghi);
                } else if (!Double.isNaN(dhi)) {
                    beam = Math.max(ghi - dhi, 0.0);
                } else {
                    DiffuseSplit.split(ghi, z, e0n, split);
                    beam = split[DiffuseSplit.BEAM];
                }
                diffuse = ghi - beam;
            } else {
                throw bad(h, t, "no global horizontal irradiance, and not both DNI and DHI; give GHI, "
                        + "or DNI together with DHI");
            }
            double top = Extraterrestrial.horizontalIrradianceWm2(e0n, z);
            if (ghi > 1.1 * top + GHI_MARGIN_WM2) {
                throw bad(h, t, "GHI " + round1(ghi) + " W/m² is more than reaches the top of the "
                        + "atmosphere (" + round1(top) + " W/m² at sun zenith " + round1(z)
                        + "°); check the time stamps' UTC offset and that irradiance is in W/m²");
            }
            ghiOut[h] = ghi;
            beamOut[h] = beam;
            diffuseOut[h] = diffuse;

            double givenCloud = weather.cloudFraction[h];
            if (!Double.isNaN(givenCloud)) {
                if (!(givenCloud >= 0 && givenCloud <= 1)) {
                    throw bad(h, t, "cloud fraction " + givenCloud + " is outside 0…1; give a "
                            + "fraction (oktas / 8, percent / 100)");
                }
                carriedCloud = givenCloud;
            } else if (z < CLOUD_ESTIMATE_MAX_ZENITH_DEG) {
                ClearSky.bird(z, e0n, p, ClearSky.DEFAULT, clear);
                double c = SkyLongwave.cloudFractionFromSolarRatio(ghi, clear[ClearSky.GHI]);
                if (!Double.isNaN(c)) {
                    carriedCloud = c;
                }
            }
            double sky = weather.skyLongwaveWm2[h];
            if (Double.isNaN(sky)) {
                double cloud = Double.isNaN(carriedCloud) ? 0.0 : carriedCloud;
                double vapourPa = rh * Psychrometrics.saturationVapourPressurePa(tK);
                double eps = SkyLongwave.cloudyEmissivity(
                        SkyLongwave.brutsaertClearEmissivity(vapourPa, tK), cloud);
                sky = SkyLongwave.downwellingWm2(eps, tK);
            } else if (!(sky > 50 && sky < 700)) {
                throw bad(h, t, "sky longwave " + sky + " W/m² is outside 50…700 W/m²; give W/m² or "
                        + "leave it empty to have it estimated");
            }
            skyLw[h] = sky;
        }
        return new Forcing(site, weather.epochSecond.clone(), weather.utcOffsetSeconds, temp, q, wind,
                pressure, ghiOut, beamOut, diffuseOut, skyLw, zenith, azimuth);
    }

    /** A given irradiance clamped at 0 from below, NaN if not given; an error if far negative or infinite. */
    private static double irradiance(double v, String name, int h, long t) {
        if (Double.isNaN(v)) {
            return v;
        }
        if (Double.isInfinite(v) || v < NEGATIVE_IRRADIANCE_LIMIT_WM2) {
            throw bad(h, t, name + " " + v + " W/m² is impossible; irradiance must be ≥ 0 W/m² "
                    + "(small negative sensor offsets above " + NEGATIVE_IRRADIANCE_LIMIT_WM2
                    + " W/m² are set to 0)");
        }
        return v < 0 ? 0.0 : v;
    }

    private static IllegalArgumentException bad(int h, long t, String what) {
        return new IllegalArgumentException("weather hour " + h + " (" + Instant.ofEpochSecond(t)
                + "): " + what);
    }

    private static double round1(double v) {
        return Math.round(v * 10.0) / 10.0;
    }
}
