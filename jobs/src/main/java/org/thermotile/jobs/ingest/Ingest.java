package org.thermotile.jobs.ingest;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalInt;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.apache.sis.util.Utilities;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.prep.PreparedGeometry;
import org.locationtech.jts.geom.prep.PreparedGeometryFactory;
import org.opengis.referencing.crs.CoordinateReferenceSystem;
import org.opengis.referencing.operation.MathTransform;
import org.opengis.referencing.operation.TransformException;
import org.opengis.util.FactoryException;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.io.raster.SisCrs;
import org.thermotile.model.resample.Resample;

/**
 * Puts the land cover and heights of a run onto one working grid ({@link WorkingGrid}): chooses
 * the grid, reprojects (Apache SIS coordinate operations), resamples, mosaics several tiles, cuts
 * an area of interest, and writes the prepared rasters; the run then reads only those.
 *
 * <p><b>Working grid</b> (run-file {@code grid:}, every key optional):
 * <ul>
 *   <li>CRS: {@code grid.crs}; else the first land-cover tile's CRS when it is projected (metres);
 *       else the WGS 84 / UTM zone of the area's centre (Apache SIS
 *       {@code CommonCRS.WGS84.universal(lat, lon)}; the area is {@code grid.area}, else the
 *       tiles' extent).</li>
 *   <li>Cell size: {@code grid.cell_size_m}; else the first tile's cell width when projected;
 *       else its nominal size: the north–south cell side in metres at the area's centre,
 *       M(φ)·|Δφ| with M the meridional radius of curvature of the WGS 84 ellipsoid
 *       M = a(1−e²)/(1−e² sin²φ)^{3/2} (Snyder 1987, Map Projections — A Working Manual, eq. 4-18),
 *       rounded to two significant digits.</li>
 *   <li>Extent: {@code grid.area}'s envelope (a box, or a polygon file whose outside cells become
 *       no-data by their centres) cut to the tiles' extent; else the tiles' extent. Edges snap to
 *       the first tile's cell edges when CRS and cell size are the first tile's, else to whole
 *       multiples of the cell size in the working CRS.</li>
 *   <li>With no {@code grid:} section and one projected land-cover file, the working grid is
 *       that file's own grid and the file is used as it is (nothing is resampled or written).</li>
 * </ul>
 *
 * <p><b>Resampling</b> (per tile, by the ratio working cell / source cell): a tile on the working
 * grid's CRS and cell size whose cell edges line up is copied cell for cell. Otherwise each working
 * cell is sampled at points transformed into the tile's CRS: land cover by nearest neighbour at
 * the cell centre, or, when coarsening (ratio ≥ {@value #COARSENING}), by the majority of k × k sub-samples
 * (k = ⌈ratio⌉, at most {@value #MAX_SUB}; ties to the smallest code); heights by bilinear
 * interpolation at the centre, or, when coarsening, the maximum of the sub-samples, so a building
 * narrower than a cell is not flattened. Methods are in {@link Resample}.
 *
 * <p><b>Mosaic</b>: a cell takes its value from the first listed tile that has data there (a glob
 * lists its files in name order); tiles must share data type and no-data value (a difference
 * usually means another class scheme, which cannot be detected otherwise). Cells that no tile
 * covers are no-data and counted in a warning.
 */
public final class Ingest {

    /** Largest number of sub-samples per axis when coarsening (our choice: bounds memory and time). */
    public static final int MAX_SUB = 8;

    /**
     * Ratio working cell / source cell from which a resampling counts as coarsening (majority,
     * maximum): 2, so that every working cell holds at least two source cells per axis (our choice;
     * below it, sub-samples of one cell fall mostly on its neighbours' source cells and nearest
     * neighbour keeps class counts better).
     */
    public static final double COARSENING = 2.0;

    private static final int BLOCK = GeoTiffWriter.TILE_SIZE;

    private Ingest() { }

    /**
     * The inputs on the working grid.
     *
     * @param grid      the working grid
     * @param rasterGrid the working grid as a {@link RasterGrid} (the land cover's own when {@code unchanged})
     * @param landCover the land cover to run on: the original file when {@code unchanged}, else the
     *                  prepared file
     * @param heights   heights on the working grid (original or prepared), or null
     * @param unchanged true when the land cover is used as it is
     * @param report    what was done, for check and the manifest
     */
    public record Prepared(WorkingGrid grid, RasterGrid rasterGrid, Path landCover, Path heights, boolean unchanged,
            IngestReport report) { }

