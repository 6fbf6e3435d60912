package org.thermotile.jobs.demo;

import java.util.Random;

/**
 * The plan of Riverside Flats, an invented riverside district: land-cover codes and heights
 * above ground on a {@value #WIDTH} × {@value #HEIGHT} grid of 4 m cells.
 *
 * <p>All geometry is in <em>cell units</em>: x eastwards from the west edge, y southwards from
 * the north edge, cell (col, row) covering [col, col+1) × [row, row+1) and sampled at its centre
 * (col + ½, row + ½). Shapes are rectangles, circles and polylines buffered by a distance.
 *
 * <p>The plan, painted in this order (later layers win):
 * <ol>
 * <li>dry grass everywhere;</li>
 * <li>west of column {@value #FRINGE_COL}, a street grid: 3-cell (12 m) streets every
 *     {@value #STREET_PITCH} cells (120 m), and a 5-cell (20 m) north–south avenue of fresh
 *     asphalt at columns {@value #AVENUE_COL0}…{@value #AVENUE_COL1_EXCLUSIVE}−1;</li>
 * <li>each block between the streets: a park, a plaza, a parking lot, or a building block
 *     (1-cell sidewalk, a yard of dry grass, irrigated lawn or concrete, 1 to 4 buildings whose
 *     roof type is drawn from weights of the block's district, one height per block);</li>
 * <li>east of the grid of streets, the fringe: dry grass with patches of bare soil, a gravel
 *     track and a hedgerow;</li>
 * <li>the river: a polyline from the west to the east edge, water within
 *     {@value #WATER_HALF_WIDTH} cells, moist soil to {@value #MUD_HALF_WIDTH}, banks of dry grass
 *     and tree clumps to {@value #BANK_HALF_WIDTH} (a concrete quay on the north bank of the old
 *     town); no building stands within {@value #BANK_HALF_WIDTH} + 1 cells;</li>
 * <li>bridges: the avenue and two streets cross the river.</li>
 * </ol>
 * Heights: roofs carry their block's height (6–30 m), trees their clump's height (8–15 m),
 * every other cell 0 m. A fixed seed makes the plan the same on every run.
 */
final class RiversideLayout {
    /** Grid size [cells]. */
    static final int WIDTH = 500;
    static final int HEIGHT = 350;

    /** First street band starts at this column/row; bands repeat every pitch, 3 cells wide [cells]. */
    static final int STREET_FIRST = 14;
    static final int STREET_PITCH = 30;
    static final int STREET_WIDTH = 3;
    static final int VERTICAL_STREETS = 15;
    static final int HORIZONTAL_STREETS = 12;
    /** First column of the unbuilt fringe in the east [cells]. */
    static final int FRINGE_COL = STREET_FIRST + (VERTICAL_STREETS - 1) * STREET_PITCH + STREET_WIDTH;
    /** The avenue, columns [AVENUE_COL0, AVENUE_COL1_EXCLUSIVE): street band 7 widened to 5 cells. */
    static final int AVENUE_COL0 = 223;
    static final int AVENUE_COL1_EXCLUSIVE = 228;
    /** Centre line of the avenue [cells], the boundary between west and east districts. */
    static final double AVENUE_CENTRE_X = 0.5 * (AVENUE_COL0 + AVENUE_COL1_EXCLUSIVE);
    /** Street bands (0-based) that cross the river on a bridge. */
    static final int[] BRIDGE_STREETS = {1, 12};

    /** River centre line [cells]: x strictly increasing from the west edge to the east edge. */
    static final double[] RIVER_X = {0, 60, 120, 180, AVENUE_CENTRE_X, 290, 360, FRINGE_COL, WIDTH};
    static final double[] RIVER_Y = {142, 152, 166, 162, 170, 186, 180, 196, 204};
    /** Distances from the river centre line [cells]. */
    static final double WATER_HALF_WIDTH = 6.5;
    static final double MUD_HALF_WIDTH = 8.0;
    static final double BANK_HALF_WIDTH = 17.0;
    /** Width of the concrete quay at the outer edge of the old town's north bank [cells]. */
    static final double QUAY_WIDTH = 2.0;

