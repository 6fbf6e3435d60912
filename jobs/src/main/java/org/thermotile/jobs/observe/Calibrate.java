package org.thermotile.jobs.observe;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.thermotile.jobs.city.PreparedRun;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.materials.Material;
import org.thermotile.model.observe.Calibration;

/**
 * Calibration of a finished run's materials against the images the comparison read
 * ({@link Observe#run}): pixels labelled by their dominant material, the run's forcing and kernel
 * settings, then {@link Calibration#fit} (plain Java on the driver over a stratified sample of
 * pixels; no Spark job per evaluation in this version) and {@link CalibrationFiles}. Writes
 * {@code RUN_DIR/observed/calibrated_materials.yaml} and {@code RUN_DIR/observed/calibration.csv}.
 */
public final class Calibrate {
    private Calibrate() {}

    /** Pixels sampled per dominant material. */
    public static final int PER_STRATUM = 30;
    /** Sampling seed (fixed, so the same inputs give the same files). */
    public static final long SEED = 20260714L;
    /** Cap on kernel runs of the optimiser. */
    public static final int MAX_EVALUATIONS = 600;

    /**
     * Parses {@code albedo,moisture_availability} into keys.
     *
     * @throws UserInputException naming the bad key and the valid ones
     */
    public static List<String> keys(String list) {
        List<String> out = new ArrayList<>();
        for (String k : list.split(",")) {
            String key = k.trim().toLowerCase(Locale.ROOT);
            if (!Calibration.KEYS.contains(key)) {
                throw new UserInputException("--calibrate: '" + k.trim() + "' is not a parameter that can be "
                        + "calibrated; fix: use a comma-separated list of " + String.join(", ", Calibration.KEYS));
            }
            if (!out.contains(key)) {
                out.add(key);
            }
        }
        return out;
    }

    /**
     * Fits {@code keys} for every material that dominates an observed pixel.
     *
     * @param run     the run prepared again from its run file
     * @param results the comparison's results (one per image)
     */
    public static Calibration.Fit run(Path runDir, PreparedRun run, List<ObserveResultView> results, List<String> keys) {
        Material[] palette = run.spec().palette();
        Forcing forcing = run.spec().forcing();
        // One pixel list per image, concatenated: pixel j of image i is index offset_i + j.
        int total = 0;
        for (ObserveResultView r : results) {
            total += r.observed().length;
        }
        int[] dominant = new int[total];
        double[][] observed = new double[results.size()][total];
        double[] hours = new double[results.size()];
        boolean[] used = new boolean[palette.length];
        int off = 0;
        for (int i = 0; i < results.size(); i++) {
            ObserveResultView r = results.get(i);
            java.util.Arrays.fill(observed[i], Double.NaN);
            hours[i] = hourOf(forcing, r.time().getEpochSecond());
            for (int j = 0; j < r.observed().length; j++) {
                int m = indexOf(palette, r.dominantMaterial()[j]);
                dominant[off + j] = m;
                observed[i][off + j] = r.observed()[j];
                if (m >= 0 && !Double.isNaN(r.observed()[j])) {
                    used[m] = true;
                }
            }
            off += r.observed().length;
        }
        List<Calibration.Parameter> free = new ArrayList<>();
        for (int m = 0; m < palette.length; m++) {
            if (used[m]) {
                for (String k : keys) {
                    free.add(Calibration.Parameter.of(m, k));
                }
            }
        }
        if (free.isEmpty()) {
            throw new UserInputException(runDir + ": no observed pixel has a simulated material; fix: give images "
                    + "that cover the run's area");
        }
        Calibration.Fit fit;
        try {
            fit = Calibration.fit(palette, free, new Calibration.Observed(dominant, hours, observed), forcing,
                    run.spec().settings(), PER_STRATUM, SEED, MAX_EVALUATIONS);
        } catch (IllegalArgumentException e) {
            throw new UserInputException(runDir + ": calibration: " + e.getMessage() + " (if the run file or the "
                    + "times are in question: --run-file must be this run's run file, and the images' times must lie "
                    + "in its kept hours)");
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
        return fit;
    }

    /** What calibration needs of one compared image. */
    public record ObserveResultView(String name, java.time.Instant time, double[] observed, String[] dominantMaterial) {
        public static ObserveResultView of(Observe.ImageResult r) {
            return new ObserveResultView(r.name(), r.time(), r.observed(), r.dominantMaterial());
        }
    }

    private static int indexOf(Material[] palette, String id) {
        if (id == null) {
            return -1;
        }
        for (int i = 0; i < palette.length; i++) {
            if (palette[i].id().equals(id)) {
                return i;
            }
        }
        return -1;
    }

    /** Fractional forcing-hour index of an instant [s since 1970]. */
    static double hourOf(Forcing f, long epochSecond) {
        long t0 = f.epochSecond[0];
        long step = f.hours() > 1 ? f.epochSecond[1] - t0 : 3600;
        return (double) (epochSecond - t0) / step;
    }
}
