package org.thermotile.jobs.city;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.HexFormat;
import java.util.Map;

/**
 * The run manifest: inputs with their SHA-256, the resolved run file, versions, timings, sizes
 * and the largest energy-closure residual. Timings are the only fields that differ between two
 * identical runs; they sit under "timing".
 */
final class Manifest {
    private Manifest() {}

    static void write(PreparedRun p, CityJob.Summary s, double simulateSeconds, double tileSeconds,
            ObjectNode partitions, java.util.List<String> reused, Path file) throws IOException {
        ObjectMapper om = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = om.createObjectNode();
        root.put("format", "thermotile-run-manifest/1");
        root.put("name", p.run().name());
        if (p.period() != null) {
            root.put("period", p.period());   // one period of a run over several: see ../../manifest.json
            root.put("run_folder", "../..");  // what "outputs" and "partitions" are relative to
        }
        ObjectNode inputs = root.putObject("inputs");
        for (Map.Entry<String, String> e : p.inputFiles().entrySet()) {
            ObjectNode i = inputs.putObject(e.getKey());
            i.put("location", e.getValue());
            i.put("sha256", sha256(RunPreparer.localPath(e.getValue(), "inputs." + e.getKey())));
        }
        root.set("run_file", resolvedRunFile(p));
        putTimeRange(root, java.util.List.of(p));
        putVersionsAndGrid(root, p);
        if (p.ingest() != null) {
            p.ingest().writeTo(root.putObject("working_grid"));   // how the inputs were put on the grid
        }
        ObjectNode sim = root.putObject("simulation");
        sim.put("cells", s.cells());
        sim.put("hours", p.spec().forcing().hours() - 1);
        sim.put("counted_hours", p.sampleEpochSeconds().length);
        sim.put("cell_hours", p.cellHours() * p.plan().variants().size());
        sim.put("max_closure_residual", s.maxClosureResidual());
        sim.put("deep_ground_c", p.spec().settings().deepGroundK() - 273.15);
        ObjectNode mat = sim.putObject("materials");
        for (int i = 0; i < p.paletteLabels().size(); i++) {
            mat.put(p.paletteLabels().get(i), p.spec().palette()[i].name());
        }
        ObjectNode codes = sim.putObject("land_cover_cells");
        p.codeCounts().forEach((k, n) -> codes.put(Integer.toString(k), n));
        var outs = root.putArray("outputs");
        s.maps().forEach(outs::add);
        // Relative to the run folder (for one period of several: two levels up, its tables' partition).
        String part = p.period() == null ? "" : "/period=" + p.period();
        outs.add("tables/cells" + part);
        outs.add("tables/material_hours" + part);
        if (!p.districtNames().isEmpty()) {
            outs.add("tables/district_hours" + part);
        }
        if (p.hourlyEpochSeconds().length > 0) {
            outs.add("tables/cell_hours" + part);
        }
        ObjectNode scen = root.putObject("scenarios");
        scen.put("cell_area_m2", p.grid().pixelAreaM2());
        scen.put("threshold_c", p.run().outputs().thresholdC());
        var dn = scen.putArray("districts");
        p.districtNames().forEach(dn::add);
        var list = scen.putArray("list");
        for (ScenarioPlanner.Treated t : p.plan().treated()) {
            ObjectNode o = list.addObject();
            o.put("name", t.scenario());
            var def = p.run().scenarios().stream().filter(x -> x.name().equals(t.scenario())).findFirst().orElseThrow();
            o.put("origin", def.origin());
            o.put("changes", def.changes().toString());
            o.put("has_cost", t.hasCost());
            var tc = o.putObject("treated_cells");
            var cost = o.putObject("cost");
            int nd = p.districtNames().size();
            for (int d = 0; d <= nd; d++) {
                String key = d < nd ? p.districtNames().get(d) : "(outside districts)";
                tc.put(key, t.cells(d));
                cost.put(key, t.cost(d, p.grid().pixelAreaM2()));
            }
        }
        root.set("partitions", partitions);
        var notes = root.putArray("notes");
        p.notes().forEach(notes::add);
        ObjectNode timing = root.putObject("timing");
        timing.put("wall_seconds", round(s.wallSeconds()));
        timing.put("simulate_seconds", round(simulateSeconds));
        // Σ over tiles of each task's time in its tile pass (read, map, step, gather): over
        // (cores × wall_seconds), the share of the run's cores the simulation itself used.
        timing.put("tile_pass_seconds", round(tileSeconds));
        timing.put("cell_hours_per_second", Math.round(s.cellHoursPerSecond()));
        timing.put("computed_cell_hours", s.cellHours());
        timing.put("stepped_cell_hours", s.steppedCellHours());
        var kept = timing.putArray("resumed_partitions");
        reused.forEach(kept::add);
        root.put("caution", CAUTION);
        Files.writeString(file, om.writeValueAsString(root) + "\n");
    }

