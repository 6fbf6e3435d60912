package org.thermotile.jobs.hotspots;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
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
import org.apache.commons.math3.distribution.NormalDistribution;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SparkSession;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.Envelope;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.Polygon;
import org.locationtech.jts.geom.prep.PreparedGeometry;
import org.locationtech.jts.geom.prep.PreparedGeometryFactory;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.hotspot.AnalysisGrid;
import org.thermotile.model.hotspot.CentroidBand;
import org.thermotile.model.hotspot.DistanceBand;
import org.thermotile.model.hotspot.ExcessBand;
import org.thermotile.model.hotspot.GlobalMoments;
import org.thermotile.model.hotspot.MoransI;
import org.thermotile.model.hotspot.ZoneSums;

/**
 * Hot and cold zones: Gi* on the polygons of a file (blocks, parcels, districts) instead of the
 * analysis grid, written under RUN/zones/STEM/STATISTIC/ (a scenario: RUN/scenarios/NAME/zones/…),
 * STEM the zones file's name without its extension.
 * <ol>
 *   <li><b>Zone values.</b> A Spark pass over windows of the map gives each zone the area-weighted
 *       mean of the simulation cells it covers, each cell weighted by the exact area of its
 *       intersection with the polygon (JTS overlay; {@link ZoneSums}). Exact overlap rather than
 *       the cell-centre rule because zones are often only a few simulation cells across (a 20 m
 *       parcel on 4 m cells is 25 cells, a third of them on the boundary): the centre rule would
 *       weigh a boundary cell fully or not at all, and a parcel smaller than a cell could hold no
 *       centre. The covered fraction is the zone's area over valid cells divided by its area.</li>
 *   <li><b>Coverage.</b> Zones below the minimum coverage (default 0.5) are left out: no value, not
 *       in the neighbours, the global moments or the FDR.</li>
 *   <li><b>Neighbours.</b> A fixed distance band between zone centroids with binary weights
 *       (Getis & Ord 1992, section 2; {@link CentroidBand}). Left out, the distance is the peak of
 *       Moran's I z-score (Moran 1950; Cliff & Ord 1981) over D_k = k·d₁, d₁ the largest
 *       nearest-neighbour centroid distance (so every zone has a neighbour at D₁), k = 1 … 12 and
 *       D_k at most half the larger side of the centroids' extent — the rule of the grid mode with
 *       the zones' spacing as step. A zone without another zone with data in its band is not
 *       tested.</li>
 *   <li><b>Gi*, excess, q.</b> Gi* z-scores of the zones (Ord & Getis 1995, with x̄ and S of the
 *       reference field's zones), two-sided normal p, BH or BY q-values over the tested zones, and
 *       the excess of the zone's mean over the city's reference: the area-weighted median of the
 *       reference's analysis cells at {@code cell_size_m} (as in the grid mode, so a zone and a grid
 *       cell are compared with the same city). Band codes as in the grid mode ({@link ExcessBand}).</li>
 * </ol>
 * Outputs: zones/ (Parquet) and zones.csv, one row per zone in file order; zones.geojson (the grid's
 * CRS) and zones_wgs84.geojson with the same properties; summary.json with the settings and the hot
 * and cold zones, largest first.
 */
public final class ZoneHotspots {
    private ZoneHotspots() {}

    /** The default zone id property. */
    public static final String DEFAULT_ID = "id";

    /** Output names inside the output folder. */
    static final String TABLE = "zones", CSV = "zones.csv", GEOJSON = "zones.geojson",
            GEOJSON_WGS84 = "zones_wgs84.geojson", SUMMARY = "summary.json";

    /** Largest number of distances scanned (as the grid mode). */
    static final int MORAN_STEPS = Hotspots.MORAN_STEPS;

    /** Where the zones come from: the file and the property holding each zone's id. */
    public record ZoneOptions(Path file, String idProperty, String option) {
        public ZoneOptions {
            if (idProperty == null || idProperty.isBlank()) {
                idProperty = DEFAULT_ID;
            }
            if (option == null) {
                option = "--zones";
            }
        }

        public ZoneOptions(Path file, String idProperty) {
            this(file, idProperty, null);
        }
    }

    /** A checked zone analysis, ready to run. */
    public record Prepared(RunFolder folder, RunFolder.Field field, int factor, ZoneFile zones, HotspotOptions options,
            Path outDir) {
    }

