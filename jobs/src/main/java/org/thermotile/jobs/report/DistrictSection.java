package org.thermotile.jobs.report;

import static org.thermotile.jobs.report.RunReport.num;
import static org.thermotile.jobs.report.RunReport.fmtInt;
import static org.thermotile.jobs.report.CurveSection.hours;
import static org.thermotile.jobs.report.CurveSection.diurnalChart;

import java.nio.file.Path;
import java.util.List;

/** Per district, from {@code tables/district_hours}: the diurnal mean with its 10th–90th percentile band, and a table. */
final class DistrictSection extends ReportSection {
    DistrictSection(ReportSection page) {
        super(page);
    }

    void districtsSection(Path dh) {
        Table t = Table.readParquet(dh);
        List<Curves.Group> groups = Curves.of(t, "district", dh);
        section("districts", "Districts");
        double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
        for (Curves.Group g : groups) {
            for (int h = 0; h < 24; h++) {
                for (double v : new double[] {g.meanByHour()[h], g.p10ByHour()[h], g.p90ByHour()[h]}) {
                    if (Double.isFinite(v)) {
                        lo = Math.min(lo, v);
                        hi = Math.max(hi, v);
                    }
                }
            }
        }
        body.append("<p>For each district, the diurnal cycle of its cells' mean surface temperature (line) and the "
                + "band from the 10th to the 90th percentile of its cells, each averaged over the counted days. All "
                + "panels share one temperature axis.</p>\n<div class=\"multiples\">\n");
        for (Curves.Group g : groups) {
            SvgChart c = diurnalChart("District " + g.key(), 420, 250, false);
            if (hi > lo) {
                c.yRange(lo, hi);
            }
            c.add(new SvgChart.Band(hours(), g.p10ByHour(), g.p90ByHour(), "#E69F00", 0.35));
            c.add(new SvgChart.Series("mean", hours(), g.meanByHour(), "#7a3b00", null, 2.2));
            body.append("<figure class=\"small-chart\" id=\"chart-district-").append(Html.esc(g.key()))
                    .append("\"><figcaption>").append(Html.esc(g.key())).append("</figcaption>").append(c.toSvg())
                    .append("</figure>\n");
        }
        body.append("</div>\n<table class=\"data\"><thead><tr><th>district</th><th>cells</th><th>period mean [°C]</th>"
                + "<th>highest hourly mean [°C]</th><th>at</th><th>highest hourly 90th percentile [°C]</th></tr></thead><tbody>\n");
        for (Curves.Group g : groups) {
            body.append("<tr><td>").append(Html.esc(g.key())).append("</td><td class=\"n\">").append(fmtInt(g.cells()))
                    .append("</td><td class=\"n\">").append(num(g.periodMean(), 1)).append("</td><td class=\"n\">")
                    .append(num(g.maxHourly(), 1)).append("</td><td>").append(Html.esc(g.maxTime()))
                    .append("</td><td class=\"n\">").append(num(g.maxP90(), 1)).append("</td></tr>\n");
        }
        body.append("</tbody></table>\n");
    }
}