    /**
     * The manifest of a run over several periods, in the run folder: each period's folder, dates,
     * weather (with its SHA-256) and totals, and where the tables are. Each period's folder holds
     * the full manifest of that period (inputs, resolved run file, partitions).
     */
    static void writePeriods(java.util.List<PreparedRun> periods, java.util.List<CityJob.Summary> each,
            CityJob.Summary all, Path file) throws IOException {
        ObjectMapper om = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = om.createObjectNode();
        PreparedRun first = periods.get(0);
        root.put("format", "thermotile-run-manifest/1");
        root.put("name", first.run().name());
        putTimeRange(root, periods);
        putVersionsAndGrid(root, first);
        var ps = root.putArray("periods");
        for (int i = 0; i < periods.size(); i++) {
            PreparedRun p = periods.get(i);
            ObjectNode o = ps.addObject();
            o.put("name", p.period());
            o.put("folder", "periods/" + p.period());
            o.put("start", p.run().period().start().toString());
            o.put("end", p.run().period().end().toString());
            o.put("spin_up_days", p.run().period().spinUpDays());
            String w = p.inputFiles().get("weather");
            if (w != null) {
                ObjectNode wo = o.putObject("weather");
                wo.put("location", w);
                wo.put("sha256", sha256(RunPreparer.localPath(w, "weather")));
            } else {
                o.put("weather", "synthetic");
            }
            o.put("counted_hours", p.sampleEpochSeconds().length);
            o.put("cell_hours", p.cellHours() * p.plan().variants().size());
            o.put("max_closure_residual", each.get(i).maxClosureResidual());
        }
        ObjectNode tables = root.putObject("tables");
        tables.put("partitioning", "period, scenario");
        var tl = tables.putArray("list");
        for (String t : Partitions.TABLES) {
            if (java.nio.file.Files.isDirectory(file.resolveSibling("tables").resolve(t))) {
                tl.add("tables/" + t);
            }
        }
        ObjectNode sim = root.putObject("simulation");
        sim.put("cells", all.cells());
        sim.put("variants", first.plan().variants().size());
        sim.put("max_closure_residual", all.maxClosureResidual());
        var outs = root.putArray("outputs");
        all.maps().forEach(outs::add);
        ObjectNode timing = root.putObject("timing");
        timing.put("wall_seconds", round(all.wallSeconds()));
        timing.put("computed_cell_hours", all.cellHours());
        timing.put("stepped_cell_hours", all.steppedCellHours());
        root.put("caution", CAUTION);
        Files.writeString(file, om.writeValueAsString(root) + "\n");
    }

    static final String CAUTION = "Surface temperature is not air temperature nor a heat-health index. "
            + "Results are estimates for comparing options; defer to local building codes and licensed professionals.";

    /**
     * The counted time of the run (all periods): from the first period's start to the last one's
     * end, local clock time at the weather's UTC offset, written in UTC (ISO 8601, "Z"). What the
     * catalogue entry's start_datetime and end_datetime say.
     */
    private static void putTimeRange(ObjectNode root, java.util.List<PreparedRun> periods) {
        java.time.Instant start = null;
        java.time.Instant end = null;
        for (PreparedRun p : periods) {
            java.time.ZoneOffset off = java.time.ZoneOffset.ofTotalSeconds(p.spec().forcing().utcOffsetSeconds);
            java.time.Instant s = p.run().period().start().toInstant(off);
            java.time.Instant e = p.run().period().end().toInstant(off);
            start = start == null || s.isBefore(start) ? s : start;
            end = end == null || e.isAfter(end) ? e : end;
        }
        ObjectNode t = root.putObject("time_range");
        t.put("start", start.toString());
        t.put("end", end.toString());
    }

    /** The "versions" and "grid" blocks every manifest has. */
    private static void putVersionsAndGrid(ObjectNode root, PreparedRun p) {
        ObjectNode v = root.putObject("versions");
        v.put("thermotile", version());
        v.put("java", System.getProperty("java.version"));
        v.put("spark", org.apache.spark.package$.MODULE$.SPARK_VERSION());
        ObjectNode grid = root.putObject("grid");
        grid.put("width", p.grid().width());
        grid.put("height", p.grid().height());
        grid.put("epsg", p.grid().epsg());
        grid.put("pixel_m", p.grid().pixelWidth());
        grid.put("tiles", p.tiles().size());
    }

    static double round(double v) {
        return Math.round(v * 1000) / 1000.0;
    }

    static String version() {
        String v = Manifest.class.getPackage().getImplementationVersion();
        return v == null ? "0.1.0-SNAPSHOT" : v;
    }

    static String sha256(Path f) throws IOException {
        try (InputStream in = Files.newInputStream(f)) {
            MessageDigest md = MessageDigest.getInstance("SHA-256");
            byte[] buf = new byte[1 << 16];
            for (int n; (n = in.read(buf)) > 0; ) {
                md.update(buf, 0, n);
            }
            return HexFormat.of().formatHex(md.digest());
        } catch (java.security.NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }

    /**
     * The run file as run, every default filled in: {@link org.thermotile.jobs.config.RunFile#toTree}
     * (site, inputs, weather, period, physics, outputs, tiling, reserved blocks as given) with the
     * geometry block replaced by the values actually used (directions, search radius, minimum sun
     * elevation, canopy transmissivity, wall emissivity). A valid run file in itself.
     */
    static com.fasterxml.jackson.databind.node.ObjectNode resolvedRunFile(PreparedRun p) {
        com.fasterxml.jackson.databind.node.ObjectNode tree = p.run().toTree();
        GeometryBlock g = p.spec().geometry();
        if (g != null) {
            com.fasterxml.jackson.databind.node.ObjectNode o = tree.putObject("geometry");
            o.put("sky_view_directions", g.directions());
            o.put("search_radius_m", g.searchRadiusM());
            o.put("min_sun_elevation_deg", g.minSunElevationDeg());
            o.put("canopy_transmissivity", g.canopyTransmissivity());
            o.put("wall_emissivity", g.wallEmissivity());
        }
        return tree;
    }
}
