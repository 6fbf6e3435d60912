package org.thermotile.jobs.observe;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.apache.sis.referencing.CRS;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.opengis.referencing.crs.CoordinateReferenceSystem;
import org.opengis.referencing.operation.MathTransform;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.storage.Folders;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.observe.Agreement;
import org.thermotile.model.observe.PixelFootprints;
import org.thermotile.model.radiation.BandRadiance;

/**
 * Compares a finished run's baseline surface temperature with thermal images.
 *
 * <p>For each image: its pixel footprints (four corners of every pixel) are transformed into the
 * run CRS with Apache SIS ({@code CRS.findOperation}); a pixel that lies wholly on the run grid is
 * compared with the area-weighted mean of the cells it covers ({@link PixelFootprints}: the usual
 * case, an image coarser than the cells). The simulated value at the acquisition time is the
 * linear interpolation between the two kept hours that bracket it (the run's hourly cell table,
 * {@code tables/cell_hours}). Brightness temperatures and radiances are corrected to surface
 * temperature with the footprint's area-weighted material emissivity by the single-channel
 * correction of Artis &amp; Carnahan (1982), {@link BandRadiance#artisCarnahan}.
 *
 * <p>Everything is checked before anything is written; the outputs are staged in a sibling folder
 * and renamed into {@code RUN_DIR/observed/} at the end.
 */
public final class Observe {
    private Observe() {}

    /** Coverage a pixel needs to count: the whole footprint on the grid (1e-9 for rounding). */
    static final double FULL = 1.0 - 1e-9;

    /** What one image gave. */
    public record ImageResult(String name, Agreement all, Map<String, Agreement> byMaterial,
            Map<String, Agreement> byDistrict, float[] difference, double[] simulated, double[] observed,
            Instant time, String[] dominantMaterial) {}

    /** Runs the comparison and writes {@code runDir/observed/}; returns the results per image. */
    public static List<ImageResult> run(SparkSession spark, Path runDir, ObservationSet set) {
        RasterGrid grid = runGrid(runDir);
        int cols = grid.width();
        int n = cols * grid.height();
        String[] material = new String[n];
        String[] district = new String[n];
        Path cellsDir = runDir.resolve("tables").resolve("cells");
        for (Row row : spark.read().parquet(org.thermotile.jobs.storage.OutputStore.localUri(cellsDir))
                .filter("scenario = 'baseline'").select("col", "row", "material", "district").collectAsList()) {
            int i = row.getInt(1) * cols + row.getInt(0);
            material[i] = row.getString(2);
            district[i] = row.isNullAt(3) ? null : row.getString(3);
        }
        Path hoursDir = runDir.resolve("tables").resolve("cell_hours");
        if (!Files.isDirectory(hoursDir)) {
            throw new UserInputException(runDir + ": the run kept no hourly surface temperatures (tables/cell_hours); "
                    + "fix: run it again with outputs.hourly_days naming the acquisition days");
        }
        List<Row> timeRows = spark.read().parquet(org.thermotile.jobs.storage.OutputStore.localUri(hoursDir)).filter("scenario = 'baseline'")
                .select("time").distinct().collectAsList();
        TreeMap<Instant, String> kept = new TreeMap<>();
        for (Row t : timeRows) {
            kept.put(OffsetDateTime.parse(t.getString(0)).toInstant(), t.getString(0));
        }
        PixelFootprints cells = new PixelFootprints(grid.originX(), grid.originY(), grid.pixelWidth(), cols,
                grid.height());
        double[] emissivity = new double[n];
        Arrays.fill(emissivity, Double.NaN);
        Map<String, Material> lib = MaterialLibrary.byId();
        for (int i = 0; i < n; i++) {
            if (material[i] != null && lib.containsKey(material[i])) {
                emissivity[i] = lib.get(material[i]).emissivity();
            }
        }
        // Check every image first: nothing is written when one is unusable.
        List<Prepared> prepared = new ArrayList<>();
        for (ObservationSet.Image img : set.images()) {
            Map.Entry<Instant, String> lo = kept.floorEntry(img.time());
            Map.Entry<Instant, String> hi = kept.ceilingEntry(img.time());
            if (lo == null || hi == null) {
                throw new UserInputException(set.file() + ": image " + img.file() + " time " + img.time()
                        + " lies outside the hours the run kept (" + (kept.isEmpty() ? "none" : kept.firstKey()
                        + " … " + kept.lastKey()) + "); fix: correct its 'time' or run again with outputs.hourly_days "
                        + "naming its day");
            }
            prepared.add(prepare(img, set, grid, cells, emissivity, lo, hi));
        }
        List<ImageResult> results = new ArrayList<>();
        for (Prepared p : prepared) {
            double[] sim = simulatedAt(spark, hoursDir, p, n, cols);
            results.add(compare(p, sim, cells, material, district, grid));
        }
        write(spark, runDir, grid, results);
        return results;
    }

