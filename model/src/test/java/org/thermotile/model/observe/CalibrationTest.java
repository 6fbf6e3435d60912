package org.thermotile.model.observe;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.thermotile.model.balance.Convection;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.TestWeather;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.materials.MaterialOverrides;
import org.thermotile.model.tile.TileSimulation;

/**
 * Calibration recovers known parameters from observations simulated by the same kernel (a
 * synthetic identifiability experiment: the truth is set, observed with seeded Gaussian noise of
 * 0.5 K, and fitted from the library's values).
 */
class CalibrationTest {
    private static Forcing forcing;
    private static TileSimulation.Settings settings;
    private static final Material[] LIBRARY = {MaterialLibrary.get("asphalt_aged"), MaterialLibrary.get("grass_irrigated")};
    /** The invented truth: a lighter asphalt (library 0.12) and a drier lawn (library β 0.9). */
    private static final double TRUE_ALBEDO = 0.20;
    private static final double TRUE_BETA = 0.55;
    private static final int PIXELS = 80; // 40 asphalt, 40 grass
    private static int day13;
    private static int night22;

    /** Two clear July days at 45° N (invented site); the second day is observed. */
    @BeforeAll
    static void weather() {
        forcing = TestWeather.clearJuly(2);
        settings = new TileSimulation.Settings(10, Convection.mcAdams(), Physical.ZERO_CELSIUS_K + 24, 24,
                Physical.ZERO_CELSIUS_K + 45, new int[0]);
        day13 = -1;
        night22 = -1;
        for (int h = 24; h < forcing.hours(); h++) {
            if (forcing.localHourOfDay(h) == 13 && day13 < 0) {
                day13 = h;
            }
            if (forcing.localHourOfDay(h) == 22 && night22 < 0) {
                night22 = h;
            }
        }
        assertTrue(day13 > 0 && night22 > day13, "hours " + day13 + ", " + night22);
    }

    private static int[] dominant() {
        int[] d = new int[PIXELS];
        for (int p = 0; p < PIXELS; p++) {
            d[p] = p % 2;
        }
        return d;
    }

    /** Observations of the true palette at {@code hours}, plus N(0, 0.5² K²) noise, seed 7. */
    private static Calibration.Observed observe(int... hours) {
        Material[] truth = {MaterialOverrides.apply(LIBRARY[0], "albedo", TRUE_ALBEDO, "test truth"),
                MaterialOverrides.apply(LIBRARY[1], "moisture_availability", TRUE_BETA, "test truth")};
        int[] d = dominant();
        TileSimulation.Result res = TileSimulation.run(truth, d, forcing, new TileSimulation.Settings(
                settings.substepMinutes(), settings.convection(), settings.deepGroundK(), settings.firstSampleHour(),
                settings.thresholdK(), hours));
        Random rnd = new Random(7);
        double[][] obs = new double[hours.length][PIXELS];
        for (int k = 0; k < hours.length; k++) {
            for (int p = 0; p < PIXELS; p++) {
                obs[k][p] = res.hourlyC[k][p] + Physical.ZERO_CELSIUS_K + 0.5 * rnd.nextGaussian();
            }
        }
        return new Calibration.Observed(d, java.util.Arrays.stream(hours).asDoubleStream().toArray(), obs);
    }

    private static final List<Calibration.Parameter> FREE = List.of(Calibration.Parameter.of(0, "albedo"),
            Calibration.Parameter.of(1, "moisture_availability"));

    private static String describe(Calibration.Fit f) {
        StringBuilder b = new StringBuilder();
        for (var e : f.estimates()) {
            b.append(String.format("%s[%d]: start %.4f fitted %.4f ± %.4f%s; ", e.parameter().key(),
                    e.parameter().material(), e.start(), e.value(), e.standardError(),
                    e.identifiable() ? "" : " NOT IDENTIFIABLE (" + e.why() + ")"));
        }
        b.append(String.format("RMSE %.3f → %.3f K, bias %.3f → %.3f K, %d evaluations", f.rmseBeforeK(),
                f.rmseAfterK(), f.biasBeforeK(), f.biasAfterK(), f.evaluations()));
        return b.toString();
    }

