package org.thermotile.jobs.demo;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.OptionalInt;
import java.util.Random;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.thermotile.jobs.city.CityJob;
import org.thermotile.jobs.city.PreparedRun;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.storage.Folders;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.observe.PixelFootprints;

/**
 * Writes the demo's INVENTED thermal images: Riverside Flats simulated with two materials changed
 * by known amounts (the "true" city, {@link #TRUTH}), seen at two acquisition times, one by day and
 * one by night, on 30 m pixels in the demo's CRS (EPSG:32632), with seeded Gaussian noise of
 * {@value #NOISE_K} K, stored as UInt16 with the scale {@value #SCALE} and offset {@value #OFFSET}
 * of a Collection 2 Level-2 surface-temperature product (USGS) and nodata 0, each with a quality
 * mask (1 clear, 2 cloud, 0 no data) on the image's grid. Nothing comes from real imagery: each
 * pixel is the area-weighted mean of the perturbed run's cells it covers, interpolated linearly
 * between the two bracketing hours, plus noise; pixels under the day image's invented cloud are
 * set to a cold cloud top and flagged 2.
 *
 * <p>Same bytes on every run (fixed seeds). Regenerate from the project root and commit the files:
 * <pre>
 * mvn -q -pl jobs -am compile dependency:build-classpath -DincludeScope=runtime -Dmdep.outputFile=target/cp.txt
 * java $SPARK_OPENS -cp "jobs/target/classes:model/target/classes:$(cat jobs/target/cp.txt)" \
 *     org.thermotile.jobs.demo.DemoObservation [demo folder, default data-samples/riverside]
 * </pre>
 * ({@code $SPARK_OPENS}: the JVM options of the {@code thermotile} launcher.) Files written into
 * {@code observed/} of the demo folder: {@code lst-day.tif}, {@code qa-day.tif}, {@code lst-night.tif},
 * {@code qa-night.tif}, {@code truth.yaml} (the true values beside the library's) and
 * {@code observations.yaml} (the images for {@code thermotile observe}).
 */
public final class DemoObservation {
    private DemoObservation() {}

    /** Collection 2 Level-2 surface temperature: K = DN · scale + offset (USGS product guide). */
    static final double SCALE = 0.00341802;
    static final double OFFSET = 149.0;
    /** Standard deviation of the invented sensor noise [K]. */
    static final double NOISE_K = 0.5;
    static final double PIXEL_M = 30;
    /** Acquisition times (UTC): 12:30 and 22:15 local time (UTC+2) on 2026-07-16. */
    static final Instant DAY = Instant.parse("2026-07-16T10:30:00Z");
    static final Instant NIGHT = Instant.parse("2026-07-16T20:15:00Z");
    static final long DAY_SEED = 1607, NIGHT_SEED = 1622;

    /** One known change of the "true" city: material, parameter, the change. */
    record Change(String material, String key, double delta) {
    }

    /** The perturbations (invented): aged asphalt brighter, dry grass moister than the library says. */
    static final List<Change> TRUTH = List.of(new Change("asphalt_aged", "albedo", 0.06),
            new Change("grass_dry", "moisture_availability", 0.15));

    public static void main(String[] args) throws Exception {
        Path demo = Path.of(args.length > 0 ? args[0] : "data-samples/riverside").toAbsolutePath().normalize();
        write(demo, demo.resolve("observed"));
    }

    /** Simulates the perturbed demo city and writes the images into {@code out}. */
    public static void write(Path demo, Path out) throws IOException {
        Path work = Files.createTempDirectory("thermotile-demo-observation-");
        try {
            Path classes = work.resolve("classes.yaml");
            Files.writeString(classes, perturbedClasses(Files.readString(demo.resolve("classes.yaml"))));
            Path runFile = work.resolve("truth.yaml");
            Files.writeString(runFile, """
                    name: riverside-true-city
                    inputs:
                      land_cover: %s
                      classes: %s
                      heights: %s
                      districts: %s
                    weather:
                      file: %s
                      fill_gaps_max_hours: 3
                    period:
                      start: 2026-07-16
                      end: 2026-07-16
                      spin_up_days: 2
                    outputs:
                      maps: [mean]
                      hourly_days: [2026-07-16]
                    """.formatted(demo.resolve("landcover.tif"), classes, demo.resolve("heights.tif"),
                    demo.resolve("districts.geojson"), demo.resolve("weather.csv")));
            PreparedRun p = RunPreparer.prepare(RunFileReader.read(runFile));
            Path run = work.resolve("run");
            RasterGrid grid = p.grid();
            double[][] day;
            double[][] night;
            try (SparkSession spark = SparkSessions.get(null, 0)) {
                CityJob.run(spark, p, new CityJob.Options(run, null, false, false, 0), System.out);
                int off = p.spec().forcing().utcOffsetSeconds;
                day = bracket(spark, run, grid, DAY, off);
                night = bracket(spark, run, grid, NIGHT, off);
            }
            Files.createDirectories(out);
            RasterGrid ig = imageGrid(grid);
            image(out, "day", ig, grid, interpolate(day, DAY), DAY_SEED, true);
            image(out, "night", ig, grid, interpolate(night, NIGHT), NIGHT_SEED, false);
            Files.writeString(out.resolve("truth.yaml"), truth(ig));
            Files.writeString(out.resolve("observations.yaml"), observationsFile());
        } finally {
            Folders.deleteQuietly(work);
        }
    }

