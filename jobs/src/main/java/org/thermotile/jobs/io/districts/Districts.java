package org.thermotile.jobs.io.districts;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.Envelope;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.LinearRing;
import org.locationtech.jts.geom.Polygon;
import org.locationtech.jts.geom.prep.PreparedGeometry;
import org.locationtech.jts.geom.prep.PreparedGeometryFactory;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * District polygons from a GeoJSON FeatureCollection, in the land-cover raster's CRS, and the
 * district of every cell (by its centre).
 *
 * <p>Format: a FeatureCollection of Polygon or MultiPolygon features, each with properties
 * {@code id} (text or number) and {@code name}; coordinates in the raster's CRS, declared by a
 * top-level {@code "crs": {"type": "name", "properties": {"name": "urn:ogc:def:crs:EPSG::32632"}}}
 * member (the GeoJSON 2008 form; RFC 7946 files are WGS 84 and are refused with advice to
 * reproject, e.g. {@code ogr2ogr -t_srs EPSG:32632}). Where districts overlap, a cell belongs to
 * the first listed; a cell whose centre lies on a shared edge belongs to the first listed of the two.
 *
 * @param districts   the districts in file order
 * @param cellDistrict per cell (row-major), the district's index, or −1 for none
 */
public record Districts(List<District> districts, int[] cellDistrict) {

    /** One district. */
    public record District(int index, String id, String name, Geometry geometry) {
    }

    public int size() {
        return districts.size();
    }

    /** Reads {@code file} and assigns the cells of {@code grid}. */
    public static Districts read(Path file, RasterGrid grid) {
        JsonNode root;
        try {
            root = new ObjectMapper().readTree(Files.readString(file));
        } catch (java.nio.file.NoSuchFileException e) {
            throw new UserInputException(file + ": districts file not found. Fix: check inputs.districts");
        } catch (IOException e) {
            throw new UserInputException(file + ": not valid JSON (" + e.getMessage()
                    + "). Fix: write a GeoJSON FeatureCollection", e);
        }
        if (!"FeatureCollection".equals(root.path("type").asText())) {
            throw new UserInputException(file + ": top-level \"type\" is '" + root.path("type").asText()
                    + "', expected 'FeatureCollection'");
        }
        checkCrs(file, root, grid);
        GeometryFactory gf = new GeometryFactory();
        List<District> list = new ArrayList<>();
        Set<String> ids = new HashSet<>();
        JsonNode features = root.path("features");
        for (int i = 0; i < features.size(); i++) {
            JsonNode f = features.get(i);
            String where = file + ", features[" + i + "]";
            JsonNode props = f.path("properties");
            String id = props.path("id").asText(null);
            String name = props.path("name").asText(id);
            if (id == null || id.isBlank()) {
                throw new UserInputException(where + ": properties.id is missing. Fix: give every district an id");
            }
            if (!ids.add(id)) {
                throw new UserInputException(where + ": id '" + id + "' is used twice. Fix: make ids unique");
            }
            Geometry g = geometry(where, f.path("geometry"), gf);
            if (!g.isValid()) {
                throw new UserInputException(where + " (" + id + "): the polygon is not valid (self-intersecting "
                        + "or badly nested rings). Fix: repair it, e.g. with ogr2ogr -makevalid");
            }
            list.add(new District(list.size(), id, name, g));
        }
        if (list.isEmpty()) {
            throw new UserInputException(file + ": holds no features. Fix: add district polygons or drop inputs.districts");
        }
        List<Geometry> geoms = list.stream().map(District::geometry).toList();
        return new Districts(List.copyOf(list), assign(geoms, grid, 0, 0, grid.width(), grid.height()));
    }

    static void checkCrs(Path file, JsonNode root, RasterGrid grid) {
        String crs = root.path("crs").path("properties").path("name").asText("");
        if (crs.isEmpty()) {
            throw new UserInputException(file + ": no \"crs\" member, so the coordinates are taken as WGS 84 "
                    + "(RFC 7946), but the land cover is EPSG:" + grid.epsg() + ". Fix: reproject the districts "
                    + "(ogr2ogr -t_srs EPSG:" + grid.epsg() + " -lco RFC7946=NO) so they carry the raster's CRS");
        }
        String digits = crs.replaceAll(".*?(\\d+)$", "$1");
        if (grid.epsg() != 0 && !digits.equals(Integer.toString(grid.epsg()))) {
            throw new UserInputException(file + ": CRS '" + crs + "' differs from the land cover's EPSG:"
                    + grid.epsg() + ". Fix: reproject the districts with ogr2ogr -t_srs EPSG:" + grid.epsg());
        }
    }

