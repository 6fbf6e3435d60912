package org.thermotile.jobs.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * A line chart written as inline SVG by hand: axes with nice ticks ({@link NiceScale}), lines,
 * shaded bands and a legend. No scripts, no fonts of its own (text inherits the page's system
 * font stack). Points with a NaN y break the line.
 */
final class SvgChart {
    static final int LEFT = 58, RIGHT_LEGEND = 250, TOP = 16, BOTTOM = 46;

    /** A line: its legend label, points, stroke colour, SVG dash pattern (null = solid), width [px], dots at points. */
    record Series(String label, double[] x, double[] y, String colour, String dash, double width, boolean markers) {
        Series(String label, double[] x, double[] y, String colour, String dash, double width) {
            this(label, x, y, colour, dash, width, false);
        }

        Series withMarkers() {
            return new Series(label, x, y, colour, dash, width, true);
        }
    }

    /** Unconnected dots (a scatter plot): legend label, coordinates, fill colour, radius [px]. */
    record Points(String label, double[] x, double[] y, String colour, double radius) {
    }

    /** A shaded band between {@code lo} and {@code hi}. */
    record Band(double[] x, double[] lo, double[] hi, String colour, double opacity) {
    }

    private final String title;
    private final String xLabel;
    private final String yLabel;
    private final int width;
    private final int height;
    private final boolean legend;
    private final List<Series> series = new ArrayList<>();
    private final List<Band> bands = new ArrayList<>();
    private final List<Points> points = new ArrayList<>();
    private double xMin = Double.NaN, xMax = Double.NaN;
    private double[] xTicks = new double[0];
    private String[] xTickLabels = new String[0];
    private double yMin = Double.NaN, yMax = Double.NaN;

    SvgChart(String title, String xLabel, String yLabel, int width, int height, boolean legend) {
        this.title = title;
        this.xLabel = xLabel;
        this.yLabel = yLabel;
        this.width = width;
        this.height = height;
        this.legend = legend;
    }

    SvgChart xAxis(double min, double max, double[] ticks, String[] labels) {
        xMin = min;
        xMax = max;
        xTicks = ticks;
        xTickLabels = labels;
        return this;
    }

    /** Fixes the y range (else it is taken from the data, widened to nice ticks). */
    private int legendWidth = RIGHT_LEGEND;

    /** The legend column's width [px] (default {@value #RIGHT_LEGEND}), for long labels in a small chart. */
    SvgChart legendWidth(int px) {
        legendWidth = px;
        return this;
    }

    private int legendChars = LEGEND_CHARS;

    /** Longest legend label shown whole in this chart (default {@value #LEGEND_CHARS}). */
    SvgChart legendChars(int n) {
        legendChars = n;
        return this;
    }

    SvgChart yRange(double min, double max) {
        yMin = min;
        yMax = max;
        return this;
    }

    SvgChart add(Series s) {
        series.add(s);
        return this;
    }

    SvgChart add(Points p) {
        points.add(p);
        return this;
    }

    SvgChart add(Band b) {
        bands.add(b);
        return this;
    }

    /** The data's y range over lines and bands, {NaN, NaN} when empty. */
    double[] dataYRange() {
        double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
        for (Series s : series) {
            for (double v : s.y()) {
                if (Double.isFinite(v)) {
                    lo = Math.min(lo, v);
                    hi = Math.max(hi, v);
                }
            }
        }
        for (Band b : bands) {
            for (int i = 0; i < b.x().length; i++) {
                if (Double.isFinite(b.lo()[i])) {
                    lo = Math.min(lo, b.lo()[i]);
                }
                if (Double.isFinite(b.hi()[i])) {
                    hi = Math.max(hi, b.hi()[i]);
                }
            }
        }
        return lo > hi ? new double[] {Double.NaN, Double.NaN} : new double[] {lo, hi};
    }

