package org.thermotile.model.sun;

import java.time.Instant;
import org.thermotile.model.constants.Physical;

/**
 * Topocentric position of the sun by the NREL Solar Position Algorithm: Reda, I. &amp; Andreas, A.
 * (2004, revised 2008), <em>Solar Position Algorithm for Solar Radiation Applications</em>,
 * NREL/TP-560-34302 (also Solar Energy 76(5), 577–589). Equation numbers below are the report's
 * section 3. Stated uncertainty ±0.0003° for the years −2000…6000.
 *
 * <p>Inputs: an instant (UTC, taken as UT1: the neglected ΔUT1 = UT1 − UTC is kept within ±0.9 s by
 * the IERS, at most 0.004° of hour angle), geodetic latitude and longitude (east positive),
 * elevation, and the station pressure and air temperature for the refraction correction (eq. 42).
 * Outputs: the refraction-corrected topocentric zenith angle θ and the azimuth Φ measured eastward
 * from north, both in degrees, and the Earth–Sun distance R in astronomical units.
 *
 * <p>Allocation-light: {@link #compute} writes into a caller's array; nothing is allocated per call.
 * Thread-safe (no state).
 */
public final class SolarPosition {
    private SolarPosition() {}

    /**
     * Default ΔT = TT − UT1 [s] for the 2020s: 32.184 s (TT − TAI) + 37 s (TAI − UTC since
     * 2017-01-01, IERS Bulletin C) − (UT1 − UTC, within ±0.2 s over 2020–2025) ≈ 69 s (values
     * from memory). An error of 1 s in ΔT moves the sun by about 0.00004° in longitude.
     */
    public static final double DEFAULT_DELTA_T_S = 69.0;

    /** Index of the zenith angle θ [°] in the {@link #compute} output. */
    public static final int ZENITH = 0;
    /** Index of the azimuth Φ [°, eastward from north] in the {@link #compute} output. */
    public static final int AZIMUTH = 1;
    /** Index of the Earth–Sun distance R [au] in the {@link #compute} output. */
    public static final int RADIUS = 2;

    /** Sun radius seen from the Earth [°] (report's value 0.26667°). */
    private static final double SUN_RADIUS_DEG = 0.26667;
    /** Atmospheric refraction at sunrise/sunset [°] (report's value 0.5667°). */
    private static final double HORIZON_REFRACTION_DEG = 0.5667;
    /** Earth equatorial radius [m] used by the report (eq. 35–37). */
    private static final double EARTH_RADIUS_M = 6378140.0;
    /** Julian day of the Unix epoch 1970-01-01T00:00Z. */
    private static final double JD_UNIX_EPOCH = 2440587.5;
    /** Julian day of J2000.0. */
    private static final double JD_J2000 = 2451545.0;

    /**
     * The sun's position for one instant.
     *
     * @param zenithDeg      topocentric zenith angle θ, refraction-corrected [°], 0…180
     * @param azimuthDeg     topocentric azimuth Φ, eastward from north [°], 0…360
     * @param radiusVectorAu Earth–Sun distance R [au]
     */
    public record Angles(double zenithDeg, double azimuthDeg, double radiusVectorAu) {
        /** True when the sun's centre is above the (refracted) horizon. */
        public boolean isUp() {
            return zenithDeg < 90.0;
        }
    }

    /**
     * Sun position at {@code time} with the default ΔT ({@link #DEFAULT_DELTA_T_S}).
     *
     * @param latitudeDeg  geodetic latitude φ [°], −90…90
     * @param longitudeDeg longitude σ [°], east positive, −180…180
     * @param elevationM   observer elevation E [m]
     * @param pressurePa   station pressure P [Pa], for refraction
     * @param airTempK     air temperature T [K], for refraction
     */
    public static Angles of(Instant time, double latitudeDeg, double longitudeDeg, double elevationM,
            double pressurePa, double airTempK) {
        return of(time, latitudeDeg, longitudeDeg, elevationM, pressurePa, airTempK, DEFAULT_DELTA_T_S);
    }

