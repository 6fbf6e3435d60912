package org.thermotile.jobs.report;

import java.util.Arrays;

/**
 * A colour ramp defined by a few control points in OKLab ({@link Oklab}) and interpolated
 * linearly there, then mapped into the sRGB gamut by lowering chroma at constant lightness and
 * hue. Precomputed into a table of {@value #STEPS} colours, so {@link #rgb} is a lookup.
 *
 * <p>The report's two ramps are of our own design:
 * <ul>
 *   <li>{@link #KILN}, sequential, for temperatures and degree-hours: deep indigo → violet →
 *       rose → orange → amber → pale cream. OKLab lightness rises in equal steps from 0.22 to
 *       0.96, so the ramp's order survives greyscale printing and every kind of colour-vision
 *       deficiency (ordering is carried by lightness, hue only adds separation; the hues run along
 *       the blue–yellow axis that red–green deficient viewers keep).</li>
 *   <li>{@link #FULCRUM}, diverging, for differences centred at zero: blue (cooler) → near-white
 *       at zero → burnt orange (warmer). Both arms have the same lightness profile, so equal
 *       magnitudes look equally strong; blue against orange stays distinct for red–green deficient
 *       viewers.</li>
 * </ul>
 */
public final class ColourRamp {

    /** Size of the lookup table. */
    public static final int STEPS = 1024;

    /** Sequential ramp for temperatures: control points as {L, C, h°} in OKLCh (our design). */
    public static final ColourRamp KILN = ofOkLch("Kiln", new double[][] {
        {0.22, 0.09, 280},
        {0.38, 0.15, 318},
        {0.54, 0.18, 8},
        {0.69, 0.17, 45},
        {0.83, 0.14, 75},
        {0.96, 0.07, 100},
    });

    /** Diverging ramp for differences: control points as {L, C, h°} in OKLCh (our design). */
    public static final ColourRamp FULCRUM = ofOkLch("Fulcrum", new double[][] {
        {0.40, 0.12, 258},
        {0.68, 0.10, 245},
        {0.97, 0.005, 90},
        {0.68, 0.12, 58},
        {0.40, 0.11, 42},
    });

    /**
     * Ramp for the hot-area bands: deep pine green (cooler) through a pale stone (not distinct) to
     * deep aubergine (warmer), control points as {L, C, h°} in OKLCh (our design). Lightness falls
     * evenly towards both ends, so the strength of a band reads in greyscale; the hues are neither
     * red nor blue.
     */
    public static final ColourRamp VERGE = ofOkLch("Verge", new double[][] {
        {0.38, 0.08, 160},
        {0.66, 0.08, 150},
        {0.95, 0.015, 85},
        {0.64, 0.10, 330},
        {0.36, 0.10, 320},
    });

    private final String name;
    private final double[][] okLab;
    private final int[] table = new int[STEPS];

    private ColourRamp(String name, double[][] okLab) {
        this.name = name;
        this.okLab = okLab;
        for (int i = 0; i < STEPS; i++) {
            table[i] = Oklab.packRgb(linearAt(i / (STEPS - 1.0)));
        }
    }

    /**
     * A ramp through control points given in OKLCh (lightness L [0, 1], chroma C, hue h [°]),
     * equally spaced along the ramp: {@code a = C·cos h, b = C·sin h}.
     */
    public static ColourRamp ofOkLch(String name, double[][] lch) {
        if (lch.length < 2) {
            throw new IllegalArgumentException("a ramp needs at least two control points");
        }
        double[][] lab = new double[lch.length][];
        for (int i = 0; i < lch.length; i++) {
            double h = Math.toRadians(lch[i][2]);
            lab[i] = new double[] {lch[i][0], lch[i][1] * Math.cos(h), lch[i][1] * Math.sin(h)};
        }
        return new ColourRamp(name, lab);
    }

    /** The ramp's name as shown in legends. */
    public String name() {
        return name;
    }

    /** The control points in OKLab, {L, a, b} each (a copy). */
    public double[][] controlPoints() {
        double[][] c = new double[okLab.length][];
        for (int i = 0; i < c.length; i++) {
            c[i] = okLab[i].clone();
        }
        return c;
    }

    /**
     * The colour at position t along the ramp, 0xRRGGBB; t is clamped to [0, 1] and NaN gives
     * the start.
     */
    public int rgb(double t) {
        if (!(t > 0)) {
            return table[0];
        }
        if (t >= 1) {
            return table[STEPS - 1];
        }
        return table[(int) Math.round(t * (STEPS - 1))];
    }

    /** The lookup table, 0xRRGGBB from t = 0 to 1 (a copy). */
    public int[] table() {
        return Arrays.copyOf(table, STEPS);
    }

    /** Linear sRGB at t: OKLab interpolated between neighbouring control points, chroma lowered into gamut. */
    private double[] linearAt(double t) {
        double pos = t * (okLab.length - 1);
        int i = Math.min(okLab.length - 2, (int) Math.floor(pos));
        double f = pos - i;
        double[] p = okLab[i], q = okLab[i + 1];
        double bigL = p[0] + f * (q[0] - p[0]);
        double a = p[1] + f * (q[1] - p[1]);
        double b = p[2] + f * (q[2] - p[2]);
        double[] rgb = Oklab.toLinearSrgb(bigL, a, b);
        if (Oklab.inGamut(rgb)) {
            return rgb;
        }
        double lo = 0, hi = 1;                 // chroma scale: lo in gamut, hi outside
        for (int k = 0; k < 40; k++) {
            double mid = 0.5 * (lo + hi);
            if (Oklab.inGamut(Oklab.toLinearSrgb(bigL, a * mid, b * mid))) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return Oklab.toLinearSrgb(bigL, a * lo, b * lo);
    }
}
