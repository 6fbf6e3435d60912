package org.thermotile.jobs.ingest;

import java.io.Serializable;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.crs.AbstractCRS;
import org.apache.sis.referencing.cs.AxesConvention;
import org.opengis.referencing.crs.CoordinateReferenceSystem;
import org.opengis.referencing.operation.MathTransform;
import org.opengis.referencing.operation.TransformException;
import org.opengis.util.FactoryException;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.io.raster.SisCrs;

/**
 * The grid every input is put onto before a run: a north-up grid of square cells in a projected
 * CRS with metre axes (easting, northing). Land cover, heights (and, later, rasterised building
 * footprints) are written on it; everything downstream of {@code RunPreparer} sees only this grid.
 *
 * <p>Cell (col, row) covers x ∈ [originX + col·s, originX + (col+1)·s), y ∈ (originY − (row+1)·s,
 * originY − row·s], s = {@code cellSizeM}; its centre is (originX + (col + ½)·s, originY − (row + ½)·s).
 *
 * @param epsg      EPSG code of the CRS, or 0 when it has none
 * @param crsWkt    the CRS as WKT 2 (ISO 19162), easting first
 * @param originX   easting of the top-left corner of the top-left cell [m]
 * @param originY   northing of that corner [m]
 * @param cellSizeM cell edge [m], &gt; 0
 * @param cols      number of columns, ≥ 1
 * @param rows      number of rows, ≥ 1
 */
public record WorkingGrid(int epsg, String crsWkt, double originX, double originY, double cellSizeM, int cols,
        int rows) implements Serializable {

    public WorkingGrid {
        if (cols < 1 || rows < 1) {
            throw new IllegalArgumentException("working grid of " + cols + " × " + rows + " cells: both must be ≥ 1");
        }
        if (!(cellSizeM > 0) || !Double.isFinite(cellSizeM)) {
            throw new IllegalArgumentException("cell size " + cellSizeM + " m must be positive and finite");
        }
    }

    /** The working grid of an existing raster grid (square cells assumed: the pixel width is used). */
    public static WorkingGrid of(RasterGrid g) {
        return new WorkingGrid(g.epsg(), g.crsWkt(), g.originX(), g.originY(), g.pixelWidth(), g.width(), g.height());
    }

    /** As a {@link RasterGrid} (what readers, writers and tile tasks use). */
    public RasterGrid toRasterGrid() {
        return new RasterGrid(cols, rows, originX, originY, cellSizeM, -cellSizeM, epsg, crsWkt);
    }

    /**
     * The CRS as an Apache SIS object, easting first: from the EPSG code when SIS knows it, else
     * from the WKT.
     */
    public CoordinateReferenceSystem crs() {
        try {
            CoordinateReferenceSystem c = epsg > 0 ? CRS.forCode("EPSG:" + epsg) : CRS.fromWKT(crsWkt);
            return AbstractCRS.castOrCopy(c).forConvention(AxesConvention.RIGHT_HANDED);
        } catch (FactoryException e) {
            try {
                return AbstractCRS.castOrCopy(CRS.fromWKT(crsWkt)).forConvention(AxesConvention.RIGHT_HANDED);
            } catch (FactoryException e2) {
                throw new IllegalStateException("the working grid's CRS cannot be rebuilt: " + e2.getMessage(), e2);
            }
        }
    }

    /** "EPSG:32632", or the CRS name. */
    public String crsLabel() {
        return epsg > 0 ? "EPSG:" + epsg : crs().getName().getCode();
    }

    /** Easting of the centre of column {@code col} [m]. */
    public double centreX(int col) {
        return originX + (col + 0.5) * cellSizeM;
    }

    /** Northing of the centre of row {@code row} [m]. */
    public double centreY(int row) {
        return originY - (row + 0.5) * cellSizeM;
    }

    /**
     * Cell centres of the window of columns {@code col0…col0+w−1}, rows {@code row0…row0+h−1} in
     * the CRS {@code target}, interleaved (x0, y0, x1, y1, …), row-major. Coordinates follow the
     * axis order of {@code target} (for EPSG:4326 as built by {@code CRS.forCode}: latitude
     * first; pass it through {@code AxesConvention.RIGHT_HANDED} for longitude first). The
     * operation is the one Apache SIS finds between the two CRSs ({@code CRS.findOperation}).
     *
     * @throws IllegalArgumentException if no operation exists or a point cannot be transformed
     */
    public double[] cellCentres(int col0, int row0, int w, int h, CoordinateReferenceSystem target) {
        double[] pts = new double[2 * w * h];
        int k = 0;
        for (int r = 0; r < h; r++) {
            double y = centreY(row0 + r);
            for (int c = 0; c < w; c++) {
                pts[k++] = centreX(col0 + c);
                pts[k++] = y;
            }
        }
        try {
            MathTransform mt = CRS.findOperation(crs(), target, null).getMathTransform();
            mt.transform(pts, 0, pts, 0, w * h);
        } catch (FactoryException | TransformException e) {
            throw new IllegalArgumentException("cell centres cannot be transformed from " + crsLabel() + " to "
                    + target.getName().getCode() + ": " + e.getMessage(), e);
        }
        return pts;
    }

    /** Number of cells, cols · rows. */
    public long cellCount() {
        return (long) cols * rows;
    }

    @Override
    public String toString() {
        return String.format(java.util.Locale.ROOT, "%s, %s m cells, %d × %d (cols × rows), origin (%s, %s) m",
                crsLabel(), trim(cellSizeM), cols, rows, trim(originX), trim(originY));
    }

    static String trim(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : Double.toString(v);
    }

    /** WKT of a CRS, for a new working grid. */
    static String wktOf(CoordinateReferenceSystem crs) {
        return SisCrs.wkt(crs);
    }
}