    /**
     * One zone's result.
     *
     * @param coveredFraction share of the zone's area over valid simulation cells
     * @param included        coverage at least the minimum (then mean and excess are given)
     * @param z               Gi* z (NaN: left out, or no neighbour with data)
     * @param band            band code, or null when the zone was not tested
     */
    public record ZoneRow(String id, int feature, double areaM2, double coveredFraction, boolean included, double mean,
            double excessK, double z, double q, Integer band, String label, double centroidX, double centroidY) {
    }

    /** What a zone analysis found; {@code hot} and {@code cold} largest first. */
    public record Result(Path outDir, String statistic, String scenario, String unit, int zones, int included,
            int tested, double distanceM, String distanceRule, double referenceK, String fdrMethod, double fdr,
            List<ZoneRow> rows, List<ZoneRow> hot, List<ZoneRow> cold, List<String> notes) {
    }

    /** Checks the run folder, the field, the options and the zones file; nothing is written. */
    public static Prepared prepare(Path runDir, HotspotOptions opt, ZoneOptions z) {
        RunFolder folder = RunFolder.open(runDir);
        RunFolder.Field field = folder.field(opt);
        int f = Hotspots.factor(field, opt);
        if (opt.weights() != DistanceBand.Weights.BINARY) {
            throw new UserInputException("--weights " + opt.weights().key() + " with " + z.option() + ": zones use "
                    + "binary weights over centroid distances. Fix: leave --weights out (binary)");
        }
        ZoneFile zf = ZoneFile.read(z.file(), z.idProperty(), field.grid(), z.option());
        if (zf.zones().size() < 3) {
            throw new UserInputException(z.file() + ": " + zf.zones().size() + " zone(s); Gi* needs at least 3. Fix: "
                    + "give more zones (blocks, parcels, districts)");
        }
        if (!Double.isNaN(opt.distanceM())) {
            double minX = Double.POSITIVE_INFINITY, maxX = Double.NEGATIVE_INFINITY, minY = minX, maxY = maxX;
            for (ZoneFile.Zone a : zf.zones()) {
                minX = Math.min(minX, a.centroidX());
                maxX = Math.max(maxX, a.centroidX());
                minY = Math.min(minY, a.centroidY());
                maxY = Math.max(maxY, a.centroidY());
            }
            double span = Math.hypot(maxX - minX, maxY - minY);
            if (opt.distanceM() >= span) {
                throw new UserInputException(String.format(Locale.ROOT, "--distance %s m reaches every zone of %s "
                        + "(the centroids' extent has a diagonal of %.1f m): each zone would be compared with the whole "
                        + "set, which the global mean already is. Fix: give less than %.0f m, or leave it out for the "
                        + "peak of Moran's I", Hotspots.num(opt.distanceM()), z.file(), span, span));
            }
        }
        String name = z.file().getFileName().toString();
        String stem = name.replaceAll("(?i)\\.(geo)?json$", "");
        Path out = field.outDir().getParent().getParent().resolve("zones").resolve(stem).resolve(field.statistic());
        if (Files.exists(out) && !opt.replace()) {
            throw new UserInputException(out + " already exists. Fix: add --replace to overwrite it");
        }
        return new Prepared(folder, field, f, zf, opt, out);
    }

    /** {@link #prepare} then {@link #run(SparkSession, Prepared)}. */
    public static Result run(SparkSession spark, Path runDir, HotspotOptions opt, ZoneOptions z) {
        return run(spark, prepare(runDir, opt, z));
    }

    /** Runs a prepared zone analysis on {@code spark} (left running); publishes the folder only when all succeeded. */
    public static Result run(SparkSession spark, Prepared p) {
        Path out = p.outDir();
        Path tmp = out.getParent().resolve("." + out.getFileName() + ".partial");
        try {
            Files.createDirectories(out.getParent());
            Hotspots.deleteTree(tmp);
            Files.createDirectories(tmp);
            Result r = execute(spark, p, tmp);
            if (Files.exists(out)) {
                Hotspots.deleteTree(out);
            }
            Files.move(tmp, out, StandardCopyOption.ATOMIC_MOVE);
            return new Result(out, r.statistic(), r.scenario(), r.unit(), r.zones(), r.included(), r.tested(),
                    r.distanceM(), r.distanceRule(), r.referenceK(), r.fdrMethod(), r.fdr(), r.rows(), r.hot(), r.cold(),
                    r.notes());
        } catch (IOException e) {
            Hotspots.deleteQuietly(tmp);
            throw new UncheckedIOException(e);
        } catch (RuntimeException | Error e) {
            Hotspots.deleteQuietly(tmp);
            throw e;
        }
    }

