package org.thermotile.jobs.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * The report's colour ramps: OKLab arithmetic against its published test values, and the design
 * requirements of Kiln (order kept in greyscale and under colour-vision deficiency) and Fulcrum
 * (centred, symmetric), measured with CIE L*, which is computed independently of OKLab.
 */
class ColourRampTest {

    /**
     * Ottosson (2020), "A perceptual color space for image processing", table of XYZ → OKLab test
     * values (from memory; they agree with the matrices to 3 decimals, which a wrong recollection
     * of either would not). XYZ → linear sRGB by the IEC 61966-2-1 matrix (from memory).
     */
    @Test
    void oklabMatchesPublishedTestValues() {
        double[][] xyzLab = {
            {0.950, 1.000, 1.089, 1.000, 0.000, 0.000},
            {1.000, 0.000, 0.000, 0.450, 1.236, -0.019},
            {0.000, 1.000, 0.000, 0.922, -0.671, 0.263},
            {0.000, 0.000, 1.000, 0.153, -1.415, -0.449},
        };
        for (double[] t : xyzLab) {
            double r = 3.2406 * t[0] - 1.5372 * t[1] - 0.4986 * t[2];
            double g = -0.9689 * t[0] + 1.8758 * t[1] + 0.0415 * t[2];
            double b = 0.0557 * t[0] - 0.2040 * t[1] + 1.0570 * t[2];
            double[] lab = Oklab.fromLinearSrgb(r, g, b);
            for (int k = 0; k < 3; k++) {
                assertEquals(t[3 + k], lab[k], 2e-3, "XYZ (" + t[0] + ", " + t[1] + ", " + t[2] + ") component " + k);
            }
        }
        double[] white = Oklab.fromLinearSrgb(1, 1, 1);
        assertEquals(1, white[0], 1e-6);
        assertEquals(0, white[1], 1e-6);
        assertEquals(0, white[2], 1e-6);
    }

    @Test
    void oklabRoundTrips() {
        for (double r = 0; r <= 1; r += 0.25) {
            for (double g = 0; g <= 1; g += 0.25) {
                for (double b = 0; b <= 1; b += 0.25) {
                    double[] lab = Oklab.fromLinearSrgb(r, g, b);
                    double[] back = Oklab.toLinearSrgb(lab[0], lab[1], lab[2]);
                    assertEquals(r, back[0], 1e-6);
                    assertEquals(g, back[1], 1e-6);
                    assertEquals(b, back[2], 1e-6);
                }
            }
        }
    }

    /** CIE L* of known colours: white 100, black 0, sRGB mid grey 0x777777 ≈ 50 (CIE 15:2004; common practice). */
    @Test
    void lightnessOfKnownColours() {
        assertEquals(100, Oklab.lightnessLStar(0xffffff), 1e-6);
        assertEquals(0, Oklab.lightnessLStar(0x000000), 1e-9);
        assertEquals(50, Oklab.lightnessLStar(0x777777), 0.5);
    }

    /**
     * Kiln prints in greyscale in order: CIE L* rises strictly along the whole table and spans at
     * least 70 of the 100 units (our design requirement).
     */
    @Test
    void kilnLightnessRisesStrictly() {
        int[] t = ColourRamp.KILN.table();
        double prev = -1;
        for (int i = 0; i < t.length; i += 4) {
            double l = Oklab.lightnessLStar(t[i]);
            assertTrue(l > prev, "L* rises at table entry " + i + ": " + prev + " → " + l);
            prev = l;
        }
        double span = Oklab.lightnessLStar(t[t.length - 1]) - Oklab.lightnessLStar(t[0]);
        assertTrue(span >= 70, "L* span " + span);
    }

