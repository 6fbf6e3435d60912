package org.thermotile.jobs.hotspots;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.Serializable;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalInt;
import java.util.TreeMap;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SparkSession;
import org.locationtech.jts.geom.Point;
import org.opengis.referencing.operation.MathTransform;
import org.opengis.referencing.operation.TransformException;
import org.thermotile.jobs.cli.UserInputException;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.hotspot.BenjaminiHochberg;
import org.thermotile.model.hotspot.DistanceBand;
import org.thermotile.model.hotspot.GiStar;
import org.thermotile.model.hotspot.GlobalMoments;
import org.thermotile.model.hotspot.HotspotClass;

/**
 * The hotspot analysis of a finished run: Getis–Ord Gi* z-scores of one per-cell statistic on a
 * fixed distance band, two-sided normal p-values, Benjamini–Hochberg classes, polygons and
 * tables, written under RUN/hotspots/STATISTIC/ (or RUN/scenarios/NAME/hotspots/STATISTIC/).
 *
 * <p>Two Spark passes read the statistic's map, never re-simulating: (1) the global count, mean
 * and standard deviation of the valid cells over fixed {@value #STATS_BLOCK}×{@value #STATS_BLOCK}
 * blocks merged in block order ({@link GlobalMoments}), so they do not depend on the tile size;
 * (2) one task per tile reads the tile with a halo of the band's radius and computes Gi*
 * ({@link GiStar}) and p = 2 Φ(−|z|) (Commons Math {@link NormalDistribution}). The driver then
 * applies Benjamini–Hochberg over all valid cells, draws the classes, merges clusters into
 * polygons and writes everything into a temporary sibling folder that is renamed into place only
 * when all of it succeeded.
 *
 * <p>The driver holds the z-scores and p-values (8 bytes each per cell), the statistic (4) and the
 * classes (4): about 25 bytes per cell, like the city job's map assembly.
 */
public final class Hotspots {
    private Hotspots() {}

    /** No-data code of the class map (kept inside the int8 range the codes fit). */
    public static final int CLASS_NODATA = -128;

    /** No-data value of the z-score map, as in the run's maps. */
    public static final float Z_NODATA = -9999f;

    /** Block edge of the global-statistics pass [cells], fixed so the result is tile-independent. */
    static final int STATS_BLOCK = 256;

    /** Output file names inside the output folder. */
    static final String ZSCORE = "zscore.tif", CLASSES = "class.tif", GEOJSON = "hotspots.geojson",
            GEOJSON_WGS84 = "hotspots_wgs84.geojson", POLYGONS = "polygons", DISTRICTS = "districts",
            SUMMARY = "summary.json";

    /** A checked analysis, ready to run: every input problem is found before any Spark work. */
    public record Prepared(RunFolder folder, RunFolder.Field field, DistanceBand band, HotspotOptions options,
            Path districtsFile) {
    }

    /**
     * What an analysis found.
     *
     * @param reference     whose mean and S were used: "own" or "baseline" (the run's map)
     * @param validCells    valid cells of the reference field; mean and sd are its
     * @param classCells    cells per class code (−3…3)
     * @param hotMeanValue  mean of the statistic over the hot cells, NaN when there are none
     * @param hotAreaRemovedM2 for a scenario whose baseline hotspots exist: baseline hot area minus
     *                      this one's [m²], else null
     */
    public record Result(Path outDir, String statistic, String scenario, String reference, String unit,
            long validCells, double mean,
            double sd, String band, HotspotClass.Thresholds thresholds, Map<Integer, Long> classCells,
            int hotPolygons, int coldPolygons, double hotAreaM2, double coldAreaM2, double hotMeanValue,
            Double hotAreaRemovedM2, List<String> outputs, List<String> notes) {
    }

    /** One tile's Gi* results, row-major over the tile. */
    record TileZ(int index, double[] z, double[] p, float[] values) implements Serializable {
        private static final long serialVersionUID = 1L;
    }

