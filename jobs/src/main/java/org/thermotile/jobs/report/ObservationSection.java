package org.thermotile.jobs.report;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Base64;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.stream.Stream;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * The report's section on observed thermal images, from the files a comparison leaves in
 * {@code observed/} ({@code agreement.csv}, {@code pairs.csv}, {@code difference_IMAGE.tif},
 * {@code CAUTIONS.txt}, and {@code calibration.csv} when the materials were calibrated): per image
 * a scatter plot of simulated against observed surface temperature with the 1:1 line, the
 * difference map on the diverging <em>Fulcrum</em> ramp, centred on 0 K; the agreement per material
 * and per district; the cautions; and the calibration table. Nothing is drawn without
 * {@code observed/}.
 */
final class ObservationSection {
    private ObservationSection() {}

    /** Points drawn per image at most (every k-th pair beyond, in pixel order: the same page every time). */
    static final int MAX_POINTS = 4000;

    /** Id of the section in the page. */
    static final String ID = "observed";

    /** What was drawn, for tests: per image, the points of its scatter plot; the agreement rows shown. */
    record Drawn(String html, Map<String, Integer> points, int agreementRows, boolean calibration) {
    }

    /** The section's HTML (without its heading), or null when the run folder has no {@code observed/}. */
    static Drawn html(Path runDir, List<MapRenderer.Outline> outlines) {
        Path obs = runDir.resolve("observed");
        if (!Files.isDirectory(obs) || !Files.isRegularFile(obs.resolve("agreement.csv"))) {
            return null;
        }
        List<String[]> agreement = csv(obs.resolve("agreement.csv"));
        List<String[]> pairs = Files.isRegularFile(obs.resolve("pairs.csv")) ? csv(obs.resolve("pairs.csv"))
                : List.<String[]>of(new String[0]);
        StringBuilder b = new StringBuilder();
        b.append("<p>The run's surface temperature at each image's acquisition time (linear between the two "
                + "bracketing hours) against the image, compared at the image's pixels: each pixel's simulated value is "
                + "the area-weighted mean of the cells it covers. Differences are simulated minus observed, in K "
                + "(the same as °C differences). Files: <code>observed/</code>.</p>\n");
        // Pairs per image, in file order.
        Map<String, List<double[]>> byImage = new LinkedHashMap<>();
        for (int i = 1; i < pairs.size(); i++) {
            String[] r = pairs.get(i);
            byImage.computeIfAbsent(r[0], k -> new ArrayList<>()).add(new double[] {num(r[3]), num(r[2])});
        }
        for (int i = 1; i < agreement.size(); i++) {
            byImage.computeIfAbsent(agreement.get(i)[0], k -> new ArrayList<>());
        }
        Map<String, Integer> drawn = new LinkedHashMap<>();
        b.append("<div class=\"figs\">\n");
        int colour = 0;
        for (var e : byImage.entrySet()) {
            String image = e.getKey();
            List<double[]> pts = e.getValue();
            String overall = "";
            for (int i = 1; i < agreement.size(); i++) {
                String[] r = agreement.get(i);
                if (r[0].equals(image) && r[1].equals("all")) {
                    overall = String.format(Locale.ROOT, "%s pixels, bias %s K, RMSE %s K", r[3], fixed(r[4], 2),
                            fixed(r[5], 2));
                }
            }
            int n = scatter(b, image, pts, RunReport.LINE_COLOURS[colour++ % RunReport.LINE_COLOURS.length], overall);
            drawn.put(image, n);
            Path tif = obs.resolve("difference_" + image + ".tif");
            if (Files.isRegularFile(tif)) {
                differenceMap(b, image, tif, outlines);
            }
        }
        b.append("</div>\n");
        int rows = 0;
        rows += agreementTable(b, agreement, "all", "Every compared pixel", "image");
        rows += agreementTable(b, agreement, "material", "Per material (the material covering most of each pixel)",
                "material");
        rows += agreementTable(b, agreement, "district", "Per district (the district covering most of each pixel)",
                "district");
        Path cautions = obs.resolve("CAUTIONS.txt");
        b.append("<h3>Cautions</h3>\n");
        if (Files.isRegularFile(cautions)) {
            b.append("<pre class=\"cautions\">").append(Html.esc(read(cautions).strip())).append("</pre>\n");
        }
        b.append("<p>").append(Html.esc("Surface temperature is not air temperature, nor a heat-health index; an "
                + "agreement with an image says how well surfaces are simulated, not how people feel the heat."))
                .append("</p>\n");
        boolean calibration = Files.isRegularFile(obs.resolve("calibration.csv"));
        if (calibration) {
            calibrationTable(b, csv(obs.resolve("calibration.csv")));
        }
        return new Drawn(b.toString(), drawn, rows, calibration);
    }

