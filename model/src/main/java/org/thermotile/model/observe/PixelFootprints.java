package org.thermotile.model.observe;

import java.util.Arrays;

/**
 * Where an observation pixel falls on the run grid, and the simulated value it should be compared
 * with.
 *
 * <p>An image pixel coarser than the run's cells (the usual case: 30–100 m thermal pixels over
 * 2–10 m cells) is compared with the <b>area-weighted mean</b> of the cells it covers:
 * {@code s̄ = Σ_c A_c s_c / Σ_c A_c}, A_c the area of the intersection of the pixel's footprint (a
 * convex quadrilateral, its four corners transformed into the run CRS) with cell c, found by
 * clipping the footprint against the cell's rectangle (Sutherland &amp; Hodgman 1974, "Reentrant
 * polygon clipping", Comm. ACM 17(1), 32–42) and the shoelace area formula. A pixel finer than the
 * cells is compared with the cell that contains its centre (nearest sampling).
 *
 * <p>Cells are north-up squares: cell (col, row) spans x ∈ [west + col·size, west + (col+1)·size]
 * and y ∈ [north − (row+1)·size, north − row·size]; its index is row·cols + col.
 *
 * @param westX  x of the grid's west edge [CRS unit, m]
 * @param northY y of the grid's north edge [m]
 * @param cellM  cell size [m], &gt; 0
 * @param cols   columns
 * @param rows   rows
 */
public record PixelFootprints(double westX, double northY, double cellM, int cols, int rows) {

    /**
     * The cells under one footprint and the area of each overlap.
     *
     * @param cells     cell indices (row·cols + col), ascending
     * @param areas     overlap areas [m²], same order
     * @param pixelArea the footprint's whole area [m²]
     */
    public record Footprint(int[] cells, double[] areas, double pixelArea) {
        /** Fraction of the footprint that lies on the grid, in [0, 1]. */
        public double coverage() {
            double sum = 0;
            for (double a : areas) {
                sum += a;
            }
            return pixelArea > 0 ? sum / pixelArea : 0;
        }

        /**
         * Area-weighted mean {@code Σ A_c v_c / Σ A_c} over cells whose value is not NaN; NaN when
         * no covered cell has a value.
         */
        public double weightedMean(double[] values) {
            double num = 0;
            double den = 0;
            for (int i = 0; i < cells.length; i++) {
                double v = values[cells[i]];
                if (!Double.isNaN(v)) {
                    num += areas[i] * v;
                    den += areas[i];
                }
            }
            return den > 0 ? num / den : Double.NaN;
        }
    }

    /**
     * Cells and overlap areas of a convex footprint given by its corners in order (either turning
     * sense), in the run CRS.
     */
    public Footprint footprint(double[] xs, double[] ys) {
        if (xs.length != ys.length || xs.length < 3) {
            throw new IllegalArgumentException("a footprint needs at least 3 corners, got " + xs.length);
        }
        double pixelArea = Math.abs(shoelace(xs, ys, xs.length));
        double minX = Arrays.stream(xs).min().orElseThrow();
        double maxX = Arrays.stream(xs).max().orElseThrow();
        double minY = Arrays.stream(ys).min().orElseThrow();
        double maxY = Arrays.stream(ys).max().orElseThrow();
        int c0 = Math.max(0, (int) Math.floor((minX - westX) / cellM));
        int c1 = Math.min(cols - 1, (int) Math.floor((maxX - westX) / cellM));
        int r0 = Math.max(0, (int) Math.floor((northY - maxY) / cellM));
        int r1 = Math.min(rows - 1, (int) Math.floor((northY - minY) / cellM));
        int capacity = Math.max(0, (c1 - c0 + 1)) * Math.max(0, (r1 - r0 + 1));
        int[] cells = new int[capacity];
        double[] areas = new double[capacity];
        int n = 0;
        int max = xs.length + 8;
        double[] bx = new double[max];
        double[] by = new double[max];
        double[] tx = new double[max];
        double[] ty = new double[max];
        for (int r = r0; r <= r1; r++) {
            double top = northY - r * cellM;
            double bottom = top - cellM;
            for (int c = c0; c <= c1; c++) {
                double left = westX + c * cellM;
                double right = left + cellM;
                int m = xs.length;
                System.arraycopy(xs, 0, bx, 0, m);
                System.arraycopy(ys, 0, by, 0, m);
                m = clip(bx, by, m, tx, ty, 0, left);
                m = clip(tx, ty, m, bx, by, 1, right);
                m = clip(bx, by, m, tx, ty, 2, bottom);
                m = clip(tx, ty, m, bx, by, 3, top);
                if (m < 3) {
                    continue;
                }
                double a = Math.abs(shoelace(bx, by, m));
                if (a > 0) {
                    cells[n] = r * cols + c;
                    areas[n] = a;
                    n++;
                }
            }
        }
        return new Footprint(Arrays.copyOf(cells, n), Arrays.copyOf(areas, n), pixelArea);
    }

    /** Footprint of an axis-aligned rectangle [x0, x1] × [y0, y1] in the run CRS. */
    public Footprint rectangle(double x0, double y0, double x1, double y1) {
        return footprint(new double[] {x0, x1, x1, x0}, new double[] {y0, y0, y1, y1});
    }

    /** Index of the cell containing (x, y) (nearest sampling), or −1 off the grid. */
    public int cellAt(double x, double y) {
        double fc = (x - westX) / cellM;
        double fr = (northY - y) / cellM;
        if (!(fc >= 0 && fr >= 0 && fc < cols && fr < rows)) {
            return -1;
        }
        return (int) fr * cols + (int) fc;
    }

    /** Twice-signed area halved: Σ (x_i y_{i+1} − x_{i+1} y_i) / 2 (shoelace formula). */
    private static double shoelace(double[] xs, double[] ys, int n) {
        double s = 0;
        for (int i = 0; i < n; i++) {
            int j = (i + 1) % n;
            s += xs[i] * ys[j] - xs[j] * ys[i];
        }
        return 0.5 * s;
    }

    /**
     * One Sutherland–Hodgman pass: keeps the part of polygon (ix, iy, n) inside one half-plane.
     * edge 0: x ≥ v, 1: x ≤ v, 2: y ≥ v, 3: y ≤ v. Returns the output's vertex count.
     */
    private static int clip(double[] ix, double[] iy, int n, double[] ox, double[] oy, int edge, double v) {
        int m = 0;
        for (int i = 0; i < n; i++) {
            int j = (i + 1) % n;
            double ax = ix[i], ay = iy[i], bx = ix[j], by = iy[j];
            boolean ain = inside(ax, ay, edge, v);
            boolean bin = inside(bx, by, edge, v);
            if (ain) {
                ox[m] = ax; oy[m] = ay; m++;
            }
            if (ain != bin) {
                double t = (edge < 2) ? (v - ax) / (bx - ax) : (v - ay) / (by - ay);
                ox[m] = ax + t * (bx - ax);
                oy[m] = ay + t * (by - ay);
                m++;
            }
        }
        return m;
    }

    private static boolean inside(double x, double y, int edge, double v) {
        return switch (edge) {
            case 0 -> x >= v;
            case 1 -> x <= v;
            case 2 -> y >= v;
            default -> y <= v;
        };
    }
}
