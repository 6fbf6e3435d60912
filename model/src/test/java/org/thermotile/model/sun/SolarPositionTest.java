package org.thermotile.model.sun;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.lang.reflect.Field;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.ZonedDateTime;
import net.e175.klaus.solarpositioning.SPA;
import org.junit.jupiter.api.Test;

class SolarPositionTest {

    /**
     * Reda &amp; Andreas (2004, rev. 2008), NREL/TP-560-34302, Appendix A.5 worked example: 2003-10-17
     * 12:30:30 local standard time, time zone −7 h, ΔUT1 = 0, ΔT = 67 s, φ = 39.742476°,
     * σ = −105.1786°, E = 1830.14 m, P = 820 mbar, T = 11 °C. Table A5.1 gives θ = 50.11162° and
     * Φ = 194.34024°, and the intermediate R = 0.9965422974 au.
     */
    @Test
    void reproducesTheReportsWorkedExample() {
        Instant t = ZonedDateTime.of(2003, 10, 17, 12, 30, 30, 0, ZoneOffset.ofHours(-7)).toInstant();
        SolarPosition.Angles a = SolarPosition.of(t, 39.742476, -105.1786, 1830.14, 82_000.0,
                273.15 + 11.0, 67.0);
        assertEquals(50.11162, a.zenithDeg(), 1e-4);
        assertEquals(194.34024, a.azimuthDeg(), 1e-4);
        assertEquals(0.9965422974, a.radiusVectorAu(), 1e-8);
        // Julian day of the example, Table A5.1: JD = 2452930.312847.
        assertEquals(2452930.312847, SolarPosition.julianDay(t.getEpochSecond()), 1e-6);
    }

    /**
     * Our transcription of Tables A4.2 and A4.3 against the tables held by the independent SPA
     * implementation net.e175.klaus.solarpositioning 2.0.3 (read by reflection, test scope only).
     */
    @Test
    void periodicTermTablesMatchAnIndependentTranscription() throws Exception {
        assertTablesEqual(SpaTables.L, (double[][][]) staticField("TERMS_L"));
        assertTablesEqual(SpaTables.B, (double[][][]) staticField("TERMS_B"));
        assertTablesEqual(SpaTables.R, (double[][][]) staticField("TERMS_R"));
        double[][] y = (double[][]) staticField("TERMS_Y");
        double[][] pe = (double[][]) staticField("TERMS_PE");
        assertEquals(63, SpaTables.Y.length);
        assertEquals(y.length, SpaTables.Y.length);
        assertEquals(pe.length, SpaTables.PE.length);
        for (int i = 0; i < y.length; i++) {
            for (int j = 0; j < 5; j++) {
                assertEquals(y[i][j], SpaTables.Y[i][j], 0.0, "Y row " + i);
            }
            assertArrayEquals(pe[i], SpaTables.PE[i], 0.0, "PE row " + i);
        }
    }

    /**
     * Every hour of 2025 at 60° N, 45° N and 33° S, sun above the horizon: zenith and azimuth agree
     * with net.e175.klaus.solarpositioning 2.0.3 ({@code SPA.calculateSolarPosition}, its SPA
     * implementation) within 0.01° (SPA's own stated uncertainty is 0.0003°).
     */
    @Test
    void agreesWithReferenceLibraryOverAYear() {
        double[][] sites = {{60.0, 10.75, 20.0}, {45.0, -93.25, 260.0}, {-33.9, 18.4, 40.0}};
        double pressurePa = 101_325.0;
        double tempK = 288.15;
        double deltaT = SolarPosition.DEFAULT_DELTA_T_S;
        double[] out = new double[3];
        double maxZenithErr = 0;
        double maxAzimuthErr = 0;
        int compared = 0;
        long start = ZonedDateTime.of(2025, 1, 1, 0, 0, 0, 0, ZoneOffset.UTC).toEpochSecond();
        for (double[] s : sites) {
            for (int h = 0; h < 8760; h++) {
                long t = start + 3600L * h;
                SolarPosition.compute(t, s[0], s[1], s[2], pressurePa, tempK, deltaT, out);
                if (out[0] >= 90.0) {
                    continue;
                }
                ZonedDateTime zdt = ZonedDateTime.ofInstant(Instant.ofEpochSecond(t), ZoneOffset.UTC);
                net.e175.klaus.solarpositioning.SolarPosition ref = SPA.calculateSolarPosition(
                        zdt, s[0], s[1], s[2], deltaT, pressurePa / 100.0, tempK - 273.15);
                maxZenithErr = Math.max(maxZenithErr, Math.abs(out[0] - ref.zenithAngle()));
                double dAz = Math.abs(out[1] - ref.azimuth());
                maxAzimuthErr = Math.max(maxAzimuthErr, Math.min(dAz, 360.0 - dAz));
                compared++;
            }
        }
        System.out.printf("SPA vs solarpositioning 2.0.3: %d sun-up hours, max |Δzenith| = %.3e°, "
                + "max |Δazimuth| = %.3e°%n", compared, maxZenithErr, maxAzimuthErr);
        assertTrue(compared > 3 * 3500, "expected daylight hours at every site, got " + compared);
        assertTrue(maxZenithErr < 0.01, "max zenith deviation " + maxZenithErr + "°");
        assertTrue(maxAzimuthErr < 0.01, "max azimuth deviation " + maxAzimuthErr + "°");
    }

    /** The sun vector is a unit vector pointing up at zenith 0 and east at (90°, 90°) (geometry). */
    @Test
    void sunVectorIsUnitAndOriented() {
        double[] v = new double[3];
        SolarPosition.sunVector(0, 123, v);
        assertArrayEquals(new double[] {0, 0, 1}, v, 1e-15);
        SolarPosition.sunVector(90, 90, v);
        assertArrayEquals(new double[] {1, 0, 0}, v, 1e-15);
        SolarPosition.sunVector(90, 180, v);
        assertArrayEquals(new double[] {0, -1, 0}, v, 1e-15);
        SolarPosition.sunVector(37, 211, v);
        assertEquals(1.0, v[0] * v[0] + v[1] * v[1] + v[2] * v[2], 1e-15);
    }

    @Test
    void rejectsImpossibleInputs() {
        double[] out = new double[2];
        assertThrows(IllegalArgumentException.class,
                () -> SolarPosition.compute(0, 91, 0, 0, 101325, 288, 69, out));
        assertThrows(IllegalArgumentException.class,
                () -> SolarPosition.compute(0, 0, 0, 0, Double.NaN, 288, 69, out));
    }

    private static Object staticField(String name) throws Exception {
        Field f = SPA.class.getDeclaredField(name);
        f.setAccessible(true);
        return f.get(null);
    }

    private static void assertTablesEqual(double[][][] ours, double[][][] ref) {
        assertEquals(ref.length, ours.length, "number of series");
        for (int i = 0; i < ref.length; i++) {
            assertEquals(ref[i].length, ours[i].length, "terms in series " + i);
            for (int j = 0; j < ref[i].length; j++) {
                assertArrayEquals(ref[i][j], ours[i][j], 0.0, "series " + i + " term " + j);
            }
        }
    }
}
