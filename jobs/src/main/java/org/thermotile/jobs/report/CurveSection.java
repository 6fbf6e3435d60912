package org.thermotile.jobs.report;

import static org.thermotile.jobs.report.RunReport.LINE_COLOURS;
import static org.thermotile.jobs.report.RunReport.DASHES;
import static org.thermotile.jobs.report.RunReport.num;
import static org.thermotile.jobs.report.RunReport.fmtInt;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.thermotile.jobs.storage.RunLayout;

/**
 * Curves from {@code tables/material_hours}: the diurnal cycle per material in panels per kind of
 * surface, the daily peaks, and the materials table; then the districts ({@link DistrictSection}).
 */
final class CurveSection extends ReportSection {
    CurveSection(ReportSection page) {
        super(page);
    }

    /** Line colour per material, in the order first drawn. */
    private final Map<String, String> lineColour = new LinkedHashMap<>();

    private String colourOf(String key) {
        return lineColour.computeIfAbsent(key, k -> LINE_COLOURS[lineColour.size() % LINE_COLOURS.length]);
    }

    private String dashOf(String key) {
        int i = new ArrayList<>(lineColour.keySet()).indexOf(key);
        return DASHES[(i / LINE_COLOURS.length) % DASHES.length];
    }

    static double[] hours() {
        double[] h = new double[24];
        for (int i = 0; i < 24; i++) {
            h[i] = i;
        }
        return h;
    }

    static SvgChart diurnalChart(String title, int width, int height, boolean legend) {
        double[] ticks = width > 600 ? new double[] {0, 3, 6, 9, 12, 15, 18, 21} : new double[] {0, 6, 12, 18};
        String[] labels = new String[ticks.length];
        for (int i = 0; i < ticks.length; i++) {
            labels[i] = String.format(Locale.ROOT, "%02d:00", (int) ticks[i]);
        }
        return new SvgChart(title, "local clock hour", "surface temperature [°C]", width, height, legend)
                .xAxis(0, 23, ticks, labels);
    }

    void curvesSection() {
        RunLayout lay = RunLayout.of(dir);
        Path mh = baselinePartition(lay.table("material_hours"));
        Path dh = baselinePartition(lay.table("district_hours"));
        boolean hasMaterials = Files.exists(mh), hasDistricts = Files.exists(dh);
        section("curves", "Curves");
        if (!hasMaterials) {
            body.append("<p class=\"missing\">No tables/material_hours table in this run folder, so no curves.</p>\n");
        } else {
            Table t = Table.readParquet(mh);
            List<Curves.Group> groups = Curves.of(t, "material", mh);
            groups.forEach(g -> colourOf(g.key()));
            body.append("<h3>Diurnal cycle per material</h3>\n<p>For each material, the surface temperature at each "
                    + "local clock hour, averaged over the material's cells and over the counted days; one panel per "
                    + "kind of surface, all panels on one temperature axis.</p>\n")
                    .append(materialPanels(groups, this::colourOf, this::dashOf));

            TreeMap<LocalDate, Double> all = Curves.allCellsDailyPeak(t, mh);
            List<LocalDate> dates = Curves.dates(groups);
            SvgChart daily = dailyChart("Daily peak of the mean surface temperature", dates, 860, 340);
            daily.add(new SvgChart.Series("all cells", indexX(dates), onDates(all, dates), "#000000", null, 3).withMarkers());
            for (Curves.Group g : groups) {
                daily.add(new SvgChart.Series(g.key(), indexX(dates), onDates(g.dailyPeak(), dates), colourOf(g.key()),
                        dashOf(g.key()), 1.6).withMarkers());
            }
            body.append("<h3>Daily peaks through the period</h3>\n<p>For each day, the highest hourly mean surface "
                    + "temperature of each material's cells, and (black) of all cells together. These are peaks of "
                    + "means: single cells reach higher, as the peak map shows.</p>\n")
                    .append("<div class=\"chart\" id=\"chart-daily-peaks\">").append(daily.toSvg()).append("</div>\n");

            body.append("<h3>Materials</h3>\n<table class=\"data\"><thead><tr><th>material</th><th>cells</th>"
                    + "<th>share</th><th>period mean [°C]</th><th>highest hourly mean [°C]</th><th>at</th></tr></thead><tbody>\n");
            long total = groups.stream().mapToLong(Curves.Group::cells).sum();
            for (Curves.Group g : groups) {
                body.append("<tr><td><span class=\"key\" style=\"background:").append(colourOf(g.key())).append("\"></span>")
                        .append(Html.esc(g.key())).append("</td><td class=\"n\">").append(fmtInt(g.cells()))
                        .append("</td><td class=\"n\">").append(num(100.0 * g.cells() / Math.max(1, total), 1))
                        .append(" %</td><td class=\"n\">").append(num(g.periodMean(), 1)).append("</td><td class=\"n\">")
                        .append(num(g.maxHourly(), 1)).append("</td><td>").append(Html.esc(g.maxTime()))
                        .append("</td></tr>\n");
            }
            body.append("</tbody></table>\n");
        }
        if (hasDistricts) {
            new DistrictSection(this).districtsSection(dh);
        }
    }