    /**
     * Prepares the land cover (and heights) of {@code run} on its working grid, writing prepared
     * rasters into {@code folder} when anything had to be resampled, cut or mosaicked.
     *
     * @param landCover the land-cover tiles as local files, in run-file order
     * @param heights   the heights tiles as local files (empty without heights)
     * @throws UserInputException naming the file, the key and the fix when inputs do not fit together
     */
    public static Prepared prepare(RunFile run, List<Path> landCover, List<Path> heights, Path folder) {
        List<GeoTiffReader> lc = new ArrayList<>();
        List<GeoTiffReader> hs = new ArrayList<>();
        try {
            for (Path p : landCover) {
                lc.add(GeoTiffReader.openSingleBandAnyCrs(p));
            }
            for (Path p : heights) {
                hs.add(GeoTiffReader.openSingleBandAnyCrs(p));
            }
            checkSameKind(lc, "inputs.land_cover", true);
            checkSameKind(hs, "inputs.heights", false);
            GeoTiffReader first = lc.get(0);
            boolean projected = SisCrs.unsuitable(first.crs()) == null;
            if (run.grid().isDefault() && lc.size() == 1 && projected) {
                return ownGrid(first, hs, folder);
            }
            return general(run, lc, hs, folder);
        } finally {
            lc.forEach(GeoTiffReader::close);
            hs.forEach(GeoTiffReader::close);
        }
    }

    /** The land cover's own grid: the land cover as it is; heights copied or resampled onto it. */
    private static Prepared ownGrid(GeoTiffReader lc, List<GeoTiffReader> hs, Path folder) {
        RasterGrid g = lc.grid();
        WorkingGrid wg = WorkingGrid.of(g);
        Map<String, String> steps = new LinkedHashMap<>();
        steps.put("land_cover", lc.file().getFileName() + ": used as it is (its own grid)");
        Map<String, Long> counts = new LinkedHashMap<>();
        Path heights = null;
        if (!hs.isEmpty()) {
            if (hs.size() == 1 && g.sameGridAs(hs.get(0).grid())) {
                heights = hs.get(0).file();
                steps.put("heights", heights.getFileName() + ": on the working grid already, used as it is");
            } else {
                Layer h = new Layer(hs, wg, null, false, steps, "heights");
                heights = folder.resolve("heights.tif");
                h.writeFloat(heights, g);
                h.checkCovers("inputs.heights");
                h.countInto(counts, "heights");
            }
        }
        return new Prepared(wg, g, lc.file(), heights, true,
                new IngestReport(wg, "the land cover's own grid", steps, counts, List.of()));
    }