    /** Special blocks, [x0, x1) × [y0, y1) [cells]. */
    static final int[] PARK = {47, 164, 167, 254};
    static final int[] PLAZA = {197, 223, 107, 134};
    static final int[] PARKING = {287, 314, 47, 74};

    /** Districts, in the order of {@link #DISTRICT_NAMES}. */
    static final int OLD_QUAY = 0, MILL_QUARTER = 1, PARKSIDE = 2, SOUTH_BANK = 3, EAST_MEADOWS = 4;
    static final String[] DISTRICT_NAMES = {"Old Quay", "Mill Quarter", "Parkside", "South Bank", "East Meadows"};
    static final String[] DISTRICT_IDS = {"old-quay", "mill-quarter", "parkside", "south-bank", "east-meadows"};

    /** Building heights per district, lowest and highest [m], drawn in 0.5 m steps per block. */
    private static final double[][] HEIGHT_RANGE_M = {{9, 18}, {6, 15}, {6, 15}, {15, 30}};
    /** Roof types and their weights per district (invented for the demo). */
    private static final DemoClass[] ROOFS = {DemoClass.ROOF_DARK, DemoClass.ROOF_WHITE,
        DemoClass.ROOF_WHITE_WEATHERED, DemoClass.ROOF_SHINGLE, DemoClass.ROOF_CLAY, DemoClass.ROOF_METAL,
        DemoClass.ROOF_GREEN};
    private static final int[][] ROOF_WEIGHTS = {
        {15, 5, 5, 25, 45, 5, 0},     // Old Quay: old houses, tiles and shingles
        {35, 5, 15, 5, 5, 35, 0},     // Mill Quarter: sheds and workshops
        {15, 10, 5, 35, 30, 0, 5},    // Parkside: houses
        {25, 30, 20, 0, 5, 5, 15},    // South Bank: new flat-roofed blocks, some green roofs
    };
    /** Tree heights, lowest and highest [m], in 0.5 m steps per clump. */
    static final double TREE_MIN_M = 8, TREE_MAX_M = 15;

    /** The seed of the plan. */
    static final long SEED = 20_260_716L;

    /** Land-cover codes ({@link DemoClass#code}) and heights above ground [m], row-major. */
    record Plan(int[] codes, float[] heightsM) { }

    private final int[] code = new int[WIDTH * HEIGHT];
    private final float[] roofM = new float[WIDTH * HEIGHT];
    private final float[] treeM = new float[WIDTH * HEIGHT];
    private final float[] riverDist = new float[WIDTH * HEIGHT];
    private final Random rnd = new Random(SEED);

    private RiversideLayout() { }

    /** Builds the plan (the same on every call). */
    static Plan build() {
        RiversideLayout l = new RiversideLayout();
        l.paint();
        return new Plan(l.code.clone(), l.heights());
    }

    private void paint() {
        for (int r = 0; r < HEIGHT; r++) {
            for (int c = 0; c < WIDTH; c++) {
                riverDist[r * WIDTH + c] = (float) riverDistance(c + 0.5, r + 0.5);
            }
        }
        fillRect(0, WIDTH, 0, HEIGHT, DemoClass.GRASS_DRY);
        streets();
        blocks();
        fringe();
        river();
        bridges();
    }

    // ---------------------------------------------------------------- streets and blocks

    private void streets() {
        for (int k = 0; k < VERTICAL_STREETS; k++) {
            int x0 = STREET_FIRST + k * STREET_PITCH;
            fillRect(x0, x0 + STREET_WIDTH, 0, HEIGHT, DemoClass.STREET);
        }
        for (int k = 0; k < HORIZONTAL_STREETS; k++) {
            int y0 = STREET_FIRST + k * STREET_PITCH;
            fillRect(0, FRINGE_COL, y0, Math.min(HEIGHT, y0 + STREET_WIDTH), DemoClass.STREET);
        }
        fillRect(AVENUE_COL0, AVENUE_COL1_EXCLUSIVE, 0, HEIGHT, DemoClass.AVENUE);
    }

