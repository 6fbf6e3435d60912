package org.thermotile.model.radiation;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;
import org.thermotile.model.constants.Physical;

class PlanckTest {

    /**
     * ∫ π B_λ dλ over 10 nm … 10 cm by adaptive Gauss–Legendre (commons-math3, independent of our
     * series), on log-spaced pieces so that every piece is smooth.
     */
    private static double numericHemisphericalWm2(double fromM, double toM, double tempK) {
        // Absolute accuracy: 1e-15 of σT⁴ per piece, so pieces where B_λ is negligible stop early.
        double scale = 5.67e-8 * Math.pow(tempK, 4);
        IterativeLegendreGaussIntegrator gauss = new IterativeLegendreGaussIntegrator(8, 1e-13, 1e-15 * scale);
        int pieces = 200;
        double logA = Math.log(fromM);
        double logB = Math.log(toM);
        double sum = 0;
        for (int i = 0; i < pieces; i++) {
            double a = Math.exp(logA + (logB - logA) * i / pieces);
            double b = Math.exp(logA + (logB - logA) * (i + 1) / pieces);
            sum += gauss.integrate(1_000_000, l -> Math.PI * Planck.spectralRadiance(l, tempK), a, b);
        }
        return sum;
    }

    /** Stefan–Boltzmann law σT⁴ with σ = 5.670374419e-8 (CODATA 2018, Tiesinga et al. 2021). */
    @ParameterizedTest
    @ValueSource(doubles = {200.0, 273.15, 300.0, 373.15, 1000.0, 5772.0})
    void planckIntegratedOverWavelengthEqualsSigmaT4(double tempK) {
        double sigmaT4 = 5.670374419e-8 * Math.pow(tempK, 4);
        double numeric = numericHemisphericalWm2(1e-8, 1e-1, tempK);
        assertEquals(1.0, numeric / sigmaT4, 1e-6, "numeric ∫πB_λ dλ at " + tempK + " K");
        // The series band integral over the same range agrees too.
        assertEquals(1.0, Planck.bandEmissionWm2(1e-8, 1e-1, tempK) / sigmaT4, 1e-6);
        assertEquals(1.0, Planck.bandEmissionWm2(1e-12, Double.POSITIVE_INFINITY, tempK) / sigmaT4, 1e-12);
    }

    /**
     * σ = 2π⁵k⁴/(15h³c²) from the exact SI constants equals the published CODATA 2018 value
     * 5.670374419e-8 W m⁻² K⁻⁴ (Tiesinga et al. 2021), which is given to 10 digits.
     */
    @Test
    void stefanBoltzmannFromPlanckConstantsMatchesCodata() {
        double h = Physical.PLANCK, c = Physical.SPEED_OF_LIGHT, k = Physical.BOLTZMANN;
        double sigma = 2 * Math.pow(Math.PI, 5) * Math.pow(k, 4) / (15 * h * h * h * c * c);
        assertEquals(5.670374419e-8, sigma, 1e-17);
    }

    /** Band integrals from the series equal the numeric quadrature of B_λ for several bands. */
    @ParameterizedTest
    @CsvSource({
        "0.3e-6, 3e-6, 5772",     // solar band of the Sun's effective temperature
        "8e-6, 14e-6, 300",       // thermal-infrared window at ambient temperature
        "3e-6, 100e-6, 310",
        "50e-6, 1e-3, 250",       // long-wave side (series for x < 1 in play)
        "1e-6, 2e-6, 1500",
    })
    void bandEmissionMatchesNumericQuadrature(double fromM, double toM, double tempK) {
        double series = Planck.bandEmissionWm2(fromM, toM, tempK);
        double numeric = numericHemisphericalWm2(fromM, toM, tempK);
        assertEquals(1.0, series / numeric, 1e-9);
    }

