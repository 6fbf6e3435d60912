package org.thermotile.jobs.hotspots;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.Polygon;
import org.locationtech.jts.operation.union.CascadedPolygonUnion;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.hotspot.Clusters;

/**
 * Hot and cold area polygons: each 4-connected cluster of analysis cells of one sign
 * ({@link Clusters}) becomes one polygon, holes kept, the union (JTS {@link CascadedPolygonUnion})
 * of its cells' squares, built from one rectangle per horizontal run of cells. Corners lie on the
 * grid lines x = originX + col·pixelWidth, y = originY + row·pixelHeight, computed the same way
 * for every rectangle, so shared edges match exactly and the union's area is the cells' area.
 * Polygons are sorted by area × |mean excess|, largest first (ties: row-major order of their
 * first cell), and numbered 1, 2, … in that order.
 */
final class HotspotPolygons {
    private HotspotPolygons() {}

    /**
     * One polygon and its attributes.
     *
     * @param sign         +1 warmer, −1 cooler
     * @param topBand      the strongest band code among its cells
     * @param geometry     the polygon in the grid's CRS [m], holes kept
     * @param areaM2       the polygon's area [m²]
     * @param meanExcess   mean excess over the city's median [K]
     * @param maxAbsExcess largest |excess| [K]
     * @param maxQ         largest q-value among its cells
     * @param mean         mean of the statistic over its cells
     * @param meanZ        mean Gi* z-score
     * @param district     index of the district holding most of its cells, or −1
     */
    record Hotspot(int id, int sign, int topBand, Polygon geometry, int cells, double areaM2, double meanExcess,
            double maxAbsExcess, double maxQ, double mean, double meanZ, int district) {
    }

    /**
     * The polygons of a sign map.
     *
     * @param sign         row-major +1 / −1 / 0, {@code noDataCode} where there is no data
     * @param values       the statistic per cell
     * @param codes        band code per cell
     * @param cellDistrict district index per cell (−1 none), or null when there are no districts
     */
    static List<Hotspot> build(RasterGrid grid, int[] sign, int noDataCode, float[] values, double[] z, double[] excess,
            double[] q, int[] codes, int[] cellDistrict, int districts) {
        int w = grid.width();
        Clusters clusters = Clusters.label(sign, w, grid.height(), noDataCode);
        GeometryFactory gf = new GeometryFactory();
        List<Hotspot> out = new ArrayList<>(clusters.count());
        int[] votes = new int[Math.max(districts, 1)];
        for (int k = 0; k < clusters.count(); k++) {
            int[] cells = clusters.cells(k);
            List<Geometry> runs = new ArrayList<>();
            double sum = 0, sumZ = 0, sumEx = 0, maxEx = 0, maxQ = 0;
            int s = sign[cells[0]];
            int top = 0;
            java.util.Arrays.fill(votes, 0);
            int runStart = cells[0];
            for (int m = 0; m < cells.length; m++) {
                int i = cells[m];
                sum += values[i];
                sumZ += z[i];
                sumEx += excess[i];
                maxEx = Math.max(maxEx, Math.abs(excess[i]));
                maxQ = Math.max(maxQ, q[i]);
                if (Math.abs(codes[i]) > Math.abs(top)) {
                    top = codes[i];
                }
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
            out.add(new Hotspot(k, s, top, poly, cells.length, poly.getArea(), sumEx / cells.length, maxEx, maxQ,
                    sum / cells.length, sumZ / cells.length, district));
        }
        out.sort(Comparator.comparingDouble((Hotspot h) -> -h.areaM2() * Math.abs(h.meanExcess()))
                .thenComparingInt(Hotspot::id));
        List<Hotspot> numbered = new ArrayList<>(out.size());
        for (int i = 0; i < out.size(); i++) {
            Hotspot h = out.get(i);
            numbered.add(new Hotspot(i + 1, h.sign(), h.topBand(), h.geometry(), h.cells(), h.areaM2(), h.meanExcess(),
                    h.maxAbsExcess(), h.maxQ(), h.mean(), h.meanZ(), h.district()));
        }
        return numbered;
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
}
