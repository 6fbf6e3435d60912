package org.thermotile.model.forcing;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.LocalDate;
import java.time.ZoneOffset;
import java.util.Arrays;
import org.junit.jupiter.api.Test;
import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.sun.DiffuseSplit;
import org.thermotile.model.sun.Extraterrestrial;
import org.thermotile.model.sun.SkyLongwave;
import org.thermotile.model.sun.SolarPosition;

class ForcingPreparerTest {
    /** A site of our invented demo city (mid-latitude, UTC+1). */
    private static final Site SITE = new Site(47.3, 8.6, 420.0);
    private static final int UTC_PLUS_1 = 3600;

    private static HourlyWeather summerDay(int days) {
        return SyntheticWeather.clearSky(SITE, SyntheticWeather.Spec.withRelativeHumidity(
                LocalDate.of(2025, 7, 15), days, UTC_PLUS_1, 17.0, 31.0, 0.5, 2.0));
    }

    /** A synthetic clear day gives complete forcing: no NaN, no GHI at night, sun down at local midnight. */
    @Test
    void syntheticDayGivesCompleteForcing() {
        Forcing f = ForcingPreparer.prepare(summerDay(1), SITE);
        assertEquals(24, f.hours());
        for (double[] a : new double[][] {f.airTempK, f.specificHumidity, f.windMs, f.pressurePa,
                f.ghiWm2, f.beamHorizontalWm2, f.diffuseHorizontalWm2, f.skyLongwaveWm2,
                f.sunZenithDeg, f.sunAzimuthDeg}) {
            assertTrue(Arrays.stream(a).allMatch(Double::isFinite));
        }
        assertEquals(0, f.localHourOfDay(0));
        assertTrue(f.sunZenithDeg[0] >= 90.0, "sun should be down at local midnight");
        int night = 0;
        for (int h = 0; h < 24; h++) {
            if (f.isNight(h)) {
                assertEquals(0.0, f.ghiWm2[h], 0.0, "GHI at night, hour " + h);
                assertEquals(0.0, f.beamHorizontalWm2[h], 0.0);
                night++;
            }
            assertEquals(f.ghiWm2[h], f.beamHorizontalWm2[h] + f.diffuseHorizontalWm2[h], 1e-9);
            // Clear-sky L↓ at 17–31 °C and RH 0.5 lies between 300 and 450 W/m² (Brutsaert ε ≈ 0.8).
            assertTrue(f.skyLongwaveWm2[h] > 300 && f.skyLongwaveWm2[h] < 450, "L↓ " + f.skyLongwaveWm2[h]);
        }
        assertTrue(night >= 6 && night <= 10, "a July night at 47° N lasts about 8 h, got " + night);
        // Local noon hour: the sun is high (zenith 47.3° − 21.5° declination ≈ 26°, plus the
        // 0.4 h between 12:00 UTC+1 and solar noon at 8.6° E).
        assertTrue(f.sunZenithDeg[12] < 30, "zenith at 12:00 " + f.sunZenithDeg[12]);
        // Pressure from elevation (ICAO standard atmosphere).
        assertEquals(Psychrometrics.standardPressurePa(420.0), f.pressurePa[12], 1e-9);
        // Specific humidity from RH 0.5 at the hour's temperature.
        assertEquals(Psychrometrics.specificHumidityFromRelative(f.airTempK[15], 0.5, f.pressurePa[15]),
                f.specificHumidity[15], 1e-15);
    }

    /** Given DNI and DHI: beam = DNI·cos θ and diffuse = DHI (definition of the components). */
    @Test
    void usesGivenDniAndDhi() {
        HourlyWeather w = summerDay(1);
        Forcing f = ForcingPreparer.prepare(w, SITE);
        for (int h = 0; h < 24; h++) {
            double cosZ = Math.cos(Math.toRadians(f.sunZenithDeg[h]));
            double expectedBeam = f.sunZenithDeg[h] < 90 ? w.dniWm2[h] * cosZ : 0.0;
            assertEquals(expectedBeam, f.beamHorizontalWm2[h], 1e-9);
            assertEquals(w.dhiWm2[h], f.diffuseHorizontalWm2[h], 1e-12);
        }
    }

