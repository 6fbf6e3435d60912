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
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.catalogue.OutputDescriptions;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.model.hotspot.AnalysisGrid;
import org.thermotile.model.hotspot.DistanceBand;
import org.thermotile.model.hotspot.ExcessBand;
import org.thermotile.model.hotspot.FalseDiscovery;
import org.thermotile.model.hotspot.GlobalMoments;
import org.thermotile.model.hotspot.HotAreas;
import org.thermotile.model.hotspot.MoransI;

/**
 * The hot-spot analysis of a finished run at planning scale, written under
 * RUN/hotspots/STATISTIC/ (or RUN/scenarios/NAME/hotspots/STATISTIC/):
 * <ol>
 *   <li>a Spark pass aggregates the statistic's map (and the reference's) to the analysis grid of
 *       {@code cell_size_m}, a whole multiple of the simulation cell, by area-weighted means
 *       ({@link AnalysisGrid}); one task per window aligned to the analysis cells;</li>
 *   <li>the driver takes the band distance as given, or at the peak of Moran's I z-score over
 *       distances ({@link MoransI}), computes Gi*, two-sided normal p-values (Commons Math
 *       {@link NormalDistribution}), BH or BY q-values and the excess over the reference's median
 *       ({@link HotAreas}), drops areas below the minimum area, and codes the cells in signed excess
 *       bands ({@link ExcessBand});</li>
 *   <li>areas (4-connected cells of one sign) become polygons with holes (JTS), sorted by area ×
 *       mean excess, largest first; maps, tables and a summary are written into a temporary sibling
 *       folder renamed into place only when all of it succeeded.</li>
 * </ol>
 * The analysis grid is small (a 40 m cell holds 100 cells of 4 m), so steps 2–3 run in the driver.
 */
public final class Hotspots {
    private Hotspots() {}

    /** No-data code of the band map (kept inside the int16 range). */
    public static final int CLASS_NODATA = -128;

    /** No-data value of the float maps, as in the run's maps. */
    public static final float Z_NODATA = -9999f;

    /** Largest number of distances the Moran's I rule scans (our choice; cost O(n × band) each). */
    static final int MORAN_STEPS = 12;

    /** Output file names inside the output folder. */
    static final String ZSCORE = "zscore.tif", BAND = "excess_band.tif", QVALUE = "qvalue.tif",
            EXCESS = "excess_k.tif", GEOJSON = "hotspots.geojson", GEOJSON_WGS84 = "hotspots_wgs84.geojson",
            POLYGONS = "polygons", DISTRICTS = "districts", CHANGE = "programme_change", SUMMARY = "summary.json",
            COVERAGE = "coverage.tif";

    /** A checked analysis, ready to run: every input problem is found before any Spark work. */
    public record Prepared(RunFolder folder, RunFolder.Field field, int factor, RasterGrid analysis, DistanceBand band,
            HotspotOptions options, Path districtsFile, DistrictCells districts) {
    }

    /**
     * What an analysis found.
     *
     * @param validCells    analysis cells with data in the reference field; mean and sd are theirs
     * @param referenceK    the reference's area-weighted median x̃ [unit of the statistic]
     * @param bandCells     analysis cells per band code
     * @param hotAreaM2     data area of the hot areas kept [m²]
     * @param cityAreaM2    data area of the whole field [m²]
     * @param hotAreaRemovedM2 for a scenario whose baseline hot spots exist with the same settings:
     *                      baseline hot area minus this one's [m²], else null
     */
    public record Result(Path outDir, String statistic, String scenario, String reference, String unit,
            long validCells, double mean, double sd, String band, double distanceM, String distanceRule,
            double analysisCellM, double referenceK, String fdrMethod, double fdr, double minExcessK,
            Map<Integer, Long> bandCells, int hotPolygons, int coldPolygons, double hotAreaM2, double coldAreaM2,
            double cityAreaM2, double largestPolygonM2, Double hotAreaRemovedM2, List<String> outputs,
            List<String> notes) {

        /** A copy in another folder. */
        Result in(Path dir) {
            return new Result(dir, statistic, scenario, reference, unit, validCells, mean, sd, band, distanceM,
                    distanceRule, analysisCellM, referenceK, fdrMethod, fdr, minExcessK, bandCells, hotPolygons,
                    coldPolygons, hotAreaM2, coldAreaM2, cityAreaM2, largestPolygonM2, hotAreaRemovedM2, outputs,
                    notes);
        }
    }

    /** One window's aggregation: its analysis-cell origin and size, means and valid areas. */
    record Part(int col0, int row0, int width, int height, double[] mean, double[] area) implements Serializable {
        private static final long serialVersionUID = 1L;
    }

