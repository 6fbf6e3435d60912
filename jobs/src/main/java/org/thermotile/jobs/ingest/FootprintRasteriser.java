package org.thermotile.jobs.ingest;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeSet;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.apache.sis.referencing.crs.AbstractCRS;
import org.apache.sis.referencing.cs.AxesConvention;
import org.locationtech.jts.algorithm.locate.IndexedPointInAreaLocator;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.Envelope;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.LinearRing;
import org.locationtech.jts.geom.Location;
import org.locationtech.jts.geom.Polygon;
import org.opengis.referencing.crs.CoordinateReferenceSystem;
import org.opengis.referencing.operation.MathTransform;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.Suggest;

/**
 * Building footprints (GeoJSON polygons with a height or floor-count attribute) rasterised into a
 * heights grid.
 *
 * <p><b>Cell-centre rule:</b> a cell belongs to a footprint when the cell's centre lies inside the
 * polygon or on its boundary (JTS {@link IndexedPointInAreaLocator}; holes excluded). A footprint
 * smaller than a cell may cover no centre and is then counted as "covers no cell centre".
 * <b>Overlaps:</b> where footprints overlap, the tallest wins (on equal heights, the first in the file).
 *
 * <p><b>Heights:</b> {@code height: ATTR} takes the attribute in metres; {@code floors: ATTR} takes
 * floors × {@code storey_height_m}. A number or a numeric text ("12.5") is accepted. A feature whose
 * value is missing (absent or null), not numeric, or ≤ 0 is not rasterised and is counted by reason;
 * it never becomes 0 m silently. When no feature has the attribute at all, the input is refused,
 * naming the attributes that exist.
 *
 * <p><b>CRS:</b> the run file's {@code inputs.buildings.crs}, else the file's legacy {@code "crs"}
 * member (GeoJSON 2008, e.g. {@code urn:ogc:def:crs:EPSG::32632}), else WGS 84 longitude/latitude as
 * RFC 7946 prescribes. Coordinates are always read as (x = easting or longitude, y = northing or
 * latitude), the GeoJSON order; when the CRS differs from the grid's, they are transformed with an
 * Apache SIS coordinate operation.
 */
public final class FootprintRasteriser {
    private FootprintRasteriser() {}

    /** Reasons a feature is not rasterised, in report order. */
    public static final List<String> SKIP_REASONS = List.of("missing", "not numeric", "not positive",
            "not a polygon");

    /**
     * Rasterised footprints.
     *
     * @param heightM   per cell (row-major), the winning footprint's height [m], NaN where no footprint
     * @param feature   per cell, the index of the winning feature in the file, −1 where none
     * @param roofMaterial per feature, the value of the roof-material attribute (null when not asked or blank)
     * @param features  features in the file
     * @param rasterised features that won at least one cell
     * @param noCell    usable features that cover no cell centre of the grid (outside it, or smaller than a cell)
     * @param skipped   reason → features without a usable height or geometry (every reason listed, 0 included)
     * @param cells     cells covered by a footprint
     * @param crs       how the coordinates' CRS was found and whether they were transformed
     */
    public record Result(float[] heightM, int[] feature, String[] roofMaterial, int features, int rasterised,
            int noCell, Map<String, Integer> skipped, long cells, String crs) {
        /** Features without a usable height or geometry. */
        public int skippedTotal() {
            return skipped.values().stream().mapToInt(Integer::intValue).sum();
        }

        /** What {@code check} prints and the manifest keeps. */
        public String note(Path file, RunFile.Buildings b) {
            return "buildings " + file.getFileName() + ": " + features + " features, " + rasterised
                    + " rasterised onto " + cells + " cells ("
                    + (b.heightAttribute() != null ? "height from '" + b.heightAttribute() + "'"
                            : "floors '" + b.floorsAttribute() + "' × " + b.storeyHeightM() + " m")
                    + "; cell-centre rule, tallest wins where footprints overlap; " + crs + "); "
                    + skippedTotal() + " without a usable height or polygon, not rasterised " + skipped
                    + "; " + noCell + " cover no cell centre";
        }
    }