    private static Prepared general(RunFile run, List<GeoTiffReader> lc, List<GeoTiffReader> hs, Path folder) {
        RunFile.Grid spec = run.grid();
        GeoTiffReader first = lc.get(0);
        boolean projected = SisCrs.unsuitable(first.crs()) == null;
        AreaOfInterest aoi = AreaOfInterest.of(run);

        // The tiles' extent in WGS 84 (longitude, latitude), for the default UTM zone and nominal size.
        CoordinateReferenceSystem geo = CommonCRS.WGS84.normalizedGeographic();
        double[] geoBox = aoi != null ? envelope(op(aoi.crs(), geo), aoi.minX(), aoi.minY(), aoi.maxX(), aoi.maxY())
                : union(lc, geo);
        double centreLon = (geoBox[0] + geoBox[2]) / 2, centreLat = (geoBox[1] + geoBox[3]) / 2;

        CoordinateReferenceSystem crs;
        String rule;
        if (spec.crs() != null) {
            crs = AreaOfInterest.crsForCode(spec.crs(), run.source() + ": grid.crs");
            String why = SisCrs.unsuitable(crs);
            if (why != null) {
                throw new UserInputException(run.source() + ": grid.crs: " + spec.crs() + " cannot carry the working grid: "
                        + why.replace("its CRS", "the CRS") + ". Fix: give a projected CRS in metres, e.g. the WGS 84 / UTM "
                        + "zone EPSG:" + SisCrs.epsgOf(CommonCRS.WGS84.universal(centreLat, centreLon)) + " of this area");
            }
            rule = "CRS from grid.crs";
        } else if (projected) {
            crs = first.crs();
            rule = "CRS of the first land-cover tile";
        } else {
            crs = CommonCRS.WGS84.universal(centreLat, centreLon);
            rule = String.format(Locale.ROOT, "CRS: the WGS 84 / UTM zone of the area's centre (%.5f° N, %.5f° E)",
                    centreLat, centreLon);
        }
        double cell;
        if (!Double.isNaN(spec.cellSizeM())) {
            cell = spec.cellSizeM();
            rule += ", cell size from grid.cell_size_m";
        } else if (projected) {
            cell = first.grid().pixelWidth();
            rule += ", cell size of the first land-cover tile";
        } else {
            cell = nominalCellM(first.grid(), centreLat);
            rule += ", cell size: the first tile's nominal " + WorkingGrid.trim(cell) + " m (north-south side at the centre)";
        }

        // Extent in the working CRS.
        double[] tiles = union(lc, crs);
        double[] box = tiles.clone();
        Geometry polygon = null;
        if (aoi != null) {
            MathTransform toWork = op(aoi.crs(), crs);
            double[] a = envelope(toWork, aoi.minX(), aoi.minY(), aoi.maxX(), aoi.maxY());
            polygon = aoi.polygonIn(toWork);
            if (polygon != null) {
                var e = polygon.getEnvelopeInternal();
                a = new double[] {e.getMinX(), e.getMinY(), e.getMaxX(), e.getMaxY()};
            }
            box = new double[] {Math.max(a[0], tiles[0]), Math.max(a[1], tiles[1]), Math.min(a[2], tiles[2]),
                    Math.min(a[3], tiles[3])};
            if (!(box[0] < box[2] && box[1] < box[3])) {
                throw new UserInputException(String.format(Locale.ROOT, "%s: grid.area (%s) lies outside every land-cover "
                        + "tile: in %s it spans x %.1f…%.1f, y %.1f…%.1f m, the tiles x %.1f…%.1f, y %.1f…%.1f m. Fix: check "
                        + "the area's coordinates and CRS (x is the easting or longitude, y the northing or latitude), "
                        + "or give the tiles that cover it", run.source(), aoi.label(), label(crs), a[0], a[2], a[1], a[3],
                        tiles[0], tiles[2], tiles[1], tiles[3]));
            }
            rule += ", cut to " + aoi.label();
        }
        double ox, oy;
        RasterGrid fg = first.grid();
        boolean snapToFirst = Utilities.equalsIgnoreMetadata(crs, first.crs()) && sameSize(fg, cell);
        if (snapToFirst) {
            ox = fg.originX() + Math.floor((box[0] - fg.originX()) / cell + 1e-9) * cell;
            oy = fg.originY() - Math.floor((fg.originY() - box[3]) / cell + 1e-9) * cell;
        } else {
            ox = Math.floor(box[0] / cell + 1e-9) * cell;
            oy = Math.ceil(box[3] / cell - 1e-9) * cell;
        }
        long cols = (long) Math.ceil((box[2] - ox) / cell - 1e-9);
        long rows = (long) Math.ceil((oy - box[1]) / cell - 1e-9);
        if (cols < 1 || rows < 1 || cols * rows > 2_000_000_000L || cols > 1_000_000 || rows > 1_000_000) {
            throw new UserInputException(run.source() + ": the working grid would be " + cols + " × " + rows + " cells of "
                    + cell + " m. Fix: give a larger grid.cell_size_m or a smaller grid.area");
        }
        int epsg = SisCrs.epsgOf(crs);
        WorkingGrid wg = new WorkingGrid(epsg, WorkingGrid.wktOf(crs), ox, oy, cell, (int) cols, (int) rows);
        RasterGrid g = wg.toRasterGrid();

        Map<String, String> steps = new LinkedHashMap<>();
        Map<String, Long> counts = new LinkedHashMap<>();
        List<String> warnings = new ArrayList<>();
        PreparedGeometry mask = polygon == null ? null : PreparedGeometryFactory.prepare(polygon);
        Layer land = new Layer(lc, wg, mask, true, steps, "land_cover");
        Path lcOut = folder.resolve("landcover.tif");
        land.writeInt(lcOut, g);
        land.countInto(counts, "land_cover");
        if (land.gaps > 0) {
            warnings.add(land.gaps + " cells of the working grid lie in no land-cover tile (a gap between or beside the "
                    + "tiles): they are no-data");
        }
        Path hOut = null;
        if (!hs.isEmpty()) {
            Layer h = new Layer(hs, wg, mask, false, steps, "heights");
            hOut = folder.resolve("heights.tif");
            h.writeFloat(hOut, g);
            h.checkCovers("inputs.heights");
            h.countInto(counts, "heights");
        }
        return new Prepared(wg, g, lcOut, hOut, false, new IngestReport(wg, rule, steps, counts, warnings));
    }

    // ---------------------------------------------------------------- one input (land cover or heights)

