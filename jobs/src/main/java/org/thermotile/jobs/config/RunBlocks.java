package org.thermotile.jobs.config;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.ArrayList;
import java.util.List;
import org.thermotile.model.geometry.GeometryFactors;
import org.thermotile.model.hotspot.DistanceBand;
import org.thermotile.model.hotspot.ExcessBand;
import org.thermotile.model.hotspot.FalseDiscovery;
import org.thermotile.model.materials.MaterialProperty;

/**
 * The run file's optional analysis blocks, {@code geometry:} and {@code hotspots:}, read and
 * checked with the same {@link Section} reader as every other block: every problem of the file is
 * reported together with its line and column, unknown keys with a did-you-mean, and a value that is
 * not a number (such as {@code 1OO}) is an error, never the default.
 *
 * <p>One {@code check…} method per block records problems while the run file is read; one
 * {@code of…} method per block gives the checked values to the jobs (absent keys as their default,
 * or NaN/null where the default depends on the grid or on the hot-spot job). Checks that need the
 * prepared grid (a search radius of at least one cell, an analysis cell of at least one simulation
 * cell) stay with the jobs, which know the grid.
 *
 * <p>To add a key: append it to the block's key list ({@link #GEOMETRY} or {@link #HOTSPOTS}),
 * check it in the block's {@code check…} method (Section getters record a problem and return null),
 * add a component to the block's record and read it in the block's {@code of…} method.
 */
public final class RunBlocks {
    private RunBlocks() {
    }

    /** Keys of the {@code geometry:} block. */
    public static final List<String> GEOMETRY = List.of("sky_view_directions", "search_radius_m",
            "min_sun_elevation_deg", "canopy_transmissivity", "wall_emissivity");
    /** Keys of the {@code hotspots:} block. */
    public static final List<String> HOTSPOTS = List.of("statistics", "cell_size_m", "distance_m", "weights", "fdr",
            "fdr_method", "min_excess_k", "min_area_m2", "min_coverage", "zones", "zone_id");
    /** Largest false discovery rate a hot-spot analysis accepts. */
    public static final double MAX_FDR = 0.20;
    /** Largest search radius of the horizon search [m]. */
    public static final double MAX_SEARCH_RADIUS_M = 2000;

    // ---------------------------------------------------------------- geometry

    /**
     * Checked {@code geometry:} settings, defaults filled in.
     *
     * @param skyViewDirections     azimuth directions of the horizon search, 16…360
     * @param searchRadiusM         obstacles farther than this are ignored [m], (0, 2000]
     * @param minSunElevationDeg    lower suns: beam counted as diffuse, no cast shadow [°], 1…45
     * @param canopyTransmissivity  share of beam sunlight through tree crowns [–], 0…1
     * @param wallEmissivity        thermal emittance of walls [–], the range of {@link MaterialProperty#EMISSIVITY}
     */
    public record Geometry(int skyViewDirections, double searchRadiusM, double minSunElevationDeg,
            double canopyTransmissivity, double wallEmissivity) {
    }

    /** Checks the {@code geometry:} block ({@code s} null when absent). */
    static void checkGeometry(YamlDoc doc, Section s, RunFile.Inputs inputs, JsonNode raw) {
        if (raw == null || raw.isNull()) {
            return;
        }
        if (inputs != null && inputs.heights() == null && inputs.buildings() == null) {
            doc.at("geometry", "geometry settings need a heights raster or building footprints. Fix: give "
                    + "inputs.heights or inputs.buildings, or drop the geometry block");
        }
        if (s == null) {
            return;
        }
        s.checkKeys(GEOMETRY, List.of(), java.util.Map.of());
        Integer dirs = s.integer("sky_view_directions", false, "a whole number 16…360, e.g. 32");
        if (dirs != null && (dirs < 16 || dirs > 360)) {
            s.doc.at(s.child("sky_view_directions"), dirs + " must be 16…360. Fix: give e.g. 32");
        }
        Double radius = s.number("search_radius_m", false, "metres, e.g. 100");
        if (radius != null && !(radius > 0 && radius <= MAX_SEARCH_RADIUS_M)) {
            s.doc.at(s.child("search_radius_m"), radius + " m must be above 0 and at most " + MAX_SEARCH_RADIUS_M
                    + " m. Fix: give e.g. 100");
        }
        Double minSun = s.number("min_sun_elevation_deg", false, "degrees 1…45, e.g. 10");
        if (minSun != null && !(minSun >= 1 && minSun <= 45)) {
            s.doc.at(s.child("min_sun_elevation_deg"), minSun + " must be 1…45°. Fix: give e.g. 10");
        }
        Double tau = s.number("canopy_transmissivity", false, "a fraction 0…1, e.g. 0.3");
        if (tau != null && !(tau >= 0 && tau <= 1)) {
            s.doc.at(s.child("canopy_transmissivity"), tau + " must be 0…1. Fix: give e.g. 0.3");
        }
        Double eps = s.number("wall_emissivity", false, "a thermal emittance, e.g. 0.9");
        if (eps != null && MaterialProperty.EMISSIVITY.problem(eps) != null) {
            s.doc.at(s.child("wall_emissivity"), MaterialProperty.EMISSIVITY.problem(eps) + ". Fix: give e.g. 0.9");
        }
    }

