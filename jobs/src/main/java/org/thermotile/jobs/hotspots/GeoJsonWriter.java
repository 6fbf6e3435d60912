package org.thermotile.jobs.hotspots;

import com.fasterxml.jackson.core.JsonEncoding;
import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.locationtech.jts.algorithm.Orientation;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.LineString;
import org.locationtech.jts.geom.Polygon;
import org.opengis.referencing.crs.CoordinateReferenceSystem;
import org.opengis.referencing.operation.MathTransform;
import org.opengis.referencing.operation.TransformException;
import org.opengis.util.FactoryException;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * Writes hotspot polygons and zones as GeoJSON FeatureCollections of Polygon (or MultiPolygon) features.
 *
 * <ul>
 *   <li>In the grid's CRS: coordinates as computed [m], with the top-level member
 *       {@code "crs": {"type": "name", "properties": {"name": "urn:ogc:def:crs:EPSG::CODE"}}} of
 *       the 2008 GeoJSON specification, which GDAL reads (RFC 7946 dropped the member and allows
 *       only WGS 84; this file is for GIS work in the city's CRS).</li>
 *   <li>In WGS 84 (RFC 7946, 2016): longitude, latitude in decimal degrees (section 4), rounded
 *       to 1e-8° (≈ 1 mm, our choice; section 11.2 advises against excess precision), exterior
 *       rings counter-clockwise and holes clockwise (section 3.1.6), no crs member. Transformed
 *       with Apache SIS {@code CRS.findOperation} from the grid's CRS to
 *       {@code CommonCRS.WGS84.normalizedGeographic()} (longitude first). Edges are not
 *       densified: a straight grid edge of a city-sized polygon stays straight to well under a
 *       millimetre in a UTM zone.</li>
 * </ul>
 * Rings follow the RFC 7946 orientation in both files. Properties are written in the given order.
 */
final class GeoJsonWriter {
    private GeoJsonWriter() {}

    /**
     * One feature: its Polygon or MultiPolygon in the grid's CRS and its properties (String,
     * Number, Boolean or null).
     */
    record Feature(Geometry geometry, Map<String, Object> properties) {
    }

    /** The grid's CRS as an Apache SIS object: from its EPSG code when SIS knows it, else its WKT. */
    static CoordinateReferenceSystem crsOf(RasterGrid grid) throws FactoryException {
        if (grid.epsg() > 0) {
            try {
                return CRS.forCode("EPSG:" + grid.epsg());
            } catch (FactoryException e) {
                // not in SIS's built-in set: the WKT still describes it
            }
        }
        return CRS.fromWKT(grid.crsWkt());
    }

    /** The transform from the grid's CRS to WGS 84 longitude, latitude [°]. */
    static MathTransform toWgs84(RasterGrid grid) {
        try {
            return CRS.findOperation(crsOf(grid), CommonCRS.WGS84.normalizedGeographic(), null).getMathTransform();
        } catch (FactoryException e) {
            throw new IllegalStateException("no transform from " + grid.crsLabel() + " to WGS 84: " + e.getMessage(), e);
        }
    }

    /** Writes the features in the grid's CRS. */
    static void writeGridCrs(Path file, RasterGrid grid, List<Feature> features) throws IOException {
        write(file, features, null, grid.epsg() > 0 ? "urn:ogc:def:crs:EPSG::" + grid.epsg() : null, 0);
    }

    /** Writes the features in WGS 84 per RFC 7946. */
    static void writeWgs84(Path file, RasterGrid grid, List<Feature> features) throws IOException {
        write(file, features, toWgs84(grid), null, 1e8);
    }

    private static void write(Path file, List<Feature> features, MathTransform mt, String crsName, double scale)
            throws IOException {
        try (JsonGenerator g = new JsonFactory().createGenerator(file.toFile(), JsonEncoding.UTF8)) {
            g.writeStartObject();
            g.writeStringField("type", "FeatureCollection");
            if (crsName != null) {
                g.writeObjectFieldStart("crs");
                g.writeStringField("type", "name");
                g.writeObjectFieldStart("properties");
                g.writeStringField("name", crsName);
                g.writeEndObject();
                g.writeEndObject();
            }
            g.writeArrayFieldStart("features");
            for (Feature f : features) {
                g.writeRaw('\n');
                g.writeStartObject();
                g.writeStringField("type", "Feature");
                g.writeObjectFieldStart("properties");
                for (Map.Entry<String, Object> p : f.properties().entrySet()) {
                    g.writeFieldName(p.getKey());
                    Object v = p.getValue();
                    if (v == null) {
                        g.writeNull();
                    } else if (v instanceof Integer i) {
                        g.writeNumber(i);
                    } else if (v instanceof Boolean b) {
                        g.writeBoolean(b);
                    } else if (v instanceof Long l) {
                        g.writeNumber(l);
                    } else if (v instanceof Number n) {
                        double d = n.doubleValue();
                        if (Double.isFinite(d)) {
                            g.writeNumber(d);
                        } else {
                            g.writeNull();
                        }
                    } else {
                        g.writeString(v.toString());
                    }
                }
                g.writeEndObject();
                g.writeObjectFieldStart("geometry");
                if (f.geometry() instanceof Polygon poly) {
                    g.writeStringField("type", "Polygon");
                    writePolygon(g, poly, mt, scale);
                } else {
                    g.writeStringField("type", "MultiPolygon");
                    g.writeArrayFieldStart("coordinates");
                    for (int k = 0; k < f.geometry().getNumGeometries(); k++) {
                        g.writeStartArray();
                        writeRings(g, (Polygon) f.geometry().getGeometryN(k), mt, scale);
                        g.writeEndArray();
                    }
                    g.writeEndArray();
                }
                g.writeEndObject();
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeEndObject();
            g.writeRaw('\n');
        }
    }

    private static void writePolygon(JsonGenerator g, Polygon p, MathTransform mt, double scale) throws IOException {
        g.writeArrayFieldStart("coordinates");
        writeRings(g, p, mt, scale);
        g.writeEndArray();
    }

    private static void writeRings(JsonGenerator g, Polygon p, MathTransform mt, double scale) throws IOException {
        writeRing(g, p.getExteriorRing(), true, mt, scale);
        for (int h = 0; h < p.getNumInteriorRing(); h++) {
            writeRing(g, p.getInteriorRingN(h), false, mt, scale);
        }
    }

    private static void writeRing(JsonGenerator g, LineString ring, boolean exterior, MathTransform mt, double scale)
            throws IOException {
        Coordinate[] c = ring.getCoordinates();
        double[] xy = new double[2 * c.length];
        for (int i = 0; i < c.length; i++) {
            xy[2 * i] = c[i].x;
            xy[2 * i + 1] = c[i].y;
        }
        if (mt != null) {
            try {
                mt.transform(xy, 0, xy, 0, c.length);
            } catch (TransformException e) {
                throw new IllegalStateException("cannot transform a hotspot polygon to WGS 84: " + e.getMessage(), e);
            }
        }
        if (scale > 0) {
            for (int i = 0; i < xy.length; i++) {
                xy[i] = Math.round(xy[i] * scale) / scale;
            }
        }
        Coordinate[] out = new Coordinate[c.length];
        for (int i = 0; i < c.length; i++) {
            out[i] = new Coordinate(xy[2 * i], xy[2 * i + 1]);
        }
        boolean ccw = Orientation.isCCW(out);
        boolean reverse = exterior != ccw;          // RFC 7946 §3.1.6: exterior CCW, holes CW
        g.writeStartArray();
        for (int k = 0; k < out.length; k++) {
            Coordinate p = out[reverse ? out.length - 1 - k : k];
            g.writeStartArray();
            g.writeNumber(p.x);
            g.writeNumber(p.y);
            g.writeEndArray();
        }
        g.writeEndArray();
    }
}
