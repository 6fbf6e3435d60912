package org.thermotile.jobs.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.FontMetrics;
import java.awt.Graphics2D;
import java.awt.Rectangle;
import java.awt.RenderingHints;
import java.awt.Shape;
import java.awt.TexturePaint;
import java.awt.font.TextLayout;
import java.awt.geom.AffineTransform;
import java.awt.geom.Path2D;
import java.awt.image.BufferedImage;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.List;
import java.util.Locale;
import javax.imageio.ImageIO;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.LineString;
import org.locationtech.jts.geom.Point;
import org.locationtech.jts.geom.Polygon;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * Draws one raster map as a PNG with Java2D: the cells coloured on a {@link ColourRamp}, a
 * legend with the colour limits written at its ends, a scale bar in metres, a north arrow,
 * outlines (districts or hotspot polygons) and their names. No-data cells are hatched.
 *
 * <p>Geometry. Cells are drawn as blocks of {@code sx × sy} screen pixels, sx = drawn width /
 * grid width; one screen pixel is {@code pixelWidth / sx} metres on the ground, so a scale bar of
 * L metres is {@code L · sx / pixelWidth} pixels long. Outline coordinates (in the raster's CRS)
 * go to the screen by the inverse of the grid's geotransform:
 * {@code px = mapX + (x − originX)/pixelWidth · sx}, {@code py = mapY + (y − originY)/pixelHeight · sy}.
 * The grid is north-up (a {@link RasterGrid} guarantees it), so grid north points up.
 */
public final class MapRenderer {
    private MapRenderer() {}

    /** Largest drawn map size [screen px]; a grid is enlarged by whole numbers up to it. */
    static final int MAX_MAP_W = 760, MAX_MAP_H = 600;
    /** Largest size of each map of a side-by-side pair, so two fit a 1280 px wide page [screen px]. */
    public static final int PAIR_MAP_W = 400, PAIR_MAP_H = 330;
    /** Largest enlargement of a small grid (our choice, keeps tiny test grids readable). */
    static final int MAX_ENLARGE = 16;
    static final int PAD = 16, TOP = 60, LEGEND_GAP = 28, LEGEND_W = 130, BOTTOM = 58;
    static final int BAR_W = 20, BAR_MIN_H = 200, BAR_MAX_H = 340;
    static final Color INK = new Color(0x1f1f1f);
    static final Color MUTED = new Color(0x555555);

    /** How a map is coloured and labelled. {@code categories} non-null draws swatches, not a bar. */
    public record Style(String title, String subtitle, String unit, ColourRamp ramp, List<Category> categories) {
        public Style(String title, String subtitle, String unit, ColourRamp ramp) {
            this(title, subtitle, unit, ramp, null);
        }
    }

    /** A class value and its legend label (for class maps). */
    public record Category(double value, String label) {
    }

    /** An outline to draw, with an optional label placed at an interior point. */
    public record Outline(Geometry geometry, String label) {
    }

    /** The scale bar as drawn: ground length [m], left end and top row [screen px], length [screen px]. */
    public record ScaleBar(double metres, int x0, int y, int heightPx, int lengthPx) {
    }

    /**
     * A drawn map.
     *
     * @param dataMin    smallest finite value of the grid (NaN when none)
     * @param dataMax    largest finite value of the grid (NaN when none)
     * @param colourLow  value drawn with the ramp's start
     * @param colourHigh value drawn with the ramp's end
     * @param cells      number of finite cells
     * @param metresPerScreenPixel ground size of one screen pixel along x [m]
     * @param map        where the grid is drawn [screen px]
     * @param legendBar  where the colour bar is drawn (null for class maps) [screen px]
     */
    public record Figure(byte[] png, int width, int height, double dataMin, double dataMax, double colourLow,
            double colourHigh, long cells, ScaleBar scaleBar, double metresPerScreenPixel, Rectangle map,
            Rectangle legendBar) {
    }

    /** Smallest and largest finite value, {NaN, NaN} when there is none. */
    public static double[] range(float[] values) {
        double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
        for (float v : values) {
            if (Float.isFinite(v)) {
                lo = Math.min(lo, v);
                hi = Math.max(hi, v);
            }
        }
        return lo > hi ? new double[] {Double.NaN, Double.NaN} : new double[] {lo, hi};
    }

    /**
     * Draws {@code values} (row-major on {@code grid}, NaN = no data) with colours from
     * {@code colourLow} (ramp start) to {@code colourHigh} (ramp end); values outside are clamped.
     */
    public static Figure render(float[] values, RasterGrid grid, List<Outline> outlines, Style style,
            double colourLow, double colourHigh) {
        return render(values, grid, outlines, style, colourLow, colourHigh, MAX_MAP_W, MAX_MAP_H);
    }

    /** As {@link #render(float[], RasterGrid, List, Style, double, double)}, the map at most {@code maxW × maxH} px. */
    public static Figure render(float[] values, RasterGrid grid, List<Outline> outlines, Style style,
            double colourLow, double colourHigh, int maxW, int maxH) {
        int w = grid.width(), h = grid.height();
        if (values.length != (long) w * h) {
            throw new IllegalArgumentException(values.length + " values for a grid of " + w + " × " + h + " cells");
        }
        double[] range = range(values);
        long cells = 0;
        for (float v : values) {
            if (Float.isFinite(v)) {
                cells++;
            }
        }
        double s = Math.min((double) maxW / w, (double) maxH / h);
        if (s >= 1) {
            s = Math.min(Math.floor(s), MAX_ENLARGE);
        }
        int dw = Math.max(1, (int) Math.round(w * s)), dh = Math.max(1, (int) Math.round(h * s));
        double sx = (double) dw / w, sy = (double) dh / h;

        int legendH = style.categories() == null ? Math.max(BAR_MIN_H, Math.min(BAR_MAX_H, dh)) + 80
                : 40 + 22 * style.categories().size() + 40;
        int width = PAD + dw + LEGEND_GAP + LEGEND_W + PAD;
        int height = TOP + Math.max(dh, legendH) + BOTTOM;
        Rectangle map = new Rectangle(PAD, TOP, dw, dh);

        BufferedImage img = new BufferedImage(width, height, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = img.createGraphics();
        try {
            g.setRenderingHint(RenderingHints.KEY_TEXT_ANTIALIASING, RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
            g.setRenderingHint(RenderingHints.KEY_FRACTIONALMETRICS, RenderingHints.VALUE_FRACTIONALMETRICS_ON);
            g.setColor(Color.WHITE);
            g.fillRect(0, 0, width, height);

            drawTitle(g, style);
            g.setPaint(hatch());
            g.fill(map);
            g.drawImage(cellImage(values, w, h, style.ramp(), colourLow, colourHigh), map.x, map.y, dw, dh, null);

            g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
            drawOutlines(g, outlines, grid, map, sx, sy);
            g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_OFF);
            g.setColor(INK);
            g.setStroke(new BasicStroke(1));
            g.drawRect(map.x - 1, map.y - 1, dw + 1, dh + 1);

            drawNorthArrow(g, map);
            double metresPerPx = grid.pixelWidth() / sx;
            ScaleBar bar = drawScaleBar(g, map, metresPerPx);

            int lx = map.x + dw + LEGEND_GAP;
            Rectangle legendBar = null;
            boolean anyNoData = cells < values.length;
            if (style.categories() == null) {
                int barH = Math.max(BAR_MIN_H, Math.min(BAR_MAX_H, dh));
                legendBar = new Rectangle(lx, TOP + 28, BAR_W, barH);
                drawColourBar(g, legendBar, style, colourLow, colourHigh, anyNoData);
            } else {
                drawCategories(g, lx, TOP, style, anyNoData);
            }
            g.dispose();
            ByteArrayOutputStream out = new ByteArrayOutputStream();
            ImageIO.write(img, "png", out);
            return new Figure(out.toByteArray(), width, height, range[0], range[1], colourLow, colourHigh, cells, bar,
                    metresPerPx, map, legendBar);
        } catch (IOException e) {
            throw new UncheckedIOException("PNG encoding failed", e);
        } finally {
            g.dispose();
        }
    }

    /** One image pixel per cell, ARGB, no-data transparent. */
    static BufferedImage cellImage(float[] values, int w, int h, ColourRamp ramp, double lo, double hi) {
        BufferedImage cellsImg = new BufferedImage(w, h, BufferedImage.TYPE_INT_ARGB);
        int[] argb = new int[w * h];
        double span = hi - lo;
        for (int i = 0; i < argb.length; i++) {
            float v = values[i];
            if (Float.isFinite(v)) {
                double t = span > 0 ? (v - lo) / span : 0.5;
                argb[i] = 0xff000000 | ramp.rgb(t);
            }
        }
        cellsImg.setRGB(0, 0, w, h, argb, 0, w);
        return cellsImg;
    }

    /** Light grey diagonal hatching for no-data cells. */
    static TexturePaint hatch() {
        BufferedImage t = new BufferedImage(8, 8, BufferedImage.TYPE_INT_RGB);
        for (int y = 0; y < 8; y++) {
            for (int x = 0; x < 8; x++) {
                t.setRGB(x, y, (x + y) % 8 == 0 ? 0xa0a0a0 : 0xf2f2f2);
            }
        }
        return new TexturePaint(t, new Rectangle(0, 0, 8, 8));
    }

    private static void drawTitle(Graphics2D g, Style style) {
        g.setColor(INK);
        g.setFont(new Font(Font.SANS_SERIF, Font.BOLD, 17));
        g.drawString(style.title(), PAD, 26);
        if (style.subtitle() != null && !style.subtitle().isEmpty()) {
            g.setColor(MUTED);
            g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 13));
            g.drawString(style.subtitle(), PAD, 46);
        }
    }

    private static void drawOutlines(Graphics2D g, List<Outline> outlines, RasterGrid grid, Rectangle map,
            double sx, double sy) {
        if (outlines == null || outlines.isEmpty()) {
            return;
        }
        AffineTransform toScreen = new AffineTransform(sx / grid.pixelWidth(), 0, 0, sy / grid.pixelHeight(),
                map.x - grid.originX() * sx / grid.pixelWidth(), map.y - grid.originY() * sy / grid.pixelHeight());
        Shape oldClip = g.getClip();
        g.clip(map);
        for (Outline o : outlines) {
            Shape shape = toScreen.createTransformedShape(path(o.geometry()));
            g.setColor(new Color(255, 255, 255, 220));
            g.setStroke(new BasicStroke(3.6f, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND));
            g.draw(shape);
            g.setColor(INK);
            g.setStroke(new BasicStroke(1.8f, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND));
            g.draw(shape);
        }
        g.setFont(new Font(Font.SANS_SERIF, Font.BOLD, 12));
        for (Outline o : outlines) {
            if (o.label() == null || o.label().isBlank() || o.geometry().isEmpty()) {
                continue;
            }
            Point p = o.geometry().getInteriorPoint();
            double[] xy = {p.getX(), p.getY()};
            toScreen.transform(xy, 0, xy, 0, 1);
            haloText(g, o.label(), (float) xy[0], (float) xy[1], true);
        }
        g.setClip(oldClip);
    }

    /** Every ring of the polygons (holes included) as one path in CRS coordinates. */
    static Path2D path(Geometry geometry) {
        Path2D.Double p = new Path2D.Double(Path2D.WIND_EVEN_ODD);
        for (int i = 0; i < geometry.getNumGeometries(); i++) {
            Geometry part = geometry.getGeometryN(i);
            if (part instanceof Polygon poly) {
                ring(p, poly.getExteriorRing());
                for (int k = 0; k < poly.getNumInteriorRing(); k++) {
                    ring(p, poly.getInteriorRingN(k));
                }
            }
        }
        return p;
    }

    private static void ring(Path2D.Double p, LineString ring) {
        Coordinate[] c = ring.getCoordinates();
        for (int k = 0; k < c.length; k++) {
            if (k == 0) {
                p.moveTo(c[k].x, c[k].y);
            } else {
                p.lineTo(c[k].x, c[k].y);
            }
        }
        p.closePath();
    }

    /** Text with a white halo so it reads on any colour; centred on (x, y) when {@code centred}. */
    static void haloText(Graphics2D g, String text, float x, float y, boolean centred) {
        TextLayout layout = new TextLayout(text, g.getFont(), g.getFontRenderContext());
        float tx = centred ? x - (float) layout.getBounds().getWidth() / 2 : x;
        float ty = centred ? y + layout.getAscent() / 2 - 1 : y;
        Shape outline = layout.getOutline(AffineTransform.getTranslateInstance(tx, ty));
        Object aa = g.getRenderingHint(RenderingHints.KEY_ANTIALIASING);
        g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
        g.setColor(new Color(255, 255, 255, 235));
        g.setStroke(new BasicStroke(3.2f, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND));
        g.draw(outline);
        g.setColor(INK);
        g.fill(outline);
        g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, aa);
    }

    private static void drawNorthArrow(Graphics2D g, Rectangle map) {
        int r = 17;
        int cx = map.x + map.width - r - 8, cy = map.y + r + 8;
        if (map.width < 4 * r || map.height < 4 * r) {
            cx = map.x + map.width - r;                     // thin map: in the strip below it, right-aligned
            cy = map.y + map.height + 6 + r;
        }
        g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
        g.setColor(new Color(255, 255, 255, 215));
        g.fillOval(cx - r, cy - r, 2 * r, 2 * r);
        g.setColor(INK);
        g.setStroke(new BasicStroke(1));
        g.drawOval(cx - r, cy - r, 2 * r, 2 * r);
        Path2D.Double left = new Path2D.Double();
        left.moveTo(cx, cy - 4);
        left.lineTo(cx - 6, cy + 12);
        left.lineTo(cx, cy + 8);
        left.closePath();
        Path2D.Double right = new Path2D.Double();
        right.moveTo(cx, cy - 4);
        right.lineTo(cx + 6, cy + 12);
        right.lineTo(cx, cy + 8);
        right.closePath();
        g.fill(left);
        g.draw(right);
        g.setFont(new Font(Font.SANS_SERIF, Font.BOLD, 12));
        FontMetrics fm = g.getFontMetrics();
        g.drawString("N", cx - fm.stringWidth("N") / 2f, cy - 6);
        g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_OFF);
    }

    /**
     * Scale bar below the map: the longest length of 1, 2 or 5 × 10ⁿ metres that fits in a
     * quarter of the map's width, drawn as a solid bar {@code L / metresPerPx} pixels long.
     */
    static ScaleBar drawScaleBar(Graphics2D g, Rectangle map, double metresPerPx) {
        double target = Math.max(1, map.width / 4.0) * metresPerPx;
        double metres = NiceScale.niceFloor(target);
        int len = (int) Math.round(metres / metresPerPx);
        int x0 = map.x, y = map.y + map.height + 18, hPx = 6;
        g.setColor(Color.WHITE);
        g.fillRect(x0, y, len, hPx);
        g.setColor(INK);
        g.fillRect(x0, y, len, hPx);
        g.fillRect(x0, y - 4, 1, hPx + 8);                  // end ticks
        g.fillRect(x0 + len - 1, y - 4, 1, hPx + 8);
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
        g.setColor(INK);
        String label = distanceLabel(metres);
        g.drawString(label, x0 + len + 8, y + hPx + 1);
        return new ScaleBar(metres, x0, y, hPx, len);
    }

    /** "250 m", "1 km", "2.5 km". */
    public static String distanceLabel(double metres) {
        if (metres >= 1000) {
            double km = metres / 1000;
            return (km == Math.rint(km) ? String.format(Locale.ROOT, "%.0f", km)
                    : String.format(Locale.ROOT, "%s", km)) + " km";
        }
        return metres == Math.rint(metres) ? String.format(Locale.ROOT, "%.0f m", metres)
                : String.format(Locale.ROOT, "%s m", metres);
    }

    /** Vertical colour bar, high at the top; the limits written exactly at the ends, nice ticks between. */
    private static void drawColourBar(Graphics2D g, Rectangle bar, Style style, double lo, double hi, boolean noData) {
        g.setColor(INK);
        g.setFont(new Font(Font.SANS_SERIF, Font.BOLD, 13));
        g.drawString(style.unit(), bar.x, bar.y - 10);
        for (int yy = 0; yy < bar.height; yy++) {
            double t = bar.height == 1 ? 0.5 : 1 - (double) yy / (bar.height - 1);
            g.setColor(new Color(style.ramp().rgb(t)));
            g.fillRect(bar.x, bar.y + yy, bar.width, 1);
        }
        g.setColor(INK);
        g.drawRect(bar.x - 1, bar.y - 1, bar.width + 1, bar.height + 1);
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
        FontMetrics fm = g.getFontMetrics();
        int tx = bar.x + bar.width + 6;
        int yHi = bar.y, yLo = bar.y + bar.height - 1;
        if (hi > lo) {
            double step = NiceScale.step(lo, hi, 6);
            for (double v : NiceScale.innerTicks(lo, hi, 6)) {
                int y = (int) Math.round(yLo - (v - lo) / (hi - lo) * (yLo - yHi));
                if (Math.abs(y - yHi) < 16 || Math.abs(y - yLo) < 16) {
                    continue;
                }
                g.setColor(MUTED);
                g.fillRect(bar.x + bar.width, y, 4, 1);
                g.drawString(NiceScale.label(v, step), tx, y + fm.getAscent() / 2 - 1);
            }
        }
        g.setColor(INK);
        g.setFont(new Font(Font.SANS_SERIF, Font.BOLD, 12));
        g.fillRect(bar.x + bar.width, yHi, 5, 1);
        g.drawString(legendValue(hi), tx, yHi + fm.getAscent() / 2 + 1);
        if (hi > lo) {
            g.fillRect(bar.x + bar.width, yLo, 5, 1);
            g.drawString(legendValue(lo), tx, yLo + fm.getAscent() / 2 - 1);
        }
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 11));
        g.setColor(MUTED);
        g.drawString("ramp: " + style.ramp().name(), bar.x, bar.y + bar.height + 18);
        if (noData) {
            swatchNoData(g, bar.x, bar.y + bar.height + 28);
        }
    }

    private static void drawCategories(Graphics2D g, int x, int top, Style style, boolean noData) {
        g.setColor(INK);
        g.setFont(new Font(Font.SANS_SERIF, Font.BOLD, 13));
        g.drawString(style.unit(), x, top + 18);
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
        int y = top + 30;
        List<Category> cats = style.categories();
        double lo = cats.stream().mapToDouble(Category::value).min().orElse(0);
        double hi = cats.stream().mapToDouble(Category::value).max().orElse(0);
        for (Category c : cats) {
            double t = hi > lo ? (c.value() - lo) / (hi - lo) : 0.5;
            g.setColor(new Color(style.ramp().rgb(t)));
            g.fillRect(x, y, 18, 14);
            g.setColor(INK);
            g.drawRect(x, y, 18, 14);
            g.drawString(c.label(), x + 26, y + 12);
            y += 22;
        }
        if (noData) {
            swatchNoData(g, x, y + 4);
        }
    }

    private static void swatchNoData(Graphics2D g, int x, int y) {
        g.setPaint(hatch());
        g.fillRect(x, y, 18, 14);
        g.setColor(INK);
        g.drawRect(x, y, 18, 14);
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
        g.drawString("no data", x + 26, y + 12);
    }

    /** A legend end value: one decimal (0.1 °C, 0.1 K h). */
    public static String legendValue(double v) {
        return String.format(Locale.ROOT, "%.1f", v);
    }
}