    /** Sun position at {@code time} with ΔT = {@code deltaTSeconds} [s]; see {@link #compute}. */
    public static Angles of(Instant time, double latitudeDeg, double longitudeDeg, double elevationM,
            double pressurePa, double airTempK, double deltaTSeconds) {
        double[] out = new double[3];
        compute(time.getEpochSecond() + time.getNano() * 1e-9, latitudeDeg, longitudeDeg, elevationM,
                pressurePa, airTempK, deltaTSeconds, out);
        return new Angles(out[ZENITH], out[AZIMUTH], out[RADIUS]);
    }

    /**
     * Computes the topocentric sun position (SPA, eqs. 4–47 of NREL/TP-560-34302).
     *
     * <p>The refraction correction Δe = (P/1010)(283/(273 + T))·1.02 / (60·tan(e₀ + 10.3/(e₀ + 5.11)))
     * [°] (eq. 42, P in mbar, T in °C) is applied while the geometric elevation e₀ is at or above
     * −(0.26667° + 0.5667°), i.e. while the sun's upper limb can still be seen over a refracted
     * horizon; below that Δe = 0 (as in NREL's later revisions of the algorithm, where the formula
     * would otherwise diverge at e₀ = −5.11°).
     *
     * @param epochSecond   instant [s since 1970-01-01T00:00Z], UTC taken as UT1
     * @param latitudeDeg   geodetic latitude φ [°], −90…90
     * @param longitudeDeg  longitude σ [°], east positive, −180…180
     * @param elevationM    observer elevation E [m]
     * @param pressurePa    station pressure P [Pa], &gt; 0
     * @param airTempK      air temperature T [K], &gt; 0
     * @param deltaTSeconds ΔT = TT − UT1 [s]
     * @param out           receives θ [°] at {@link #ZENITH}, Φ [°] at {@link #AZIMUTH} and, if its
     *                      length is at least 3, R [au] at {@link #RADIUS}
     * @throws IllegalArgumentException for a latitude, longitude, pressure or temperature outside
     *                                  its domain
     */
    public static void compute(double epochSecond, double latitudeDeg, double longitudeDeg,
            double elevationM, double pressurePa, double airTempK, double deltaTSeconds, double[] out) {
        if (!(latitudeDeg >= -90 && latitudeDeg <= 90)) {
            throw new IllegalArgumentException("latitude " + latitudeDeg + "° is outside −90…90°");
        }
        if (!(longitudeDeg >= -180 && longitudeDeg <= 180)) {
            throw new IllegalArgumentException("longitude " + longitudeDeg + "° is outside −180…180°");
        }
        if (!(pressurePa > 0 && pressurePa < 200_000) || !(airTempK > 0 && airTempK < 400)
                || !Double.isFinite(elevationM) || !Double.isFinite(deltaTSeconds)
                || !Double.isFinite(epochSecond)) {
            throw new IllegalArgumentException("sun position needs a finite time and elevation, "
                    + "pressure in (0, 200000) Pa and temperature in (0, 400) K; got time "
                    + epochSecond + " s, elevation " + elevationM + " m, pressure " + pressurePa
                    + " Pa, temperature " + airTempK + " K, ΔT " + deltaTSeconds + " s");
        }
        // 3.1 Julian day, ephemeris day, centuries and millennium (eqs. 4–8).
        double jd = julianDay(epochSecond);
        double jc = (jd - JD_J2000) / 36525.0;
        double jde = jd + deltaTSeconds / 86400.0;
        double jce = (jde - JD_J2000) / 36525.0;
        double jme = jce / 10.0;

        // 3.2 Earth heliocentric longitude, latitude [°] and radius vector [au] (eqs. 9–14).
        double lDeg = limitDegrees(Math.toDegrees(earthSeries(SpaTables.L, jme)));
        double bDeg = Math.toDegrees(earthSeries(SpaTables.B, jme));
        double r = earthSeries(SpaTables.R, jme);

        // 3.3 Geocentric longitude and latitude (eqs. 13–14).
        double theta = limitDegrees(lDeg + 180.0);
        double beta = -bDeg;

        // 3.4 Nutation in longitude and obliquity (eqs. 15–23).
        double x0 = cubic(297.85036, 445267.111480, -0.0019142, 1.0 / 189474.0, jce);
        double x1 = cubic(357.52772, 35999.050340, -0.0001603, -1.0 / 300000.0, jce);
        double x2 = cubic(134.96298, 477198.867398, 0.0086972, 1.0 / 56250.0, jce);
        double x3 = cubic(93.27191, 483202.017538, -0.0036825, 1.0 / 327270.0, jce);
        double x4 = cubic(125.04452, -1934.136261, 0.0020708, 1.0 / 450000.0, jce);
        double sumPsi = 0;
        double sumEps = 0;
        for (int i = 0; i < SpaTables.Y.length; i++) {
            int[] y = SpaTables.Y[i];
            double arg = Math.toRadians(x0 * y[0] + x1 * y[1] + x2 * y[2] + x3 * y[3] + x4 * y[4]);
            double[] pe = SpaTables.PE[i];
            sumPsi += (pe[0] + pe[1] * jce) * Math.sin(arg);
            sumEps += (pe[2] + pe[3] * jce) * Math.cos(arg);
        }
        double deltaPsi = sumPsi / 36_000_000.0;
        double deltaEps = sumEps / 36_000_000.0;

        // 3.5 True obliquity of the ecliptic (eqs. 24–25).
        double u = jme / 10.0;
        double eps0 = 84381.448 + u * (-4680.93 + u * (-1.55 + u * (1999.25 + u * (-51.38
                + u * (-249.67 + u * (-39.05 + u * (7.12 + u * (27.87 + u * (5.79 + u * 2.45)))))))));
        double eps = eps0 / 3600.0 + deltaEps;
        double epsRad = Math.toRadians(eps);

        // 3.6–3.7 Aberration and apparent sun longitude (eqs. 26–27).
        double deltaTau = -20.4898 / (3600.0 * r);
        double lambda = theta + deltaPsi + deltaTau;
        double lambdaRad = Math.toRadians(lambda);

        // 3.8 Apparent sidereal time at Greenwich (eqs. 28–29).
        double nu0 = limitDegrees(280.46061837 + 360.98564736629 * (jd - JD_J2000)
                + jc * jc * (0.000387933 - jc / 38710000.0));
        double nu = nu0 + deltaPsi * Math.cos(epsRad);

        // 3.9–3.10 Geocentric right ascension and declination (eqs. 30–31).
        double betaRad = Math.toRadians(beta);
        double alpha = limitDegrees(Math.toDegrees(Math.atan2(
                Math.sin(lambdaRad) * Math.cos(epsRad) - Math.tan(betaRad) * Math.sin(epsRad),
                Math.cos(lambdaRad))));
        double deltaRad = Math.asin(Math.sin(betaRad) * Math.cos(epsRad)
                + Math.cos(betaRad) * Math.sin(epsRad) * Math.sin(lambdaRad));

        // 3.11 Observer local hour angle (eq. 32).
        double hRad = Math.toRadians(limitDegrees(nu + longitudeDeg - alpha));

        // 3.12 Topocentric right ascension and declination (eqs. 33–39).
        double phiRad = Math.toRadians(latitudeDeg);
        double xiRad = Math.toRadians(8.794 / (3600.0 * r));
        double uRad = Math.atan(0.99664719 * Math.tan(phiRad));
        double x = Math.cos(uRad) + elevationM / EARTH_RADIUS_M * Math.cos(phiRad);
        double y = 0.99664719 * Math.sin(uRad) + elevationM / EARTH_RADIUS_M * Math.sin(phiRad);
        double denom = Math.cos(deltaRad) - x * Math.sin(xiRad) * Math.cos(hRad);
        double deltaAlphaRad = Math.atan2(-x * Math.sin(xiRad) * Math.sin(hRad), denom);
        double deltaPrimeRad = Math.atan2((Math.sin(deltaRad) - y * Math.sin(xiRad))
                * Math.cos(deltaAlphaRad), denom);

        // 3.13 Topocentric local hour angle (eq. 40).
        double hPrimeRad = hRad - deltaAlphaRad;

        // 3.14 Topocentric zenith angle with refraction (eqs. 41–44).
        double e0 = Math.toDegrees(Math.asin(Math.sin(phiRad) * Math.sin(deltaPrimeRad)
                + Math.cos(phiRad) * Math.cos(deltaPrimeRad) * Math.cos(hPrimeRad)));
        double deltaE = 0;
        if (e0 >= -(SUN_RADIUS_DEG + HORIZON_REFRACTION_DEG)) {
            double pMbar = pressurePa / 100.0;
            double tC = airTempK - Physical.ZERO_CELSIUS_K;
            deltaE = (pMbar / 1010.0) * (283.0 / (273.0 + tC))
                    * 1.02 / (60.0 * Math.tan(Math.toRadians(e0 + 10.3 / (e0 + 5.11))));
        }
        double zenith = 90.0 - (e0 + deltaE);

        // 3.15 Topocentric azimuth (eqs. 45–47), eastward from north.
        double gamma = Math.toDegrees(Math.atan2(Math.sin(hPrimeRad),
                Math.cos(hPrimeRad) * Math.sin(phiRad) - Math.tan(deltaPrimeRad) * Math.cos(phiRad)));
        double azimuth = limitDegrees(gamma + 180.0);

        out[ZENITH] = zenith;
        out[AZIMUTH] = azimuth;
        if (out.length > RADIUS) {
            out[RADIUS] = r;
        }
    }

