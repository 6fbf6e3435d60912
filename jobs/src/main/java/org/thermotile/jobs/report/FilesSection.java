package org.thermotile.jobs.report;

import static org.thermotile.jobs.report.RunReport.FILE;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/** The list of the run folder's files, with the formats of its maps and tables. */
final class FilesSection extends ReportSection {
    FilesSection(ReportSection page) {
        super(page);
    }

    void filesSection() {
        section("files", "Files in this folder");
        body.append("<ul class=\"files\">\n");
        for (Path p : list(dir)) {
            String n = p.getFileName().toString();
            if (n.equals(FILE)) {
                continue;
            }
            body.append("<li><code>").append(Html.esc(n)).append(Files.isDirectory(p) ? "/" : "").append("</code>");
            if (Files.isDirectory(p)) {
                List<String> kids = list(p).stream().map(q -> q.getFileName().toString()
                        + (Files.isDirectory(q) ? "/" : "")).toList();
                body.append(" ").append(Html.esc(String.join("  ", kids)));
            }
            body.append("</li>\n");
        }
        body.append("</ul>\n<p class=\"small\">Maps are float32 GeoTIFF in EPSG:").append(manifest.path("grid")
                .path("epsg").asInt()).append(" with no-data −9999 (open them in any GIS); tables are Parquet. "
                + "Made by <code>thermotile report</code> from these files alone; run it again to remake this page.</p>\n");
    }
}