    /** One input mosaicked onto the working grid, block by block. */
    private static final class Layer {
        final List<Src> srcs = new ArrayList<>();
        final WorkingGrid wg;
        final PreparedGeometry mask;
        final boolean integer;
        final GeometryFactory gf = new GeometryFactory();
        final int srcNoData;            // integer land cover: the tiles' no-data code, if any
        final boolean hasSrcNoData;
        final int outNoData;
        final GeoTiffWriter.IntType type;
        long gaps, outside, noData, overlap;
        final long[] fromTile;

        Layer(List<GeoTiffReader> readers, WorkingGrid wg, PreparedGeometry mask, boolean integer,
                Map<String, String> steps, String key) {
            this.wg = wg;
            this.mask = mask;
            this.integer = integer;
            CoordinateReferenceSystem work = wg.crs();
            for (int i = 0; i < readers.size(); i++) {
                Src s = new Src(readers.get(i), work, wg);
                srcs.add(s);
                steps.put(readers.size() == 1 ? key : key + "[" + i + "]", s.describe(integer));
            }
            fromTile = new long[readers.size()];
            GeoTiffReader r0 = readers.get(0);
            hasSrcNoData = r0.noDataValue().isPresent() && !Double.isNaN(r0.noDataValue().getAsDouble());
            srcNoData = hasSrcNoData ? (int) r0.noDataValue().getAsDouble() : Integer.MIN_VALUE;
            type = switch (r0.sampleType()) {
                case UINT8 -> GeoTiffWriter.IntType.UINT8;
                case INT16 -> GeoTiffWriter.IntType.INT16;
                default -> GeoTiffWriter.IntType.UINT16;
            };
            outNoData = hasSrcNoData && srcNoData >= type.min && srcNoData <= type.max ? srcNoData
                    : (type == GeoTiffWriter.IntType.INT16 ? type.min : type.max);
        }

        void writeInt(Path file, RasterGrid g) {
            try {
                GeoTiffWriter.writeIntBlocks(file, g, type, 1, OptionalInt.of(outNoData),
                        (band, c0, r0, w, h, out) -> fillInt(c0, r0, w, h, out));
            } catch (IllegalArgumentException e) {
                throw new UserInputException(srcs.get(0).file + ": a land-cover code does not fit the prepared "
                        + type.name().toLowerCase(Locale.ROOT) + " raster (" + e.getMessage() + "). Fix: class codes must "
                        + "be 0…65535", e);
            }
        }

        void writeFloat(Path file, RasterGrid g) {
            GeoTiffWriter.writeFloatBlocks(file, g, 1, Float.NaN, (band, c0, r0, w, h, out) -> fillFloat(c0, r0, w, h, out));
        }

        /** Refuses heights tiles of which no cell falls on the working grid (another CRS or place). */
        void checkCovers(String key) {
            long covered = noData;
            for (long n : fromTile) {
                covered += n;
            }
            if (covered == 0) {
                Src s = srcs.get(0);
                throw new UserInputException(s.file + " (" + s.srcLabel + "): covers no cell of the working grid (" + wg
                        + "). Fix: check " + key + "'s CRS and extent; it must overlap the land cover (reproject it "
                        + "with gdalwarp -t_srs " + wg.crsLabel() + " if its CRS is declared wrongly)");
            }
        }

        void countInto(Map<String, Long> counts, String key) {
            if (srcs.size() > 1) {
                for (int i = 0; i < fromTile.length; i++) {
                    counts.put(key + "[" + i + "]", fromTile[i]);
                }
                counts.put(key + " overlap (first listed wins)", overlap);
            } else {
                counts.put(key + " with data", fromTile[0]);
            }
            counts.put(key + " no-data in the source", noData);
            counts.put(key + " in no tile", gaps);
            if (mask != null) {
                counts.put(key + " outside the area", outside);
            }
        }

        /** Per cell of a block: 0 no tile, 1 covered with no-data, 2 has a value, 3 outside the area. */
        private byte[] start(int c0, int r0, int w, int h) {
            byte[] state = new byte[w * h];
            if (mask != null) {
                for (int r = 0; r < h; r++) {
                    for (int c = 0; c < w; c++) {
                        Coordinate p = new Coordinate(wg.centreX(c0 + c), wg.centreY(r0 + r));
                        if (!mask.covers(gf.createPoint(p))) {
                            state[r * w + c] = 3;
                        }
                    }
                }
            }
            return state;
        }