    /** Edges of the blocks along one axis: {start0, end0, start1, end1, …}, end exclusive [cells]. */
    private static int[] blockEdges(int streets, int limit) {
        int[] e = new int[2 * (streets + 1)];
        int n = 0;
        int start = 0;
        for (int k = 0; k < streets; k++) {
            int s = STREET_FIRST + k * STREET_PITCH;
            e[n++] = start;
            e[n++] = s;
            start = s + STREET_WIDTH;
        }
        e[n++] = start;
        e[n++] = limit;
        return e;
    }

    private void blocks() {
        int[] xs = blockEdges(VERTICAL_STREETS - 1, FRINGE_COL - STREET_WIDTH);
        int[] ys = blockEdges(HORIZONTAL_STREETS, HEIGHT);
        for (int j = 0; j < ys.length; j += 2) {
            for (int i = 0; i < xs.length; i += 2) {
                int x0 = xs[i];
                int x1 = xs[i + 1];
                int y0 = ys[j];
                int y1 = ys[j + 1];
                // the avenue is wider than a street: trim the blocks beside it
                if (x1 > AVENUE_COL0 && x0 < AVENUE_COL0) {
                    x1 = AVENUE_COL0;
                } else if (x0 < AVENUE_COL1_EXCLUSIVE && x1 > AVENUE_COL1_EXCLUSIVE) {
                    x0 = AVENUE_COL1_EXCLUSIVE;
                }
                double cx = 0.5 * (x0 + x1);
                double cy = 0.5 * (y0 + y1);
                if (inside(PARK, cx, cy)) {
                    continue;                       // painted as one park below
                }
                if (x0 == PLAZA[0] && y0 == PLAZA[2]) {
                    plaza();
                } else if (x0 == PARKING[0] && y0 == PARKING[2]) {
                    parking();
                } else if (x1 - x0 >= 10 && y1 - y0 >= 10) {
                    buildingBlock(x0, x1, y0, y1, districtOf(cx, cy));
                }
            }
        }
        park();
    }

    private void buildingBlock(int x0, int x1, int y0, int y1, int district) {
        fillRect(x0, x1, y0, y1, DemoClass.SIDEWALK);
        double u = rnd.nextDouble();
        DemoClass yard = u < 0.55 ? DemoClass.GRASS_DRY : u < 0.75 ? DemoClass.LAWN : DemoClass.SIDEWALK;
        int ix0 = x0 + 1;
        int ix1 = x1 - 1;
        int iy0 = y0 + 1;
        int iy1 = y1 - 1;
        fillRect(ix0, ix1, iy0, iy1, yard);
        double[] hr = HEIGHT_RANGE_M[district];
        float heightM = (float) (hr[0] + 0.5 * rnd.nextInt((int) Math.round(2 * (hr[1] - hr[0])) + 1));
        int nx = ix1 - ix0 >= 16 ? 1 + rnd.nextInt(2) : 1;
        int ny = iy1 - iy0 >= 16 ? 1 + rnd.nextInt(2) : 1;
        int splitX = nx == 1 ? ix1 : ix0 + (int) Math.round((ix1 - ix0) * (0.4 + 0.2 * rnd.nextDouble()));
        int splitY = ny == 1 ? iy1 : iy0 + (int) Math.round((iy1 - iy0) * (0.4 + 0.2 * rnd.nextDouble()));
        for (int b = 0; b < nx * ny; b++) {
            int lx0 = b % nx == 0 ? ix0 : splitX;
            int lx1 = b % nx == 0 ? splitX : ix1;
            int ly0 = b / nx == 0 ? iy0 : splitY;
            int ly1 = b / nx == 0 ? splitY : iy1;
            int bx0 = lx0 + 1 + rnd.nextInt(3);
            int bx1 = lx1 - 1 - rnd.nextInt(3);
            int by0 = ly0 + 1 + rnd.nextInt(3);
            int by1 = ly1 - 1 - rnd.nextInt(3);
            DemoClass roof = pick(ROOFS, ROOF_WEIGHTS[district]);
            if (bx1 - bx0 >= 4 && by1 - by0 >= 4 && clearOfRiver(bx0, bx1, by0, by1)) {
                for (int r = by0; r < by1; r++) {
                    for (int c = bx0; c < bx1; c++) {
                        code[r * WIDTH + c] = roof.code;
                        roofM[r * WIDTH + c] = heightM;
                    }
                }
            }
        }
        int trees = rnd.nextInt(4);                 // 0 to 3 yard trees, on yard cells only
        for (int t = 0; t < trees; t++) {
            double tx = ix0 + 2 + rnd.nextDouble() * (ix1 - ix0 - 4);
            double ty = iy0 + 2 + rnd.nextDouble() * (iy1 - iy0 - 4);
            treeClump(tx, ty, 1.5 + rnd.nextDouble(), treeHeight(), ix0, ix1, iy0, iy1, yard);
        }
    }

