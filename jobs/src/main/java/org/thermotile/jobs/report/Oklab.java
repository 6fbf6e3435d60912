package org.thermotile.jobs.report;

/**
 * Colour arithmetic for the report's ramps: the OKLab perceptual colour space, the sRGB transfer
 * curve and CIE lightness L*. Stateless; every method works on doubles in [0, 1] unless stated.
 *
 * <p>OKLab (Ottosson 2020, "A perceptual color space for image processing", bottosson.github.io):
 * linear sRGB → LMS by a 3×3 matrix, a cube root per channel, then a second 3×3 matrix to
 * (L, a, b). L runs from 0 (black) to 1 (white); a and b are the green–red and blue–yellow axes.
 * Equal steps in OKLab are meant to look like equal steps in colour, which is why the ramps are
 * defined and interpolated there.
 */
public final class Oklab {
    private Oklab() {}

    /**
     * Linear sRGB → OKLab, Ottosson (2020) forward matrices M1 (for linear sRGB) and M2.
     *
     * @param r linear red [0, 1]
     * @param g linear green [0, 1]
     * @param b linear blue [0, 1]
     * @return {L, a, b}; L in [0, 1]
     */
    public static double[] fromLinearSrgb(double r, double g, double b) {
        double l = 0.4122214708 * r + 0.5363325363 * g + 0.0514459929 * b;
        double m = 0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b;
        double s = 0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b;
        double l_ = Math.cbrt(l), m_ = Math.cbrt(m), s_ = Math.cbrt(s);
        return new double[] {
            0.2104542553 * l_ + 0.7936177850 * m_ - 0.0040720468 * s_,
            1.9779984951 * l_ - 2.4285922050 * m_ + 0.4505937099 * s_,
            0.0259040371 * l_ + 0.7827717662 * m_ - 0.8086757660 * s_};
    }

    /**
     * OKLab → linear sRGB, Ottosson (2020) inverse matrices. The result may fall outside [0, 1]
     * for colours outside the sRGB gamut; see {@link #inGamut}.
     *
     * @return {r, g, b} linear
     */
    public static double[] toLinearSrgb(double bigL, double a, double b) {
        double l_ = bigL + 0.3963377774 * a + 0.2158037573 * b;
        double m_ = bigL - 0.1055613458 * a - 0.0638541728 * b;
        double s_ = bigL - 0.0894841775 * a - 1.2914855480 * b;
        double l = l_ * l_ * l_, m = m_ * m_ * m_, s = s_ * s_ * s_;
        return new double[] {
            4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
            -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
            -0.0041960863 * l - 0.7034186147 * m + 1.7076147010 * s};
    }

    /** True when every linear channel lies in [−1e−9, 1 + 1e−9] (a rounding margin, our choice). */
    public static boolean inGamut(double[] linear) {
        for (double c : linear) {
            if (c < -1e-9 || c > 1 + 1e-9) {
                return false;
            }
        }
        return true;
    }

    /**
     * sRGB transfer curve, linear → encoded (IEC 61966-2-1:1999):
     * {@code V = 12.92·x} for x ≤ 0.0031308, else {@code 1.055·x^(1/2.4) − 0.055}.
     */
    public static double encode(double linear) {
        double x = Math.min(1, Math.max(0, linear));
        return x <= 0.0031308 ? 12.92 * x : 1.055 * Math.pow(x, 1 / 2.4) - 0.055;
    }

    /**
     * sRGB transfer curve, encoded → linear (IEC 61966-2-1:1999):
     * {@code x = V/12.92} for V ≤ 0.04045, else {@code ((V + 0.055)/1.055)^2.4}.
     */
    public static double decode(double encoded) {
        return encoded <= 0.04045 ? encoded / 12.92 : Math.pow((encoded + 0.055) / 1.055, 2.4);
    }

    /** Packs linear sRGB into 0xRRGGBB (encoded, rounded to 8 bits per channel). */
    public static int packRgb(double[] linear) {
        int r = (int) Math.round(255 * encode(linear[0]));
        int g = (int) Math.round(255 * encode(linear[1]));
        int b = (int) Math.round(255 * encode(linear[2]));
        return (r << 16) | (g << 8) | b;
    }

    /**
     * CIE 1976 lightness L* of an 8-bit sRGB colour 0xRRGGBB: relative luminance
     * {@code Y = 0.2126·R + 0.7152·G + 0.0722·B} of the linear channels (IEC 61966-2-1, D65 white
     * Y = 1), then {@code L* = 116·f(Y) − 16} with {@code f(Y) = Y^(1/3)} for Y > (6/29)³, else
     * {@code Y/(3·(6/29)²) + 4/29} (CIE 15:2004). This is what a greyscale print keeps.
     *
     * @return L* in [0, 100]
     */
    public static double lightnessLStar(int rgb) {
        double r = decode(((rgb >> 16) & 0xff) / 255.0);
        double g = decode(((rgb >> 8) & 0xff) / 255.0);
        double b = decode((rgb & 0xff) / 255.0);
        return lightnessLStarOfY(0.2126 * r + 0.7152 * g + 0.0722 * b);
    }

    /** CIE 1976 L* of relative luminance Y (white = 1), CIE 15:2004. */
    public static double lightnessLStarOfY(double y) {
        double d = 6.0 / 29;
        double f = y > d * d * d ? Math.cbrt(y) : y / (3 * d * d) + 4.0 / 29;
        return 116 * f - 16;
    }

    /** "#rrggbb" of 0xRRGGBB. */
    public static String hex(int rgb) {
        return String.format("#%06x", rgb & 0xffffff);
    }
}
