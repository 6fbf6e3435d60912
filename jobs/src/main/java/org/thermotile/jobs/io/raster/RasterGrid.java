package org.thermotile.jobs.io.raster;

import java.io.Serializable;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;

/**
 * A north-up raster grid: its size in cells, its affine geotransform and its coordinate reference
 * system (CRS). Immutable and serialisable, so Spark tasks can carry it.
 *
 * <p>The geotransform is GDAL's north-up form (GDAL data model, "Affine GeoTransform"): the
 * top-left corner of cell (col, row) lies at
 * <pre>  x = originX + col · pixelWidth,   y = originY + row · pixelHeight</pre>
 * with {@code pixelWidth > 0} and {@code pixelHeight < 0} (rows run southwards). The CRS is
 * projected with metre axes (easting, northing), so coordinates and sizes are in [m].
 *
 * @param width       number of columns (≥ 1)
 * @param height      number of rows (≥ 1)
 * @param originX     easting of the top-left corner of the top-left cell [m]
 * @param originY     northing of the top-left corner of the top-left cell [m]
 * @param pixelWidth  cell size along x, positive [m]
 * @param pixelHeight cell size along y, negative for north-up [m]
 * @param epsg        EPSG code of the CRS, or 0 when the CRS has none
 * @param crsWkt      the CRS as OGC/ISO 19162 Well-Known Text (WKT 2)
 */
public record RasterGrid(int width, int height, double originX, double originY, double pixelWidth,
        double pixelHeight, int epsg, String crsWkt) implements Serializable {

    /** Relative tolerance, in cells, for {@link #sameGridAs}: 1e-6 of a cell (our choice). */
    public static final double GRID_TOLERANCE_CELLS = 1e-6;

    public RasterGrid {
        if (width < 1 || height < 1) {
            throw new IllegalArgumentException("raster size " + width + " × " + height + " cells: both must be ≥ 1");
        }
        if (!(pixelWidth > 0) || !Double.isFinite(pixelWidth) || !(pixelHeight < 0) || !Double.isFinite(pixelHeight)) {
            throw new IllegalArgumentException("pixel size " + pixelWidth + " × " + pixelHeight
                    + " m: a north-up grid needs pixelWidth > 0 and pixelHeight < 0");
        }
        if (!Double.isFinite(originX) || !Double.isFinite(originY)) {
            throw new IllegalArgumentException("grid origin (" + originX + ", " + originY + ") is not finite");
        }
        if (epsg < 0) {
            throw new IllegalArgumentException("EPSG code " + epsg + " is negative");
        }
        Objects.requireNonNull(crsWkt, "crsWkt");
        if (crsWkt.isBlank()) {
            throw new IllegalArgumentException("the CRS WKT is empty");
        }
    }

    /**
     * A grid in the CRS of the given EPSG code, its WKT filled in by Apache SIS. Without the
     * optional EPSG database SIS knows a limited set of codes, among them every WGS 84 / UTM zone
     * (32601–32660, 32701–32760).
     *
     * @throws IllegalArgumentException if SIS cannot build the CRS for that code
     */
    public static RasterGrid ofEpsg(int width, int height, double originX, double originY,
            double pixelWidth, double pixelHeight, int epsg) {
        return new RasterGrid(width, height, originX, originY, pixelWidth, pixelHeight, epsg, SisCrs.wktOfEpsg(epsg));
    }

    /**
     * The EPSG code of the WGS 84 / UTM zone holding a point, as chosen by Apache SIS
     * {@code CommonCRS.WGS84.universal(lat, lon)} (zone from longitude, with the Norway and
     * Svalbard exceptions; 326xx north of the equator, 327xx south).
     *
     * @param latitudeDeg  geodetic latitude [°], −80…84
     * @param longitudeDeg longitude [°], −180…180
     */
    public static int utmEpsg(double latitudeDeg, double longitudeDeg) {
        return SisCrs.utmEpsg(latitudeDeg, longitudeDeg);
    }

    /** Easting of the centre of column {@code col}: x = originX + (col + ½)·pixelWidth [m]. */
    public double cellCentreX(int col) {
        return originX + (col + 0.5) * pixelWidth;
    }

    /** Northing of the centre of row {@code row}: y = originY + (row + ½)·pixelHeight [m]. */
    public double cellCentreY(int row) {
        return originY + (row + 0.5) * pixelHeight;
    }

    /** Area of one cell in the projected plane: |pixelWidth · pixelHeight| [m²]. */
    public double pixelAreaM2() {
        return Math.abs(pixelWidth * pixelHeight);
    }

    /** Number of cells, width · height. */
    public long cellCount() {
        return (long) width * height;
    }

    /** True when {@link #differenceFrom} finds no difference. */
    public boolean sameGridAs(RasterGrid other) {
        return differenceFrom(other).isEmpty();
    }

    /**
     * What differs between this grid and {@code other}, in words ("width 300 vs 301; origin x
     * 690000.0 vs 690030.0 m"), or empty when they are the same grid. Sizes must be equal; origin
     * and pixel size may differ by at most {@link #GRID_TOLERANCE_CELLS} of a cell; the CRS is
     * compared by EPSG code when both have one, else by WKT text.
     */
    public Optional<String> differenceFrom(RasterGrid other) {
        List<String> d = new ArrayList<>();
        if (width != other.width) {
            d.add("width " + width + " vs " + other.width + " cells");
        }
        if (height != other.height) {
            d.add("height " + height + " vs " + other.height + " cells");
        }
        double tolX = GRID_TOLERANCE_CELLS * pixelWidth;
        double tolY = GRID_TOLERANCE_CELLS * -pixelHeight;
        if (Math.abs(originX - other.originX) > tolX) {
            d.add("origin x " + originX + " vs " + other.originX + " m");
        }
        if (Math.abs(originY - other.originY) > tolY) {
            d.add("origin y " + originY + " vs " + other.originY + " m");
        }
        if (Math.abs(pixelWidth - other.pixelWidth) > tolX) {
            d.add("pixel width " + pixelWidth + " vs " + other.pixelWidth + " m");
        }
        if (Math.abs(pixelHeight - other.pixelHeight) > tolY) {
            d.add("pixel height " + pixelHeight + " vs " + other.pixelHeight + " m");
        }
        if (epsg > 0 && other.epsg > 0) {
            if (epsg != other.epsg) {
                d.add("CRS EPSG:" + epsg + " vs EPSG:" + other.epsg);
            }
        } else if (!crsWkt.equals(other.crsWkt)) {
            d.add("CRS " + crsLabel() + " vs " + other.crsLabel() + " (WKT differs)");
        }
        return d.isEmpty() ? Optional.empty() : Optional.of(String.join("; ", d));
    }

    /** "EPSG:32633", or "a CRS without EPSG code". */
    public String crsLabel() {
        return epsg > 0 ? "EPSG:" + epsg : "a CRS without EPSG code";
    }

    @Override
    public String toString() {
        return width + "×" + height + " cells, origin (" + originX + ", " + originY + ") m, pixel "
                + pixelWidth + " × " + pixelHeight + " m, " + crsLabel();
    }
}