    /**
     * Checks everything an analysis needs: the run folder, the scenario and statistic, the band
     * distance against the cell size and the grid, the output folder, the districts file.
     */
    public static Prepared prepare(Path runDir, HotspotOptions opt) {
        RunFolder folder = RunFolder.open(runDir);
        RunFolder.Field field = folder.field(opt);
        RasterGrid g = field.grid();
        double a = g.pixelWidth(), b = -g.pixelHeight();
        double spanX = g.width() * a, spanY = g.height() * b;
        double d = opt.distanceM();
        if (d < Math.min(a, b)) {
            throw new UserInputException(String.format(Locale.ROOT, "--distance %s m is smaller than one cell of %s "
                    + "(%s m × %s m): the band would hold no neighbour. Fix: give at least %s m, e.g. --distance %s",
                    num(d), field.source().map(), num(a), num(b), num(Math.min(a, b)), num(Math.min(a, b) * 10)));
        }
        if (d > Math.min(spanX, spanY)) {
            throw new UserInputException(String.format(Locale.ROOT, "--distance %s m is larger than the grid of %s "
                    + "(%s m × %s m): every cell would be compared with nearly the whole city, which the global mean "
                    + "already is. Fix: give at most %s m, typically a block or two (e.g. 100 m)",
                    num(d), field.source().map(), num(spanX), num(spanY), num(Math.min(spanX, spanY))));
        }
        DistanceBand band = DistanceBand.of(d, a, b, opt.weights());
        if (Files.exists(field.outDir()) && !opt.replace()) {
            throw new UserInputException(field.outDir() + " already exists. Fix: add --replace to overwrite it");
        }
        Path districts = folder.districtsFile().orElse(null);
        if (districts != null && !Files.isRegularFile(districts)) {
            throw new UserInputException(folder.dir().resolve("manifest.json") + ", key run_file.inputs.districts: "
                    + districts + " is missing. Fix: put the districts file back, or run again without districts");
        }
        return new Prepared(folder, field, band, opt, districts);
    }

    /** {@link #prepare} then {@link #run(SparkSession, Prepared)}. */
    public static Result run(SparkSession spark, Path runDir, HotspotOptions opt) {
        return run(spark, prepare(runDir, opt));
    }

    /** Runs a prepared analysis on {@code spark} (left running). */
    public static Result run(SparkSession spark, Prepared p) {
        Path out = p.field().outDir();
        Path tmp = out.getParent().resolve("." + out.getFileName() + ".partial");
        try {
            Files.createDirectories(out.getParent());
            deleteTree(tmp);
            Files.createDirectories(tmp);
            Result r = execute(spark, p, tmp);
            if (Files.exists(out)) {
                deleteTree(out);
            }
            Files.move(tmp, out, StandardCopyOption.ATOMIC_MOVE);
            return new Result(out, r.statistic(), r.scenario(), r.reference(), r.unit(), r.validCells(), r.mean(), r.sd(), r.band(),
                    r.thresholds(), r.classCells(), r.hotPolygons(), r.coldPolygons(), r.hotAreaM2(), r.coldAreaM2(),
                    r.hotMeanValue(), r.hotAreaRemovedM2(), r.outputs(), r.notes());
        } catch (IOException e) {
            deleteQuietly(tmp);
            throw new UncheckedIOException(e);
        } catch (RuntimeException | Error e) {
            deleteQuietly(tmp);
            throw e;
        }
    }