    /**
     * The zones' area-weighted sums over one window of the map: for every cell of the window that a
     * zone's polygon meets, the exact area of their intersection (a whole cell's area when the
     * polygon contains the cell).
     *
     * @param values row-major window values, NaN for no data
     */
    static ZoneSums accumulate(List<Geometry> zones, RasterGrid grid, int col0, int row0, int w, int h, float[] values) {
        ZoneSums sums = new ZoneSums(zones.size());
        GeometryFactory gf = new GeometryFactory();
        double ox = grid.originX(), oy = grid.originY(), pw = grid.pixelWidth(), ph = grid.pixelHeight();
        double cellArea = Math.abs(pw * ph);
        Envelope win = new Envelope(ox + col0 * pw, ox + (col0 + w) * pw, oy + row0 * ph, oy + (row0 + h) * ph);
        for (int z = 0; z < zones.size(); z++) {
            Geometry g = zones.get(z);
            Envelope e = g.getEnvelopeInternal();
            if (!e.intersects(win)) {
                continue;
            }
            PreparedGeometry pg = PreparedGeometryFactory.prepare(g);
            int c0 = Math.max(col0, (int) Math.floor((e.getMinX() - ox) / pw));
            int c1 = Math.min(col0 + w - 1, (int) Math.ceil((e.getMaxX() - ox) / pw) - 1);
            int r0 = Math.max(row0, (int) Math.floor((e.getMaxY() - oy) / ph));
            int r1 = Math.min(row0 + h - 1, (int) Math.ceil((e.getMinY() - oy) / ph) - 1);
            for (int r = r0; r <= r1; r++) {
                double ya = oy + r * ph, yb = oy + (r + 1) * ph;
                for (int c = c0; c <= c1; c++) {
                    float v = values[(r - row0) * w + (c - col0)];
                    if (Float.isNaN(v)) {
                        continue;
                    }
                    double xa = ox + c * pw, xb = ox + (c + 1) * pw;
                    Polygon cell = gf.createPolygon(new Coordinate[] {new Coordinate(xa, ya), new Coordinate(xb, ya),
                            new Coordinate(xb, yb), new Coordinate(xa, yb), new Coordinate(xa, ya)});
                    double a;
                    if (pg.contains(cell)) {
                        a = cellArea;
                    } else if (pg.intersects(cell)) {
                        a = g.intersection(cell).getArea();
                    } else {
                        continue;
                    }
                    sums.add(z, a, v);
                }
            }
        }
        return sums;
    }

    /** The zones' sums over the whole map, by Spark tasks over windows, merged in window order. */
    static ZoneSums aggregate(JavaSparkContext jsc, FieldSource src, RasterGrid grid, List<Geometry> zones, int tile) {
        List<int[]> wins = Hotspots.windows(grid, tile);
        ArrayList<Geometry> geoms = new ArrayList<>(zones);
        List<ZoneSums> parts = jsc.parallelize(wins, Math.max(1, wins.size()))
                .map(w -> accumulate(geoms, grid, w[0], w[1], w[2], w[3], src.read(w[0], w[1], w[2], w[3])))
                .collect();
        ZoneSums all = new ZoneSums(zones.size());
        parts.forEach(all::merge);
        return all;
    }