        private void tally(byte[] state, int[] cover, int[] tileOf) {
            for (int i = 0; i < state.length; i++) {
                switch (state[i]) {
                    case 0 -> gaps++;
                    case 1 -> noData++;
                    case 2 -> fromTile[tileOf[i]]++;
                    default -> outside++;
                }
                if (cover[i] > 1) {
                    overlap++;
                }
            }
        }

        void fillInt(int c0, int r0, int w, int h, int[] out) {
            java.util.Arrays.fill(out, outNoData);
            byte[] state = start(c0, r0, w, h);
            int[] cover = new int[w * h];
            int[] tileOf = new int[w * h];
            int[] samples = new int[MAX_SUB * MAX_SUB];
            for (int t = 0; t < srcs.size(); t++) {
                Src s = srcs.get(t);
                Window win = s.window(c0, r0, w, h);
                if (win == null) {
                    continue;
                }
                int[] v = s.reader.readIntWindow(win.c0, win.r0, win.w, win.h);
                for (int r = 0; r < h; r++) {
                    double[] px = s.pixels(c0, r0 + r, w);
                    int kk = s.k * s.k;
                    for (int c = 0; c < w; c++) {
                        int i = r * w + c;
                        if (state[i] == 3) {
                            continue;
                        }
                        int n = 0;
                        for (int q = 0; q < kk; q++) {
                            double pc = px[2 * (c * kk + q)], pr = px[2 * (c * kk + q) + 1];
                            long ic = Resample.nearestIndex(pc), ir = Resample.nearestIndex(pr);
                            if (ic < 0 || ir < 0 || ic >= s.g.width() || ir >= s.g.height()) {
                                continue;
                            }
                            int code = v[(int) (ir - win.r0) * win.w + (int) (ic - win.c0)];
                            if (!hasSrcNoData && code == outNoData) {
                                throw new UserInputException(s.file + ": uses code " + code + ", which the prepared land "
                                        + "cover needs as its no-data code (the tiles declare none). Fix: declare the "
                                        + "tiles' no-data value (gdal_edit.py -a_nodata <code>)");
                            }
                            samples[n++] = hasSrcNoData && code == srcNoData ? outNoData : code;
                        }
                        if (n == 0) {
                            continue;
                        }
                        cover[i]++;
                        if (state[i] == 2) {
                            continue;
                        }
                        int code = n == 1 ? samples[0] : Resample.majority(samples, n, outNoData);
                        if (code == outNoData) {
                            state[i] = 1;
                        } else {
                            out[i] = code;
                            state[i] = 2;
                            tileOf[i] = t;
                        }
                    }
                }
            }
            tally(state, cover, tileOf);
        }

        void fillFloat(int c0, int r0, int w, int h, float[] out) {
            java.util.Arrays.fill(out, Float.NaN);
            byte[] state = start(c0, r0, w, h);
            int[] cover = new int[w * h];
            int[] tileOf = new int[w * h];
            float[] samples = new float[MAX_SUB * MAX_SUB];
            for (int t = 0; t < srcs.size(); t++) {
                Src s = srcs.get(t);
                Window win = s.window(c0, r0, w, h);
                if (win == null) {
                    continue;
                }
                float[] v = s.reader.readFloatWindow(win.c0, win.r0, win.w, win.h);
                for (int r = 0; r < h; r++) {
                    double[] px = s.pixels(c0, r0 + r, w);
                    int kk = s.k * s.k;
                    for (int c = 0; c < w; c++) {
                        int i = r * w + c;
                        if (state[i] == 3) {
                            continue;
                        }
                        int n = 0;
                        float val = Float.NaN;
                        for (int q = 0; q < kk; q++) {
                            double pc = px[2 * (c * kk + q)], pr = px[2 * (c * kk + q) + 1];
                            long ic = Resample.nearestIndex(pc), ir = Resample.nearestIndex(pr);
                            if (ic < 0 || ir < 0 || ic >= s.g.width() || ir >= s.g.height()) {
                                continue;
                            }
                            if (s.aligned || kk > 1) {
                                samples[n++] = v[(int) (ir - win.r0) * win.w + (int) (ic - win.c0)];
                            } else {
                                samples[n++] = bilinear(v, win, s.g, pc, pr);
                            }
                        }
                        if (n == 0) {
                            continue;
                        }
                        cover[i]++;
                        if (state[i] == 2) {
                            continue;
                        }
                        val = n == 1 ? samples[0] : Resample.max(samples, n);
                        if (Float.isNaN(val)) {
                            state[i] = 1;
                        } else {
                            out[i] = val;
                            state[i] = 2;
                            tileOf[i] = t;
                        }
                    }
                }
            }
            tally(state, cover, tileOf);
        }