    private static Result execute(SparkSession spark, Prepared p, Path tmp) throws IOException {
        RunFolder.Field field = p.field();
        RasterGrid grid = field.grid();
        DistanceBand band = p.band();
        HotspotOptions opt = p.options();
        List<String> notes = new ArrayList<>();
        JavaSparkContext jsc = JavaSparkContext.fromSparkContext(spark.sparkContext());
        FieldSource src = field.source().forTasks();

        // Pass 1: global n, mean, S over fixed blocks, merged in block order.
        FieldSource ref = field.reference().forTasks();
        List<int[]> blocks = windows(grid, STATS_BLOCK);
        List<GlobalMoments> parts = jsc.parallelize(blocks, Math.max(1, blocks.size())).map(w -> {
            GlobalMoments m = new GlobalMoments();
            m.addAll(ref.read(w[0], w[1], w[2], w[3]));
            return m;
        }).collect();
        GlobalMoments global = new GlobalMoments();
        parts.forEach(global::merge);
        if (global.count() < 2) {
            throw new UserInputException(ref.map() + ": " + global.count() + " cell(s) with data; Gi* needs at "
                    + "least 2. Fix: check the run's land cover (every cell is no data?)");
        }
        if (global.sd() == 0) {
            notes.add("every cell has the same value (" + global.mean() + "): nothing can stand out, all z = 0");
        }

        // Pass 2: Gi* per tile with a halo, and two-sided normal p-values.
        List<int[]> tiles = windows(grid, opt.tileSize());
        List<int[]> indexed = new ArrayList<>();
        for (int i = 0; i < tiles.size(); i++) {
            int[] t = tiles.get(i);
            indexed.add(new int[] {i, t[0], t[1], t[2], t[3]});
        }
        int gridW = grid.width(), gridH = grid.height();
        List<TileZ> results = new ArrayList<>(jsc.parallelize(indexed, Math.max(1, indexed.size()))
                .map(t -> tileZ(t, gridW, gridH, src, band, global)).collect());
        results.sort(Comparator.comparingInt(TileZ::index));

        int n = gridW * gridH;
        double[] z = new double[n];
        double[] pv = new double[n];
        float[] values = new float[n];
        for (TileZ t : results) {
            int[] w = tiles.get(t.index());
            for (int r = 0; r < w[3]; r++) {
                int dst = (w[1] + r) * gridW + w[0];
                System.arraycopy(t.z(), r * w[2], z, dst, w[2]);
                System.arraycopy(t.p(), r * w[2], pv, dst, w[2]);
                System.arraycopy(t.values(), r * w[2], values, dst, w[2]);
            }
        }

        // Benjamini–Hochberg over every valid cell, then classes.
        HotspotClass.Thresholds th = HotspotClass.Thresholds.of(BenjaminiHochberg.sortedValid(pv), opt.fdr());
        int[] classes = new int[n];
        float[] zMap = new float[n];
        Map<Integer, Long> classCells = new TreeMap<>();
        for (HotspotClass.Code c : HotspotClass.TABLE) {
            classCells.put(c.code(), 0L);
        }
        double hotSum = 0;
        long hot = 0;
        for (int i = 0; i < n; i++) {
            if (Double.isNaN(z[i])) {
                classes[i] = CLASS_NODATA;
                zMap[i] = Z_NODATA;
                continue;
            }
            int c = HotspotClass.code(z[i], pv[i], th);
            classes[i] = c;
            zMap[i] = (float) z[i];
            classCells.merge(c, 1L, Long::sum);
            if (c > 0) {
                hotSum += values[i];
                hot++;
            }
        }

        // Districts.
        DistrictCells districts = null;
        if (p.districtsFile() != null) {
            districts = opt.districts().load(p.districtsFile(), grid);
            if (districts == null) {
                notes.add("districts in " + p.districtsFile() + " not read: no district reader is wired in; "
                        + "the district table has one row for all cells");
            }
        }
        int nd = districts == null ? 0 : districts.districts().size();
        int[] cellDistrict = districts == null ? null : districts.cellDistrict();

        // Polygons.
        List<HotspotPolygons.Hotspot> polys = HotspotPolygons.build(grid, classes, CLASS_NODATA, values, z,
                cellDistrict, nd);
        writeMaps(tmp, grid, zMap, classes, field, band, opt, global);
        List<GeoJsonWriter.Feature> features = new ArrayList<>();
        List<Row> polyRows = new ArrayList<>();
        MathTransform toWgs = GeoJsonWriter.toWgs84(grid);
        double cellArea = grid.pixelAreaM2();
        int hotPolys = 0, coldPolys = 0;
        double hotArea = 0, coldArea = 0;
        int[] hotPolysByDistrict = new int[nd + 1];
        int[] coldPolysByDistrict = new int[nd + 1];
        for (HotspotPolygons.Hotspot h : polys) {
            String did = h.district() >= 0 ? districts.districts().get(h.district()).id() : null;
            String dname = h.district() >= 0 ? districts.districts().get(h.district()).name() : null;
            Map<String, Object> props = new LinkedHashMap<>();
            props.put("id", h.id());
            props.put("class", h.code());
            props.put("label", HotspotClass.label(h.code()));
            props.put("cells", h.cells());
            props.put("area_m2", h.areaM2());
            props.put("statistic", field.statistic());
            props.put("unit", field.unit());
            props.put("mean_value", h.mean());
            props.put("min_value", h.min());
            props.put("max_value", h.max());
            props.put("mean_z", h.meanZ());
            props.put("district_id", did);
            props.put("district_name", dname);
            features.add(new GeoJsonWriter.Feature(h.geometry(), props));
            Point c = h.geometry().getCentroid();
            double[] ll = {c.getX(), c.getY()};
            try {
                toWgs.transform(ll, 0, ll, 0, 1);
            } catch (TransformException e) {
                throw new IllegalStateException("cannot transform a centroid to WGS 84: " + e.getMessage(), e);
            }
            polyRows.add(RowFactory.create(h.id(), h.code(), HotspotClass.label(h.code()), h.cells(), h.areaM2(),
                    field.statistic(), field.unit(), h.mean(), h.min(), h.max(), h.meanZ(), did, dname,
                    c.getX(), c.getY(), ll[0], ll[1]));
            int slot = h.district() >= 0 ? h.district() : nd;
            if (h.code() > 0) {
                hotPolys++;
                hotArea += h.areaM2();
                hotPolysByDistrict[slot]++;
            } else {
                coldPolys++;
                coldArea += h.areaM2();
                coldPolysByDistrict[slot]++;
            }
        }
        GeoJsonWriter.writeGridCrs(tmp.resolve(GEOJSON), grid, features);
        GeoJsonWriter.writeWgs84(tmp.resolve(GEOJSON_WGS84), grid, features);
        if (grid.epsg() == 0) {
            notes.add(GEOJSON + " carries no CRS member (the grid's CRS has no EPSG code); its coordinates are in "
                    + "the maps' CRS");
        }
        HotspotTables.write(spark, polyRows, HotspotTables.POLYGONS, tmp.resolve(POLYGONS));
        HotspotTables.write(spark, districtRows(classes, values, cellDistrict, districts, cellArea,
                hotPolysByDistrict, coldPolysByDistrict), HotspotTables.DISTRICTS, tmp.resolve(DISTRICTS));

        Double removed = null;
        if (field.scenario() != null && field.referenceLabel().equals("baseline")) {
            Path base = p.folder().dir().resolve("hotspots").resolve(field.statistic()).resolve(SUMMARY);
            if (Files.isRegularFile(base)) {
                JsonNode b = new ObjectMapper().readTree(base.toFile());
                boolean same = b.path("distance_m").asDouble() == band.distanceM()
                        && b.path("weights").asText().equals(band.weights().key())
                        && b.path("fdr").asDouble() == opt.fdr();
                if (same) {
                    removed = b.path("hot_area_m2").asDouble() - hotArea;
                } else {
                    notes.add("the run's own hotspots (" + base.getParent() + ") used other settings (distance "
                            + b.path("distance_m").asText() + " m, " + b.path("weights").asText() + ", FDR "
                            + b.path("fdr").asText() + "): run them again with these to see the hot area removed");
                }
            } else {
                notes.add("no hotspots of the run itself for " + field.statistic() + " (" + base.getParent()
                        + "): run 'thermotile hotspots' on the run with the same settings to see the hot area removed");
            }
        } else if (field.scenario() != null && !field.statistic().startsWith(RunFolder.DELTA)) {
            notes.add("Gi* of the scenario against its own mean: hot spots are relative to the scenario's city, "
                    + "so their area is not comparable with the run's (use --reference baseline for that)");
        }
        List<String> outputs = List.of(ZSCORE, CLASSES, GEOJSON, GEOJSON_WGS84, POLYGONS + "/", DISTRICTS + "/", SUMMARY);
        Result r = new Result(tmp, field.statistic(), field.scenario(), field.referenceLabel(), field.unit(), global.count(), global.mean(),
                global.sd(), band.toString(), th, classCells, hotPolys, coldPolys, hotArea, coldArea,
                hot == 0 ? Double.NaN : hotSum / hot, removed, outputs, List.copyOf(notes));
        writeSummary(tmp.resolve(SUMMARY), r, p, global);
        return r;
    }