    private static Result execute(SparkSession spark, Prepared p, Path tmp) throws IOException {
        RunFolder.Field field = p.field();
        RasterGrid grid = field.grid();
        HotspotOptions opt = p.options();
        List<ZoneFile.Zone> zones = p.zones().zones();
        int n = zones.size();
        List<String> notes = new ArrayList<>();
        JavaSparkContext jsc = JavaSparkContext.fromSparkContext(spark.sparkContext());
        FieldSource src = field.source().forTasks();
        FieldSource ref = field.reference().forTasks();
        List<Geometry> geoms = zones.stream().map(ZoneFile.Zone::geometry).toList();

        // The city's reference: the grid mode's median of the reference's analysis cells.
        AnalysisGrid refGrid = Hotspots.aggregate(jsc, ref, grid, p.factor(), opt.tileSize())
                .withMinCoverage(opt.minCoverage());
        double median = refGrid.weightedMedian();

        ZoneSums sums = aggregate(jsc, src, grid, geoms, opt.tileSize());
        ZoneSums refSums = ref.equals(src) ? sums : aggregate(jsc, ref, grid, geoms, opt.tileSize());
        double[] values = new double[n], refValues = new double[n], cover = new double[n];
        double[] cx = new double[n], cy = new double[n];
        int included = 0;
        for (int i = 0; i < n; i++) {
            ZoneFile.Zone z = zones.get(i);
            if (!(sums.validAreaM2(i) > 0)) {
                throw new UserInputException(String.format(Locale.ROOT, "%s, features[%d] (id '%s'): the zone covers no "
                        + "valid simulation cell of %s (only no-data cells, e.g. outside the land cover or over "
                        + "excluded water). Fix: remove the zone, or correct its coordinates", p.zones().file(),
                        z.feature(), z.id(), field.source().map()));
            }
            cover[i] = sums.validAreaM2(i) / z.areaM2();
            boolean in = AnalysisGrid.covered(cover[i], opt.minCoverage());
            values[i] = in ? sums.mean(i) : Double.NaN;
            refValues[i] = in ? refSums.mean(i) : Double.NaN;
            cx[i] = z.centroidX();
            cy[i] = z.centroidY();
            included += in ? 1 : 0;
        }
        if (included < n) {
            notes.add(String.format(Locale.ROOT, "%d zone(s) cover less than %s of their area with valid simulation "
                    + "cells and are left out (--min-coverage)", n - included, Hotspots.num(opt.minCoverage())));
        }
        GlobalMoments global = new GlobalMoments();
        for (double v : refValues) {
            global.add(v);
        }
        if (included < 3) {
            throw new UserInputException(p.zones().file() + ": " + included + " zone(s) reach the minimum coverage of "
                    + Hotspots.num(opt.minCoverage()) + "; Gi* needs at least 3. Fix: give zones over the run's grid, "
                    + "or a lower --min-coverage");
        }

        Analysis an;
        try {
            an = analyse(values, cx, cy, global, median, opt);
        } catch (UserInputException e) {
            throw new UserInputException(p.zones().file() + ": " + e.getMessage(), e);
        }
        double d = an.band().distanceM();
        double[] z = an.z(), q = an.q();
        int tested = an.tested();
        MoransI.Result[] scan = an.scan();
        String rule = an.rule();
        if (tested < included) {
            notes.add((included - tested) + " zone(s) have no other zone with data within " + Hotspots.num(d)
                    + " m of their centroid and are not tested (give a larger --distance to test them)");
        }
        if (global.sd() == 0) {
            notes.add("every zone has the same value: nothing can stand out, all z = 0");
        }
        List<ZoneRow> rows = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            ZoneFile.Zone zn = zones.get(i);
            boolean in = !Double.isNaN(values[i]);
            double ex = in ? values[i] - median : Double.NaN;
            Integer code = an.codes()[i];
            String label = !in ? "left out (coverage below " + Hotspots.num(opt.minCoverage()) + ")"
                    : code == null ? "not tested (no neighbour in the band)" : ExcessBand.label(code, opt.minExcessK());
            rows.add(new ZoneRow(zn.id(), zn.feature(), zn.areaM2(), cover[i], in, in ? values[i] : Double.NaN, ex, z[i],
                    q[i], code, label, zn.centroidX(), zn.centroidY()));
        }
        Comparator<ZoneRow> largest = Comparator.comparingDouble(ZoneRow::areaM2).reversed()
                .thenComparing(Comparator.comparingDouble((ZoneRow r) -> Math.abs(r.excessK())).reversed())
                .thenComparingInt(ZoneRow::feature);
        List<ZoneRow> hot = rows.stream().filter(r -> r.band() != null && r.band() > 0).sorted(largest).toList();
        List<ZoneRow> cold = rows.stream().filter(r -> r.band() != null && r.band() < 0).sorted(largest).toList();