    /** GHI alone is split by Erbs et al. (1982); beam + diffuse = GHI. */
    @Test
    void splitsGhiAloneByErbs() {
        HourlyWeather s = summerDay(1);
        int n = s.hours();
        HourlyWeather w = new HourlyWeather(s.epochSecond, s.utcOffsetSeconds, s.airTempK,
                s.relHumidity, s.windMs, s.ghiWm2, HourlyWeather.absent(n), HourlyWeather.absent(n),
                HourlyWeather.absent(n), HourlyWeather.absent(n), HourlyWeather.absent(n));
        Forcing f = ForcingPreparer.prepare(w, SITE);
        double[] split = new double[2];
        for (int h = 0; h < n; h++) {
            assertEquals(s.ghiWm2[h], f.ghiWm2[h], 1e-12);
            double e0n = Extraterrestrial.normalIrradianceFromRadiusWm2(
                    SolarPosition.radiusVectorAu(s.epochSecond[h]));
            DiffuseSplit.split(s.ghiWm2[h], f.sunZenithDeg[h], e0n, split);
            assertEquals(split[0], f.beamHorizontalWm2[h], 1e-6);
            assertEquals(s.ghiWm2[h], f.beamHorizontalWm2[h] + f.diffuseHorizontalWm2[h], 1e-9);
        }
        // Clear noon: k_t above 0.7, so Erbs puts most of GHI in the beam.
        assertTrue(f.beamHorizontalWm2[13] > 0.7 * f.ghiWm2[13]);
        // Pressure was NaN: the standard atmosphere at 420 m fills it.
        assertEquals(Psychrometrics.standardPressurePa(420.0), f.pressurePa[0], 1e-9);
    }

    /**
     * Sky longwave: overcast (c = 1) gives the black body σT⁴ (Crawford &amp; Duchon 1999); with no
     * cloud information a half-bright day gives c = 0.5 from the solar ratio, carried into the night.
     */
    @Test
    void skyLongwaveFromCloudFractionOrSolarRatio() {
        HourlyWeather s = summerDay(1);
        int n = s.hours();
        double[] overcast = new double[n];
        Arrays.fill(overcast, 1.0);
        HourlyWeather w1 = new HourlyWeather(s.epochSecond, s.utcOffsetSeconds, s.airTempK,
                s.relHumidity, s.windMs, s.ghiWm2, s.dniWm2, s.dhiWm2, HourlyWeather.absent(n),
                overcast, s.pressurePa);
        Forcing f1 = ForcingPreparer.prepare(w1, SITE);
        for (int h = 0; h < n; h++) {
            double t = s.airTempK[h];
            assertEquals(Physical.STEFAN_BOLTZMANN * t * t * t * t, f1.skyLongwaveWm2[h], 1e-9);
        }

        double[] halfGhi = new double[n];
        for (int h = 0; h < n; h++) {
            halfGhi[h] = 0.5 * s.ghiWm2[h];
        }
        HourlyWeather w2 = new HourlyWeather(s.epochSecond, s.utcOffsetSeconds, s.airTempK,
                s.relHumidity, s.windMs, halfGhi, HourlyWeather.absent(n), HourlyWeather.absent(n),
                HourlyWeather.absent(n), HourlyWeather.absent(n), s.pressurePa);
        Forcing f2 = ForcingPreparer.prepare(w2, SITE);
        // The synthetic GHI is the default clear sky, so the ratio is exactly 0.5 in daylight.
        int lastHour = n - 1;
        assertTrue(f2.isNight(lastHour));
        double t = s.airTempK[lastHour];
        double e = 0.5 * Psychrometrics.saturationVapourPressurePa(t);
        double expected = SkyLongwave.downwellingWm2(
                SkyLongwave.cloudyEmissivity(SkyLongwave.brutsaertClearEmissivity(e, t), 0.5), t);
        assertEquals(expected, f2.skyLongwaveWm2[lastHour], 1e-9);
        // Before the first daylight hour nothing is known: clear sky.
        double t0 = s.airTempK[0];
        double clear0 = SkyLongwave.downwellingWm2(SkyLongwave.brutsaertClearEmissivity(
                0.5 * Psychrometrics.saturationVapourPressurePa(t0), t0), t0);
        assertEquals(clear0, f2.skyLongwaveWm2[0], 1e-9);
    }