    /**
     * Checks everything an analysis needs: the run folder, the scenario and statistic, the analysis
     * cell against the simulation cell, the band distance against the analysis cell and the grid,
     * the output folder, the districts file and that its polygons meet the grid.
     */
    public static Prepared prepare(Path runDir, HotspotOptions opt) {
        RunFolder folder = RunFolder.open(runDir);
        RunFolder.Field field = folder.field(opt);
        RasterGrid g = field.grid();
        double a = g.pixelWidth();
        double sim = Math.max(a, -g.pixelHeight());
        int f = factor(field, opt);
        double cell = f * sim;
        RasterGrid an = new RasterGrid((g.width() + f - 1) / f, (g.height() + f - 1) / f, g.originX(), g.originY(),
                a * f, g.pixelHeight() * f, g.epsg(), g.crsWkt());
        if ((long) an.width() * an.height() < 3) {
            throw new UserInputException(String.format(Locale.ROOT, "--cell-size %s m leaves %d × %d analysis cells "
                    + "on the grid of %s; Gi* needs at least 3. Fix: give a smaller cell, e.g. --cell-size %s",
                    num(cell), an.width(), an.height(), field.source().map(), num(sim)));
        }
        double spanX = an.width() * cell, spanY = an.height() * cell;
        double d = opt.distanceM();
        DistanceBand band = null;
        if (!Double.isNaN(d)) {
            if (d < cell) {
                throw new UserInputException(String.format(Locale.ROOT, "--distance (distance_m) %s m is smaller than "
                        + "one analysis cell (%s m): the band would hold no neighbour. Fix: give at least %s m, or leave "
                        + "it out to take the peak of Moran's I", num(d), num(cell), num(cell)));
            }
            if (d > Math.min(spanX, spanY)) {
                throw new UserInputException(String.format(Locale.ROOT, "--distance %s m is larger than the grid of %s "
                        + "(%s m × %s m): every cell would be compared with nearly the whole city, which the global "
                        + "mean already is. Fix: give at most %s m, typically a block or two (e.g. 100 m)",
                        num(d), field.source().map(), num(spanX), num(spanY), num(Math.min(spanX, spanY))));
            }
            band = DistanceBand.of(d, cell, cell, opt.weights());
        }
        if (Files.exists(field.outDir()) && !opt.replace()) {
            throw new UserInputException(field.outDir() + " already exists. Fix: add --replace to overwrite it");
        }
        Path districts = folder.districtsFile().orElse(null);
        if (districts != null && !Files.isRegularFile(districts)) {
            throw new UserInputException(folder.dir().resolve("manifest.json") + ", key run_file.inputs.districts: "
                    + districts + " is missing. Fix: put the districts file back, or run again without districts");
        }
        DistrictCells dc = districts == null ? null : opt.districts().load(districts, an);
        if (dc != null) {
            int[] count = new int[dc.districts().size()];
            for (int k : dc.cellDistrict()) {
                if (k >= 0) {
                    count[k]++;
                }
            }
            for (DistrictCells.District x : dc.districts()) {
                if (count[x.index()] == 0) {
                    throw new UserInputException(String.format(Locale.ROOT, "%s: polygon '%s' (%s) holds the centre of "
                            + "no analysis cell of %s m on the grid of %s (outside the grid, or smaller than a cell). "
                            + "Fix: remove it or correct its coordinates (the grid's CRS is %s), or give a smaller "
                            + "--cell-size", districts, x.id(), x.name(), num(cell), field.source().map(), g.crsLabel()));
                }
            }
        }
        return new Prepared(folder, field, f, an, band, opt, districts, dc);
    }

