package org.thermotile.jobs.report;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.LinearRing;
import org.locationtech.jts.geom.Polygon;

/**
 * Reads the polygons of a GeoJSON FeatureCollection (RFC 7946) into JTS geometries: district
 * outlines and hotspot polygons. Coordinates are taken as written (the run's districts are in
 * the raster's CRS). Polygon and MultiPolygon features are kept; features of other geometry
 * types are counted in {@link Collection#skipped()}.
 */
public final class GeoJsonPolygons {
    private GeoJsonPolygons() {}

    /** One polygon feature: its properties in file order (values as text) and its geometry. */
    public record Feature(Map<String, String> properties, Geometry geometry) {
        /** A property as text, or {@code fallback} when absent or null. */
        public String property(String key, String fallback) {
            String v = properties.get(key);
            return v == null ? fallback : v;
        }
    }

    /** The polygon features of a file and how many non-polygon features were left out. */
    public record Collection(List<Feature> features, int skipped) {
    }

    private static final GeometryFactory GEOMETRY = new GeometryFactory();

    /**
     * Reads {@code file}.
     *
     * @throws ReportException naming the file, the feature index and the fix when the file is
     *                         not JSON, not a FeatureCollection, or a polygon is malformed
     */
    public static Collection read(Path file) {
        JsonNode root;
        try {
            root = new ObjectMapper().readTree(file.toFile());
        } catch (IOException e) {
            throw new ReportException(file + ": cannot be read as JSON (" + e.getMessage()
                    + "). Fix: write it again as a GeoJSON FeatureCollection");
        }
        if (root == null || !"FeatureCollection".equals(root.path("type").asText())) {
            throw new ReportException(file + ": top-level \"type\" is not \"FeatureCollection\". Fix: write the "
                    + "outlines as a GeoJSON FeatureCollection of Polygon or MultiPolygon features");
        }
        JsonNode features = root.path("features");
        if (!features.isArray()) {
            throw new ReportException(file + ": \"features\" is missing or not an array. Fix: add a \"features\" list");
        }
        List<Feature> out = new ArrayList<>();
        int skipped = 0;
        for (int i = 0; i < features.size(); i++) {
            JsonNode f = features.get(i);
            JsonNode g = f.path("geometry");
            String type = g.path("type").asText("");
            String where = file + ", features[" + i + "]";
            Geometry geometry;
            switch (type) {
                case "Polygon" -> geometry = polygon(g.path("coordinates"), where);
                case "MultiPolygon" -> {
                    JsonNode parts = g.path("coordinates");
                    if (!parts.isArray() || parts.isEmpty()) {
                        throw new ReportException(where + ": MultiPolygon without coordinates. Fix: give a list of polygons");
                    }
                    Polygon[] ps = new Polygon[parts.size()];
                    for (int k = 0; k < ps.length; k++) {
                        ps[k] = polygon(parts.get(k), where + ".geometry.coordinates[" + k + "]");
                    }
                    geometry = GEOMETRY.createMultiPolygon(ps);
                }
                default -> {
                    skipped++;
                    continue;
                }
            }
            Map<String, String> props = new LinkedHashMap<>();
            JsonNode p = f.path("properties");
            for (Iterator<Map.Entry<String, JsonNode>> it = p.fields(); it.hasNext(); ) {
                Map.Entry<String, JsonNode> e = it.next();
                props.put(e.getKey(), e.getValue().isNull() ? null : e.getValue().isValueNode()
                        ? e.getValue().asText() : e.getValue().toString());
            }
            out.add(new Feature(props, geometry));
        }
        return new Collection(List.copyOf(out), skipped);
    }

    private static Polygon polygon(JsonNode rings, String where) {
        if (!rings.isArray() || rings.isEmpty()) {
            throw new ReportException(where + ": polygon without rings. Fix: give [[[x, y], …]] with the outer ring first");
        }
        LinearRing shell = ring(rings.get(0), where + " ring 0");
        LinearRing[] holes = new LinearRing[rings.size() - 1];
        for (int k = 1; k < rings.size(); k++) {
            holes[k - 1] = ring(rings.get(k), where + " ring " + k);
        }
        return GEOMETRY.createPolygon(shell, holes);
    }

    private static LinearRing ring(JsonNode pts, String where) {
        if (!pts.isArray() || pts.size() < 4) {
            throw new ReportException(where + ": a ring needs at least 4 positions (first = last), found "
                    + (pts.isArray() ? pts.size() : 0) + ". Fix: close the ring by repeating its first position");
        }
        Coordinate[] c = new Coordinate[pts.size()];
        for (int k = 0; k < c.length; k++) {
            JsonNode xy = pts.get(k);
            if (!xy.isArray() || xy.size() < 2 || !xy.get(0).isNumber() || !xy.get(1).isNumber()) {
                throw new ReportException(where + ", position " + k + ": " + xy + " is not [x, y]. Fix: write "
                        + "each position as two numbers");
            }
            c[k] = new Coordinate(xy.get(0).asDouble(), xy.get(1).asDouble());
        }
        if (!c[0].equals2D(c[c.length - 1])) {
            throw new ReportException(where + ": the ring is not closed (first " + c[0] + ", last " + c[c.length - 1]
                    + "). Fix: repeat the first position at the end");
        }
        return GEOMETRY.createLinearRing(c);
    }
}
