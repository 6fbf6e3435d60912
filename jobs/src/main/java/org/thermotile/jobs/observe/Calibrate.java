package org.thermotile.jobs.observe;

import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.apache.spark.sql.SparkSession;
import org.thermotile.jobs.city.PreparedRun;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.materials.Material;
import org.thermotile.model.observe.Calibration;
import org.thermotile.model.observe.PixelCells;
import org.thermotile.model.observe.PixelFootprints;
import org.thermotile.model.observe.PixelSimulation;

/**
 * Calibration of a finished run's materials against the images the comparison read
 * ({@link Observe#run}).
 *
 * <p><b>Sample.</b> Every observed pixel is labelled by its dominant material (the palette entry
 * covering most of its footprint); a <em>stratified random sample by dominant material, equal
 * allocation</em> (up to {@link #PER_STRATUM} pixels per material, without replacement, fixed seed
 * {@link #SEED}; {@link Calibration#stratifiedSample}) is drawn over all images. Each sampled pixel
 * is simulated as its real footprint: the run's own cells under it (their materials, sky view
 * factor and cast shadows, through the city job's {@link org.thermotile.jobs.city.TileTask#inputs}
 * and the tile kernel), averaged with the overlap areas the comparison uses.
 *
 * <p><b>Evaluations.</b> Each evaluation of the objective is one Spark job over partitions of the
 * sampled pixels ({@link CalibrationJob}); the optimiser, the uncertainty and the files are on the
 * driver ({@link Calibration#fit}, {@link CalibrationFiles}). Writes
 * {@code RUN_DIR/observed/calibrated_materials.yaml}, {@code RUN_DIR/observed/calibration.csv} and
 * {@code RUN_DIR/observed/calibration.parquet} (the CSV's rows, typed).
 */
public final class Calibrate {
    private Calibrate() {}

    /** Pixels sampled per dominant material. */
    public static final int PER_STRATUM = 30;
    /** Sampling seed (fixed, so the same inputs give the same files). */
    public static final long SEED = 20260714L;
    /** Cap on kernel runs of the optimiser. */
    public static final int MAX_EVALUATIONS = 600;
    /** A progress line every this many evaluations (and the first). */
    static final int PROGRESS_EVERY = 10;

    /** The sampling, as the outputs name it. */
    public static String samplingLabel() {
        return "stratified random sample by dominant material, equal allocation (up to " + PER_STRATUM
                + " pixels per material, without replacement), seed " + SEED;
    }

    /**
     * Parses {@code albedo,moisture_availability} into keys. A key may name one material as
     * {@code MATERIAL.KEY} ({@code asphalt_aged.albedo}): that parameter then moves for that
     * material only; a bare key moves for every material that dominates an observed pixel.
     *
     * @throws UserInputException naming the bad key and the valid ones
     */
    public static List<String> keys(String list) {
        List<String> out = new ArrayList<>();
        for (String k : list.split(",")) {
            String given = k.trim().toLowerCase(Locale.ROOT);
            int dot = given.lastIndexOf('.');
            String key = dot < 0 ? given : given.substring(dot + 1);
            if (!Calibration.KEYS.contains(key) || dot == 0) {
                throw new UserInputException("--calibrate: '" + k.trim() + "' is not a parameter that can be "
                        + "calibrated; fix: use a comma-separated list of " + String.join(", ", Calibration.KEYS)
                        + ", each alone (every observed material) or as MATERIAL.KEY (one material, e.g. "
                        + "asphalt_aged.albedo)");
            }
            if (!out.contains(given)) {
                out.add(given);
            }
        }
        return out;
    }

