package org.thermotile.jobs.ingest;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.apache.sis.referencing.crs.AbstractCRS;
import org.apache.sis.referencing.cs.AxesConvention;
import org.locationtech.jts.geom.CoordinateSequence;
import org.locationtech.jts.geom.CoordinateSequenceFilter;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.GeometryFactory;
import org.opengis.referencing.crs.CoordinateReferenceSystem;
import org.opengis.referencing.operation.MathTransform;
import org.opengis.referencing.operation.TransformException;
import org.opengis.util.FactoryException;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.io.districts.Districts;

/**
 * An area of interest ({@code grid.area}): a box in any CRS, or the union of the polygons of a
 * GeoJSON file, each in the CRS it declares. Coordinates are read east first (x = longitude for
 * geographic CRSs), whatever the EPSG axis order.
 *
 * @param polygon the polygons in {@code crs}, or null for a box
 * @param minX    box (or the polygons' envelope) west edge, in {@code crs} units
 * @param minY    south edge
 * @param maxX    east edge
 * @param maxY    north edge
 * @param crs     the CRS of the coordinates, easting (longitude) first
 * @param label   the area as the user wrote it, for messages
 */
record AreaOfInterest(Geometry polygon, double minX, double minY, double maxX, double maxY,
        CoordinateReferenceSystem crs, String label) {

    /** The area of a run file, or null when the grid has none. */
    static AreaOfInterest of(RunFile run) {
        RunFile.Area a = run.grid().area();
        if (a == null) {
            return null;
        }
        if (a.isBox()) {
            CoordinateReferenceSystem crs = crsForCode(a.bboxCrs(), run.source() + ": grid.area.crs");
            return new AreaOfInterest(null, a.minX(), a.minY(), a.maxX(), a.maxY(), crs,
                    "bbox [" + a.minX() + ", " + a.minY() + ", " + a.maxX() + ", " + a.maxY() + "] in " + a.bboxCrs());
        }
        return readPolygon(Path.of(a.polygon()));
    }

    /**
     * The CRS of an EPSG code with easting (longitude) first.
     *
     * @param where the file and key, for the message
     * @throws UserInputException when Apache SIS cannot build it
     */
    static CoordinateReferenceSystem crsForCode(String code, String where) {
        try {
            return AbstractCRS.castOrCopy(CRS.forCode(code)).forConvention(AxesConvention.RIGHT_HANDED);
        } catch (FactoryException | RuntimeException e) {
            throw new UserInputException(where + ": " + code + " is not a CRS Apache SIS can build here ("
                    + e.getMessage() + "). Fix: give an EPSG code SIS knows without the EPSG database, e.g. "
                    + "EPSG:4326 (WGS 84) or a WGS 84 / UTM zone EPSG:326xx (north) / EPSG:327xx (south)", e);
        }
    }

    /** Polygons of a GeoJSON FeatureCollection, Feature or geometry; WGS 84 unless a "crs" member says otherwise. */
    static AreaOfInterest readPolygon(Path file) {
        JsonNode root;
        try {
            root = new ObjectMapper().readTree(Files.readString(file));
        } catch (java.nio.file.NoSuchFileException e) {
            throw new UserInputException(file + ": area-of-interest file not found. Fix: check grid.area.polygon");
        } catch (IOException e) {
            throw new UserInputException(file + ": not valid JSON (" + e.getMessage() + "). Fix: give a GeoJSON "
                    + "file of Polygon or MultiPolygon features (grid.area.polygon)", e);
        }
        String crsName = root.path("crs").path("properties").path("name").asText("");
        CoordinateReferenceSystem crs;
        if (crsName.isEmpty()) {
            crs = CommonCRS.WGS84.normalizedGeographic();     // RFC 7946: longitude, latitude
        } else {
            String digits = crsName.replaceAll(".*?(\\d+)$", "$1");
            crs = crsForCode("EPSG:" + digits, file + ": \"crs\" member '" + crsName + "'");
        }
        GeometryFactory gf = new GeometryFactory();
        List<Geometry> parts = new ArrayList<>();
        String type = root.path("type").asText();
        if ("FeatureCollection".equals(type)) {
            JsonNode fs = root.path("features");
            for (int i = 0; i < fs.size(); i++) {
                parts.add(Districts.geometry(file + ", features[" + i + "]", fs.get(i).path("geometry"), gf));
            }
        } else if ("Feature".equals(type)) {
            parts.add(Districts.geometry(file.toString(), root.path("geometry"), gf));
        } else {
            parts.add(Districts.geometry(file.toString(), root, gf));
        }
        if (parts.isEmpty()) {
            throw new UserInputException(file + ": holds no polygon. Fix: give at least one Polygon feature in grid.area.polygon");
        }
        Geometry union = gf.buildGeometry(parts).union();
        if (union.isEmpty()) {
            throw new UserInputException(file + ": its polygons enclose no area. Fix: check grid.area.polygon");
        }
        var env = union.getEnvelopeInternal();
        return new AreaOfInterest(union, env.getMinX(), env.getMinY(), env.getMaxX(), env.getMaxY(), crs,
                "polygons of " + file.getFileName());
    }

    /** The polygons transformed by {@code mt} (from {@link #crs} to another CRS), or null for a box. */
    Geometry polygonIn(MathTransform mt) {
        if (polygon == null) {
            return null;
        }
        Geometry g = polygon.copy();
        double[] p = new double[2];
        g.apply(new CoordinateSequenceFilter() {
            @Override
            public void filter(CoordinateSequence seq, int i) {
                p[0] = seq.getX(i);
                p[1] = seq.getY(i);
                try {
                    mt.transform(p, 0, p, 0, 1);
                } catch (TransformException e) {
                    throw new UserInputException("grid.area: a polygon vertex (" + seq.getX(i) + ", " + seq.getY(i)
                            + ") cannot be transformed to the working grid's CRS: " + e.getMessage()
                            + ". Fix: check the polygon's CRS", e);
                }
                seq.setOrdinate(i, 0, p[0]);
                seq.setOrdinate(i, 1, p[1]);
            }

            @Override
            public boolean isDone() {
                return false;
            }

            @Override
            public boolean isGeometryChanged() {
                return true;
            }
        });
        return g;
    }
}