    String toSvg() {
        double[] yr = Double.isNaN(yMin) ? dataYRange() : new double[] {yMin, yMax};
        if (Double.isNaN(yr[0])) {
            yr = new double[] {0, 1};
        }
        if (!(yr[1] > yr[0])) {
            yr = new double[] {yr[0] - 1, yr[1] + 1};
        }
        double[] yt = NiceScale.looseTicks(yr[0], yr[1], 6);
        double y0 = yt[0], y1 = yt[yt.length - 1];
        double yStep = yt.length > 1 ? yt[1] - yt[0] : 1;
        int right = legend ? legendWidth : 14;
        double pw = width - LEFT - right, ph = height - TOP - BOTTOM;
        double x0 = xMin, x1 = xMax;
        if (!(x1 > x0)) {
            x1 = x0 + 1;
        }
        final double fx0 = x0, fx1 = x1;
        java.util.function.DoubleUnaryOperator px = v -> LEFT + (v - fx0) / (fx1 - fx0) * pw;
        java.util.function.DoubleUnaryOperator py = v -> TOP + (y1 - v) / (y1 - y0) * ph;

        StringBuilder b = new StringBuilder();
        b.append(String.format(Locale.ROOT, "<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"chart\" viewBox=\"0 0 %d %d\" "
                + "width=\"%d\" height=\"%d\" role=\"img\"><title>%s</title>\n", width, height, width, height, Html.esc(title)));
        b.append("<g class=\"grid\" stroke=\"#dddddd\" stroke-width=\"1\">\n");
        for (double v : yt) {
            b.append(String.format(Locale.ROOT, "<line x1=\"%d\" x2=\"%.1f\" y1=\"%.1f\" y2=\"%.1f\"/>\n", LEFT, LEFT + pw,
                    py.applyAsDouble(v), py.applyAsDouble(v)));
        }
        b.append("</g>\n");
        for (Band band : bands) {
            b.append(bandPath(band, px, py));
        }
        for (Points p : points) {
            b.append("<g class=\"points\" fill=\"").append(p.colour()).append("\" fill-opacity=\"0.55\"><title>")
                    .append(Html.esc(p.label())).append("</title>");
            for (int i = 0; i < p.x().length; i++) {
                if (Double.isFinite(p.x()[i]) && Double.isFinite(p.y()[i])) {
                    b.append(String.format(Locale.ROOT, "<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\"/>",
                            px.applyAsDouble(p.x()[i]), py.applyAsDouble(p.y()[i]), p.radius()));
                }
            }
            b.append("</g>\n");
        }
        for (Series s : series) {
            b.append(linePath(s, px, py));
        }
        // axes
        b.append(String.format(Locale.ROOT, "<g stroke=\"#333333\" stroke-width=\"1\" fill=\"none\"><path d=\"M%d %.1f V%.1f H%.1f\"/></g>\n",
                LEFT, (double) TOP, TOP + ph, LEFT + pw));
        b.append("<g font-size=\"12\" fill=\"#333333\">\n");
        for (double v : yt) {
            b.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%.1f\" text-anchor=\"end\">%s</text>\n", LEFT - 6,
                    py.applyAsDouble(v) + 4, NiceScale.label(v, yStep)));
        }
        for (int i = 0; i < xTicks.length; i++) {
            double x = px.applyAsDouble(xTicks[i]);
            b.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" x2=\"%.1f\" y1=\"%.1f\" y2=\"%.1f\" stroke=\"#333333\"/>"
                    + "<text x=\"%.1f\" y=\"%.1f\" text-anchor=\"middle\">%s</text>\n", x, x, TOP + ph, TOP + ph + 4, x,
                    TOP + ph + 17, Html.esc(xTickLabels[i])));
        }
        b.append(String.format(Locale.ROOT, "<text x=\"%.1f\" y=\"%d\" text-anchor=\"middle\">%s</text>\n", LEFT + pw / 2,
                height - 8, Html.esc(xLabel)));
        b.append(String.format(Locale.ROOT, "<text transform=\"translate(14 %.1f) rotate(-90)\" text-anchor=\"middle\">%s</text>\n",
                TOP + ph / 2, Html.esc(yLabel)));
        if (legend) {
            double ly = TOP + 6;
            for (Series s : series) {
                double lx = LEFT + pw + 14;
                b.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" x2=\"%.1f\" y1=\"%.1f\" y2=\"%.1f\" stroke=\"%s\" "
                        + "stroke-width=\"%.1f\"%s/>", lx, lx + 24, ly, ly, s.colour(), s.width(), dash(s.dash())));
                b.append(String.format(Locale.ROOT, "<text x=\"%.1f\" y=\"%.1f\">%s<title>%s</title></text>\n", lx + 30,
                        ly + 4, Html.esc(shorten(s.label(), legendChars)), Html.esc(s.label())));
                ly += 18;
            }
            for (Band band : bands) {
                double lx = LEFT + pw + 14;
                b.append(String.format(Locale.ROOT, "<rect x=\"%.1f\" y=\"%.1f\" width=\"24\" height=\"10\" fill=\"%s\" "
                        + "fill-opacity=\"%.2f\"/>", lx, ly - 5, band.colour(), band.opacity()));
                ly += 18;
            }
        }
        b.append("</g>\n</svg>");
        return b.toString();
    }

    /** Longest legend label shown whole; longer ones end in "…" (the whole label is the tooltip). */
    static final int LEGEND_CHARS = 30;

    static String shorten(String s, int max) {
        return s.length() <= max ? s : s.substring(0, max - 1) + "…";
    }

    private static String dash(String d) {
        return d == null ? "" : " stroke-dasharray=\"" + d + "\"";
    }

    private static String linePath(Series s, java.util.function.DoubleUnaryOperator px,
            java.util.function.DoubleUnaryOperator py) {
        StringBuilder d = new StringBuilder();
        boolean pen = false;
        for (int i = 0; i < s.x().length; i++) {
            if (!Double.isFinite(s.y()[i])) {
                pen = false;
                continue;
            }
            d.append(pen ? " L" : (d.length() == 0 ? "M" : " M"));
            d.append(String.format(Locale.ROOT, "%.1f %.1f", px.applyAsDouble(s.x()[i]), py.applyAsDouble(s.y()[i])));
            pen = true;
        }
        if (d.length() == 0) {
            return "";
        }
        StringBuilder b = new StringBuilder(String.format(Locale.ROOT, "<path d=\"%s\" fill=\"none\" stroke=\"%s\" "
                + "stroke-width=\"%.1f\" stroke-linejoin=\"round\"%s><title>%s</title></path>\n", d, s.colour(), s.width(),
                dash(s.dash()), Html.esc(s.label())));
        if (s.markers()) {
            b.append("<g fill=\"").append(s.colour()).append("\">");
            for (int i = 0; i < s.x().length; i++) {
                if (Double.isFinite(s.y()[i])) {
                    b.append(String.format(Locale.ROOT, "<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\"/>",
                            px.applyAsDouble(s.x()[i]), py.applyAsDouble(s.y()[i]), 1.2 + s.width()));
                }
            }
            b.append("</g>\n");
        }
        return b.toString();
    }

    private static String bandPath(Band band, java.util.function.DoubleUnaryOperator px,
            java.util.function.DoubleUnaryOperator py) {
        StringBuilder d = new StringBuilder();
        int n = band.x().length;
        for (int i = 0; i < n; i++) {
            if (Double.isFinite(band.hi()[i])) {
                d.append(d.length() == 0 ? "M" : " L").append(String.format(Locale.ROOT, "%.1f %.1f",
                        px.applyAsDouble(band.x()[i]), py.applyAsDouble(band.hi()[i])));
            }
        }
        for (int i = n - 1; i >= 0; i--) {
            if (Double.isFinite(band.lo()[i])) {
                d.append(" L").append(String.format(Locale.ROOT, "%.1f %.1f", px.applyAsDouble(band.x()[i]),
                        py.applyAsDouble(band.lo()[i])));
            }
        }
        if (d.length() == 0) {
            return "";
        }
        return String.format(Locale.ROOT, "<path d=\"%s Z\" fill=\"%s\" fill-opacity=\"%.2f\" stroke=\"none\"/>\n", d,
                band.colour(), band.opacity());
    }
}