    /** True when no cell of the rectangle lies within {@link #BANK_HALF_WIDTH} + 1 of the river. */
    private boolean clearOfRiver(int x0, int x1, int y0, int y1) {
        for (int r = y0; r < y1; r++) {
            for (int c = x0; c < x1; c++) {
                if (riverDist[r * WIDTH + c] <= BANK_HALF_WIDTH + 1) {
                    return false;
                }
            }
        }
        return true;
    }

    private void plaza() {
        fillRect(PLAZA[0], PLAZA[1], PLAZA[2], PLAZA[3], DemoClass.PLAZA_CONCRETE);
        fillRect(PLAZA[0] + 3, PLAZA[1] - 3, PLAZA[2] + 3, PLAZA[3] - 3, DemoClass.PLAZA_PAVERS);
        double[][] trees = {{PLAZA[0] + 5.5, PLAZA[2] + 5.5}, {PLAZA[1] - 5.5, PLAZA[2] + 5.5},
            {PLAZA[0] + 5.5, PLAZA[3] - 5.5}, {PLAZA[1] - 5.5, PLAZA[3] - 5.5}};
        for (double[] t : trees) {
            treeClump(t[0], t[1], 1.6, treeHeight(), PLAZA[0], PLAZA[1], PLAZA[2], PLAZA[3], DemoClass.PLAZA_PAVERS);
        }
    }

    private void parking() {
        fillRect(PARKING[0], PARKING[1], PARKING[2], PARKING[3], DemoClass.SIDEWALK);
        fillRect(PARKING[0] + 1, PARKING[1] - 1, PARKING[2] + 1, PARKING[3] - 1, DemoClass.PARKING);
        double y = 0.5 * (PARKING[2] + PARKING[3]);
        for (double x = PARKING[0] + 3.5; x < PARKING[1] - 2; x += 5) {
            treeClump(x, y, 1.3, treeHeight(), PARKING[0], PARKING[1], PARKING[2], PARKING[3], DemoClass.PARKING);
        }
    }

    private void park() {
        int x0 = PARK[0], x1 = PARK[1], y0 = PARK[2], y1 = PARK[3];
        fillRect(x0, x1, y0, y1, DemoClass.LAWN);
        double halfPath = 0.8;
        double xm = 0.5 * (x0 + x1);
        double ym = 0.5 * (y0 + y1);
        polyline(new double[] {x0, xm, x1}, new double[] {y1, ym, y0}, halfPath, DemoClass.GRAVEL, x0, x1, y0, y1);
        polyline(new double[] {x0, x1}, new double[] {ym, ym}, halfPath, DemoClass.GRAVEL, x0, x1, y0, y1);
        polyline(new double[] {x0 + 4.5, x1 - 4.5, x1 - 4.5, x0 + 4.5, x0 + 4.5},
                new double[] {y0 + 4.5, y0 + 4.5, y1 - 4.5, y1 - 4.5, y0 + 4.5}, halfPath, DemoClass.GRAVEL,
                x0, x1, y0, y1);
        for (int i = 0; i < 30; i++) {
            double tx = x0 + 3 + rnd.nextDouble() * (x1 - x0 - 6);
            double ty = y0 + 3 + rnd.nextDouble() * (y1 - y0 - 6);
            treeClump(tx, ty, 2 + 3 * rnd.nextDouble(), treeHeight(), x0, x1, y0, y1, DemoClass.LAWN);
        }
    }

    // ---------------------------------------------------------------- fringe, river, bridges