    /**
     * Images at 13:00 and 22:00 local of 40 asphalt and 40 lawn pixels (25 of each sampled), true
     * asphalt albedo 0.20 and lawn β 0.55, fitted from the library's 0.12 and 0.9. Tolerances
     * (ours): albedo within 0.02, β within 0.05, and both within 3 standard errors of the curvature
     * estimate; the fitted RMSE is the noise's 0.5 K within 0.1 K (the sd of a sample RMSE of
     * m = 100 residuals is about 0.5/√(2m) ≈ 0.035 K, normal theory, common practice).
     */
    @Test
    void dayAndNightImagesRecoverAlbedoAndMoisture() {
        Calibration.Fit f = Calibration.fit(LIBRARY, FREE, observe(day13, night22), forcing, settings, 25, 11, 400);
        String d = "true albedo " + TRUE_ALBEDO + ", true β " + TRUE_BETA + "; " + describe(f);
        System.out.println("day+night: " + d);
        var a = f.estimates().get(0);
        var b = f.estimates().get(1);
        assertTrue(a.identifiable() && b.identifiable(), d);
        assertEquals(TRUE_ALBEDO, a.value(), 0.02, d);
        assertEquals(TRUE_BETA, b.value(), 0.05, d);
        assertEquals(TRUE_ALBEDO, a.value(), 3 * a.standardError() + 1e-3, d);
        assertEquals(TRUE_BETA, b.value(), 3 * b.standardError() + 1e-3, d);
        assertEquals(0.5, f.rmseAfterK(), 0.1, d);
        assertTrue(f.rmseBeforeK() > 1.0, d);
    }

    /**
     * One night-time image (22:00 local) and the lawn's albedo and β both free: the lawn's night
     * temperature answers to one combination of the two (the day's absorbed and evaporated energy
     * carried into the night by storage), so JᵀJ is singular and albedo is reported as not
     * identifiable. The asphalt's albedo, the only free parameter of its cells, is still
     * identified from the same night image through its heat storage: we pin that too, so the
     * verdict is shown to come from the data and not from the night alone.
     */
    @Test
    void oneNightImageDoesNotIdentifyAlbedo() {
        List<Calibration.Parameter> free = List.of(Calibration.Parameter.of(1, "albedo"),
                Calibration.Parameter.of(1, "moisture_availability"), Calibration.Parameter.of(0, "albedo"));
        Calibration.Fit f = Calibration.fit(LIBRARY, free, observe(night22), forcing, settings, 25, 11, 400);
        String d = "true lawn albedo 0.23 (library), true lawn β " + TRUE_BETA + ", true asphalt albedo "
                + TRUE_ALBEDO + "; " + describe(f);
        System.out.println("night only: " + d);
        assertFalse(f.estimates().get(0).identifiable(), d);
        assertFalse(f.estimates().get(1).identifiable(), d);
        assertTrue(f.estimates().get(0).why().contains("singular"), d);
        var asphalt = f.estimates().get(2);
        assertTrue(asphalt.identifiable(), d);
        assertEquals(TRUE_ALBEDO, asphalt.value(), 0.05, d);
    }

    /** Equal allocation, without replacement, deterministic for a seed, only observed pixels. */
    @Test
    void stratifiedSampleIsEqualAllocationAndSeeded() {
        int[] d = {0, 1, 1, 1, 1, 1, 1, 0, 1, -1, 1, 0};
        double[] o = new double[d.length];
        o[11] = Double.NaN; // pixel 11 (material 0) has no observation
        var obs = new Calibration.Observed(d, new double[] {night22}, new double[][] {o});
        int[] s = Calibration.stratifiedSample(obs, 2, 3, 5);
        assertEquals(5, s.length, java.util.Arrays.toString(s)); // 2 eligible of material 0, 3 of material 1
        assertTrue((s[0] == 0 || s[0] == 7) && (s[1] == 0 || s[1] == 7) && s[0] != s[1], java.util.Arrays.toString(s));
        assertEquals(3, java.util.Arrays.stream(s, 2, 5).distinct().filter(p -> d[p] == 1).count());
        assertEquals(java.util.Arrays.toString(s), java.util.Arrays.toString(Calibration.stratifiedSample(obs, 2, 3, 5)));
    }

    /** A cap too small for BOBYQA (its 2n + 1 = 5 starting points and a few steps) is a clear error, not a silent stop. */
    @Test
    void tooFewEvaluationsIsAClearError() {
        var e = org.junit.jupiter.api.Assertions.assertThrows(IllegalArgumentException.class,
                () -> Calibration.fit(LIBRARY, FREE, observe(day13, night22), forcing, settings, 5, 11, 8));
        assertTrue(e.getMessage().contains("did not converge within 8 kernel runs"), e.getMessage());
    }
}
