package org.thermotile.jobs.hotspots;

import java.util.ArrayList;
import java.util.List;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.Polygon;
import org.locationtech.jts.operation.union.CascadedPolygonUnion;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.hotspot.Clusters;
import org.thermotile.model.hotspot.HotspotClass;

/**
 * Hotspot polygons: each 4-connected cluster of cells of one non-zero class ({@link Clusters})
 * becomes one polygon, the union (JTS {@link CascadedPolygonUnion}) of its cells' squares, built
 * from one rectangle per horizontal run of cells. Corners lie on the grid lines
 * x = originX + col·pixelWidth, y = originY + row·pixelHeight, computed the same way for every
 * rectangle, so shared edges match exactly and the union's area is the cells' area.
 */
final class HotspotPolygons {
    private HotspotPolygons() {}

    /**
     * One polygon and its attributes.
     *
     * @param id        1, 2, … in the row-major order of the polygons' first cells
     * @param code      class code (−3…3, not 0)
     * @param geometry  the polygon in the grid's CRS [m]
     * @param cells     number of cells
     * @param areaM2    the polygon's area [m²]
     * @param mean      mean of the statistic over its cells [unit of the statistic]
     * @param min       smallest value
     * @param max       largest value
     * @param meanZ     mean Gi* z-score
     * @param district  index of the district holding most of its cells, or −1
     */
    record Hotspot(int id, int code, Polygon geometry, int cells, double areaM2, double mean, double min, double max,
            double meanZ, int district) {
    }

    /**
     * The polygons of a class map.
     *
     * @param classes      row-major class codes, {@code noDataCode} where there is no data
     * @param values       the statistic per cell
     * @param z            Gi* z-score per cell
     * @param cellDistrict district index per cell (−1 none), or null when there are no districts
     * @param districts    number of districts
     */
    static List<Hotspot> build(RasterGrid grid, int[] classes, int noDataCode, float[] values, double[] z,
            int[] cellDistrict, int districts) {
        int w = grid.width();
        Clusters clusters = Clusters.label(classes, w, grid.height(), noDataCode);
        GeometryFactory gf = new GeometryFactory();
        List<Hotspot> out = new ArrayList<>(clusters.count());
        int[] votes = new int[Math.max(districts, 1)];
        for (int k = 0; k < clusters.count(); k++) {
            int[] cells = clusters.cells(k);
            List<Geometry> runs = new ArrayList<>();
            double sum = 0, sumZ = 0, min = Double.POSITIVE_INFINITY, max = Double.NEGATIVE_INFINITY;
            java.util.Arrays.fill(votes, 0);
            int runStart = cells[0];
            for (int m = 0; m < cells.length; m++) {
                int i = cells[m];
                double v = values[i];
                sum += v;
                sumZ += z[i];
                min = Math.min(min, v);
                max = Math.max(max, v);
                if (cellDistrict != null && cellDistrict[i] >= 0) {
                    votes[cellDistrict[i]]++;
                }
                boolean runEnds = m == cells.length - 1 || cells[m + 1] != i + 1 || (i + 1) % w == 0;
                if (runEnds) {
                    runs.add(rectangle(gf, grid, runStart % w, i % w + 1, i / w));
                    if (m < cells.length - 1) {
                        runStart = cells[m + 1];
                    }
                }
            }
            Geometry union = runs.size() == 1 ? runs.get(0) : CascadedPolygonUnion.union(runs);
            if (!(union instanceof Polygon poly)) {
                throw new IllegalStateException("cluster " + k + " of " + cells.length + " cells gave a "
                        + union.getGeometryType() + ", not one polygon");
            }
            int district = -1;
            for (int d = 0; d < districts; d++) {
                if (votes[d] > 0 && (district < 0 || votes[d] > votes[district])) {
                    district = d;
                }
            }
            int code = classes[cells[0]];
            out.add(new Hotspot(k + 1, code, poly, cells.length, poly.getArea(), sum / cells.length, min, max,
                    sumZ / cells.length, district));
        }
        return out;
    }

    /** The rectangle of columns col0 … col1−1 of one row, on the grid lines. */
    private static Polygon rectangle(GeometryFactory gf, RasterGrid g, int col0, int col1, int row) {
        double x0 = g.originX() + col0 * g.pixelWidth();
        double x1 = g.originX() + col1 * g.pixelWidth();
        double yTop = g.originY() + row * g.pixelHeight();
        double yBottom = g.originY() + (row + 1) * g.pixelHeight();
        return gf.createPolygon(new Coordinate[] {
            new Coordinate(x0, yBottom), new Coordinate(x1, yBottom), new Coordinate(x1, yTop),
            new Coordinate(x0, yTop), new Coordinate(x0, yBottom)});
    }

    /** True for hot classes. */
    static boolean isHot(int code) {
        return code > HotspotClass.NOT_SIGNIFICANT;
    }
}