    private void fringe() {
        int x0 = FRINGE_COL;
        for (int i = 0; i < 8; i++) {
            double cx = x0 + 4 + rnd.nextDouble() * (WIDTH - x0 - 8);
            double cy = 4 + rnd.nextDouble() * (HEIGHT - 8);
            double ax = 3 + 7 * rnd.nextDouble();
            double ay = 2 + 5 * rnd.nextDouble();
            for (int r = Math.max(0, (int) (cy - ay)); r < Math.min(HEIGHT, (int) (cy + ay) + 1); r++) {
                for (int c = Math.max(x0, (int) (cx - ax)); c < Math.min(WIDTH, (int) (cx + ax) + 1); c++) {
                    double dx = (c + 0.5 - cx) / ax;
                    double dy = (r + 0.5 - cy) / ay;
                    if (dx * dx + dy * dy <= 1) {
                        code[r * WIDTH + c] = DemoClass.SOIL_DRY.code;
                    }
                }
            }
        }
        polyline(new double[] {x0, 462, WIDTH}, new double[] {75.5, 96, 104}, 1.0, DemoClass.GRAVEL,
                x0, WIDTH, 0, HEIGHT);
        for (double y = 6.5; y < HEIGHT; y += 7) {
            if (rnd.nextDouble() < 0.6) {
                treeClump(x0 + 3.5, y, 1.5 + rnd.nextDouble(), treeHeight(), x0, WIDTH, 0, HEIGHT,
                        DemoClass.GRASS_DRY);
            }
        }
    }

    private void river() {
        for (int r = 0; r < HEIGHT; r++) {
            for (int c = 0; c < WIDTH; c++) {
                int i = r * WIDTH + c;
                double d = riverDist[i];
                if (d <= WATER_HALF_WIDTH) {
                    code[i] = DemoClass.WATER.code;
                } else if (d <= MUD_HALF_WIDTH) {
                    code[i] = DemoClass.MUD.code;
                } else if (d <= BANK_HALF_WIDTH) {
                    boolean quay = c + 0.5 < AVENUE_CENTRE_X && r + 0.5 < riverY(c + 0.5)
                            && d > BANK_HALF_WIDTH - QUAY_WIDTH;
                    code[i] = quay ? DemoClass.SIDEWALK.code : DemoClass.GRASS_DRY.code;
                }
            }
        }
        for (double x = 3; x < WIDTH; x += 7) {
            for (int side = -1; side <= 1; side += 2) {
                if (rnd.nextDouble() < 0.8) {
                    double offset = 10.5 + 4.5 * rnd.nextDouble();
                    treeClump(x, riverY(x) + side * offset, 2 + 1.5 * rnd.nextDouble(), treeHeight(),
                            0, WIDTH, 0, HEIGHT, DemoClass.GRASS_DRY);
                }
            }
        }
    }

    private void bridges() {
        for (int k : BRIDGE_STREETS) {
            int x0 = STREET_FIRST + k * STREET_PITCH;
            bridge(x0, x0 + STREET_WIDTH, DemoClass.STREET);
        }
        bridge(AVENUE_COL0, AVENUE_COL1_EXCLUSIVE, DemoClass.AVENUE);
    }

    private void bridge(int x0, int x1, DemoClass deck) {
        for (int r = 0; r < HEIGHT; r++) {
            for (int c = x0; c < x1; c++) {
                if (riverDist[r * WIDTH + c] <= BANK_HALF_WIDTH) {
                    code[r * WIDTH + c] = deck.code;
                }
            }
        }
    }

    // ---------------------------------------------------------------- heights and helpers

    private float[] heights() {
        float[] h = new float[WIDTH * HEIGHT];
        for (int i = 0; i < h.length; i++) {
            int c = code[i];
            h[i] = c >= DemoClass.ROOF_DARK.code && c <= DemoClass.ROOF_GREEN.code ? roofM[i]
                    : c == DemoClass.TREES.code ? treeM[i] : 0f;
        }
        return h;
    }

    private float treeHeight() {
        return (float) (TREE_MIN_M + 0.5 * rnd.nextInt((int) Math.round(2 * (TREE_MAX_M - TREE_MIN_M)) + 1));
    }