        /** Bilinear value at pixel coordinates (pc, pr) between the four nearest centres, clamped at the tile's edges. */
        private static float bilinear(float[] v, Window win, RasterGrid g, double pc, double pr) {
            double tc = pc - 0.5, tr = pr - 0.5;
            long i0 = (long) Math.floor(tc), j0 = (long) Math.floor(tr);
            double ft = tc - i0, fu = tr - j0;
            int a0 = (int) clamp(i0, win.c0, win.c0 + win.w - 1) - win.c0;
            int a1 = (int) clamp(i0 + 1, win.c0, win.c0 + win.w - 1) - win.c0;
            int b0 = (int) clamp(j0, win.r0, win.r0 + win.h - 1) - win.r0;
            int b1 = (int) clamp(j0 + 1, win.r0, win.r0 + win.h - 1) - win.r0;
            return (float) Resample.bilinear(v[b0 * win.w + a0], v[b0 * win.w + a1], v[b1 * win.w + a0],
                    v[b1 * win.w + a1], ft, fu);
        }

        private static long clamp(long x, long lo, long hi) {
            return Math.max(lo, Math.min(hi, x));
        }
    }

    /** A window of a source tile: columns c0…c0+w−1, rows r0…r0+h−1. */
    private record Window(int c0, int r0, int w, int h) { }

    /** One source tile and how working cells map onto its pixels. */
    private static final class Src {
        final GeoTiffReader reader;
        final Path file;
        final RasterGrid g;
        final WorkingGrid wg;
        final MathTransform toSrc;       // working CRS → tile CRS
        final boolean aligned;           // same CRS and cell size, edges on the same lines
        final long dCol, dRow;           // aligned: tile column = working column + dCol
        final double ratio;              // working cell / tile cell (metres)
        final int k;                     // sub-samples per axis
        final String srcLabel;

        Src(GeoTiffReader r, CoordinateReferenceSystem work, WorkingGrid wg) {
            this.reader = r;
            this.file = r.file();
            this.g = r.grid();
            this.wg = wg;
            this.toSrc = op(work, r.crs());
            this.srcLabel = label(r.crs());
            boolean sameCrs = Utilities.equalsIgnoreMetadata(work, r.crs())
                    || (g.epsg() > 0 && g.epsg() == wg.epsg() && SisCrs.unsuitable(r.crs()) == null);
            double dc = (wg.originX() - g.originX()) / g.pixelWidth();
            double dr = (wg.originY() - g.originY()) / g.pixelHeight();
            aligned = sameCrs && sameSize(g, wg.cellSizeM()) && Math.abs(dc - Math.rint(dc)) < 1e-6
                    && Math.abs(dr - Math.rint(dr)) < 1e-6;
            dCol = Math.round(dc);
            dRow = Math.round(dr);
            double srcCellM = SisCrs.unsuitable(r.crs()) == null ? g.pixelWidth()
                    : nominalCellM(g, g.originY() + g.pixelHeight() * g.height() / 2.0, true);
            ratio = wg.cellSizeM() / srcCellM;
            k = aligned || ratio < COARSENING - 1e-9 ? 1 : Math.min(MAX_SUB, Resample.subSamples(ratio));
        }

        String describe(boolean integer) {
            String name = file.getFileName().toString();
            if (aligned) {
                return name + ": same CRS, cell size and cell edges as the working grid; cells copied (no resampling)";
            }
            String how = integer
                    ? (k > 1 ? "majority of " + k + " × " + k + " sub-samples per cell (coarsening ×" + fmt(ratio) + ")"
                            : "nearest neighbour at the cell centre")
                    : (k > 1 ? "maximum of " + k + " × " + k + " sub-samples per cell (coarsening ×" + fmt(ratio)
                            + ", so buildings are not flattened)" : "bilinear at the cell centre (no-data: nearest)");
            boolean same = SisCrs.unsuitable(reader.crs()) == null && g.epsg() > 0 && g.epsg() == wg.epsg();
            return name + (same ? ": resampled in " + srcLabel : ": reprojected from " + srcLabel + " to " + wg.crsLabel())
                    + " at " + WorkingGrid.trim(wg.cellSizeM())
                    + " m by " + how;
        }