    /** The demo's class table with the {@link #TRUTH} overrides added to every class of those materials. */
    static String perturbedClasses(String yaml) {
        StringBuilder b = new StringBuilder();
        for (String line : yaml.split("\n", -1)) {
            String l = line;
            for (Change c : TRUTH) {
                if (line.contains("material: " + c.material() + ",") && line.trim().endsWith("}")
                        && !line.contains("overrides")) {
                    l = line.substring(0, line.lastIndexOf('}')) + ", overrides: {" + c.key() + ": "
                            + num(trueValue(c)) + "}}";
                }
            }
            b.append(l).append('\n');
        }
        return b.substring(0, b.length() - 1);
    }

    static double libraryValue(Change c) {
        Material m = MaterialLibrary.byId().get(c.material());
        return switch (c.key()) {
            case "albedo" -> m.albedo();
            case "moisture_availability" -> m.moistureAvailability();
            default -> throw new IllegalArgumentException(c.key());
        };
    }

    static double trueValue(Change c) {
        return Math.round((libraryValue(c) + c.delta()) * 1e6) / 1e6;
    }

    /** The 30 m image grid: the run's area, its corner 5 m west and north of the run's (pixels straddle cells). */
    static RasterGrid imageGrid(RasterGrid run) {
        double x0 = run.originX() - 5, y0 = run.originY() + 5;
        int w = (int) Math.ceil((run.width() * run.pixelWidth() + 5) / PIXEL_M);
        int h = (int) Math.ceil((run.height() * Math.abs(run.pixelHeight()) + 5) / PIXEL_M);
        return new RasterGrid(w, h, x0, y0, PIXEL_M, -PIXEL_M, run.epsg(), run.crsWkt());
    }

    /** Surface temperature [K] per cell at the two kept hours bracketing {@code t}: {t0, t1, values0, values1}. */
    static double[][] bracket(SparkSession spark, Path run, RasterGrid grid, Instant t, int offsetSeconds) {
        long h0 = t.getEpochSecond() / 3600 * 3600;
        long h1 = h0 + 3600;
        double[] a = nan(grid.width() * grid.height());
        double[] b = nan(grid.width() * grid.height());
        java.time.ZoneOffset zo = java.time.ZoneOffset.ofTotalSeconds(offsetSeconds);
        String t0 = OffsetDateTime.ofInstant(Instant.ofEpochSecond(h0), zo).toString();
        String t1 = OffsetDateTime.ofInstant(Instant.ofEpochSecond(h1), zo).toString();
        for (Row r : spark.read().parquet(run.resolve("tables/cell_hours").toUri().toString())
                .filter(org.apache.spark.sql.functions.col("scenario").equalTo("baseline")
                        .and(org.apache.spark.sql.functions.col("time").isin(t0, t1)))
                .select("col", "row", "time", "surface_c").collectAsList()) {
            long s = OffsetDateTime.parse(r.getString(2)).toEpochSecond();
            int i = r.getInt(1) * grid.width() + r.getInt(0);
            if (s == h0) {
                a[i] = r.getFloat(3) + 273.15;
            } else if (s == h1) {
                b[i] = r.getFloat(3) + 273.15;
            }
        }
        return new double[][] {{h0, h1}, a, b};
    }

    static double[] interpolate(double[][] br, Instant t) {
        double f = (t.getEpochSecond() - br[0][0]) / (br[0][1] - br[0][0]);
        double[] v = new double[br[1].length];
        for (int i = 0; i < v.length; i++) {
            v[i] = br[1][i] + f * (br[2][i] - br[1][i]);
        }
        return v;
    }

    private static double[] nan(int n) {
        double[] v = new double[n];
        Arrays.fill(v, Double.NaN);
        return v;
    }