    /**
     * The analysis cell as a whole number f of simulation cells per edge: {@code cell_size_m} checked
     * against the field's simulation cell, or 40 m rounded up to a multiple of it.
     */
    static int factor(RunFolder.Field field, HotspotOptions opt) {
        RasterGrid g = field.grid();
        double sim = Math.max(g.pixelWidth(), -g.pixelHeight());
        double cellM = opt.cellSizeM();
        int f;
        if (Double.isNaN(cellM)) {
            f = (int) Math.max(1, Math.ceil(HotspotOptions.DEFAULT_CELL_SIZE_M / sim - 1e-9));
        } else {
            if (cellM < sim * (1 - 1e-9)) {
                throw new UserInputException(String.format(Locale.ROOT, "--cell-size (cell_size_m) %s m is smaller than "
                        + "the simulation cell of %s (%s m): an analysis cell must hold whole simulation cells. Fix: give "
                        + "a whole multiple of %s m, e.g. --cell-size %s", num(cellM), field.source().map(), num(sim),
                        num(sim), num(sim * Math.max(1, Math.round(HotspotOptions.DEFAULT_CELL_SIZE_M / sim)))));
            }
            try {
                f = AnalysisGrid.factor(cellM, sim);
            } catch (IllegalArgumentException e) {
                long k = Math.max(1, Math.round(cellM / sim));
                throw new UserInputException("--cell-size (cell_size_m) " + num(cellM) + " m: " + e.getMessage()
                        + " of " + field.source().map() + ". Fix: give a whole multiple, e.g. --cell-size "
                        + num(k * sim));
            }
        }
        return f;
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
            return r.in(out);
        } catch (IOException e) {
            deleteQuietly(tmp);
            throw new UncheckedIOException(e);
        } catch (RuntimeException | Error e) {
            deleteQuietly(tmp);
            throw e;
        }
    }

    /** The field aggregated to the analysis grid by Spark tasks over windows aligned to the analysis cells. */
    static AnalysisGrid aggregate(JavaSparkContext jsc, FieldSource src, RasterGrid grid, int f, int tileSize) {
        int step = f * Math.max(1, tileSize / f);
        List<int[]> wins = windows(grid, step);
        double cellArea = grid.pixelAreaM2();
        List<Part> parts = new ArrayList<>(jsc.parallelize(wins, Math.max(1, wins.size())).map(w -> {
            AnalysisGrid a = AnalysisGrid.aggregate(src.read(w[0], w[1], w[2], w[3]), w[2], w[3], cellArea, f);
            return new Part(w[0] / f, w[1] / f, a.width(), a.height(), a.mean(), a.validAreaM2());
        }).collect());
        int aw = (grid.width() + f - 1) / f, ah = (grid.height() + f - 1) / f;
        double[] mean = new double[aw * ah], area = new double[aw * ah], cov = new double[aw * ah];
        for (Part pt : parts) {
            for (int r = 0; r < pt.height(); r++) {
                System.arraycopy(pt.mean(), r * pt.width(), mean, (pt.row0() + r) * aw + pt.col0(), pt.width());
                System.arraycopy(pt.area(), r * pt.width(), area, (pt.row0() + r) * aw + pt.col0(), pt.width());
            }
        }
        for (int k = 0; k < cov.length; k++) {
            cov[k] = area[k] / (cellArea * f * (double) f);
        }
        return new AnalysisGrid(f, aw, ah, mean, area, cov);
    }

    private static Result execute(SparkSession spark, Prepared p, Path tmp) throws IOException {
        RunFolder.Field field = p.field();
        RasterGrid grid = field.grid();
        RasterGrid an = p.analysis();
        HotspotOptions opt = p.options();
        List<String> notes = new ArrayList<>();
        JavaSparkContext jsc = JavaSparkContext.fromSparkContext(spark.sparkContext());
        FieldSource src = field.source().forTasks();
        FieldSource ref = field.reference().forTasks();
        int f = p.factor();
        double cell = an.pixelWidth();

        // Coverage rule: analysis cells with less than the minimum share of valid simulation cells
        // (grid edge, no-data) are left out of Gi*, the global moments and the median.
        AnalysisGrid raw = aggregate(jsc, src, grid, f, opt.tileSize());
        AnalysisGrid agg = raw.withMinCoverage(opt.minCoverage());
        AnalysisGrid refAgg = ref.equals(src) ? agg
                : aggregate(jsc, ref, grid, f, opt.tileSize()).withMinCoverage(opt.minCoverage());
        int below = raw.belowCoverage(opt.minCoverage());
        if (below > 0) {
            notes.add(String.format(Locale.ROOT, "%d analysis cell(s) with data cover less than %s of their area "
                    + "(grid edge or no-data) and are left out (--min-coverage)", below, num(opt.minCoverage())));
        }
        GlobalMoments global = new GlobalMoments();
        for (double v : refAgg.mean()) {
            global.add(v);
        }
        if (global.count() < 3) {
            throw new UserInputException(ref.map() + ": " + global.count() + " analysis cell(s) of " + num(cell)
                    + " m with data; Gi* needs at least 3. Fix: check the run's land cover, or give a smaller --cell-size");
        }
        if (global.sd() == 0) {
            notes.add("every analysis cell has the same value (" + global.mean() + "): nothing can stand out, all z = 0");
        }
        double median = refAgg.weightedMedian();

        // Band distance: given, or the peak of Moran's I z-score (Moran 1950; Cliff & Ord 1981).
        DistanceBand band = p.band();
        String rule = "given";
        MoransI.Result[] scan = null;
        if (band == null) {
            int steps = (int) Math.max(1, Math.min(MORAN_STEPS, Math.floor(Math.min(an.width(), an.height()) / 2.0)));
            scan = MoransI.scan(agg.mean(), an.width(), an.height(), cell, steps);
            band = DistanceBand.of(MoransI.peak(scan), cell, cell, opt.weights());
            rule = "moran_peak";
        }

        NormalDistribution normal = new NormalDistribution(null, 0, 1);
        HotAreas.Result hr = HotAreas.analyse(agg.mean(), an.width(), an.height(), band, global, median,
                opt.fdrMethod(), opt.fdr(), opt.minExcessK(), normal::cumulativeProbability, CLASS_NODATA);
        double cellArea = an.pixelAreaM2();
        int minCells = (int) Math.ceil(opt.minAreaM2() / cellArea - 1e-9);
        int[] codes = HotAreas.dropSmall(hr.codes(), an.width(), an.height(), CLASS_NODATA, Math.max(1, minCells));
        int n = codes.length;

        Map<Integer, Long> bandCells = new TreeMap<>(Comparator.reverseOrder());
        for (ExcessBand.Band bd : ExcessBand.table(opt.minExcessK())) {
            bandCells.put(bd.code(), 0L);
        }
        double hotArea = 0, coldArea = 0, city = 0;
        for (int i = 0; i < n; i++) {
            if (codes[i] == CLASS_NODATA) {
                continue;
            }
            bandCells.merge(codes[i], 1L, Long::sum);
            city += agg.validAreaM2()[i];
            if (codes[i] > 0) {
                hotArea += agg.validAreaM2()[i];
            } else if (codes[i] < 0) {
                coldArea += agg.validAreaM2()[i];
            }
        }

        DistrictCells districts = p.districts();
        if (p.districtsFile() != null && districts == null) {
            notes.add("districts in " + p.districtsFile() + " not read: no district reader is wired in; "
                    + "the district table has one row for all cells");
        }
        int nd = districts == null ? 0 : districts.districts().size();
        int[] cellDistrict = districts == null ? null : districts.cellDistrict();

        // Polygons: one per area of one sign, largest area × |mean excess| first.
        int[] sign = new int[n];
        float[] meanF = new float[n];
        for (int i = 0; i < n; i++) {
            sign[i] = codes[i] == CLASS_NODATA ? CLASS_NODATA : Integer.signum(codes[i]);
            meanF[i] = (float) agg.mean()[i];
        }
        List<HotspotPolygons.Hotspot> polys = HotspotPolygons.build(an, sign, CLASS_NODATA, meanF, hr.z(), hr.excessK(),
                hr.q(), codes, cellDistrict, nd);
        writeMaps(tmp, an, hr, codes, field, band, opt, global, median, rule, agg.coverage());
        List<GeoJsonWriter.Feature> features = new ArrayList<>();
        List<Row> polyRows = new ArrayList<>();
        MathTransform toWgs = GeoJsonWriter.toWgs84(an);
        int hotPolys = 0, coldPolys = 0;
        int[] hotPolysByDistrict = new int[nd + 1];
        int[] coldPolysByDistrict = new int[nd + 1];
        double largest = 0;
        for (HotspotPolygons.Hotspot h : polys) {
            String did = h.district() >= 0 ? districts.districts().get(h.district()).id() : null;
            String dname = h.district() >= 0 ? districts.districts().get(h.district()).name() : null;
            String kind = h.sign() > 0 ? "warmer" : "cooler";
            String label = ExcessBand.label(h.topBand(), opt.minExcessK());
            Map<String, Object> props = new LinkedHashMap<>();
            props.put("id", h.id());
            props.put("kind", kind);
            props.put("top_band", h.topBand());
            props.put("label", label);
            props.put("cells", h.cells());
            props.put("area_m2", h.areaM2());
            props.put("holes", h.geometry().getNumInteriorRing());
            props.put("mean_excess_k", h.meanExcess());
            props.put("max_abs_excess_k", h.maxAbsExcess());
            props.put("area_x_excess_k_m2", h.areaM2() * Math.abs(h.meanExcess()));
            props.put("max_q", h.maxQ());
            props.put("statistic", field.statistic());
            props.put("unit", field.unit());
            props.put("mean_value", h.mean());
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
            polyRows.add(RowFactory.create(h.id(), kind, h.topBand(), label, h.cells(), h.areaM2(),
                    h.geometry().getNumInteriorRing(), h.meanExcess(), h.maxAbsExcess(),
                    h.areaM2() * Math.abs(h.meanExcess()), h.maxQ(), field.statistic(), field.unit(), h.mean(),
                    h.meanZ(), did, dname, c.getX(), c.getY(), ll[0], ll[1]));
            int slot = h.district() >= 0 ? h.district() : nd;
            largest = Math.max(largest, h.areaM2());
            if (h.sign() > 0) {
                hotPolys++;
                hotPolysByDistrict[slot]++;
            } else {
                coldPolys++;
                coldPolysByDistrict[slot]++;
            }
        }
        GeoJsonWriter.writeGridCrs(tmp.resolve(GEOJSON), an, features);
        GeoJsonWriter.writeWgs84(tmp.resolve(GEOJSON_WGS84), an, features);
        if (grid.epsg() == 0) {
            notes.add(GEOJSON + " carries no CRS member (the grid's CRS has no EPSG code); its coordinates are in "
                    + "the maps' CRS");
        }
        HotspotTables.write(spark, polyRows, HotspotTables.POLYGONS, tmp.resolve(POLYGONS));
        HotspotTables.write(spark, districtRows(codes, agg, hr.excessK(), cellDistrict, districts,
                hotPolysByDistrict, coldPolysByDistrict), HotspotTables.DISTRICTS, tmp.resolve(DISTRICTS));

        // Programmes: the hot area a scenario removes or adds against the run's own hot spots.
        Double removed = null;
        List<String> outputs = new ArrayList<>(List.of(BAND, EXCESS, QVALUE, ZSCORE, COVERAGE, GEOJSON, GEOJSON_WGS84,
                POLYGONS + "/", DISTRICTS + "/"));
        List<double[]> change = null;
        if (field.scenario() != null && field.referenceLabel().equals("baseline")) {
            Path baseDir = p.folder().dir().resolve("hotspots").resolve(field.statistic());
            Path base = baseDir.resolve(SUMMARY);
            if (Files.isRegularFile(base)) {
                JsonNode b = new ObjectMapper().readTree(base.toFile());
                boolean same = b.path("distance_m").asDouble() == band.distanceM()
                        && b.path("weights").asText().equals(band.weights().key())
                        && b.path("fdr").asDouble() == opt.fdr()
                        && b.path("fdr_method").asText().equals(opt.fdrMethod().key())
                        && b.path("analysis_cell_m").asDouble() == cell
                        && b.path("min_excess_k").asDouble() == opt.minExcessK()
                        && b.path("min_area_m2").asDouble() == opt.minAreaM2()
                        && b.path("min_coverage").asDouble(0) == opt.minCoverage();
                if (same && Files.isRegularFile(baseDir.resolve(BAND))) {
                    removed = b.path("hot_area_m2").asDouble() - hotArea;
                    int[] baseCodes = readCodes(baseDir.resolve(BAND));
                    change = changeByDistrict(baseCodes, codes, agg.validAreaM2(), cellDistrict, nd);
                    HotspotTables.write(spark, changeRows(change, districts), HotspotTables.CHANGE, tmp.resolve(CHANGE));
                    outputs.add(CHANGE + "/");
                } else {
                    notes.add("the run's own hot spots (" + base.getParent() + ") used other settings (distance "
                            + b.path("distance_m").asText() + " m, " + b.path("weights").asText() + ", "
                            + b.path("fdr_method").asText() + " " + b.path("fdr").asText() + ", cell "
                            + b.path("analysis_cell_m").asText() + " m): run them again with these (give --distance "
                            + num(band.distanceM()) + ") to see the hot area removed");
                }
            } else {
                notes.add("no hot spots of the run itself for " + field.statistic() + " (" + base.getParent()
                        + "): run 'thermotile hotspots' on the run with the same settings to see the hot area removed");
            }
        } else if (field.scenario() != null && !field.statistic().startsWith(RunFolder.DELTA)) {
            notes.add("Gi* of the scenario against its own median and spread: hot areas are relative to the scenario's "
                    + "city, so their area is not comparable with the run's (use --reference baseline for that)");
        }
        outputs.add(SUMMARY);
        Result r = new Result(tmp, field.statistic(), field.scenario(), field.referenceLabel(), field.unit(),
                global.count(), global.mean(), global.sd(), band.toString(), band.distanceM(), rule, cell, median,
                opt.fdrMethod().key(), opt.fdr(), opt.minExcessK(), bandCells, hotPolys, coldPolys, hotArea, coldArea,
                city, largest, removed, List.copyOf(outputs), List.copyOf(notes));
        writeSummary(tmp.resolve(SUMMARY), r, p, global, band, scan, change, districts);
        return r;
    }

    /** The codes of a band map written by an earlier analysis. */
    static int[] readCodes(Path file) {
        try (GeoTiffReader rd = GeoTiffReader.openSingleBand(file)) {
            float[] v = rd.readFloatWindow(0, 0, rd.grid().width(), rd.grid().height());
            int[] out = new int[v.length];
            for (int i = 0; i < v.length; i++) {
                out[i] = Float.isNaN(v[i]) ? CLASS_NODATA : Math.round(v[i]);
            }
            return out;
        }
    }

    /**
     * Per district (index nd: outside every district, or all cells): {baseline hot area, scenario
     * hot area, area removed (hot before, not after), area added (hot after, not before)} [m²],
     * over the analysis cells' data areas.
     */
    static List<double[]> changeByDistrict(int[] base, int[] scen, double[] area, int[] cellDistrict, int nd) {
        List<double[]> out = new ArrayList<>();
        for (int k = 0; k <= nd; k++) {
            out.add(new double[4]);
        }
        for (int i = 0; i < scen.length; i++) {
            boolean hb = base[i] != CLASS_NODATA && base[i] > 0, hs = scen[i] != CLASS_NODATA && scen[i] > 0;
            double[] row = out.get(cellDistrict == null || cellDistrict[i] < 0 ? nd : cellDistrict[i]);
            row[0] += hb ? area[i] : 0;
            row[1] += hs ? area[i] : 0;
            row[2] += hb && !hs ? area[i] : 0;
            row[3] += hs && !hb ? area[i] : 0;
        }
        return out;
    }

    private static List<Row> changeRows(List<double[]> change, DistrictCells d) {
        int nd = d == null ? 0 : d.districts().size();
        List<Row> rows = new ArrayList<>();
        for (int k = 0; k <= nd; k++) {
            double[] c = change.get(k);
            if (k == nd && d != null && c[0] == 0 && c[1] == 0) {
                continue;
            }
            String id = k < nd ? d.districts().get(k).id() : null;
            String name = k < nd ? d.districts().get(k).name() : d == null ? "(all cells)" : "(outside districts)";
            rows.add(RowFactory.create(id, name, c[0], c[1], c[2], c[3], c[2] - c[3]));
        }
        return rows;
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

    private static List<Row> districtRows(int[] codes, AnalysisGrid agg, double[] excess, int[] cellDistrict,
            DistrictCells d, int[] hotPolys, int[] coldPolys) {
        int nd = d == null ? 0 : d.districts().size();
        long[] cells = new long[nd + 1];
        double[] area = new double[nd + 1], sum = new double[nd + 1], hot = new double[nd + 1], cold = new double[nd + 1],
                hotEx = new double[nd + 1];
        for (int i = 0; i < codes.length; i++) {
            int c = codes[i];
            if (c == CLASS_NODATA) {
                continue;
            }
            int k = cellDistrict == null || cellDistrict[i] < 0 ? nd : cellDistrict[i];
            double a = agg.validAreaM2()[i];
            cells[k]++;
            area[k] += a;
            sum[k] += a * agg.mean()[i];
            if (c > 0) {
                hot[k] += a;
                hotEx[k] += a * excess[i];
            } else if (c < 0) {
                cold[k] += a;
            }
        }
        List<Row> rows = new ArrayList<>();
        for (int k = 0; k <= nd; k++) {
            if (k == nd && d != null && cells[k] == 0) {
                continue;
            }
            String id = k < nd ? d.districts().get(k).id() : null;
            String name = k < nd ? d.districts().get(k).name() : d == null ? "(all cells)" : "(outside districts)";
            Double mean = area[k] == 0 ? null : sum[k] / area[k];
            Double hotShare = area[k] == 0 ? null : hot[k] / area[k];
            Double coldShare = area[k] == 0 ? null : cold[k] / area[k];
            Double hotExcess = hot[k] == 0 ? null : hotEx[k] / hot[k];
            rows.add(RowFactory.create(id, name, cells[k], area[k], mean, hot[k], hotShare, hotExcess, cold[k], coldShare,
                    hotPolys[k], coldPolys[k]));
        }
        return rows;
    }

    /** The coding as GDAL metadata items: BAND_code = label, and how a cell gets its band. */
    static Map<String, String> coding(double minExcessK) {
        Map<String, String> m = new LinkedHashMap<>();
        for (ExcessBand.Band b : ExcessBand.table(minExcessK)) {
            m.put("BAND_" + b.code(), b.label());
        }
        m.put("BAND_" + CLASS_NODATA, "no data");
        m.put("CODING", "code = signed lower edge of the excess band in tenths of a kelvin; a cell is warmer (cooler) "
                + "when its q-value <= FDR, its Gi* z > 0 (< 0) and its excess over the city's median >= (<= -) the "
                + "minimum excess; bands at 1, 2, 4 times the minimum excess; areas below the minimum area not distinct");
        return m;
    }

    private static void writeMaps(Path tmp, RasterGrid an, HotAreas.Result hr, int[] codes, RunFolder.Field field,
            DistanceBand band, HotspotOptions opt, GlobalMoments g, double median, String rule, double[] coverage)
            throws IOException {
        Map<String, String> common = new LinkedHashMap<>();
        common.put("STATISTIC", field.statistic());
        common.put("UNIT", ascii(field.unit()));
        common.put("SOURCE", ascii(field.description()));
        common.put("SCENARIO", field.scenario() == null ? RunFolder.BASELINE : ascii(field.scenario()));
        common.put("REFERENCE", field.referenceLabel());
        common.put("ANALYSIS_CELL_M", num(an.pixelWidth()));
        common.put("AGGREGATION", "area-weighted mean of the simulation cells; no data left out");
        common.put("CITY_MEDIAN", Double.toString(median));
        common.put("DISTANCE_M", num(band.distanceM()));
        common.put("DISTANCE_RULE", rule.equals("given") ? "given" : "peak of Moran's I z-score (Moran 1950; Cliff and Ord 1981)");
        common.put("WEIGHTS", band.weights().key());
        common.put("BAND_CELLS", Integer.toString(band.size()));
        common.put("VALID_CELLS", Long.toString(g.count()));
        common.put("GLOBAL_MEAN", Double.toString(g.mean()));
        common.put("GLOBAL_SD", Double.toString(g.sd()));
        common.put("FDR_METHOD", opt.fdrMethod() == FalseDiscovery.BH ? "Benjamini-Hochberg 1995"
                : "Benjamini-Yekutieli 2001");
        common.put("FDR", num(opt.fdr()));
        common.put("MIN_EXCESS_K", num(opt.minExcessK()));
        common.put("MIN_AREA_M2", num(opt.minAreaM2()));
        common.put("MIN_COVERAGE", num(opt.minCoverage()));
        int n = codes.length;
        float[] z = new float[n], q = new float[n], ex = new float[n];
        for (int i = 0; i < n; i++) {
            boolean nd = codes[i] == CLASS_NODATA;
            z[i] = nd ? Z_NODATA : (float) hr.z()[i];
            q[i] = nd ? Z_NODATA : (float) hr.q()[i];
            ex[i] = nd ? Z_NODATA : (float) hr.excessK()[i];
        }
        Path bf = tmp.resolve(BAND);
        GeoTiffWriter.writeInt(bf, an, GeoTiffWriter.IntType.INT16, codes, OptionalInt.of(CLASS_NODATA));
        Map<String, String> bItems = new LinkedHashMap<>(coding(opt.minExcessK()));
        bItems.putAll(common);
        StringBuilder table = new StringBuilder();
        for (ExcessBand.Band b : ExcessBand.table(opt.minExcessK())) {
            table.append(b.code()).append(" = ").append(b.label()).append("; ");
        }
        table.append(CLASS_NODATA).append(" = no data");
        TiffMetadata.addAscii(bf, Map.of(
                TiffMetadata.IMAGE_DESCRIPTION, "thermotile excess bands of " + field.statistic() + ": " + table,
                TiffMetadata.GDAL_METADATA, TiffMetadata.gdalMetadataXml(bItems, OutputDescriptions.excessBand(
                        field.statistic()))));
        writeFloat(tmp.resolve(EXCESS), an, ex, common, "thermotile excess over the city's median of "
                + field.statistic() + " [K], per analysis cell; no data -9999", OutputDescriptions.excess(field.statistic()));
        writeFloat(tmp.resolve(QVALUE), an, q, common, "thermotile " + opt.fdrMethod().key().toUpperCase(Locale.ROOT)
                + " q-values of the Gi* p-values of " + field.statistic() + "; no data -9999",
                OutputDescriptions.qvalue(field.statistic(), opt.fdrMethod() == FalseDiscovery.BH
                        ? "Benjamini-Hochberg" : "Benjamini-Yekutieli"));
        writeFloat(tmp.resolve(ZSCORE), an, z, common, "thermotile Gi* z-scores of " + field.statistic() + ", "
                + num(band.distanceM()) + " m " + band.weights().key() + " band; no data -9999",
                OutputDescriptions.zscore(field.statistic()));
        float[] cov = new float[n];
        for (int i = 0; i < n; i++) {
            cov[i] = (float) coverage[i];
        }
        writeFloat(tmp.resolve(COVERAGE), an, cov, common, "thermotile coverage of each analysis cell: share of its "
                + "area holding valid simulation cells [0-1]; cells below MIN_COVERAGE are left out of the analysis",
                OutputDescriptions.coverage());
    }

    private static void writeFloat(Path f, RasterGrid an, float[] v, Map<String, String> items, String description,
            GeoTiffWriter.Band bandText) throws IOException {
        GeoTiffWriter.writeFloat(f, an, v, Z_NODATA);
        TiffMetadata.addAscii(f, Map.of(TiffMetadata.IMAGE_DESCRIPTION, description,
                TiffMetadata.GDAL_METADATA, TiffMetadata.gdalMetadataXml(items, bandText)));
    }

    /** The Moran's I scan that chose the distance band, as the summary's {@code moran_scan} (none: nothing). */
    static void putMoranScan(ObjectNode root, MoransI.Result[] scan) {
        if (scan == null) {
            return;
        }
        ArrayNode s = root.putArray("moran_scan");
        for (MoransI.Result m : scan) {
            ObjectNode o = s.addObject();
            o.put("distance_m", m.distanceM());
            o.put("moran_i", m.i());
            o.put("z", m.z());
        }
    }

    private static void writeSummary(Path file, Result r, Prepared p, GlobalMoments g, DistanceBand band,
            MoransI.Result[] scan, List<double[]> change, DistrictCells districts) throws IOException {
        ObjectMapper om = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = om.createObjectNode();
        root.put("format", "thermotile-hotspots/2");
        root.put("statistic", r.statistic());
        root.put("unit", r.unit());
        root.put("scenario", r.scenario() == null ? RunFolder.BASELINE : r.scenario());
        root.put("source", p.field().description());
        root.put("reference", p.field().referenceLabel());
        root.put("analysis_cell_m", r.analysisCellM());
        root.put("simulation_cells_per_analysis_cell", p.factor() * p.factor());
        root.put("distance_m", band.distanceM());
        root.put("distance_rule", r.distanceRule());
        putMoranScan(root, scan);
        root.put("weights", band.weights().key());
        root.put("band_cells", band.size());
        root.put("fdr_method", r.fdrMethod());
        root.put("fdr", r.fdr());
        root.put("min_excess_k", r.minExcessK());
        root.put("min_area_m2", p.options().minAreaM2());
        root.put("min_coverage", p.options().minCoverage());
        root.put("city_median", r.referenceK());
        ObjectNode gl = root.putObject("global");
        gl.put("valid_cells", g.count());
        gl.put("mean", g.mean());
        gl.put("sd", g.sd());
        gl.put("min", g.min());
        gl.put("max", g.max());
        ObjectNode coding = root.putObject("coding");
        coding(r.minExcessK()).forEach(coding::put);
        ObjectNode cc = root.putObject("band_cells");
        r.bandCells().forEach((k, v) -> cc.put(Integer.toString(k), v));
        root.put("hot_polygons", r.hotPolygons());
        root.put("cold_polygons", r.coldPolygons());
        root.put("hot_area_m2", r.hotAreaM2());
        root.put("cold_area_m2", r.coldAreaM2());
        root.put("city_area_m2", r.cityAreaM2());
        root.put("hot_share", r.cityAreaM2() > 0 ? r.hotAreaM2() / r.cityAreaM2() : 0);
        root.put("cold_share", r.cityAreaM2() > 0 ? r.coldAreaM2() / r.cityAreaM2() : 0);
        root.put("largest_polygon_m2", r.largestPolygonM2());
        if (r.hotAreaRemovedM2() != null) {
            root.put("hot_area_removed_m2", r.hotAreaRemovedM2());
        }
        if (change != null) {
            ArrayNode ch = root.putArray("programme_change");
            int nd = districts == null ? 0 : districts.districts().size();
            for (int k = 0; k <= nd; k++) {
                double[] c = change.get(k);
                if (k == nd && districts != null && c[0] == 0 && c[1] == 0) {
                    continue;
                }
                ObjectNode o = ch.addObject();
                o.put("district_id", k < nd ? districts.districts().get(k).id() : null);
                o.put("district_name", k < nd ? districts.districts().get(k).name()
                        : districts == null ? "(all cells)" : "(outside districts)");
                o.put("baseline_hot_m2", c[0]);
                o.put("scenario_hot_m2", c[1]);
                o.put("removed_m2", c[2]);
                o.put("added_m2", c[3]);
            }
        }
        ArrayNode outs = root.putArray("outputs");
        r.outputs().forEach(outs::add);
        ArrayNode notes = root.putArray("notes");
        r.notes().forEach(notes::add);
        root.put("caution", "Surface temperature is not air temperature nor a heat-health index. Hot areas are "
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
        org.thermotile.jobs.storage.Folders.deleteQuietly(dir);
    }

    static void deleteTree(Path dir) throws IOException {
        org.thermotile.jobs.storage.Folders.deleteTree(dir);
    }
}