        /**
         * The pixel coordinates (column, row; edges at integers) in this tile of the k × k
         * sub-sample points of the cells {@code c0…c0+w−1} of working row {@code row}, interleaved,
         * cell by cell.
         */
        double[] pixels(int c0, int row, int w) {
            int kk = k * k;
            double[] p = new double[2 * w * kk];
            if (aligned) {
                for (int c = 0; c < w; c++) {
                    p[2 * c] = c0 + c + dCol + 0.5;
                    p[2 * c + 1] = row + dRow + 0.5;
                }
                return p;
            }
            double s = wg.cellSizeM();
            int n = 0;
            for (int c = 0; c < w; c++) {
                for (int j = 0; j < k; j++) {
                    for (int i = 0; i < k; i++) {
                        p[n++] = wg.originX() + (c0 + c + (i + 0.5) / k) * s;
                        p[n++] = wg.originY() - (row + (j + 0.5) / k) * s;
                    }
                }
            }
            transform(p);
            return p;
        }

        private void transform(double[] p) {
            try {
                toSrc.transform(p, 0, p, 0, p.length / 2);
            } catch (TransformException e) {
                throw new UserInputException(file + ": the working grid's cells cannot be placed in this tile's CRS ("
                        + e.getMessage() + "). Fix: choose a working CRS (grid.crs) valid over the area", e);
            }
            for (int i = 0; i < p.length; i += 2) {
                p[i] = (p[i] - g.originX()) / g.pixelWidth();
                p[i + 1] = (p[i + 1] - g.originY()) / g.pixelHeight();
            }
        }

        /** The tile window a working block needs (its boundary transformed, 2 cells of margin), or null. */
        Window window(int c0, int r0, int w, int h) {
            double minC, minR, maxC, maxR;
            if (aligned) {
                minC = c0 + dCol;
                minR = r0 + dRow;
                maxC = minC + w - 1;
                maxR = minR + h - 1;
            } else {
                int per = 4 * k;
                double[] p = new double[2 * 4 * (per + 1)];
                int n = 0;
                double s = wg.cellSizeM();
                for (int i = 0; i <= per; i++) {
                    double f = (double) i / per;
                    double[][] edge = {{c0 + f * w, r0}, {c0 + f * w, r0 + h}, {c0, r0 + f * h}, {c0 + w, r0 + f * h}};
                    for (double[] e : edge) {
                        p[n++] = wg.originX() + e[0] * s;
                        p[n++] = wg.originY() - e[1] * s;
                    }
                }
                transform(p);
                minC = minR = Double.POSITIVE_INFINITY;
                maxC = maxR = Double.NEGATIVE_INFINITY;
                for (int i = 0; i < p.length; i += 2) {
                    minC = Math.min(minC, p[i]);
                    maxC = Math.max(maxC, p[i]);
                    minR = Math.min(minR, p[i + 1]);
                    maxR = Math.max(maxR, p[i + 1]);
                }
                minC = Math.floor(minC) - 2;
                minR = Math.floor(minR) - 2;
                maxC = Math.floor(maxC) + 2;
                maxR = Math.floor(maxR) + 2;
            }
            long a0 = Math.max(0, (long) minC), b0 = Math.max(0, (long) minR);
            long a1 = Math.min(g.width() - 1L, (long) maxC), b1 = Math.min(g.height() - 1L, (long) maxR);
            if (a0 > a1 || b0 > b1) {
                return null;
            }
            return new Window((int) a0, (int) b0, (int) (a1 - a0 + 1), (int) (b1 - b0 + 1));
        }
    }

    // ---------------------------------------------------------------- helpers

    private static void checkSameKind(List<GeoTiffReader> rs, String key, boolean integer) {
        if (rs.isEmpty()) {
            return;
        }
        GeoTiffReader a = rs.get(0);
        if (integer && !a.sampleType().isInteger()) {
            throw new UserInputException(a.file() + ": land cover holds " + a.sampleType().label()
                    + " samples; class codes must be integers. Fix: write the land cover as an "
                    + "integer raster (e.g. gdal_translate -ot UInt16)");
        }
        for (int i = 1; i < rs.size(); i++) {
            GeoTiffReader b = rs.get(i);
            String na = a.noDataValue().isPresent() ? Double.toString(a.noDataValue().getAsDouble()) : "none";
            String nb = b.noDataValue().isPresent() ? Double.toString(b.noDataValue().getAsDouble()) : "none";
            if (a.sampleType() != b.sampleType() || !na.equals(nb)) {
                throw new UserInputException(b.file() + " (" + key + "[" + i + "]): holds " + b.sampleType().label()
                        + " samples with no-data " + nb + ", but the first tile " + a.file().getFileName() + " holds "
                        + a.sampleType().label() + " with no-data " + na + "; tiles of one mosaic must share data type "
                        + "and no-data value (a difference often means another class scheme). Fix: convert the tiles "
                        + "alike (gdal_translate -ot … -a_nodata …), checking that their codes mean the same classes");
            }
        }
    }