    /** One tile: window with halo (NaN beyond the grid), Gi*, p-values, and the core's values. */
    static TileZ tileZ(int[] t, int gridW, int gridH, FieldSource src, DistanceBand band, GlobalMoments global) {
        int c0 = t[1], r0 = t[2], w = t[3], h = t[4];
        int rc = band.radiusCols(), rr = band.radiusRows();
        int wc0 = Math.max(0, c0 - rc), wr0 = Math.max(0, r0 - rr);
        int wc1 = Math.min(gridW, c0 + w + rc), wr1 = Math.min(gridH, r0 + h + rr);
        float[] raw = src.read(wc0, wr0, wc1 - wc0, wr1 - wr0);
        int winW = w + 2 * rc, winH = h + 2 * rr;
        double[] win = new double[winW * winH];
        Arrays.fill(win, Double.NaN);
        int offC = wc0 - (c0 - rc), offR = wr0 - (r0 - rr);
        int rawW = wc1 - wc0;
        for (int r = 0; r < wr1 - wr0; r++) {
            for (int c = 0; c < rawW; c++) {
                win[(r + offR) * winW + c + offC] = raw[r * rawW + c];
            }
        }
        double[] z = new double[w * h];
        GiStar.zScores(win, w, h, band, global, z);
        double[] p = new double[w * h];
        float[] values = new float[w * h];
        NormalDistribution normal = new NormalDistribution(null, 0, 1);
        for (int r = 0; r < h; r++) {
            for (int c = 0; c < w; c++) {
                int i = r * w + c;
                p[i] = Double.isNaN(z[i]) ? Double.NaN : twoSidedP(normal, z[i]);
                values[i] = (float) win[(r + rr) * winW + c + rc];
            }
        }
        return new TileZ(t[0], z, p, values);
    }