        writeTables(spark, tmp, rows, field.unit());
        List<GeoJsonWriter.Feature> features = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            features.add(new GeoJsonWriter.Feature(zones.get(i).geometry(), properties(rows.get(i), field)));
        }
        GeoJsonWriter.writeGridCrs(tmp.resolve(GEOJSON), grid, features);
        GeoJsonWriter.writeWgs84(tmp.resolve(GEOJSON_WGS84), grid, features);
        Result r = new Result(tmp, field.statistic(), field.scenario(), field.unit(), n, included, tested, d, rule, median,
                opt.fdrMethod().key(), opt.fdr(), List.copyOf(rows), hot, cold, List.copyOf(notes));
        writeSummary(tmp.resolve(SUMMARY), r, p, global, scan);
        return r;
    }

    /**
     * The zones' Gi* analysis once their values are known: the band (given, or the Moran's I peak),
     * z, p, q over the tested zones, and the band codes (null where not tested).
     *
     * @param values zone means [unit of the field], NaN for zones left out
     * @param global n, x̄ and S of the reference's zones
     * @param median the city's reference x̃
     */
    record Analysis(CentroidBand band, String rule, MoransI.Result[] scan, double[] z, double[] p, double[] q,
            Integer[] codes, int tested) {
    }

    static Analysis analyse(double[] values, double[] cx, double[] cy, GlobalMoments global, double median,
            HotspotOptions opt) {
        int n = values.length;
        String rule = "given";
        MoransI.Result[] scan = null;
        double d = opt.distanceM();
        if (Double.isNaN(d)) {
            double step = CentroidBand.largestNearestNeighbour(cx, cy, values);
            double minX = Double.POSITIVE_INFINITY, maxX = Double.NEGATIVE_INFINITY, minY = minX, maxY = maxX;
            for (int i = 0; i < n; i++) {
                if (!Double.isNaN(values[i])) {
                    minX = Math.min(minX, cx[i]);
                    maxX = Math.max(maxX, cx[i]);
                    minY = Math.min(minY, cy[i]);
                    maxY = Math.max(maxY, cy[i]);
                }
            }
            if (!(step > 0)) {
                throw new UserInputException("the zones' centroids coincide, so no distance band separates them. "
                        + "Fix: give zones at different places");
            }
            double half = Math.max(maxX - minX, maxY - minY) / 2;
            int steps = (int) Math.max(1, Math.min(MORAN_STEPS, Math.floor(half / step * (1 + 1e-9))));
            scan = CentroidBand.scan(cx, cy, values, step, steps);
            d = MoransI.peak(scan);
            rule = "moran_peak";
        }
        CentroidBand band = CentroidBand.of(cx, cy, d);
        double[] z = band.zScores(values, global);
        NormalDistribution normal = new NormalDistribution(null, 0, 1);
        double[] pv = new double[n];
        int tested = 0;
        for (int i = 0; i < n; i++) {
            pv[i] = Double.isNaN(z[i]) ? Double.NaN : Math.min(1.0, 2.0 * normal.cumulativeProbability(-Math.abs(z[i])));
            tested += Double.isNaN(z[i]) ? 0 : 1;
        }
        double[] q = opt.fdrMethod().qValues(pv);
        Integer[] codes = new Integer[n];
        for (int i = 0; i < n; i++) {
            codes[i] = Double.isNaN(z[i]) ? null
                    : ExcessBand.code(values[i] - median, z[i], q[i], opt.fdr(), opt.minExcessK());
        }
        return new Analysis(band, rule, scan, z, pv, q, codes, tested);
    }

    private static Map<String, Object> properties(ZoneRow r, RunFolder.Field field) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("zone_id", r.id());
        m.put("feature", r.feature());
        m.put("area_m2", r.areaM2());
        m.put("covered_fraction", r.coveredFraction());
        m.put("included", r.included());
        m.put("statistic", field.statistic());
        m.put("unit", field.unit());
        m.put("mean_value", r.mean());
        m.put("excess_k", r.excessK());
        m.put("z", r.z());
        m.put("q", r.q());
        m.put("band", r.band());
        m.put("label", r.label());
        return m;
    }

    /** The zones table's columns, in order (Parquet and CSV alike). */
    static final List<String> COLUMNS = List.of(HotspotTables.ZONES.fieldNames());

    private static void writeTables(SparkSession spark, Path tmp, List<ZoneRow> rows, String unit) throws IOException {
        List<Row> out = new ArrayList<>();
        StringBuilder csv = new StringBuilder(String.join(",", COLUMNS)).append('\n');
        for (ZoneRow r : rows) {
            Object[] v = {r.id(), r.feature(), r.areaM2(), r.coveredFraction(), r.included(), nullable(r.mean()), unit,
                    nullable(r.excessK()), nullable(r.z()), nullable(r.q()), r.band(), r.label(), r.centroidX(),
                    r.centroidY()};
            out.add(RowFactory.create(v));
            for (int k = 0; k < v.length; k++) {
                if (k > 0) {
                    csv.append(',');
                }
                csv.append(csvText(v[k]));
            }
            csv.append('\n');
        }
        HotspotTables.write(spark, out, HotspotTables.ZONES, tmp.resolve(TABLE));
        Files.writeString(tmp.resolve(CSV), csv.toString());
    }

    private static Double nullable(double v) {
        return Double.isNaN(v) ? null : v;
    }

    /** A CSV field (RFC 4180): empty for null, quoted when it holds a comma, quote or line break. */
    static String csvText(Object v) {
        if (v == null) {
            return "";
        }
        String s = v.toString();
        if (s.contains(",") || s.contains("\"") || s.contains("\n") || s.contains("\r")) {
            return "\"" + s.replace("\"", "\"\"") + "\"";
        }
        return s;
    }

    private static void writeSummary(Path file, Result r, Prepared p, GlobalMoments g, MoransI.Result[] scan)
            throws IOException {
        HotspotOptions opt = p.options();
        ObjectMapper om = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = om.createObjectNode();
        root.put("format", "thermotile-zone-hotspots/1");
        root.put("statistic", r.statistic());
        root.put("unit", r.unit());
        root.put("scenario", r.scenario() == null ? RunFolder.BASELINE : r.scenario());
        root.put("source", p.field().description());
        root.put("reference", p.field().referenceLabel());
        root.put("zones_file", p.zones().file().toString());
        root.put("zone_id", p.zones().idProperty());
        root.put("aggregation", "area-weighted mean of the simulation cells, each weighted by its exact overlap with "
                + "the zone; no data left out");
        root.put("min_coverage", opt.minCoverage());
        root.put("zones", r.zones());
        root.put("included", r.included());
        root.put("tested", r.tested());
        root.put("neighbours", "distance band between zone centroids, binary weights (Getis and Ord 1992)");
        root.put("distance_m", r.distanceM());
        root.put("distance_rule", r.distanceRule());
        Hotspots.putMoranScan(root, scan);
        root.put("fdr_method", r.fdrMethod());
        root.put("fdr", r.fdr());
        root.put("min_excess_k", opt.minExcessK());
        root.put("city_median", r.referenceK());
        root.put("city_median_rule", "area-weighted median of the reference's analysis cells of "
                + Hotspots.num(p.factor() * Math.max(p.field().grid().pixelWidth(), -p.field().grid().pixelHeight()))
                + " m, as the grid mode");
        ObjectNode gl = root.putObject("global");
        gl.put("zones", g.count());
        gl.put("mean", g.mean());
        gl.put("sd", g.sd());
        ObjectNode coding = root.putObject("coding");
        Hotspots.coding(opt.minExcessK()).forEach((k, v) -> {
            if (!k.equals("BAND_" + Hotspots.CLASS_NODATA)) {
                coding.put(k, v);
            }
        });
        coding.put("BAND_null", "not tested: coverage below min_coverage, or no other zone in the band");
        list(root.putArray("hot_zones"), r.hot());
        list(root.putArray("cold_zones"), r.cold());
        ArrayNode outs = root.putArray("outputs");
        List.of(TABLE + "/", CSV, GEOJSON, GEOJSON_WGS84, SUMMARY).forEach(outs::add);
        ArrayNode notes = root.putArray("notes");
        r.notes().forEach(notes::add);
        root.put("caution", "Surface temperature is not air temperature nor a heat-health index. Hot zones are "
                + "estimates for comparing options; defer to local building codes and licensed professionals.");
        Files.writeString(file, om.writeValueAsString(root) + "\n");
    }

    private static void list(ArrayNode a, List<ZoneRow> rows) {
        for (ZoneRow z : rows) {
            ObjectNode o = a.addObject();
            o.put("zone_id", z.id());
            o.put("area_m2", z.areaM2());
            o.put("excess_k", z.excessK());
            o.put("z", z.z());
            o.put("q", z.q());
            o.put("band", z.band());
            o.put("label", z.label());
        }
    }
}