    /** The checked {@code geometry:} settings of {@code run}, with defaults for absent keys. */
    public static Geometry geometryOf(RunFile run) {
        JsonNode n = run.reserved("geometry");
        if (n == null || n.isNull()) {
            n = com.fasterxml.jackson.databind.node.NullNode.getInstance();
        }
        return new Geometry(n.path("sky_view_directions").asInt(32), n.path("search_radius_m").asDouble(100),
                n.path("min_sun_elevation_deg").asDouble(10), n.path("canopy_transmissivity").asDouble(0.3),
                n.path("wall_emissivity").asDouble(GeometryFactors.DEFAULT_WALL_EMISSIVITY));
    }

    // ---------------------------------------------------------------- hotspots

    /**
     * Checked {@code hotspots:} settings; what the hot-spot job defaults is NaN or null here.
     *
     * @param statistics  maps to analyse; empty for the job's default
     * @param cellSizeM   analysis cell [m], NaN for the default
     * @param distanceM   neighbourhood radius [m], NaN for the peak of Moran's I
     * @param weights     spatial weights, null for the default (binary)
     * @param fdr         false discovery rate, NaN for the default
     * @param fdrMethod   FDR procedure, null for the default (bh)
     * @param minExcessK  smallest excess that counts [K], NaN for the default
     * @param minAreaM2   smallest area kept [m²], NaN for the default
     * @param minCoverage smallest covered share of an analysis cell or zone [–], NaN for the default
     * @param zones       GeoJSON file of zones as written (relative to the run file), or null for the grid mode
     * @param zoneId      property holding each zone's id, or null for the default
     */
    public record Hotspots(List<String> statistics, double cellSizeM, double distanceM, DistanceBand.Weights weights,
            double fdr, FalseDiscovery fdrMethod, double minExcessK, double minAreaM2, double minCoverage,
            String zones, String zoneId) {
    }

