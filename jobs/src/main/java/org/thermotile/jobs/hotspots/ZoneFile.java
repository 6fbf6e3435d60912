package org.thermotile.jobs.hotspots;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeSet;
import org.locationtech.jts.geom.Envelope;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.Point;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.io.districts.Districts;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * The zones of a zone analysis (blocks, parcels, districts): a GeoJSON FeatureCollection of
 * Polygon or MultiPolygon features in the run's CRS (declared by the GeoJSON 2008 {@code "crs"}
 * member, as for districts), each with a unique id in the property the user names.
 *
 * <p>Refused, with the feature's index and id and the fix: a missing or blank id, an id used twice,
 * a geometry that is not a Polygon or MultiPolygon, an invalid or empty polygon, and a zone that
 * lies wholly outside the grid.
 *
 * @param file       the file read
 * @param idProperty the property holding each zone's id
 * @param zones      the zones in file order
 */
record ZoneFile(Path file, String idProperty, List<Zone> zones) {

    /**
     * One zone.
     *
     * @param feature  its index in the file's features array
     * @param areaM2   the polygon's area [m²]
     * @param centroidX the polygon's centroid [m, grid CRS]
     */
    record Zone(int feature, String id, Geometry geometry, double areaM2, double centroidX, double centroidY) {
    }

    /** Reads {@code file} for {@code grid}; {@code option} names the option or key in messages. */
    static ZoneFile read(Path file, String idProperty, RasterGrid grid, String option) {
        JsonNode root;
        try {
            root = new ObjectMapper().readTree(Files.readString(file));
        } catch (NoSuchFileException e) {
            throw new UserInputException(file + ": zones file not found. Fix: check " + option);
        } catch (IOException e) {
            throw new UserInputException(file + ": not valid JSON (" + e.getMessage().split("\n")[0]
                    + "). Fix: give a GeoJSON FeatureCollection of the zones", e);
        }
        if (root == null || !"FeatureCollection".equals(root.path("type").asText())) {
            throw new UserInputException(file + ": top-level \"type\" is '" + (root == null ? "" : root.path("type").asText())
                    + "', expected 'FeatureCollection'. Fix: give a GeoJSON FeatureCollection of the zones");
        }
        String crs = root.path("crs").path("properties").path("name").asText("");
        String epsg = "EPSG:" + grid.epsg();
        if (crs.isEmpty()) {
            throw new UserInputException(file + ": no \"crs\" member, so the coordinates are WGS 84 (RFC 7946), but the "
                    + "run's grid is " + grid.crsLabel() + ". Fix: reproject the zones, e.g. ogr2ogr -t_srs " + epsg
                    + " -lco RFC7946=NO zones_utm.geojson " + file.getFileName());
        }
        String digits = crs.replaceAll(".*?(\\d+)$", "$1");
        if (grid.epsg() != 0 && !digits.equals(Integer.toString(grid.epsg()))) {
            throw new UserInputException(file + ": CRS '" + crs + "' differs from the run's " + epsg
                    + ". Fix: reproject the zones, e.g. ogr2ogr -t_srs " + epsg + " -lco RFC7946=NO");
        }
        JsonNode features = root.path("features");
        if (!features.isArray() || features.isEmpty()) {
            throw new UserInputException(file + ": holds no features. Fix: add the zones' polygons");
        }
        GeometryFactory gf = new GeometryFactory();
        Envelope extent = new Envelope(grid.originX(), grid.originX() + grid.width() * grid.pixelWidth(),
                grid.originY(), grid.originY() + grid.height() * grid.pixelHeight());
        Geometry gridBox = gf.toGeometry(extent);
        Map<String, Integer> seen = new HashMap<>();
        List<Zone> zones = new ArrayList<>();
        for (int i = 0; i < features.size(); i++) {
            JsonNode f = features.get(i);
            String where = file + ", features[" + i + "]";
            JsonNode idNode = f.path("properties").path(idProperty);
            if (idNode.isMissingNode() || idNode.isNull() || idNode.asText().isBlank()) {
                TreeSet<String> names = new TreeSet<>();
                f.path("properties").fieldNames().forEachRemaining(names::add);
                throw new UserInputException(where + ": property '" + idProperty + "' (the zone id) is missing or "
                        + "blank. Fix: give every zone an id in '" + idProperty + "', or name another property with "
                        + option.replace("--zones", "--zone-id").replace(".zones", ".zone_id") + " (this feature has "
                        + (names.isEmpty() ? "no properties" : names) + ")");
            }
            String id = idNode.asText();
            Integer first = seen.putIfAbsent(id, i);
            if (first != null) {
                throw new UserInputException(where + ": zone id '" + id + "' is used twice (also features[" + first
                        + "]). Fix: make the ids in '" + idProperty + "' unique, or name a property that is");
            }
            String type = f.path("geometry").path("type").asText("(none)");
            if (!type.equals("Polygon") && !type.equals("MultiPolygon")) {
                throw new UserInputException(where + " (id '" + id + "'): geometry type '" + type + "' is not a zone. "
                        + "Fix: give Polygon or MultiPolygon geometries (buffer points or lines into polygons first)");
            }
            Geometry g = Districts.geometry(where + " (id '" + id + "')", f.path("geometry"), gf);
            if (!g.isValid()) {
                throw new UserInputException(where + " (id '" + id + "'): the polygon is not valid (self-intersecting "
                        + "or badly nested rings). Fix: repair it, e.g. with ogr2ogr -makevalid");
            }
            if (!(g.getArea() > 0)) {
                throw new UserInputException(where + " (id '" + id + "'): the polygon has no area. Fix: remove it or "
                        + "correct its coordinates");
            }
            if (!g.getEnvelopeInternal().intersects(extent) || !(g.intersection(gridBox).getArea() > 0)) {
                Envelope e = g.getEnvelopeInternal();
                throw new UserInputException(String.format(Locale.ROOT, "%s (id '%s'): the zone (x %.1f…%.1f, y "
                        + "%.1f…%.1f) lies outside the grid (x %.1f…%.1f, y %.1f…%.1f, %s). Fix: remove it, or "
                        + "correct its coordinates (they must be in the grid's CRS)", where, id, e.getMinX(), e.getMaxX(),
                        e.getMinY(), e.getMaxY(), extent.getMinX(), extent.getMaxX(), extent.getMinY(),
                        extent.getMaxY(), grid.crsLabel()));
            }
            Point c = g.getCentroid();
            zones.add(new Zone(i, id, g, g.getArea(), c.getX(), c.getY()));
        }
        return new ZoneFile(file, idProperty, List.copyOf(zones));
    }
}