    /**
     * Blackbody fraction F(0→λT), Incropera &amp; DeWitt, Fundamentals of Heat and Mass Transfer
     * (6th ed.), Table 12.1 "Blackbody radiation functions" (from memory). The table predates the
     * CODATA 2018 c₂ and is printed to 6 digits; tolerance 5e-5.
     */
    @ParameterizedTest
    @CsvSource({
        "1000, 0.000321", "2000, 0.066728", "2898, 0.250108", "3000, 0.273232",
        "4000, 0.480877", "5000, 0.633747", "6000, 0.737818", "10000, 0.914199",
    })
    void fractionBelowMatchesBlackbodyTable(double lambdaTMicronK, double expected) {
        assertEquals(expected, Planck.fractionBelow(lambdaTMicronK * 1e-6, 1.0), 5e-5);
    }

    /** Both branches of the band-fraction series meet smoothly at x = c₂/(λT) = 1. */
    @Test
    void seriesBranchesAreContinuousAtTheSwitch() {
        double below = Planck.upperTailIntegral(Math.nextDown(1.0));
        double above = Planck.upperTailIntegral(1.0);
        assertEquals(above, below, 1e-13);
        assertEquals(Math.pow(Math.PI, 4) / 15, Planck.upperTailIntegral(0.0), 1e-15);
        assertEquals(0.0, Planck.upperTailIntegral(Double.POSITIVE_INFINITY), 0.0);
    }

    /**
     * Wien peak λ_max = b/T with b = 2.897771955e-3 m K (CODATA 2018); at 300 K ≈ 9.66 µm, "about
     * 10 µm" for terrestrial surfaces (common practice). The peak is also found by a golden-section
     * search on B_λ itself.
     */
    @Test
    void wienPeakAt300K() {
        double peak = Planck.wienPeakWavelengthM(300.0);
        assertEquals(2.897771955e-3 / 300.0, peak, 1e-15);
        assertEquals(9.66e-6, peak, 0.01e-6);
        assertEquals(10e-6, peak, 0.5e-6);
        double found = goldenMaximum(1e-6, 50e-6, 300.0);
        assertEquals(peak, found, 1e-11);
    }

    @Test
    void wienConstantFromSecondRadiationConstant() {
        // c₂/x_w with c₂ = hc/k reproduces the CODATA 2018 Wien constant to its 10 digits.
        assertEquals(2.897771955e-3, Planck.wienPeakWavelengthM(1.0), 1e-12);
    }

    /** Spectral radiance at a point: Planck's law evaluated by hand from CODATA 2018 constants. */
    @Test
    void spectralRadianceAtTenMicronsAnd300K() {
        double h = 6.62607015e-34, c = 299792458.0, k = 1.380649e-23, l = 10e-6, t = 300.0;
        double expected = 2 * h * c * c / Math.pow(l, 5) / (Math.exp(h * c / (l * k * t)) - 1);
        assertEquals(expected, Planck.spectralRadiance(l, t), expected * 1e-12);
    }

    @Test
    void badArgumentsAreRejectedWithTheirName() {
        var e = assertThrows(IllegalArgumentException.class, () -> Planck.spectralRadiance(-1e-6, 300));
        assertTrue(e.getMessage().contains("wavelength"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> Planck.fractionBelow(1e-6, 0));
        assertTrue(e.getMessage().contains("temperature"), e.getMessage());
        e = assertThrows(IllegalArgumentException.class, () -> Planck.bandEmissionWm2(2e-6, 1e-6, 300));
        assertTrue(e.getMessage().contains("upper wavelength"), e.getMessage());
    }

    private static double goldenMaximum(double a, double b, double tempK) {
        double g = (Math.sqrt(5) - 1) / 2;
        double c = b - g * (b - a), d = a + g * (b - a);
        while (b - a > 1e-13) {
            if (Planck.spectralRadiance(c, tempK) > Planck.spectralRadiance(d, tempK)) {
                b = d;
            } else {
                a = c;
            }
            c = b - g * (b - a);
            d = a + g * (b - a);
        }
        return (a + b) / 2;
    }
}