    /** Writes {@code lst-NAME.tif} and {@code qa-NAME.tif}. */
    static void image(Path out, String name, RasterGrid ig, RasterGrid grid, double[] cellsK, long seed,
            boolean cloud) {
        PixelFootprints cells = new PixelFootprints(grid.originX(), grid.originY(), grid.pixelWidth(), grid.width(),
                grid.height());
        Random rnd = new Random(seed);
        int[] dn = new int[ig.width() * ig.height()];
        int[] qa = new int[dn.length];
        // An invented cloud over the day image: a disc of 120 m radius north-east of the centre.
        double cx = grid.originX() + 0.7 * grid.width() * grid.pixelWidth();
        double cy = grid.originY() - 0.3 * grid.height() * grid.pixelWidth();
        for (int r = 0; r < ig.height(); r++) {
            for (int c = 0; c < ig.width(); c++) {
                int p = r * ig.width() + c;
                double x0 = ig.originX() + PIXEL_M * c;
                double y1 = ig.originY() - PIXEL_M * r;
                PixelFootprints.Footprint f = cells.rectangle(x0, y1 - PIXEL_M, x0 + PIXEL_M, y1);
                double k = f.coverage() > 0.5 ? f.weightedMean(cellsK) : Double.NaN;
                double noise = rnd.nextGaussian() * NOISE_K;   // drawn for every pixel: the field is seed-stable
                if (Double.isNaN(k)) {
                    continue;                                   // dn 0 (nodata), qa 0
                }
                double px = x0 + PIXEL_M / 2, py = y1 - PIXEL_M / 2;
                boolean cloudy = cloud && Math.hypot(px - cx, py - cy) < 120;
                double v = cloudy ? 268.0 + noise : k + noise;   // a cold cloud top (invented)
                dn[p] = (int) Math.max(1, Math.min(65535, Math.round((v - OFFSET) / SCALE)));
                qa[p] = cloudy ? 2 : 1;
            }
        }
        GeoTiffWriter.writeInt(out.resolve("lst-" + name + ".tif"), ig, GeoTiffWriter.IntType.UINT16, dn,
                OptionalInt.of(0));
        GeoTiffWriter.writeInt(out.resolve("qa-" + name + ".tif"), ig, GeoTiffWriter.IntType.UINT8, qa,
                OptionalInt.empty());
    }

    static String truth(RasterGrid ig) {
        StringBuilder b = new StringBuilder();
        b.append("# INVENTED demo observation of the invented city Riverside Flats: not measured, not from any\n")
                .append("# real image. Written by org.thermotile.jobs.demo.DemoObservation. The images are the demo\n")
                .append("# city simulated with the changes below (class-table overrides), plus noise.\n")
                .append("changes:\n");
        for (Change c : TRUTH) {
            b.append("  - {material: ").append(c.material()).append(", parameter: ").append(c.key())
                    .append(", library: ").append(num(libraryValue(c))).append(", true: ").append(num(trueValue(c)))
                    .append("}\n");
        }
        b.append("noise_k: ").append(num(NOISE_K)).append("            # Gaussian, standard deviation\n")
                .append("seeds: {day: ").append(DAY_SEED).append(", night: ").append(NIGHT_SEED).append("}\n")
                .append("images:\n")
                .append("  - {file: lst-day.tif, mask: qa-day.tif, time: ").append(DAY).append("}\n")
                .append("  - {file: lst-night.tif, mask: qa-night.tif, time: ").append(NIGHT).append("}\n")
                .append("grid: {crs: EPSG:").append(ig.epsg()).append(", pixel_m: ").append(num(PIXEL_M))
                .append(", width: ").append(ig.width()).append(", height: ").append(ig.height())
                .append(", west: ").append(num(ig.originX())).append(", north: ").append(num(ig.originY())).append("}\n")
                .append("stored: {type: UInt16, scale: ").append(SCALE).append(", offset: ").append(num(OFFSET))
                .append(", nodata: 0}\n")
                .append("mask_codes: {0: no data, 1: clear, 2: cloud}\n");
        return b.toString();
    }

    /** The images as an observations file for {@code thermotile observe} (the same entries as the demo run's block). */
    static String observationsFile() {
        return "# INVENTED demo images (see truth.yaml). thermotile observe RUN_DIR --observations observations.yaml\n"
                + "observations:\n" + entries("");
    }

    /** The two entries, their paths prefixed by {@code dir}. */
    public static String entries(String dir) {
        return String.format(Locale.ROOT, """
                  - {file: %slst-day.tif, time: "%s", kind: surface_temperature, units: K,
                     scale: %s, offset: %s, nodata: 0, mask: {file: %sqa-day.tif, keep: [1]}}
                  - {file: %slst-night.tif, time: "%s", kind: surface_temperature, units: K,
                     scale: %s, offset: %s, nodata: 0, mask: {file: %sqa-night.tif, keep: [1]}}
                """, dir, DAY, SCALE, num(OFFSET), dir, dir, NIGHT, SCALE, num(OFFSET), dir);
    }

    private static String num(double v) {
        String s = String.format(Locale.ROOT, "%.6f", v).replaceAll("0+$", "");
        return s.endsWith(".") ? s + "0" : s;
    }

    static List<String> files() {
        return new ArrayList<>(List.of("lst-day.tif", "qa-day.tif", "lst-night.tif", "qa-night.tif", "truth.yaml",
                "observations.yaml"));
    }
}