    @Test
    void smallNegativeIrradianceIsClampedAtNight() {
        HourlyWeather s = summerDay(1);
        int n = s.hours();
        double[] ghi = s.ghiWm2.clone();
        ghi[1] = -3.5;
        HourlyWeather w = new HourlyWeather(s.epochSecond, s.utcOffsetSeconds, s.airTempK,
                s.relHumidity, s.windMs, ghi, HourlyWeather.absent(n), HourlyWeather.absent(n),
                HourlyWeather.absent(n), HourlyWeather.absent(n), s.pressurePa);
        Forcing f = ForcingPreparer.prepare(w, SITE);
        assertEquals(0.0, f.ghiWm2[1], 0.0);
        assertEquals(0.0, f.diffuseHorizontalWm2[1], 0.0);
    }

    /** Impossible inputs give errors naming the hour and its time, and the fix. */
    @Test
    void impossibleCombinationsAreClearErrors() {
        HourlyWeather s = summerDay(1);
        int n = s.hours();
        // Sunshine at 02:00 local: a shifted clock.
        double[] ghi = s.ghiWm2.clone();
        ghi[2] = 600;
        HourlyWeather shifted = new HourlyWeather(s.epochSecond, s.utcOffsetSeconds, s.airTempK,
                s.relHumidity, s.windMs, ghi, HourlyWeather.absent(n), HourlyWeather.absent(n),
                HourlyWeather.absent(n), HourlyWeather.absent(n), s.pressurePa);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> ForcingPreparer.prepare(shifted, SITE));
        assertTrue(e.getMessage().contains("hour 2 (2025-07-15T01:00:00Z)"), e.getMessage());
        assertTrue(e.getMessage().contains("UTC offset"), e.getMessage());

        double[] rh = s.relHumidity.clone();
        rh[5] = 55.0;
        HourlyWeather percent = new HourlyWeather(s.epochSecond, s.utcOffsetSeconds, s.airTempK, rh,
                s.windMs, s.ghiWm2, s.dniWm2, s.dhiWm2, s.skyLongwaveWm2, s.cloudFraction, s.pressurePa);
        e = assertThrows(IllegalArgumentException.class, () -> ForcingPreparer.prepare(percent, SITE));
        assertTrue(e.getMessage().contains("hour 5") && e.getMessage().contains("percentage"), e.getMessage());

        double[] dni = s.dniWm2.clone();
        dni[0] = 500;
        HourlyWeather nightDni = new HourlyWeather(s.epochSecond, s.utcOffsetSeconds, s.airTempK,
                s.relHumidity, s.windMs, s.ghiWm2, dni, s.dhiWm2, s.skyLongwaveWm2, s.cloudFraction,
                s.pressurePa);
        e = assertThrows(IllegalArgumentException.class, () -> ForcingPreparer.prepare(nightDni, SITE));
        assertTrue(e.getMessage().contains("hour 0") && e.getMessage().contains("below the horizon"),
                e.getMessage());

        HourlyWeather noSun = new HourlyWeather(s.epochSecond, s.utcOffsetSeconds, s.airTempK,
                s.relHumidity, s.windMs, HourlyWeather.absent(n), s.dniWm2, HourlyWeather.absent(n),
                s.skyLongwaveWm2, s.cloudFraction, s.pressurePa);
        e = assertThrows(IllegalArgumentException.class, () -> ForcingPreparer.prepare(noSun, SITE));
        assertTrue(e.getMessage().contains("hour 0") && e.getMessage().contains("give GHI"), e.getMessage());

        double[] neg = s.ghiWm2.clone();
        neg[3] = -400;
        HourlyWeather negative = new HourlyWeather(s.epochSecond, s.utcOffsetSeconds, s.airTempK,
                s.relHumidity, s.windMs, neg, HourlyWeather.absent(n), HourlyWeather.absent(n),
                s.skyLongwaveWm2, s.cloudFraction, s.pressurePa);
        e = assertThrows(IllegalArgumentException.class, () -> ForcingPreparer.prepare(negative, SITE));
        assertTrue(e.getMessage().contains("hour 3") && e.getMessage().contains("GHI"), e.getMessage());
    }

    @Test
    void timeStampsStartAtLocalMidnight() {
        HourlyWeather w = summerDay(2);
        assertEquals(48, w.hours());
        assertEquals(LocalDate.of(2025, 7, 15).atStartOfDay().toEpochSecond(ZoneOffset.ofHours(1)),
                w.epochSecond[0]);
    }
}