    /** Two-sided p-value of a standard normal z: p = 2 Φ(−|z|) (Φ from Commons Math, via erfc). */
    static double twoSidedP(NormalDistribution normal, double z) {
        return Math.min(1.0, 2.0 * normal.cumulativeProbability(-Math.abs(z)));
    }

    /** Windows {col0, row0, width, height} of edge {@code size} covering the grid, row-major. */
    static List<int[]> windows(RasterGrid g, int size) {
        List<int[]> out = new ArrayList<>();
        for (int r0 = 0; r0 < g.height(); r0 += size) {
            for (int c0 = 0; c0 < g.width(); c0 += size) {
                out.add(new int[] {c0, r0, Math.min(size, g.width() - c0), Math.min(size, g.height() - r0)});
            }
        }
        return out;
    }

    private static List<Row> districtRows(int[] classes, float[] values, int[] cellDistrict, DistrictCells d,
            double cellArea, int[] hotPolys, int[] coldPolys) {
        int nd = d == null ? 0 : d.districts().size();
        long[] cells = new long[nd + 1], hot = new long[nd + 1], hot99 = new long[nd + 1], cold = new long[nd + 1],
                cold99 = new long[nd + 1];
        double[] sum = new double[nd + 1];
        for (int i = 0; i < classes.length; i++) {
            int c = classes[i];
            if (c == CLASS_NODATA) {
                continue;
            }
            int k = cellDistrict == null || cellDistrict[i] < 0 ? nd : cellDistrict[i];
            cells[k]++;
            sum[k] += values[i];
            if (c > 0) {
                hot[k]++;
                hot99[k] += c == HotspotClass.HOT_99 ? 1 : 0;
            } else if (c < 0) {
                cold[k]++;
                cold99[k] += c == HotspotClass.COLD_99 ? 1 : 0;
            }
        }
        List<Row> rows = new ArrayList<>();
        for (int k = 0; k <= nd; k++) {
            if (k == nd && d != null && cells[k] == 0) {
                continue;
            }
            String id = k < nd ? d.districts().get(k).id() : null;
            String name = k < nd ? d.districts().get(k).name() : d == null ? "(all cells)" : "(outside districts)";
            Double mean = cells[k] == 0 ? null : sum[k] / cells[k];
            Double hotShare = cells[k] == 0 ? null : (double) hot[k] / cells[k];
            Double coldShare = cells[k] == 0 ? null : (double) cold[k] / cells[k];
            rows.add(RowFactory.create(id, name, cells[k], cells[k] * cellArea, mean, hot[k], hot[k] * cellArea,
                    hotShare, hot99[k], cold[k], cold[k] * cellArea, coldShare, cold99[k], hotPolys[k], coldPolys[k]));
        }
        return rows;
    }

