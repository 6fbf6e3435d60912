package org.thermotile.jobs.report;

import static org.thermotile.jobs.report.RunReport.FILE;
import static org.thermotile.jobs.report.RunReport.fileName;
import static org.thermotile.jobs.report.RunReport.periodText;
import static org.thermotile.jobs.report.CurveSection.hours;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

/** The index page of a run over several periods: its periods, linked to their reports, and the ranking across them. */
final class PeriodsSection extends ReportSection {
    PeriodsSection(ReportSection page) {
        super(page);
    }

    /** The periods of a run over several, linked to their reports, and the ranking across them. */
    void periodsSection() {
        section("periods", "Periods");
        body.append("<p>Each period is a complete run of the baseline and every scenario with its own weather; "
                + "its report, maps and comparison are in its folder. The tables hold every period in one dataset "
                + "per table, partitioned by period and scenario (<code>tables/cells/period=NAME/scenario=NAME/</code>).</p>\n");
        body.append("<table>\n<thead><tr><th>period</th><th>dates (local)</th><th>weather</th><th class=\"n\">"
                + "counted hours</th><th>report</th></tr></thead>\n<tbody>\n");
        for (JsonNode p : manifest.path("periods")) {
            String folder = p.path("folder").asText();
            JsonNode w = p.path("weather");
            String weather = w.isObject() ? fileName(w.path("location").asText()) : w.asText();
            body.append("<tr><td>").append(Html.esc(p.path("name").asText())).append("</td><td>")
                    .append(Html.esc(periodText(p.path("start").asText(), p.path("end").asText())))
                    .append("</td><td><code>")
                    .append(Html.esc(weather)).append("</code></td><td class=\"n\">")
                    .append(p.path("counted_hours").asInt()).append("</td><td><a href=\"")
                    .append(Html.esc(folder + "/" + FILE)).append("\">").append(Html.esc(folder + "/" + FILE))
                    .append("</a></td></tr>\n");
        }
        body.append("</tbody>\n</table>\n");
        Path ranking = dir.resolve("comparison").resolve("ranking_by_period.parquet");
        if (Files.exists(ranking)) {
            section("comparison", "Ranking across periods");
            body.append("<p>Whole grid; rank 1 is best in its period. Peak reduction is baseline minus scenario "
                    + "(positive = cooler). Full tables: <code>comparison/ranking_by_period.csv</code> and "
                    + "<code>.parquet</code>.</p>\n");
            try {
                Table t = Table.readParquet(ranking);
                int iPeriod = t.require("period", ranking), iScen = t.require("scenario", ranking);
                int iDist = t.require("district", ranking), iRank = t.require("rank", ranking);
                int iRed = t.require("peak_reduction_mean_c", ranking);
                int iDh = t.require("degree_hours_avoided_k_h_m2", ranking);
                body.append("<table>\n<thead><tr><th>period</th><th class=\"n\">rank</th><th>scenario</th>"
                        + "<th class=\"n\">mean peak reduction °C</th><th class=\"n\">degree-hours avoided K·h·m²</th>"
                        + "</tr></thead>\n<tbody>\n");
                for (Object[] r : t.rows()) {
                    if (!"(all)".equals(String.valueOf(r[iDist]))) {
                        continue;
                    }
                    body.append("<tr><td>").append(Html.esc(String.valueOf(r[iPeriod]))).append("</td><td class=\"n\">")
                            .append(r[iRank]).append("</td><td>").append(Html.esc(String.valueOf(r[iScen])))
                            .append("</td><td class=\"n\">")
                            .append(String.format(Locale.ROOT, "%.2f", Table.number(r[iRed])))
                            .append("</td><td class=\"n\">")
                            .append(String.format(Locale.ROOT, "%.3g", Table.number(r[iDh])))
                            .append("</td></tr>\n");
                }
                body.append("</tbody>\n</table>\n");
            } catch (ReportException e) {
                body.append("<p class=\"missing\">").append(Html.esc(e.getMessage())).append("</p>\n");
            }
        }
    }
}