    /** Checks the {@code hotspots:} block ({@code s} null when absent); statistics against the run's maps. */
    static void checkHotspots(Section s, RunFile.Outputs outputs) {
        if (s == null) {
            return;
        }
        s.checkKeys(HOTSPOTS, List.of(), java.util.Map.of());
        List<String> maps = new ArrayList<>();
        if (outputs != null) {
            outputs.maps().stream().filter(RunFile.MapKind::hotspots).map(RunFile.MapKind::key).forEach(maps::add);
        }
        JsonNode stats = s.list("statistics", false, "a list of the run's maps, e.g. [peak]");
        if (stats != null) {
            for (int i = 0; i < stats.size(); i++) {
                String p = s.child("statistics") + "[" + i + "]";
                JsonNode v = stats.get(i);
                if (!v.isTextual()) {
                    s.doc.at(p, "expected a map name, got " + YamlDoc.describe(v) + ". Fix: use one of " + maps);
                } else if (outputs != null && !maps.contains(v.asText())) {
                    s.doc.at(p, "'" + v.asText() + "' is not one of the run's maps (peak_hour excepted)"
                            + Suggest.didYouMean(v.asText(), maps) + ". Fix: use one of " + maps);
                }
            }
        }
        Double cell = s.number("cell_size_m", false, "metres, a whole multiple of the simulation cell, e.g. 40");
        if (cell != null && !(cell > 0)) {
            s.doc.at(s.child("cell_size_m"), cell + " m must be above 0. Fix: give a whole multiple of the "
                    + "simulation cell, e.g. 40");
        }
        Double d = s.number("distance_m", false, "metres, e.g. 120, or leave it out for the peak of Moran's I");
        if (d != null && !(d > 0)) {
            s.doc.at(s.child("distance_m"), d + " m must be above 0. Fix: give at least one analysis cell, or "
                    + "leave distance_m out for the peak of Moran's I");
        }
        choice(s, "weights", List.of("binary", "inverse_distance"));
        Double fdr = s.number("fdr", false, "a rate above 0 and at most " + MAX_FDR + ", e.g. 0.05");
        if (fdr != null && !(fdr > 0 && fdr <= MAX_FDR)) {
            s.doc.at(s.child("fdr"), fdr + " must be above 0 and at most " + MAX_FDR + ". Fix: give e.g. 0.05");
        }
        choice(s, "fdr_method", List.of("bh", "by"));
        Double ex = s.number("min_excess_k", false, "kelvin, e.g. 1");
        if (ex != null && !(ex > 0 && ex <= ExcessBand.MAX_MIN_EXCESS_K)) {
            s.doc.at(s.child("min_excess_k"), ex + " must be above 0 and at most " + ExcessBand.MAX_MIN_EXCESS_K
                    + " K. Fix: give e.g. 1");
        }
        Double area = s.number("min_area_m2", false, "square metres, e.g. 3200");
        if (area != null && !(area >= 0)) {
            s.doc.at(s.child("min_area_m2"), area + " must be a number of m² at least 0. Fix: give e.g. 3200");
        }
        Double cov = s.number("min_coverage", false, "a share from 0 to 1, e.g. 0.5");
        if (cov != null && !(cov >= 0 && cov <= 1)) {
            s.doc.at(s.child("min_coverage"), cov + " must be a share from 0 to 1. Fix: give e.g. 0.5");
        }
        String zones = s.text("zones", false, "a GeoJSON file of polygons, e.g. zones: blocks.geojson");
        if (zones != null && zones.isBlank()) {
            s.doc.at(s.child("zones"), "give a GeoJSON file of polygons, e.g. zones: blocks.geojson");
        }
        String zoneId = s.text("zone_id", false, "the property holding each zone's id, e.g. zone_id: block");
        if (zoneId != null && zones == null) {
            s.doc.at(s.child("zone_id"), "given without zones. Fix: add zones: FILE.geojson, or drop zone_id");
        }
        String w = s.text("weights", false, "one of binary, inverse_distance");
        if (zones != null && w != null && !w.equals("binary")) {
            s.doc.at(s.child("weights"), "zones use binary weights over centroid distances. Fix: drop weights, or "
                    + "run the zones with 'thermotile hotspots --zones'");
        }
    }

    private static void choice(Section s, String key, List<String> allowed) {
        String v = s.text(key, false, "one of " + String.join(", ", allowed));
        if (v != null && !allowed.contains(v)) {
            s.doc.at(s.child(key), "'" + v + "' is not one of " + String.join(", ", allowed)
                    + Suggest.didYouMean(v, allowed) + ". Fix: use " + String.join(" or ", allowed));
        }
    }

    /** The checked {@code hotspots:} settings of {@code run}, or null when it has no such block. */
    public static Hotspots hotspotsOf(RunFile run) {
        JsonNode n = run.reserved("hotspots");
        if (n == null || n.isNull()) {
            return null;
        }
        List<String> stats = new ArrayList<>();
        n.path("statistics").forEach(v -> stats.add(v.asText()));
        return new Hotspots(List.copyOf(stats), n.path("cell_size_m").asDouble(Double.NaN),
                n.path("distance_m").asDouble(Double.NaN),
                n.has("weights") ? DistanceBand.Weights.ofKey(n.get("weights").asText()) : null,
                n.path("fdr").asDouble(Double.NaN),
                n.has("fdr_method") ? FalseDiscovery.ofKey(n.get("fdr_method").asText()) : null,
                n.path("min_excess_k").asDouble(Double.NaN), n.path("min_area_m2").asDouble(Double.NaN),
                n.path("min_coverage").asDouble(Double.NaN), n.path("zones").asText(null),
                n.path("zone_id").asText(null));
    }
}
