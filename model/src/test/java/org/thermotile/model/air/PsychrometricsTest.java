package org.thermotile.model.air;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.api.Test;

class PsychrometricsTest {

    /**
     * Magnus (WMO coefficients) within 0.5 % of the saturation vapour pressure over liquid water
     * tabulated from the Hyland &amp; Wexler (1983) formulation in the CRC Handbook of Chemistry and
     * Physics ("Vapor pressure of water", values in hPa; from memory, −20 and −10 °C over
     * supercooled water).
     */
    @ParameterizedTest(name = "{0} °C: {1} hPa")
    @CsvSource({
        "-20, 1.2559",
        "-10, 2.8652",
        "0, 6.1121",
        "10, 12.282",
        "20, 23.392",
        "25, 31.697",
        "30, 42.467",
        "40, 73.844",
        "50, 123.52",
    })
    void magnusMatchesTheTabulatedSaturationPressureWithinHalfAPercent(double tC, double tableHpa) {
        double ours = Psychrometrics.saturationVapourPressurePa(tC + 273.15) / 100.0;
        assertEquals(tableHpa, ours, 0.005 * tableHpa);
    }

    /** The analytic slope equals a central difference of the function. */
    @Test
    void slopeIsTheDerivative() {
        for (double t = 250; t <= 340; t += 7.5) {
            double h = 1e-3;
            double fd = (Psychrometrics.saturationVapourPressurePa(t + h)
                    - Psychrometrics.saturationVapourPressurePa(t - h)) / (2 * h);
            assertEquals(fd, Psychrometrics.saturationVapourPressureSlopePaK(t), 1e-6 * fd);
        }
    }

    /**
     * Specific humidity q = 0.622 e/(p − 0.378 e) (WMO-No. 8, 2018, Annex 4.B): at e = 2339 Pa
     * and p = 101325 Pa, q = 0.622·2339/(101325 − 0.378·2339) = 0.014487 (worked by hand).
     */
    @Test
    void specificHumidityFollowsTheDefinitionAndInverts() {
        double q = Psychrometrics.specificHumidity(2339, 101_325);
        assertEquals(0.62198 * 2339 / (101_325 - 0.37802 * 2339), q, 1e-12);
        assertEquals(0.014487, q, 5e-6);
        assertEquals(2339, Psychrometrics.vapourPressurePa(q, 101_325), 1e-9);
    }

    /** Latent heat: 2.501e6 J/kg at 0 °C and about 2.43e6 J/kg at 30 °C (Rogers &amp; Yau 1989 Table 2.1, from memory). */
    @Test
    void latentHeatOfVaporisation() {
        assertEquals(2.501e6, Psychrometrics.latentHeatVaporisationJkg(273.15), 1);
        assertEquals(2.430e6, Psychrometrics.latentHeatVaporisationJkg(303.15), 0.002 * 2.43e6);
    }

    /** ICAO standard atmosphere: 89,875 Pa at 1000 m (ICAO Doc 7488, from memory). */
    @Test
    void standardPressureAtElevation() {
        assertEquals(101_325, Psychrometrics.standardPressurePa(0), 1e-9);
        assertEquals(89_875, Psychrometrics.standardPressurePa(1000), 10);
        assertTrue(Psychrometrics.standardPressurePa(2000) < Psychrometrics.standardPressurePa(1000));
    }
}
