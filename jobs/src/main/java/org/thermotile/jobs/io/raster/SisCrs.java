package org.thermotile.jobs.io.raster;

import java.util.Locale;
import javax.measure.Unit;
import org.apache.sis.io.wkt.Convention;
import org.apache.sis.io.wkt.WKTFormat;
import org.apache.sis.measure.Units;
import org.apache.sis.metadata.iso.citation.Citations;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.apache.sis.referencing.IdentifiedObjects;
import org.opengis.metadata.Identifier;
import org.opengis.referencing.crs.CoordinateReferenceSystem;
import org.opengis.referencing.crs.ProjectedCRS;
import org.opengis.referencing.cs.AxisDirection;
import org.opengis.referencing.cs.CoordinateSystem;
import org.opengis.util.FactoryException;

/** The bridge between {@link RasterGrid}'s EPSG code and WKT and Apache SIS CRS objects (also used by the working grid of {@code jobs/ingest}). */
public final class SisCrs {

    private SisCrs() { }

    /** WKT 2 (ISO 19162:2019) of a CRS, on one line. */
    public static String wkt(CoordinateReferenceSystem crs) {
        WKTFormat format = new WKTFormat(Locale.ROOT, (java.time.ZoneId) null);
        format.setConvention(Convention.WKT2_2019);
        format.setIndentation(WKTFormat.SINGLE_LINE);
        return format.format(crs);
    }

    /** The EPSG code attached to the CRS, or 0 when it has none. No database look-up. */
    public static int epsgOf(CoordinateReferenceSystem crs) {
        Identifier id = IdentifiedObjects.getIdentifier(crs, Citations.EPSG);
        if (id == null) {
            return 0;
        }
        try {
            return Integer.parseInt(id.getCode().trim());
        } catch (NumberFormatException e) {
            return 0;
        }
    }

    static String wktOfEpsg(int epsg) {
        try {
            return wkt(CRS.forCode("EPSG:" + epsg));
        } catch (FactoryException e) {
            throw new IllegalArgumentException("EPSG:" + epsg + " is not known to Apache SIS without the EPSG "
                    + "database (" + e.getMessage() + "); use a WGS 84 / UTM zone (EPSG:326xx or 327xx)", e);
        }
    }

    static int utmEpsg(double latitudeDeg, double longitudeDeg) {
        return epsgOf(CommonCRS.WGS84.universal(latitudeDeg, longitudeDeg));
    }

    /** The SIS CRS of a grid: from its EPSG code when SIS knows it, else from its WKT. */
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

    /**
     * Why a CRS cannot carry a thermotile grid, or {@code null} when it can: it must be projected,
     * with metre axes pointing east then north.
     */
    public static String unsuitable(CoordinateReferenceSystem crs) {
        if (!(crs instanceof ProjectedCRS)) {
            return "its CRS \"" + crs.getName().getCode() + "\" is not projected (cell sizes would be in degrees, not metres)";
        }
        CoordinateSystem cs = crs.getCoordinateSystem();
        for (int i = 0; i < cs.getDimension(); i++) {
            Unit<?> u = cs.getAxis(i).getUnit();
            if (!Units.METRE.equals(u)) {
                return "its CRS \"" + crs.getName().getCode() + "\" has axis " + (i + 1) + " in " + u + ", not metres";
            }
        }
        if (cs.getDimension() != 2 || cs.getAxis(0).getDirection() != AxisDirection.EAST
                || cs.getAxis(1).getDirection() != AxisDirection.NORTH) {
            return "its CRS \"" + crs.getName().getCode() + "\" does not have (easting, northing) axes";
        }
        return null;
    }
}
