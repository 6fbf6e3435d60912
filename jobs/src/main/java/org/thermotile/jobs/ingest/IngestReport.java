package org.thermotile.jobs.ingest;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * What the ingest did, for {@code check} and the run manifest: the working grid and the rule that
 * chose it, per input what was reprojected, resampled or mosaicked and how, and the cell counts.
 *
 * @param grid    the working grid
 * @param rule    how the grid was chosen, in words
 * @param steps   per input (land cover, heights), one line each on what was done to it
 * @param counts  named cell counts (per tile, overlaps, gaps, outside the area), in a fixed order
 * @param warnings things the user should look at (gaps between tiles)
 */
public record IngestReport(WorkingGrid grid, String rule, Map<String, String> steps, Map<String, Long> counts,
        List<String> warnings) {

    public IngestReport {
        steps = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(steps));
        counts = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(counts));
        warnings = List.copyOf(warnings);
    }

    /** The lines {@code check} prints, indented by the caller. */
    public List<String> lines() {
        List<String> out = new ArrayList<>();
        out.add("working grid: " + grid + " (" + rule + ")");
        steps.forEach((k, v) -> out.add(k + ": " + v));
        if (!counts.isEmpty()) {
            StringBuilder b = new StringBuilder("cells:");
            counts.forEach((k, v) -> b.append(' ').append(k).append(' ').append(v).append(','));
            b.setLength(b.length() - 1);
            out.add(b.toString());
        }
        warnings.forEach(w -> out.add("warning: " + w));
        return out;
    }

    /** Fills the manifest's {@code working_grid} block. */
    public void writeTo(ObjectNode o) {
        o.put("crs", grid.crsLabel());
        o.put("cell_size_m", grid.cellSizeM());
        o.put("cols", grid.cols());
        o.put("rows", grid.rows());
        o.put("origin_x", grid.originX());
        o.put("origin_y", grid.originY());
        o.put("rule", rule);
        ObjectNode s = o.putObject("inputs");
        steps.forEach(s::put);
        ObjectNode c = o.putObject("cells");
        counts.forEach(c::put);
        var w = o.putArray("warnings");
        warnings.forEach(w::add);
    }
}