    /** Simulated (y) against observed (x) in °C, the 1:1 line dashed; returns the points drawn. */
    private static int scatter(StringBuilder b, String image, List<double[]> pts, String colour, String overall) {
        int stride = Math.max(1, (pts.size() + MAX_POINTS - 1) / MAX_POINTS);
        List<double[]> shown = new ArrayList<>();
        for (int i = 0; i < pts.size(); i += stride) {
            shown.add(pts.get(i));
        }
        double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
        for (double[] p : shown) {
            lo = Math.min(lo, Math.min(p[0], p[1]));
            hi = Math.max(hi, Math.max(p[0], p[1]));
        }
        if (!(hi > lo)) {
            lo = Double.isFinite(lo) ? lo - 1 : 0;
            hi = Double.isFinite(hi) ? hi + 1 : 1;
        }
        double[] ticks = NiceScale.looseTicks(lo, hi, 6);
        String[] labels = new String[ticks.length];
        double step = ticks.length > 1 ? ticks[1] - ticks[0] : 1;
        for (int i = 0; i < ticks.length; i++) {
            labels[i] = NiceScale.label(ticks[i], step);
        }
        double a = ticks[0], z = ticks[ticks.length - 1];
        SvgChart chart = new SvgChart("Simulated against observed, " + image, "observed surface temperature (°C)",
                "simulated (°C)", 460, 400, false).xAxis(a, z, ticks, labels).yRange(a, z);
        chart.add(new SvgChart.Series("1:1", new double[] {a, z}, new double[] {a, z}, "#333333", "5 4", 1));
        double[] x = new double[shown.size()];
        double[] y = new double[shown.size()];
        for (int i = 0; i < x.length; i++) {
            x[i] = shown.get(i)[0];
            y[i] = shown.get(i)[1];
        }
        chart.add(new SvgChart.Points(image, x, y, colour, 1.6));
        b.append("<figure class=\"chart\" id=\"scatter-").append(Html.esc(image)).append("\" data-points=\"")
                .append(shown.size()).append("\">\n").append(chart.toSvg()).append("\n<figcaption>")
                .append(Html.esc(image + ": " + overall + (stride > 1 ? "; every " + stride + "th pixel drawn" : "")
                        + ". Points above the dashed 1:1 line are simulated warmer than observed."))
                .append("</figcaption>\n</figure>\n");
        return shown.size();
    }