    /** The parameters {@code keys} free: bare keys for every used material, MATERIAL.KEY for that one. */
    static List<Calibration.Parameter> freeParameters(Material[] palette, boolean[] used, List<String> keys) {
        for (String k : keys) {
            int dot = k.lastIndexOf('.');
            if (dot < 0) {
                continue;
            }
            String id = k.substring(0, dot);
            int m = indexOf(palette, id);
            if (m < 0 || !used[m]) {
                List<String> observed = new ArrayList<>();
                for (int i = 0; i < palette.length; i++) {
                    if (used[i]) {
                        observed.add(palette[i].id());
                    }
                }
                throw new UserInputException("--calibrate: material '" + id + "' " + (m < 0 ? "is not in the run"
                        : "dominates no observed pixel") + "; fix: use one of the materials the images see: "
                        + String.join(", ", observed));
            }
        }
        List<Calibration.Parameter> free = new ArrayList<>();
        for (int m = 0; m < palette.length; m++) {
            if (!used[m]) {
                continue;
            }
            for (String k : keys) {
                int dot = k.lastIndexOf('.');
                String key = dot < 0 ? k : k.substring(dot + 1);
                boolean mine = dot < 0 || k.substring(0, dot).equals(palette[m].id());
                Calibration.Parameter p = mine ? Calibration.Parameter.of(m, key) : null;
                if (p != null && !free.contains(p)) {
                    free.add(p);
                }
            }
        }
        return free;
    }

    private static int indexOf(Material[] palette, String id) {
        for (int i = 0; i < palette.length; i++) {
            if (palette[i].id().equals(id)) {
                return i;
            }
        }
        return -1;
    }

    /** What the sample and its simulation are, before any evaluation. */
    record Sample(Material[] palette, List<Calibration.Parameter> free, int[] sample, double[][] observedK,
            List<PixelCells> cells, PixelSimulation simulation) {}

    /**
     * Draws the sample and reads the sampled pixels' cells, once per run tile (no evaluation yet).
     *
     * @param run     the run prepared again from its run file
     * @param results the comparison's results (one per image)
     */
    static Sample sample(Path runDir, PreparedRun run, List<ObserveResultView> results, List<String> keys) {
        Material[] palette = run.spec().palette();
        Forcing forcing = run.spec().forcing();
        int[] gridMaterials = CalibrationSample.gridMaterials(run.spec());
        // One pixel list per image, concatenated: pixel j of image i is index offset_i + j.
        List<PixelFootprints.Footprint> footprints = new ArrayList<>();
        List<double[]> observedPerImage = new ArrayList<>();
        for (ObserveResultView r : results) {
            List<PixelFootprints.Footprint> f = CalibrationSample.footprints(r.imageFile(), run.grid());
            if (f.size() != r.observed().length) {
                throw new IllegalStateException(r.imageFile() + ": " + f.size() + " footprints for "
                        + r.observed().length + " compared pixels");
            }
            footprints.addAll(f);
            observedPerImage.add(r.observed());
        }
        int total = footprints.size();
        int[] dominant = new int[total];
        double[][] observed = new double[results.size()][total];
        double[] hours = new double[results.size()];
        boolean[] used = new boolean[palette.length];
        int off = 0;
        for (int i = 0; i < results.size(); i++) {
            double[] o = observedPerImage.get(i);
            Arrays.fill(observed[i], Double.NaN);
            hours[i] = hourOf(forcing, results.get(i).time().getEpochSecond());
            for (int j = 0; j < o.length; j++) {
                int p = off + j;
                observed[i][p] = o[j];
                dominant[p] = Double.isNaN(o[j]) ? -1
                        : CalibrationSample.dominant(footprints.get(p), gridMaterials, palette.length);
                if (dominant[p] >= 0) {
                    used[dominant[p]] = true;
                }
            }
            off += o.length;
        }
        List<Calibration.Parameter> free = freeParameters(palette, used, keys);
        if (free.isEmpty()) {
            throw new UserInputException(runDir + ": no observed pixel has a simulated material; fix: give images "
                    + "that cover the run's area");
        }
        try {
            Calibration.Observed obs = new Calibration.Observed(dominant, hours, observed);
            int[] sample = Calibration.stratifiedSample(obs, palette.length, PER_STRATUM, SEED);
            List<PixelFootprints.Footprint> sampled = new ArrayList<>(sample.length);
            for (int p : sample) {
                sampled.add(footprints.get(p));
            }
            List<PixelCells> cells = CalibrationSample.cells(sampled, run.spec(), run.run().tiling().tileSize());
            PixelSimulation sim = new PixelSimulation(forcing, run.spec().settings(), hours);
            return new Sample(palette, free, sample, Calibration.observedOf(obs, sample), cells, sim);
        } catch (IllegalArgumentException e) {
            throw new UserInputException(runDir + ": calibration: " + e.getMessage() + " (if the run file or the "
                    + "times are in question: --run-file must be this run's run file, and the images' times must lie "
                    + "in its kept hours)");
        }
    }