    private static void writeMaps(Path tmp, RasterGrid grid, float[] zMap, int[] classes, RunFolder.Field field,
            DistanceBand band, HotspotOptions opt, GlobalMoments g) throws IOException {
        Path zf = tmp.resolve(ZSCORE);
        GeoTiffWriter.writeFloat(zf, grid, zMap, Z_NODATA);
        Map<String, String> common = new LinkedHashMap<>();
        common.put("STATISTIC", field.statistic());
        common.put("UNIT", ascii(field.unit()));
        common.put("SOURCE", ascii(field.description()));
        common.put("SCENARIO", field.scenario() == null ? RunFolder.BASELINE : ascii(field.scenario()));
        common.put("REFERENCE", field.referenceLabel());
        common.put("DISTANCE_M", num(band.distanceM()));
        common.put("WEIGHTS", band.weights().key());
        common.put("BAND_CELLS", Integer.toString(band.size()));
        common.put("VALID_CELLS", Long.toString(g.count()));
        common.put("GLOBAL_MEAN", Double.toString(g.mean()));
        common.put("GLOBAL_SD", Double.toString(g.sd()));
        common.put("METHOD", "Getis-Ord Gi* z-score (Getis and Ord 1992; Ord and Getis 1995)");
        Map<String, String> zItems = new LinkedHashMap<>(common);
        TiffMetadata.addAscii(zf, Map.of(
                TiffMetadata.IMAGE_DESCRIPTION, "thermotile Gi* z-scores of " + field.statistic() + ", "
                        + num(band.distanceM()) + " m " + band.weights().key() + " band; no data -9999",
                TiffMetadata.GDAL_METADATA, TiffMetadata.gdalMetadataXml(zItems)));

        Path cf = tmp.resolve(CLASSES);
        GeoTiffWriter.writeInt(cf, grid, GeoTiffWriter.IntType.INT16, classes, OptionalInt.of(CLASS_NODATA));
        Map<String, String> cItems = new LinkedHashMap<>();
        StringBuilder table = new StringBuilder();
        for (HotspotClass.Code c : HotspotClass.TABLE) {
            cItems.put("CLASS_" + c.code(), c.label());
            table.append(c.code()).append(" = ").append(c.label()).append("; ");
        }
        cItems.put("CLASS_" + CLASS_NODATA, "no data");
        table.append(CLASS_NODATA).append(" = no data");
        cItems.putAll(common);
        cItems.put("FDR", num(opt.fdr()));
        cItems.put("SIGNIFICANCE", "two-sided normal p-values, Benjamini-Hochberg (1995) FDR over all valid cells; "
                + "class 3/2/1 passes at FDR 0.01/0.05/0.10, and every class also at FDR " + num(opt.fdr()));
        TiffMetadata.addAscii(cf, Map.of(
                TiffMetadata.IMAGE_DESCRIPTION, "thermotile hotspot classes of " + field.statistic() + ": " + table,
                TiffMetadata.GDAL_METADATA, TiffMetadata.gdalMetadataXml(cItems)));
    }

