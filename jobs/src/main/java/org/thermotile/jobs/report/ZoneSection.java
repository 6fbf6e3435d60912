package org.thermotile.jobs.report;

import static org.thermotile.jobs.report.RunReport.num;
import static org.thermotile.jobs.report.RunReport.fmtInt;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/** Zone analyses ({@code zones/STEM/STATISTIC/summary.json}): the hot zones, largest first. */
final class ZoneSection extends ReportSection {
    ZoneSection(ReportSection page) {
        super(page);
    }

    /** Zone analyses (zones/STEM/STATISTIC/summary.json): the hot zones, largest first. */
    void zonesSection() {
        List<Path> sums = new ArrayList<>();
        for (Path stem : list(dir.resolve("zones"))) {
            for (Path st : list(stem)) {
                if (Files.isRegularFile(st.resolve("summary.json"))) {
                    sums.add(st.resolve("summary.json"));
                }
            }
        }
        if (sums.isEmpty()) {
            return;
        }
        section("zones", "Hot zones");
        body.append("<p>Zones (blocks, parcels, districts) whose area-weighted mean is warmer than the city's median by "
                + "at least the minimum excess and whose Getis–Ord Gi* passes the false-discovery-rate test; zones with "
                + "too little data (below the minimum coverage) are left out. Largest first.</p>\n");
        for (Path sum : sums) {
            JsonNode j;
            try {
                j = new ObjectMapper().readTree(sum.toFile());
            } catch (IOException e) {
                throw new UncheckedIOException("cannot read " + sum, e);
            }
            Path st = sum.getParent();
            body.append("<h3>").append(Html.esc(st.getParent().getFileName().toString())).append(" (")
                    .append(Html.esc(st.getFileName().toString())).append("): ").append(j.path("hot_zones").size())
                    .append(" hot of ").append(j.path("zones").asInt()).append(" zones</h3>\n")
                    .append("<table class=\"data\"><thead><tr><th>zone</th><th>area [m²]</th><th>excess [K]</th>"
                            + "<th>q</th><th>band</th></tr></thead><tbody>\n");
            JsonNode hot = j.path("hot_zones");
            for (int i = 0; i < Math.min(TABLE_ROWS, hot.size()); i++) {
                JsonNode z = hot.get(i);
                body.append("<tr><td>").append(Html.esc(z.path("zone_id").asText())).append("</td><td class=\"n\">")
                        .append(fmtInt(Math.round(z.path("area_m2").asDouble()))).append("</td><td class=\"n\">")
                        .append(num(z.path("excess_k").asDouble(), 2)).append("</td><td class=\"n\">")
                        .append(String.format(Locale.ROOT, "%.2g", z.path("q").asDouble())).append("</td><td>")
                        .append(Html.esc(z.path("label").asText())).append("</td></tr>\n");
            }
            body.append("</tbody></table>\n");
            if (hot.size() > TABLE_ROWS) {
                body.append("<p class=\"small\">The first ").append(TABLE_ROWS).append(" of ").append(hot.size())
                        .append(" hot zones; all are in <code>").append(Html.esc(rel(sum))).append("</code>.</p>\n");
            }
        }
    }
}