    /**
     * Simulated dichromacy: Machado, Oliveira & Fernandes (2009), "A physiologically-based model
     * for simulation of color vision deficiency", IEEE TVCG 15(6), severity-1.0 matrices on linear
     * RGB (values from memory; each row sums to 1 as the model requires). Under each, Kiln's L*
     * still rises strictly, and samples an eighth of the ramp apart stay at least 0.05 apart in
     * OKLab (our requirement; clearly distinct steps).
     */
    @Test
    void kilnKeepsItsOrderUnderColourVisionDeficiency() {
        double[][][] cvd = {
            {{0.152286, 1.052583, -0.204868}, {0.114503, 0.786281, 0.099216}, {-0.003882, -0.048116, 1.051998}},
            {{0.367322, 0.860646, -0.227968}, {0.280085, 0.672501, 0.047413}, {-0.011820, 0.042940, 0.968881}},
            {{1.255528, -0.076749, -0.178779}, {-0.078411, 0.930809, 0.147602}, {0.004733, 0.691367, 0.303900}},
        };
        String[] names = {"protanopia", "deuteranopia", "tritanopia"};
        int[] table = ColourRamp.KILN.table();
        for (int k = 0; k < cvd.length; k++) {
            double[][] m = cvd[k];
            for (double[] row : m) {
                assertEquals(1, row[0] + row[1] + row[2], 1e-5, names[k] + " row sums to 1");
            }
            double prev = -1;
            double[] prevLab = null;
            for (int i = 0; i < table.length; i += 4) {
                double[] sim = simulate(m, table[i]);
                double l = Oklab.lightnessLStarOfY(0.2126 * sim[0] + 0.7152 * sim[1] + 0.0722 * sim[2]);
                assertTrue(l > prev, names[k] + ": L* rises at entry " + i);
                prev = l;
            }
            for (int j = 0; j <= 8; j++) {
                int i = Math.min(table.length - 1, j * table.length / 8);
                double[] sim = simulate(m, table[i]);
                double[] lab = Oklab.fromLinearSrgb(sim[0], sim[1], sim[2]);
                if (prevLab != null) {
                    double d = Math.sqrt(sq(lab[0] - prevLab[0]) + sq(lab[1] - prevLab[1]) + sq(lab[2] - prevLab[2]));
                    assertTrue(d >= 0.05, names[k] + ": step " + j + " ΔE_OK " + d);
                }
                prevLab = lab;
            }
        }
    }

    /**
     * Fulcrum: lightest at its centre (value 0), darker in both directions, both arms alike in
     * lightness (within 3 L*, our requirement) and the centre nearly neutral (OKLab chroma < 0.02).
     */
    @Test
    void fulcrumIsCentredAndSymmetric() {
        int[] t = ColourRamp.FULCRUM.table();
        int mid = (t.length - 1) / 2;
        double lMid = Oklab.lightnessLStar(t[mid]);
        double prevLow = lMid, prevHigh = lMid;
        for (int d = 8; d <= mid; d += 8) {
            double lo = Oklab.lightnessLStar(t[mid - d]), hi = Oklab.lightnessLStar(t[mid + 1 + d]);
            assertTrue(lo < prevLow && hi < prevHigh, "darker away from the centre at offset " + d);
            assertTrue(Math.abs(lo - hi) < 3, "arms alike at offset " + d + ": " + lo + " vs " + hi);
            prevLow = lo;
            prevHigh = hi;
        }
        int c = ColourRamp.FULCRUM.rgb(0.5);
        double[] lab = Oklab.fromLinearSrgb(Oklab.decode((c >> 16 & 255) / 255.0), Oklab.decode((c >> 8 & 255) / 255.0),
                Oklab.decode((c & 255) / 255.0));
        assertTrue(Math.hypot(lab[1], lab[2]) < 0.02, "centre chroma " + Math.hypot(lab[1], lab[2]));
        // the cool arm is blue, the warm arm orange: OKLab b < 0 and b > 0 respectively
        assertTrue(labOf(ColourRamp.FULCRUM.rgb(0))[2] < 0 && labOf(ColourRamp.FULCRUM.rgb(1))[2] > 0);
    }

    static double[] labOf(int rgb) {
        return Oklab.fromLinearSrgb(Oklab.decode((rgb >> 16 & 255) / 255.0), Oklab.decode((rgb >> 8 & 255) / 255.0),
                Oklab.decode((rgb & 255) / 255.0));
    }

    static double[] simulate(double[][] m, int rgb) {
        double r = Oklab.decode((rgb >> 16 & 255) / 255.0);
        double g = Oklab.decode((rgb >> 8 & 255) / 255.0);
        double b = Oklab.decode((rgb & 255) / 255.0);
        double[] out = new double[3];
        for (int i = 0; i < 3; i++) {
            out[i] = Math.min(1, Math.max(0, m[i][0] * r + m[i][1] * g + m[i][2] * b));
        }
        return out;
    }

    static double sq(double x) {
        return x * x;
    }
}