    /**
     * Julian day JD of an instant: JD = t/86400 + 2440587.5, t in [s since 1970-01-01T00:00Z]
     * (equivalent to eq. 4 of NREL/TP-560-34302 for Gregorian dates).
     */
    public static double julianDay(double epochSecond) {
        return epochSecond / 86400.0 + JD_UNIX_EPOCH;
    }

    /**
     * Earth–Sun distance R [au] at an instant (SPA eqs. 9–12 for the radius vector), ΔT default.
     * The extraterrestrial normal irradiance scales as 1/R².
     */
    public static double radiusVectorAu(double epochSecond) {
        double jde = julianDay(epochSecond) + DEFAULT_DELTA_T_S / 86400.0;
        return earthSeries(SpaTables.R, (jde - JD_J2000) / 365250.0);
    }

    /**
     * Unit vector towards the sun in a local east–north–up frame:
     * (sin θ sin Φ, sin θ cos Φ, cos θ) with θ the zenith angle and Φ the azimuth eastward from north.
     *
     * @param zenithDeg  zenith angle θ [°]
     * @param azimuthDeg azimuth Φ [°], eastward from north
     * @param out        receives east, north, up components (length ≥ 3)
     */
    public static void sunVector(double zenithDeg, double azimuthDeg, double[] out) {
        double z = Math.toRadians(zenithDeg);
        double a = Math.toRadians(azimuthDeg);
        double s = Math.sin(z);
        out[0] = s * Math.sin(a);
        out[1] = s * Math.cos(a);
        out[2] = Math.cos(z);
    }

    /**
     * One Earth series value: Σᵢ (Σⱼ Aᵢⱼ cos(Bᵢⱼ + Cᵢⱼ·JME)) · JMEⁱ / 10⁸ (eqs. 9–11), in radians for L
     * and B and in au for R.
     */
    static double earthSeries(double[][][] table, double jme) {
        double sum = 0;
        double power = 1;
        for (double[][] series : table) {
            double s = 0;
            for (double[] t : series) {
                s += t[0] * Math.cos(t[1] + t[2] * jme);
            }
            sum += s * power;
            power *= jme;
        }
        return sum / 1e8;
    }

    private static double cubic(double a0, double a1, double a2, double a3, double t) {
        return a0 + t * (a1 + t * (a2 + t * a3));
    }

    /** Angle reduced to [0, 360) [°]. */
    static double limitDegrees(double deg) {
        double d = deg % 360.0;
        return d < 0 ? d + 360.0 : d;
    }
}