    /** Reads {@code file} as {@code b} describes and rasterises it onto {@code grid}. */
    public static Result read(Path file, RunFile.Buildings b, FootprintGrid grid) {
        JsonNode root;
        try {
            root = new ObjectMapper().readTree(Files.readString(file));
        } catch (NoSuchFileException e) {
            throw new UserInputException(file + ": footprints file not found. Fix: check inputs.buildings.file");
        } catch (IOException e) {
            throw new UserInputException(file + ": not valid JSON (" + e.getMessage()
                    + "). Fix: give a GeoJSON FeatureCollection of building polygons", e);
        }
        if (root == null || !"FeatureCollection".equals(root.path("type").asText())) {
            throw new UserInputException(file + ": top-level \"type\" is '" + (root == null ? "" : root.path("type").asText())
                    + "', expected 'FeatureCollection'. Fix: give a GeoJSON FeatureCollection of building polygons");
        }
        JsonNode features = root.path("features");
        String attr = b.heightAttribute() != null ? b.heightAttribute() : b.floorsAttribute();
        String key = b.heightAttribute() != null ? "inputs.buildings.height" : "inputs.buildings.floors";
        TreeSet<String> names = new TreeSet<>();
        boolean any = false;
        for (JsonNode f : features) {
            JsonNode p = f.path("properties");
            p.fieldNames().forEachRemaining(names::add);
            any |= p.has(attr);
        }
        if (features.isEmpty()) {
            throw new UserInputException(file + ": holds no features. Fix: add building polygons or drop inputs.buildings");
        }
        if (!any) {
            String hint = Suggest.closest(attr, names).map(c -> " Did you mean '" + c + "'?").orElse("");
            throw new UserInputException(file + ": no feature has the attribute '" + attr + "' named by " + key + "."
                    + hint + " The features' attributes: " + (names.isEmpty() ? "(none)" : String.join(", ", names))
                    + ". Fix: name the attribute that holds the " + (b.heightAttribute() != null
                    ? "height in metres" : "number of floors") + " in " + key);
        }
        CrsChoice crs = crs(file, root, b, grid);

        GeometryFactory gf = new GeometryFactory();
        int n = grid.cols() * grid.rows();
        float[] height = new float[n];
        Arrays.fill(height, Float.NaN);
        int[] winner = new int[n];
        Arrays.fill(winner, -1);
        String[] roof = new String[features.size()];
        Map<String, Integer> skipped = new LinkedHashMap<>();
        SKIP_REASONS.forEach(r -> skipped.put(r, 0));
        int noCell = 0;
        for (int i = 0; i < features.size(); i++) {
            JsonNode f = features.get(i);
            String where = file + ", features[" + i + "]";
            JsonNode props = f.path("properties");
            String reason = null;
            double h = Double.NaN;
            JsonNode v = props.get(attr);
            if (v == null || v.isNull() || (v.isTextual() && v.asText().isBlank())) {
                reason = "missing";
            } else {
                h = number(v);
                if (Double.isNaN(h)) {
                    reason = "not numeric";
                } else if (!(h > 0)) {
                    reason = "not positive";
                } else if (b.floorsAttribute() != null) {
                    h *= b.storeyHeightM();
                }
            }
            if (reason == null && h > 1000) {
                throw new UserInputException(where + ": " + attr + " = " + v.asText() + " gives " + h + " m, above "
                        + "1000 m. Fix: heights are metres above ground" + (b.floorsAttribute() != null
                        ? " (floors × storey_height_m)" : "") + "; check the attribute and its unit");
            }
            Geometry g = reason == null ? polygons(where, f.path("geometry"), gf, crs.transform) : null;
            if (reason == null && g == null) {
                reason = "not a polygon";
            }
            if (reason != null) {
                skipped.merge(reason, 1, Integer::sum);
                continue;
            }
            if (b.roofMaterialAttribute() != null) {
                JsonNode m = props.get(b.roofMaterialAttribute());
                roof[i] = m == null || m.isNull() || m.asText().isBlank() ? null : m.asText().strip();
            }
            if (rasterise(g, (float) h, i, grid, height, winner) == 0) {
                noCell++;
            }
        }
        long cells = 0;
        java.util.BitSet won = new java.util.BitSet();
        for (int c = 0; c < n; c++) {
            if (winner[c] >= 0) {
                cells++;
                won.set(winner[c]);
            }
        }
        return new Result(height, winner, roof, features.size(), won.cardinality(), noCell, skipped, cells, crs.note);
    }

