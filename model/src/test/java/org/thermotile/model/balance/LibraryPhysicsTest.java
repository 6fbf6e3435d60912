package org.thermotile.model.balance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.LocalDate;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.ForcingPreparer;
import org.thermotile.model.forcing.Site;
import org.thermotile.model.forcing.SyntheticWeather;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;

/** Checks that every library material runs through the full chain: synthetic weather → forcing → kernel. */
class LibraryPhysicsTest {
    static Forcing month;

    @BeforeAll
    static void forcing() {
        Site site = new Site(45.3, 9.9, 120);
        month = ForcingPreparer.prepare(SyntheticWeather.clearSky(site,
                SyntheticWeather.Spec.withRelativeHumidity(LocalDate.of(2026, 7, 1), 31, 7200, 19, 33, 0.45, 2.0)),
                site);
    }

    /**
     * Energy closure over 30 days for every library material (issue check): |Σ fluxes·Δt − Δ storage|
     * &lt; 0.1 % of Σ|fluxes|·Δt.
     */
    @Test
    void everyLibraryMaterialClosesItsEnergyBudgetOverThirtyDays() {
        for (Material m : MaterialLibrary.all()) {
            SingleSurface.Result r = SingleSurface.run(m, month, 10, Convection.mcAdams(), 299.15, 24, 318.15);
            assertTrue(Math.abs(r.closureResidualFraction) < 1e-3, m.id() + ": " + r.closureResidualFraction);
            for (int h = 0; h < r.hours(); h++) {
                double t = r.surfaceTempK[h] - Physical.ZERO_CELSIUS_K;
                assertTrue(t > -10 && t < 100, m.id() + " at hour " + h + ": " + t + " °C");
            }
        }
    }

    /** Water (a deep mixed layer) has the smallest diurnal range in the library (issue check). */
    @Test
    void waterHasTheSmallestDiurnalRange() {
        String smallest = null;
        double best = Double.POSITIVE_INFINITY;
        for (Material m : MaterialLibrary.all()) {
            SingleSurface.Result r = SingleSurface.run(m, month, 10, Convection.mcAdams(), 299.15, 24 * 20, 318.15);
            double range = range(r, r.hours() - 24, r.hours());
            if (range < best) {
                best = range;
                smallest = m.id();
            }
        }
        assertEquals("water", smallest);
    }

    /** A white membrane's peak is below a dark membrane's by tens of kelvin on a clear day (common practice). */
    @Test
    void whiteRoofPeaksFarBelowDarkRoof() {
        double dark = peak("roof_membrane_dark");
        double white = peak("roof_membrane_white");
        assertTrue(dark - white > 15, "dark " + dark + " K, white " + white + " K");
        assertTrue(dark - Physical.ZERO_CELSIUS_K > 60, "a dark roof exceeds 60 °C on a clear 33 °C day: " + dark);
    }

    static double peak(String id) {
        SingleSurface.Result r = SingleSurface.run(MaterialLibrary.get(id), month, 10, Convection.mcAdams(),
                299.15, 24 * 3, 318.15);
        return r.statistics.peakK(0);
    }

    static double range(SingleSurface.Result r, int from, int to) {
        double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
        for (int i = from; i < to; i++) {
            lo = Math.min(lo, r.surfaceTempK[i]);
            hi = Math.max(hi, r.surfaceTempK[i]);
        }
        return hi - lo;
    }
}