    private static void differenceMap(StringBuilder b, String image, Path tif, List<MapRenderer.Outline> outlines) {
        float[] v;
        RasterGrid g;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(tif)) {
            g = r.grid();
            v = r.readFloatWindow(0, 0, g.width(), g.height());
        }
        for (int i = 0; i < v.length; i++) {
            if (v[i] == -9999f) {
                v[i] = Float.NaN;
            }
        }
        double[] range = MapRenderer.range(v);
        double m = Double.isNaN(range[0]) ? 1 : Math.max(1, Math.max(Math.abs(range[0]), Math.abs(range[1])));
        MapRenderer.Style style = new MapRenderer.Style("Simulated − observed, " + image,
                "each cell shows the pixel covering most of it", "K", ColourRamp.FULCRUM);
        MapRenderer.Figure f = MapRenderer.render(v, g, outlines, style, -m, m);
        String caption = "Difference map of " + image + " on the Fulcrum ramp, centred on 0 K (colour ends ±"
                + MapRenderer.legendValue(m) + " K): brown where the simulation is warmer than the image, blue where it "
                + "is cooler; hatched cells have no compared pixel (edges, masked clouds, no data).";
        b.append("<figure class=\"map\" id=\"difference-").append(Html.esc(image)).append("\">\n")
                .append("<img src=\"data:image/png;base64,").append(Base64.getEncoder().encodeToString(f.png()))
                .append("\" width=\"").append(f.width()).append("\" height=\"").append(f.height()).append("\" alt=\"")
                .append(Html.esc(caption)).append("\">\n<figcaption>").append(Html.esc(caption))
                .append(" <code>observed/difference_").append(Html.esc(image)).append(".tif</code></figcaption>\n")
                .append("</figure>\n");
    }

    /** The rows of one group; returns how many were shown. */
    private static int agreementTable(StringBuilder b, List<String[]> rows, String group, String title, String what) {
        List<String[]> mine = rows.stream().skip(1).filter(r -> r.length >= 8 && r[1].equals(group)).toList();
        if (mine.isEmpty()) {
            return 0;
        }
        b.append("<h3>").append(Html.esc(title)).append("</h3>\n<table class=\"agreement\" data-group=\"")
                .append(group).append("\">\n<thead><tr><th>image</th>")
                .append(group.equals("all") ? "" : "<th>" + what + "</th>")
                .append("<th class=\"n\">pixels</th><th class=\"n\">bias (K)</th><th class=\"n\">RMSE (K)</th>"
                        + "<th class=\"n\">MAE (K)</th><th class=\"n\">correlation r</th></tr></thead>\n<tbody>\n");
        for (String[] r : mine) {
            b.append("<tr><td>").append(Html.esc(r[0])).append("</td>")
                    .append(group.equals("all") ? "" : "<td>" + Html.esc(r[2]) + "</td>")
                    .append("<td class=\"n\">").append(Html.esc(r[3])).append("</td><td class=\"n\">")
                    .append(fixed(r[4], 2)).append("</td><td class=\"n\">").append(fixed(r[5], 2))
                    .append("</td><td class=\"n\">").append(fixed(r[6], 2)).append("</td><td class=\"n\">")
                    .append(fixed(r[7], 3)).append("</td></tr>\n");
        }
        b.append("</tbody>\n</table>\n");
        return mine.size();
    }

    private static void calibrationTable(StringBuilder b, List<String[]> rows) {
        b.append("<h3>Calibration</h3>\n<p>Material parameters fitted to the images (<code>observed/calibration.csv</code>, "
                + "the calibrated materials in <code>observed/calibrated_materials.yaml</code>). A parameter marked not "
                + "identifiable could not be told from the images and was kept at its starting value.</p>\n")
                .append("<table class=\"calibration\">\n<thead><tr><th>parameter</th><th>material</th><th class=\"n\">"
                        + "before</th><th class=\"n\">after</th><th class=\"n\">standard error</th><th>identifiable</th>"
                        + "<th>note</th></tr></thead>\n<tbody>\n");
        for (String[] r : rows.subList(1, rows.size())) {
            b.append("<tr>");
            for (int i = 0; i < 7; i++) {
                String c = i < r.length ? r[i] : "";
                b.append(i >= 2 && i <= 4 ? "<td class=\"n\">" : "<td>").append(Html.esc(c)).append("</td>");
            }
            b.append("</tr>\n");
        }
        b.append("</tbody>\n</table>\n");
    }

    private static String fixed(String v, int digits) {
        double d = num(v);
        return Double.isNaN(d) ? "–" : String.format(Locale.ROOT, "%." + digits + "f", d).replace('-', '−');
    }

    private static double num(String v) {
        try {
            return v == null || v.isEmpty() ? Double.NaN : Double.parseDouble(v);
        } catch (NumberFormatException e) {
            return Double.NaN;
        }
    }

    private static String read(Path f) {
        try {
            return Files.readString(f);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + f, e);
        }
    }

    /** A CSV file as rows of cells (header first); double-quoted cells may hold commas and "" quotes. */
    static List<String[]> csv(Path f) {
        List<String[]> out = new ArrayList<>();
        try (Stream<String> lines = Files.lines(f)) {
            for (String line : (Iterable<String>) lines::iterator) {
                if (line.isEmpty()) {
                    continue;
                }
                List<String> cells = new ArrayList<>();
                StringBuilder c = new StringBuilder();
                boolean quoted = false;
                for (int i = 0; i < line.length(); i++) {
                    char ch = line.charAt(i);
                    if (quoted) {
                        if (ch == '"' && i + 1 < line.length() && line.charAt(i + 1) == '"') {
                            c.append('"');
                            i++;
                        } else if (ch == '"') {
                            quoted = false;
                        } else {
                            c.append(ch);
                        }
                    } else if (ch == '"') {
                        quoted = true;
                    } else if (ch == ',') {
                        cells.add(c.toString());
                        c.setLength(0);
                    } else {
                        c.append(ch);
                    }
                }
                cells.add(c.toString());
                out.add(cells.toArray(new String[0]));
            }
        } catch (IOException e) {
            throw new ReportException(f + ": cannot be read (" + e.getMessage() + ")", e);
        }
        if (out.isEmpty()) {
            throw new ReportException(f + ": is empty. Fix: run 'thermotile observe' again");
        }
        return out;
    }
}