    /**
     * Writes {@code h} into the cells whose centre {@code g} covers, where it is taller than what is
     * there; returns the number of cell centres covered (whether or not it won them).
     */
    static int rasterise(Geometry g, float h, int featureIndex, FootprintGrid grid, float[] height, int[] winner) {
        Envelope env = g.getEnvelopeInternal();
        double cs = grid.cellSizeM();
        // Columns whose centre x = originX + (c + ½)·cs lies in [minX, maxX]; rows likewise, y southward.
        int c0 = Math.max(0, (int) Math.ceil((env.getMinX() - grid.originX()) / cs - 0.5));
        int c1 = Math.min(grid.cols() - 1, (int) Math.floor((env.getMaxX() - grid.originX()) / cs - 0.5));
        int r0 = Math.max(0, (int) Math.ceil((grid.originY() - env.getMaxY()) / cs - 0.5));
        int r1 = Math.min(grid.rows() - 1, (int) Math.floor((grid.originY() - env.getMinY()) / cs - 0.5));
        if (c0 > c1 || r0 > r1) {
            return 0;
        }
        IndexedPointInAreaLocator loc = new IndexedPointInAreaLocator(g);
        Coordinate p = new Coordinate();
        int covered = 0;
        for (int r = r0; r <= r1; r++) {
            p.y = grid.centreY(r);
            for (int c = c0; c <= c1; c++) {
                p.x = grid.centreX(c);
                if (loc.locate(p) != Location.EXTERIOR) {
                    covered++;
                    int i = r * grid.cols() + c;
                    if (winner[i] < 0 || h > height[i]) {
                        height[i] = h;
                        winner[i] = featureIndex;
                    }
                }
            }
        }
        return covered;
    }

    /** A JSON number, or a text holding a plain decimal; NaN otherwise. */
    static double number(JsonNode v) {
        if (v.isNumber()) {
            return v.asDouble();
        }
        if (v.isTextual()) {
            String t = v.asText().strip();
            if (t.matches("[+-]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+-]?\\d+)?")) {
                return Double.parseDouble(t);
            }
        }
        return Double.NaN;
    }

    /** The CRS of the coordinates and the transform into the grid's CRS (null when they agree). */
    record CrsChoice(MathTransform transform, String note) {
    }