    /** True when the grid's cells are {@code cell} metres square (to 1e-9 relative). */
    private static boolean sameSize(RasterGrid g, double cell) {
        return Math.abs(g.pixelWidth() - cell) <= 1e-9 * cell && Math.abs(-g.pixelHeight() - cell) <= 1e-9 * cell;
    }

    /** "EPSG:4326" or the CRS name. */
    static String label(CoordinateReferenceSystem crs) {
        int e = SisCrs.epsgOf(crs);
        return e > 0 ? "EPSG:" + e : crs.getName().getCode();
    }

    private static String fmt(double v) {
        return String.format(Locale.ROOT, "%.3g", v);
    }

    /** The coordinate operation between two CRSs found by Apache SIS. */
    static MathTransform op(CoordinateReferenceSystem from, CoordinateReferenceSystem to) {
        try {
            return CRS.findOperation(from, to, null).getMathTransform();
        } catch (FactoryException e) {
            throw new UserInputException("no coordinate operation from " + label(from) + " to " + label(to) + ": "
                    + e.getMessage() + ". Fix: choose grid.crs on the same datum as the inputs (e.g. a WGS 84 / UTM zone)", e);
        }
    }

    /** Envelope [minx, miny, maxx, maxy] of a box's boundary (32 points per edge) transformed by {@code mt}. */
    static double[] envelope(MathTransform mt, double x0, double y0, double x1, double y1) {
        int per = 32;
        double[] p = new double[2 * 4 * (per + 1)];
        int n = 0;
        for (int i = 0; i <= per; i++) {
            double f = (double) i / per;
            double x = x0 + f * (x1 - x0), y = y0 + f * (y1 - y0);
            p[n++] = x; p[n++] = y0;
            p[n++] = x; p[n++] = y1;
            p[n++] = x0; p[n++] = y;
            p[n++] = x1; p[n++] = y;
        }
        try {
            mt.transform(p, 0, p, 0, p.length / 2);
        } catch (TransformException e) {
            throw new UserInputException("an extent cannot be transformed between CRSs: " + e.getMessage()
                    + ". Fix: check the CRSs of the inputs and of grid.area", e);
        }
        double[] env = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY};
        for (int i = 0; i < p.length; i += 2) {
            env[0] = Math.min(env[0], p[i]);
            env[1] = Math.min(env[1], p[i + 1]);
            env[2] = Math.max(env[2], p[i]);
            env[3] = Math.max(env[3], p[i + 1]);
        }
        return env;
    }

    /** Union of the tiles' extents in {@code crs}. */
    private static double[] union(List<GeoTiffReader> rs, CoordinateReferenceSystem crs) {
        double[] u = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY};
        for (GeoTiffReader r : rs) {
            RasterGrid g = r.grid();
            double[] e = envelope(op(r.crs(), crs), g.originX(), g.originY() + g.pixelHeight() * g.height(),
                    g.originX() + g.pixelWidth() * g.width(), g.originY());
            u[0] = Math.min(u[0], e[0]);
            u[1] = Math.min(u[1], e[1]);
            u[2] = Math.max(u[2], e[2]);
            u[3] = Math.max(u[3], e[3]);
        }
        return u;
    }

    /** WGS 84 semi-major axis a [m] and first eccentricity squared e² (NIMA TR8350.2, 2000, table 3.1/3.3). */
    private static final double A = 6_378_137.0, E2 = 6.69437999014e-3;

    /** Nominal cell size of a geographic grid, rounded to two significant digits; see the class javadoc. */
    static double nominalCellM(RasterGrid g, double latDeg) {
        return nominalCellM(g, latDeg, false);
    }

    /** M(φ)·|Δφ| [m] (Snyder 1987, eq. 4-18), rounded to two significant digits unless {@code exact}. */
    static double nominalCellM(RasterGrid g, double latDeg, boolean exact) {
        double phi = Math.toRadians(latDeg);
        double s = Math.sin(phi);
        double m = A * (1 - E2) / Math.pow(1 - E2 * s * s, 1.5);
        double v = m * Math.toRadians(Math.abs(g.pixelHeight()));
        if (exact) {
            return v;
        }
        double mag = Math.pow(10, Math.floor(Math.log10(v)) - 1);
        return Math.round(v / mag) * mag;
    }
}