    /**
     * Checks every image of {@code set} against the run grid before a run starts: readable, its mask
     * on its grid and keeping some pixel, its CRS transformable, and at least one valid pixel lying
     * wholly on the grid. Emissivity is not known yet, so a brightness temperature is checked as if
     * every surface were black; the run repeats the full check.
     *
     * @throws UserInputException naming the image and the fix
     */
    public static void check(ObservationSet set, RasterGrid grid) {
        PixelFootprints cells = new PixelFootprints(grid.originX(), grid.originY(), grid.pixelWidth(), grid.width(),
                grid.height());
        double[] black = new double[grid.width() * grid.height()];
        Arrays.fill(black, 1.0);
        Map.Entry<Instant, String> any = Map.entry(Instant.EPOCH, "");
        for (ObservationSet.Image img : set.images()) {
            prepare(img, set, grid, cells, black, any, any);
        }
    }

    /** The run's grid, from its mean map (or its first map when it wrote no mean). */
    private static RasterGrid runGrid(Path runDir) {
        Path maps = runDir.resolve("maps");
        Path f = maps.resolve("mean.tif");
        if (!Files.isRegularFile(f)) {
            try (var s = Files.list(maps)) {
                f = s.filter(q -> q.toString().endsWith(".tif")).sorted().findFirst().orElse(f);
            } catch (IOException e) {
                throw new UserInputException(runDir + " has no maps/ folder; fix: give a finished run's folder");
            }
        }
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            return r.grid();
        }
    }

    private record Prepared(ObservationSet.Image image, List<PixelFootprints.Footprint> footprints,
            double[] observedK, int[] pixelOfCell, Instant t0, String t0s, Instant t1, String t1s) {}

    private static Prepared prepare(ObservationSet.Image img, ObservationSet set, RasterGrid grid,
            PixelFootprints cells, double[] emissivity, Map.Entry<Instant, String> lo, Map.Entry<Instant, String> hi) {
        float[] raw;
        RasterGrid ig;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(img.file())) {
            ig = r.grid();
            raw = r.readFloatWindow(0, 0, ig.width(), ig.height());
        }
        boolean[] keep = null;
        if (img.maskFile() != null) {
            try (GeoTiffReader m = GeoTiffReader.openSingleBand(img.maskFile())) {
                if (!m.grid().sameGridAs(ig)) {
                    throw new UserInputException(set.file() + ": mask " + img.maskFile() + " is not on the grid of "
                            + img.file() + "; fix: give the quality mask of that image");
                }
                int[] codes = m.readIntWindow(0, 0, ig.width(), ig.height());
                keep = new boolean[codes.length];
                int kept = 0;
                for (int i = 0; i < codes.length; i++) {
                    for (int k : img.maskKeep()) {
                        if (codes[i] == k) {
                            keep[i] = true;
                            kept++;
                        }
                    }
                }
                if (kept == 0) {
                    throw new UserInputException(set.file() + ": mask.keep " + Arrays.toString(img.maskKeep())
                            + " names no code present in " + img.maskFile() + "; fix: list the codes of good pixels");
                }
            }
        }
        int w = ig.width();
        int h = ig.height();
        List<PixelFootprints.Footprint> fps = footprints(img.file(), ig, grid, cells);
        double[] obs = new double[w * h];
        int[] pixelOfCell = new int[cells.cols() * cells.rows()];
        Arrays.fill(pixelOfCell, -1);
        int usable = 0;
        for (int r = 0; r < h; r++) {
            for (int c = 0; c < w; c++) {
                int p = r * w + c;
                PixelFootprints.Footprint f = fps.get(p);
                double v = img.scaling().decode(raw[p]);
                if (keep != null && !keep[p]) {
                    v = Double.NaN;
                }
                if (f.coverage() < FULL) {
                    v = Double.NaN;
                }
                if (!Double.isNaN(v) && !img.kind().equals("surface_temperature")) {
                    double tb = v;
                    if (img.kind().equals("radiance")) {
                        tb = Double.isNaN(img.k1()) ? BandRadiance.brightnessFromBand(v, img.fromUm() * 1e-6,
                                img.toUm() * 1e-6) : BandRadiance.brightnessFromK(v, img.k1(), img.k2());
                    }
                    double eps = f.weightedMean(emissivity);
                    v = Double.isNaN(eps) ? Double.NaN : BandRadiance.artisCarnahan(tb, img.wavelengthM(), eps);
                }
                obs[p] = v;
                if (!Double.isNaN(v)) {
                    usable++;
                    // The difference map: a cell shows the pixel covering at least half of it.
                    for (int j = 0; j < f.cells().length; j++) {
                        if (f.areas()[j] >= 0.5 * cells.cellM() * cells.cellM()) {
                            pixelOfCell[f.cells()[j]] = p;
                        }
                    }
                }
            }
        }
        if (usable == 0) {
            throw new UserInputException(set.file() + ": image " + img.file() + " has no valid pixel lying wholly on the "
                    + "run grid (" + grid.crsLabel() + ", " + grid.width() + "×" + grid.height() + " cells); fix: give an "
                    + "image that covers the run's area, with its CRS declared");
        }
        return new Prepared(img, fps, obs, pixelOfCell, lo.getKey(), lo.getValue(), hi.getKey(), hi.getValue());
    }

    /** Surface temperature [K] at the acquisition time: linear between the bracketing kept hours. */
    private static double[] simulatedAt(SparkSession spark, Path hoursDir, Prepared p, int n, int cols) {
        double[] a = new double[n];
        double[] b = new double[n];
        Arrays.fill(a, Double.NaN);
        Arrays.fill(b, Double.NaN);
        for (Row row : spark.read().parquet(org.thermotile.jobs.storage.OutputStore.localUri(hoursDir))
                .filter(org.apache.spark.sql.functions.col("scenario").equalTo("baseline")
                        .and(org.apache.spark.sql.functions.col("time").isin(p.t0s(), p.t1s())))
                .select("col", "row", "time", "surface_c").collectAsList()) {
            int i = row.getInt(1) * cols + row.getInt(0);
            double k = row.getFloat(3) + 273.15;
            if (row.getString(2).equals(p.t0s())) {
                a[i] = k;
            }
            if (row.getString(2).equals(p.t1s())) {
                b[i] = k;
            }
        }
        long span = p.t1().getEpochSecond() - p.t0().getEpochSecond();
        double f = span == 0 ? 0 : (double) (p.image().time().getEpochSecond() - p.t0().getEpochSecond()) / span;
        double[] s = new double[n];
        for (int i = 0; i < n; i++) {
            s[i] = a[i] + f * (b[i] - a[i]);
        }
        return s;
    }

    private static ImageResult compare(Prepared p, double[] sim, PixelFootprints cells, String[] material,
            String[] district, RasterGrid grid) {
        Agreement all = new Agreement();
        Map<String, Agreement> byMat = new TreeMap<>();
        Map<String, Agreement> byDist = new TreeMap<>();
        double[] simPix = new double[p.observedK().length];
        String[] dominantOf = new String[simPix.length];
        for (int px = 0; px < simPix.length; px++) {
            PixelFootprints.Footprint f = p.footprints().get(px);
            double o = p.observedK()[px];
            simPix[px] = Double.NaN;
            if (Double.isNaN(o)) {
                continue;
            }
            double s = f.weightedMean(sim);
            simPix[px] = s;
            all.add(s, o);
            // A pixel counts for the material and district that cover most of it.
            String m = dominant(f, material);
            dominantOf[px] = m;
            if (m != null) {
                byMat.computeIfAbsent(m, k -> new Agreement()).add(s, o);
            }
            String d = dominant(f, district);
            if (d != null) {
                byDist.computeIfAbsent(d, k -> new Agreement()).add(s, o);
            }
        }
        float[] diff = new float[sim.length];
        for (int i = 0; i < diff.length; i++) {
            int px = p.pixelOfCell()[i];
            // Compared at the image's resolution: the pixel's simulated mean minus its observation.
            double d = px < 0 || Double.isNaN(sim[i]) ? Double.NaN : simPix[px] - p.observedK()[px];
            diff[i] = Double.isNaN(d) ? org.thermotile.jobs.city.CityJob.MAP_NODATA : (float) d;
        }
        return new ImageResult(p.image().name(), all, byMat, byDist, diff, simPix, p.observedK(), p.image().time(),
                dominantOf);
    }

    private static String dominant(PixelFootprints.Footprint f, String[] label) {
        Map<String, Double> area = new TreeMap<>();
        for (int i = 0; i < f.cells().length; i++) {
            String l = label[f.cells()[i]];
            if (l != null) {
                area.merge(l, f.areas()[i], Double::sum);
            }
        }
        return area.entrySet().stream().max(Map.Entry.comparingByValue()).map(Map.Entry::getKey).orElse(null);
    }

    /** Columns of {@code observed/agreement.parquet}: one row per image and group, units in the names. */
    static final org.apache.spark.sql.types.StructType AGREEMENT = new org.apache.spark.sql.types.StructType()
            .add("image", "string", false).add("group", "string", false).add("name", "string", false)
            .add("count", "long", false).add("bias_k", "double", true).add("rmse_k", "double", true)
            .add("mae_k", "double", true).add("pearson_r", "double", true);

    /** Columns of {@code observed/pairs.parquet}: one row per compared pixel. */
    static final org.apache.spark.sql.types.StructType PAIRS = new org.apache.spark.sql.types.StructType()
            .add("image", "string", false).add("pixel", "int", false).add("simulated_c", "double", false)
            .add("observed_c", "double", false);

    private static Double orNull(double v) {
        return Double.isNaN(v) ? null : v;
    }

    private static Row agreementRow(String image, String group, String name, Agreement a) {
        return org.apache.spark.sql.RowFactory.create(image, group, name, a.count(), orNull(a.bias()),
                orNull(a.rmse()), orNull(a.mae()), orNull(a.pearson()));
    }

    /** One Parquet part (stable name, canonical footer) in the folder {@code dir}. */
    private static void parquet(SparkSession spark, List<Row> rows, org.apache.spark.sql.types.StructType schema,
            Path dir) {
        spark.createDataFrame(rows, schema).coalesce(1).write().mode(org.apache.spark.sql.SaveMode.ErrorIfExists)
                .parquet(org.thermotile.jobs.storage.OutputStore.sparkUri(dir));
        org.thermotile.jobs.storage.CanonicalParquet.renameParts(dir);
    }

    private static void write(SparkSession spark, Path runDir, RasterGrid grid, List<ImageResult> results) {
        Path out = runDir.resolve("observed");
        Path tmp = runDir.resolve(".observed.tmp");
        try {
            Folders.deleteQuietly(tmp);
            Files.createDirectories(tmp);
            StringBuilder csv = new StringBuilder("image,group,name,count,bias_k,rmse_k,mae_k,pearson_r\n");
            StringBuilder pairs = new StringBuilder("image,pixel,simulated_c,observed_c\n");
            List<Row> agreementRows = new ArrayList<>();
            List<Row> pairRows = new ArrayList<>();
            for (ImageResult r : results) {
                float[] diff = r.difference();
                GeoTiffWriter.writeFloatBlocks(tmp.resolve("difference_" + r.name() + ".tif"), grid,
                        java.util.List.of(org.thermotile.jobs.catalogue.OutputDescriptions.observedDifference(r.name())),
                        org.thermotile.jobs.city.CityJob.MAP_NODATA, (band, c0, r0, w, h, block) -> {
                            for (int row = 0; row < h; row++) {
                                System.arraycopy(diff, (r0 + row) * grid.width() + c0, block, row * w, w);
                            }
                        }, org.thermotile.jobs.io.raster.CloudOptimized.Resampling.AVERAGE);
                row(csv, r.name(), "all", "all", r.all());
                agreementRows.add(agreementRow(r.name(), "all", "all", r.all()));
                r.byMaterial().forEach((k, v) -> row(csv, r.name(), "material", k, v));
                r.byMaterial().forEach((k, v) -> agreementRows.add(agreementRow(r.name(), "material", k, v)));
                r.byDistrict().forEach((k, v) -> row(csv, r.name(), "district", k, v));
                r.byDistrict().forEach((k, v) -> agreementRows.add(agreementRow(r.name(), "district", k, v)));
                for (int i = 0; i < r.observed().length; i++) {
                    if (!Double.isNaN(r.observed()[i]) && !Double.isNaN(r.simulated()[i])) {
                        pairs.append(r.name()).append(',').append(i).append(',')
                                .append(fmt(r.simulated()[i] - 273.15)).append(',')
                                .append(fmt(r.observed()[i] - 273.15)).append('\n');
                        pairRows.add(org.apache.spark.sql.RowFactory.create(r.name(), i,
                                r.simulated()[i] - 273.15, r.observed()[i] - 273.15));
                    }
                }
            }
            parquet(spark, agreementRows, AGREEMENT, tmp.resolve("agreement.parquet"));
            parquet(spark, pairRows, PAIRS, tmp.resolve("pairs.parquet"));
            Files.writeString(tmp.resolve("agreement.csv"), csv.toString());
            Files.writeString(tmp.resolve("pairs.csv"), pairs.toString());
            Files.writeString(tmp.resolve("CAUTIONS.txt"), CAUTIONS);
            if (Files.exists(out)) {
                Folders.deleteTree(out);
            }
            Files.move(tmp, out);
        } catch (IOException e) {
            Folders.deleteQuietly(tmp);
            throw new UncheckedIOException(e);
        } catch (RuntimeException e) {
            Folders.deleteQuietly(tmp);
            throw e;
        }
    }

    /** The cautions printed with every comparison. */
    public static final String CAUTIONS = """
            Reading a comparison with a thermal image:
            - view angle and thermal anisotropy: a sensor sees roofs and sunlit walls in proportions that depend
              on its view angle; the simulation gives the plan-view surface (walls are not simulated);
            - sub-pixel mixing: a pixel mixes every surface it covers; its simulated value is the area-weighted
              mean of the cells it covers, which is not the same as the radiance mean;
            - time of overpass: the simulation is interpolated linearly between two hours; fast changes
              (shadow edges, sunrise) are smoothed;
            - emissivity and atmosphere: brightness temperatures are corrected with the library emissivity of
              the covered materials; the atmosphere is not corrected here;
            - surface temperature is not air temperature, nor a heat-health index.
            """;

    private static void row(StringBuilder sb, String image, String group, String name, Agreement a) {
        sb.append(image).append(',').append(group).append(',').append(name.contains(",") ? '"' + name + '"' : name)
                .append(',').append(a.count()).append(',').append(fmt(a.bias())).append(',').append(fmt(a.rmse()))
                .append(',').append(fmt(a.mae())).append(',').append(fmt(a.pearson())).append('\n');
    }

    private static String fmt(double v) {
        return Double.isNaN(v) ? "" : String.format(Locale.ROOT, "%.4f", v);
    }

    /**
     * Every pixel's footprint on the run's cells, row-major over the image: its four corners
     * transformed into the run's CRS with Apache SIS and clipped against the cells.
     *
     * @throws UserInputException when the image's CRS cannot be transformed to the run's
     */
    static List<PixelFootprints.Footprint> footprints(Object file, RasterGrid ig, RasterGrid grid,
            PixelFootprints cells) {
        MathTransform tr;
        try {
            tr = CRS.findOperation(crsOf(ig), crsOf(grid), null).getMathTransform();
        } catch (Exception e) {
            throw new UserInputException(file + ": its CRS cannot be transformed to the run's ("
                    + e.getMessage() + "); fix: give the image a CRS with an EPSG code or a full WKT");
        }
        int w = ig.width();
        int h = ig.height();
        double[] corners = new double[(w + 1) * (h + 1) * 2];
        for (int r = 0; r <= h; r++) {
            for (int c = 0; c <= w; c++) {
                int k = 2 * (r * (w + 1) + c);
                corners[k] = ig.originX() + c * ig.pixelWidth();
                corners[k + 1] = ig.originY() + r * ig.pixelHeight();
            }
        }
        try {
            tr.transform(corners, 0, corners, 0, corners.length / 2);
        } catch (Exception e) {
            throw new UserInputException(file + ": its pixel corners cannot be transformed to the run CRS ("
                    + e.getMessage() + "); fix: check the image's CRS");
        }
        List<PixelFootprints.Footprint> out = new ArrayList<>(w * h);
        for (int r = 0; r < h; r++) {
            for (int c = 0; c < w; c++) {
                int a = 2 * (r * (w + 1) + c), b = a + 2, d = 2 * ((r + 1) * (w + 1) + c + 1), e = d - 2;
                out.add(cells.footprint(new double[] {corners[a], corners[b], corners[d], corners[e]},
                        new double[] {corners[a + 1], corners[b + 1], corners[d + 1], corners[e + 1]}));
            }
        }
        return out;
    }

    private static CoordinateReferenceSystem crsOf(RasterGrid g) throws Exception {
        if (g.epsg() > 0) {
            try {
                return CRS.forCode("EPSG:" + g.epsg());
            } catch (Exception e) {
                // fall back to the WKT
            }
        }
        return CRS.fromWKT(g.crsWkt());
    }
}