    static CrsChoice crs(Path file, JsonNode root, RunFile.Buildings b, FootprintGrid grid) {
        String name;
        String from;
        if (b.crs() != null) {
            name = b.crs();
            from = "inputs.buildings.crs";
        } else if (!root.path("crs").path("properties").path("name").asText("").isEmpty()) {
            name = root.path("crs").path("properties").path("name").asText();
            from = "the file's \"crs\" member";
        } else {
            name = "OGC:CRS84";
            from = "RFC 7946 default";
        }
        CoordinateReferenceSystem source;
        try {
            String u = name.toUpperCase(java.util.Locale.ROOT);
            if (u.endsWith("CRS84") || u.matches(".*EPSG:+(\\d\\.?\\d*:+)?4326")) {
                source = CommonCRS.WGS84.normalizedGeographic();
            } else {
                source = AbstractCRS.castOrCopy(CRS.forCode(name)).forConvention(AxesConvention.RIGHT_HANDED);
            }
        } catch (Exception e) {
            throw new UserInputException(file + ": CRS '" + name + "' (" + from + ") cannot be resolved by Apache SIS ("
                    + e.getMessage() + "). Fix: give inputs.buildings.crs as EPSG:4326 or a WGS 84 / UTM code "
                    + "(EPSG:326xx, 327xx), or reproject the file with ogr2ogr -t_srs matching the land cover", e);
        }
        try {
            CoordinateReferenceSystem target = AbstractCRS.castOrCopy(CRS.fromWKT(grid.crsWkt()))
                    .forConvention(AxesConvention.RIGHT_HANDED);
            if (org.apache.sis.util.Utilities.equalsIgnoreMetadata(source, target)) {
                return new CrsChoice(null, "coordinates in " + name + " (" + from + "), the grid's CRS");
            }
            MathTransform mt = CRS.findOperation(source, target, null).getMathTransform();
            return new CrsChoice(mt.isIdentity() ? null : mt, "coordinates in " + name + " (" + from
                    + ") transformed to the grid's CRS with Apache SIS");
        } catch (Exception e) {
            throw new UserInputException(file + ": no coordinate operation from '" + name + "' (" + from
                    + ") to the grid's CRS (" + e.getMessage() + "). Fix: reproject the file with ogr2ogr -t_srs "
                    + "matching the land cover", e);
        }
    }

    /** A Polygon or MultiPolygon in the grid's CRS; null for any other geometry (or none). */
    static Geometry polygons(String where, JsonNode g, GeometryFactory gf, MathTransform mt) {
        String type = g.path("type").asText("");
        JsonNode c = g.path("coordinates");
        if ("Polygon".equals(type)) {
            return polygon(where, c, gf, mt);
        }
        if ("MultiPolygon".equals(type)) {
            Polygon[] parts = new Polygon[c.size()];
            for (int i = 0; i < c.size(); i++) {
                parts[i] = polygon(where, c.get(i), gf, mt);
            }
            return gf.createMultiPolygon(parts);
        }
        return null;
    }

    static Polygon polygon(String where, JsonNode rings, GeometryFactory gf, MathTransform mt) {
        if (rings.size() == 0) {
            throw new UserInputException(where + ": a polygon with no rings. Fix: remove the feature or give its ring");
        }
        LinearRing shell = ring(where, rings.get(0), gf, mt);
        LinearRing[] holes = new LinearRing[rings.size() - 1];
        for (int i = 1; i < rings.size(); i++) {
            holes[i - 1] = ring(where, rings.get(i), gf, mt);
        }
        return gf.createPolygon(shell, holes);
    }

    static LinearRing ring(String where, JsonNode pts, GeometryFactory gf, MathTransform mt) {
        double[] xy = new double[pts.size() * 2];
        for (int i = 0; i < pts.size(); i++) {
            JsonNode p = pts.get(i);
            if (p.size() < 2 || !p.get(0).isNumber() || !p.get(1).isNumber()) {
                throw new UserInputException(where + ": position " + i + " of a ring is not [x, y]. Fix: write "
                        + "positions as [x, y] numbers");
            }
            xy[2 * i] = p.get(0).asDouble();
            xy[2 * i + 1] = p.get(1).asDouble();
        }
        if (mt != null) {
            try {
                mt.transform(xy, 0, xy, 0, pts.size());
            } catch (org.opengis.referencing.operation.TransformException e) {
                throw new UserInputException(where + ": a position cannot be transformed to the grid's CRS ("
                        + e.getMessage() + "). Fix: check the coordinates and their CRS", e);
            }
        }
        Coordinate[] cs = new Coordinate[pts.size()];
        for (int i = 0; i < cs.length; i++) {
            cs[i] = new Coordinate(xy[2 * i], xy[2 * i + 1]);
        }
        if (cs.length < 4 || !cs[0].equals2D(cs[cs.length - 1])) {
            throw new UserInputException(where + ": a ring needs at least 4 positions and must end where it starts. "
                    + "Fix: close the ring");
        }
        return gf.createLinearRing(cs);
    }
}