    /** Trees on the cells of {@code under} within {@code radius} of (cx, cy), inside the box. */
    private void treeClump(double cx, double cy, double radius, float heightM, int x0, int x1, int y0, int y1,
            DemoClass under) {
        int c0 = Math.max(x0, (int) Math.floor(cx - radius));
        int c1 = Math.min(x1, (int) Math.ceil(cx + radius) + 1);
        int r0 = Math.max(y0, (int) Math.floor(cy - radius));
        int r1 = Math.min(y1, (int) Math.ceil(cy + radius) + 1);
        for (int r = Math.max(0, r0); r < Math.min(HEIGHT, r1); r++) {
            for (int c = Math.max(0, c0); c < Math.min(WIDTH, c1); c++) {
                double dx = c + 0.5 - cx;
                double dy = r + 0.5 - cy;
                int i = r * WIDTH + c;
                if (dx * dx + dy * dy <= radius * radius && code[i] == under.code) {
                    code[i] = DemoClass.TREES.code;
                    treeM[i] = heightM;
                }
            }
        }
    }

    /** Paints the cells within {@code halfWidth} of a polyline, inside the box. */
    private void polyline(double[] xs, double[] ys, double halfWidth, DemoClass cls, int x0, int x1, int y0, int y1) {
        for (int r = Math.max(0, y0); r < Math.min(HEIGHT, y1); r++) {
            for (int c = Math.max(0, x0); c < Math.min(WIDTH, x1); c++) {
                if (polylineDistance(xs, ys, c + 0.5, r + 0.5) <= halfWidth) {
                    code[r * WIDTH + c] = cls.code;
                }
            }
        }
    }

    private void fillRect(int x0, int x1, int y0, int y1, DemoClass cls) {
        for (int r = y0; r < y1; r++) {
            for (int c = x0; c < x1; c++) {
                code[r * WIDTH + c] = cls.code;
            }
        }
    }

    private DemoClass pick(DemoClass[] options, int[] weights) {
        int total = 0;
        for (int w : weights) {
            total += w;
        }
        int u = rnd.nextInt(total);
        for (int k = 0; k < options.length; k++) {
            u -= weights[k];
            if (u < 0) {
                return options[k];
            }
        }
        throw new IllegalStateException("weights do not add up");
    }

    private static boolean inside(int[] box, double x, double y) {
        return x >= box[0] && x < box[1] && y >= box[2] && y < box[3];
    }

    /** District of a point of the built-up area (west of {@link #FRINGE_COL}) [cells]. */
    static int districtOf(double x, double y) {
        if (x >= FRINGE_COL) {
            return EAST_MEADOWS;
        }
        boolean north = y < riverY(x);
        boolean west = x < AVENUE_CENTRE_X;
        return north ? (west ? OLD_QUAY : MILL_QUARTER) : (west ? PARKSIDE : SOUTH_BANK);
    }

    /** The river centre line's y at {@code x}, linear between vertices [cells]. */
    static double riverY(double x) {
        for (int k = 1; k < RIVER_X.length; k++) {
            if (x <= RIVER_X[k] || k == RIVER_X.length - 1) {
                double t = (x - RIVER_X[k - 1]) / (RIVER_X[k] - RIVER_X[k - 1]);
                return RIVER_Y[k - 1] + t * (RIVER_Y[k] - RIVER_Y[k - 1]);
            }
        }
        throw new IllegalStateException("river needs two vertices");
    }

    /** Shortest distance from (px, py) to the river centre line [cells]. */
    static double riverDistance(double px, double py) {
        return polylineDistance(RIVER_X, RIVER_Y, px, py);
    }

    /** Shortest Euclidean distance from (px, py) to a polyline (its segments, ends included). */
    static double polylineDistance(double[] xs, double[] ys, double px, double py) {
        double best = Double.POSITIVE_INFINITY;
        for (int k = 1; k < xs.length; k++) {
            double ax = xs[k - 1];
            double ay = ys[k - 1];
            double dx = xs[k] - ax;
            double dy = ys[k] - ay;
            double len2 = dx * dx + dy * dy;
            double t = len2 == 0 ? 0 : ((px - ax) * dx + (py - ay) * dy) / len2;
            t = Math.max(0, Math.min(1, t));
            double ex = ax + t * dx - px;
            double ey = ay + t * dy - py;
            best = Math.min(best, ex * ex + ey * ey);
        }
        return Math.sqrt(best);
    }
}