    /**
     * Fits {@code keys} for every material that dominates an observed pixel, each evaluation a
     * Spark job over the sampled pixels; progress (evaluation n, RMSE) goes to {@code console}.
     *
     * @param run     the run prepared again from its run file
     * @param results the comparison's results (one per image)
     */
    public static Calibration.Fit run(SparkSession spark, Path runDir, PreparedRun run,
            List<ObserveResultView> results, List<String> keys, PrintStream console) {
        Sample s = sample(runDir, run, results, keys);
        console.printf(Locale.ROOT, "  %s: %d pixels, %d parameters, each evaluation a Spark job over their cells "
                + "(%d forcing hours)%n", samplingLabel(), s.sample().length, s.free().size(), s.simulation().hours());
        Calibration.Progress progress = (n, rmse, best) -> {
            if (n == 1 || n % PROGRESS_EVERY == 0) {
                console.printf(Locale.ROOT, "  evaluation %d: RMSE %.3f K (best %.3f K)%n", n, rmse, best);
            }
        };
        Calibration.Fit fit;
        try (CalibrationJob job = new CalibrationJob(spark, s.simulation(), s.cells())) {
            fit = Calibration.fit(s.palette(), s.free(), s.sample(), s.observedK(), job, MAX_EVALUATIONS, progress);
        } catch (IllegalArgumentException e) {
            throw new UserInputException(runDir + ": calibration: " + e.getMessage());
        }
        Path dir = runDir.resolve("observed");
        try {
            Files.createDirectories(dir);
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
        List<String> names = results.stream().map(ObserveResultView::name).toList();
        CalibrationFiles.writeMaterials(dir.resolve("calibrated_materials.yaml"), fit,
                "observations " + String.join(", ", names));
        CalibrationFiles.writeStatistics(dir.resolve("calibration.csv"), fit);
        CalibrationFiles.writeParquet(spark, dir.resolve("calibration.parquet"), fit);
        return fit;
    }

    /** What calibration needs of one compared image: its observed values [K] per pixel and its file. */
    public record ObserveResultView(String name, java.time.Instant time, double[] observed, Path imageFile) {
        /** The result of comparing {@code image} (the same entry of the observation set). */
        public static ObserveResultView of(Observe.ImageResult r, ObservationSet.Image image) {
            if (!r.name().equals(image.name())) {
                throw new IllegalArgumentException("result " + r.name() + " is not of image " + image.name());
            }
            return new ObserveResultView(r.name(), r.time(), r.observed(), image.file());
        }

        /** Each result with its image, in the set's order. */
        public static List<ObserveResultView> of(List<Observe.ImageResult> results, ObservationSet set) {
            List<ObserveResultView> out = new ArrayList<>();
            for (int i = 0; i < results.size(); i++) {
                out.add(of(results.get(i), set.images().get(i)));
            }
            return out;
        }
    }

    /** Fractional forcing-hour index of an instant [s since 1970]. */
    static double hourOf(Forcing f, long epochSecond) {
        long t0 = f.epochSecond[0];
        long step = f.hours() > 1 ? f.epochSecond[1] - t0 : 3600;
        return (double) (epochSecond - t0) / step;
    }
}