    private static void writeSummary(Path file, Result r, Prepared p, GlobalMoments g) throws IOException {
        ObjectMapper om = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = om.createObjectNode();
        root.put("format", "thermotile-hotspots/1");
        root.put("statistic", r.statistic());
        root.put("unit", r.unit());
        root.put("scenario", r.scenario() == null ? RunFolder.BASELINE : r.scenario());
        root.put("source", p.field().description());
        root.put("reference", p.field().referenceLabel());
        root.put("distance_m", p.band().distanceM());
        root.put("weights", p.band().weights().key());
        root.put("band_cells", p.band().size());
        root.put("fdr", p.options().fdr());
        ObjectNode gl = root.putObject("global");
        gl.put("valid_cells", g.count());
        gl.put("mean", g.mean());
        gl.put("sd", g.sd());
        gl.put("min", g.min());
        gl.put("max", g.max());
        ObjectNode t = root.putObject("p_thresholds");
        t.put("class_1", r.thresholds().p90());
        t.put("class_2", r.thresholds().p95());
        t.put("class_3", r.thresholds().p99());
        ObjectNode cc = root.putObject("class_cells");
        r.classCells().forEach((k, v) -> cc.put(Integer.toString(k), v));
        root.put("hot_polygons", r.hotPolygons());
        root.put("cold_polygons", r.coldPolygons());
        root.put("hot_area_m2", r.hotAreaM2());
        root.put("cold_area_m2", r.coldAreaM2());
        if (Double.isNaN(r.hotMeanValue())) {
            root.putNull("hot_mean_value");
        } else {
            root.put("hot_mean_value", r.hotMeanValue());
        }
        if (r.hotAreaRemovedM2() != null) {
            root.put("hot_area_removed_m2", r.hotAreaRemovedM2());
        }
        ArrayNode outs = root.putArray("outputs");
        r.outputs().forEach(outs::add);
        ArrayNode notes = root.putArray("notes");
        r.notes().forEach(notes::add);
        root.put("caution", "Surface temperature is not air temperature nor a heat-health index. Hotspots are "
                + "estimates for comparing options; defer to local building codes and licensed professionals.");
        Files.writeString(file, om.writeValueAsString(root) + "\n");
    }

    /** Text as ASCII for TIFF tags: °C as degC, other non-ASCII characters as '?'. */
    static String ascii(String s) {
        String t = s.replace("°C", "degC").replace("²", "2");
        StringBuilder b = new StringBuilder(t.length());
        for (char ch : t.toCharArray()) {
            b.append(ch < 128 ? ch : '?');
        }
        return b.toString();
    }

    static String num(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : Double.toString(v);
    }

    static void deleteQuietly(Path dir) {
        org.thermotile.jobs.io.Folders.deleteQuietly(dir);
    }

    static void deleteTree(Path dir) throws IOException {
        org.thermotile.jobs.io.Folders.deleteTree(dir);
    }
}