    /** A Polygon or MultiPolygon from its GeoJSON geometry object; {@code where} names it in messages. */
    public static Geometry geometry(String where, JsonNode g, GeometryFactory gf) {
        String type = g.path("type").asText();
        JsonNode c = g.path("coordinates");
        return switch (type) {
            case "Polygon" -> polygon(where, c, gf);
            case "MultiPolygon" -> {
                Polygon[] parts = new Polygon[c.size()];
                for (int i = 0; i < c.size(); i++) {
                    parts[i] = polygon(where, c.get(i), gf);
                }
                yield gf.createMultiPolygon(parts);
            }
            default -> throw new UserInputException(where + ": geometry type '" + type
                    + "' is not a district; use Polygon or MultiPolygon");
        };
    }

    static Polygon polygon(String where, JsonNode rings, GeometryFactory gf) {
        if (rings.size() == 0) {
            throw new UserInputException(where + ": a polygon with no rings");
        }
        LinearRing shell = ring(where, rings.get(0), gf);
        LinearRing[] holes = new LinearRing[rings.size() - 1];
        for (int i = 1; i < rings.size(); i++) {
            holes[i - 1] = ring(where, rings.get(i), gf);
        }
        return gf.createPolygon(shell, holes);
    }

    static LinearRing ring(String where, JsonNode pts, GeometryFactory gf) {
        Coordinate[] cs = new Coordinate[pts.size()];
        for (int i = 0; i < pts.size(); i++) {
            JsonNode p = pts.get(i);
            if (p.size() < 2 || !p.get(0).isNumber() || !p.get(1).isNumber()) {
                throw new UserInputException(where + ": coordinate " + i + " is not [x, y]");
            }
            cs[i] = new Coordinate(p.get(0).asDouble(), p.get(1).asDouble());
        }
        if (cs.length < 4 || !cs[0].equals2D(cs[cs.length - 1])) {
            throw new UserInputException(where + ": a ring needs at least 4 positions and must end where it starts");
        }
        return gf.createLinearRing(cs);
    }

    /** The districts' geometries in order (serialisable, for tile tasks). */
    public List<Geometry> geometries() {
        return districts.stream().map(District::geometry).toList();
    }

    /**
     * District index of each cell centre of a window (row-major), first district wins, −1
     * outside every district. Tile tasks call this on their own window.
     */
    public static int[] assign(List<Geometry> geoms, RasterGrid grid, int col0, int row0, int w, int h) {
        GeometryFactory gf = new GeometryFactory();
        int[] out = new int[w * h];
        Arrays.fill(out, -1);
        for (int d = 0; d < geoms.size(); d++) {
            Geometry g = geoms.get(d);
            PreparedGeometry pg = PreparedGeometryFactory.prepare(g);
            Envelope env = g.getEnvelopeInternal();
            int c0 = Math.max(col0, (int) Math.floor((env.getMinX() - grid.originX()) / grid.pixelWidth()));
            int c1 = Math.min(col0 + w - 1, (int) Math.ceil((env.getMaxX() - grid.originX()) / grid.pixelWidth()));
            int r0 = Math.max(row0, (int) Math.floor((env.getMaxY() - grid.originY()) / grid.pixelHeight()));
            int r1 = Math.min(row0 + h - 1, (int) Math.ceil((env.getMinY() - grid.originY()) / grid.pixelHeight()));
            for (int r = r0; r <= r1; r++) {
                double y = grid.cellCentreY(r);
                for (int c = c0; c <= c1; c++) {
                    int i = (r - row0) * w + (c - col0);
                    if (out[i] < 0 && pg.covers(gf.createPoint(new Coordinate(grid.cellCentreX(c), y)))) {
                        out[i] = d;
                    }
                }
            }
        }
        return out;
    }
}