    /**
     * The diurnal curves of the materials as small multiples: one panel per kind of surface
     * ({@link MaterialKinds}), each material in exactly one panel, all panels on one temperature axis.
     */
    static String materialPanels(List<Curves.Group> groups, java.util.function.Function<String, String> colour,
            java.util.function.Function<String, String> dash) {
        StringBuilder b = new StringBuilder("<div class=\"multiples\" id=\"chart-diurnal-materials\">\n");
        double[] range = MaterialKinds.range(groups);
        for (Map.Entry<String, List<Curves.Group>> kind : MaterialKinds.byKind(groups).entrySet()) {
            SvgChart c = diurnalChart(kind.getKey(), 600, 280, true).legendWidth(290)
                    .legendChars(36);
            if (range[1] > range[0]) {
                c.yRange(range[0], range[1]);
            }
            for (Curves.Group g : kind.getValue()) {
                c.add(new SvgChart.Series(g.key(), hours(), g.meanByHour(), colour.apply(g.key()), dash.apply(g.key()), 2));
            }
            b.append("<figure class=\"small-chart\" id=\"chart-diurnal-").append(MaterialKinds.id(kind.getKey()))
                    .append("\"><figcaption>").append(Html.esc(kind.getKey())).append("</figcaption>")
                    .append(c.toSvg()).append("</figure>\n");
        }
        return b.append("</div>\n").toString();
    }

    private static SvgChart dailyChart(String title, List<LocalDate> dates, int width, int height) {
        int n = dates.size();
        int every = Math.max(1, (int) Math.ceil(n / 12.0));
        List<Double> ticks = new ArrayList<>();
        List<String> labels = new ArrayList<>();
        for (int i = 0; i < n; i += every) {
            ticks.add((double) i);
            labels.add(dates.get(i).toString().substring(5));
        }
        return new SvgChart(title, "local date (month-day)", "surface temperature [°C]", width, height, true)
                .xAxis(-0.3, Math.max(0.3, n - 0.7), ticks.stream().mapToDouble(Double::doubleValue).toArray(),
                        labels.toArray(String[]::new));
    }

    private static double[] indexX(List<LocalDate> dates) {
        double[] x = new double[dates.size()];
        for (int i = 0; i < x.length; i++) {
            x[i] = i;
        }
        return x;
    }

    private static double[] onDates(Map<LocalDate, Double> values, List<LocalDate> dates) {
        double[] y = new double[dates.size()];
        for (int i = 0; i < y.length; i++) {
            y[i] = values.getOrDefault(dates.get(i), Double.NaN);
        }
        return y;
    }

    /** Tables are partitioned by scenario: the report's curves are the baseline's. */
    static Path baselinePartition(Path table) {
        Path b = table.resolve("scenario=baseline");
        return Files.isDirectory(b) ? b : table;
    }
}
