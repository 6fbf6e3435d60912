package org.thermotile.jobs.cli;

import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.apache.spark.sql.SparkSession;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.observe.Observe;
import org.thermotile.jobs.observe.ObservationSet;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code thermotile observe}: a finished run against thermal images. */
@Command(name = "observe", mixinStandardHelpOptions = true,
        description = {"Compares a finished run's baseline surface temperature with thermal images (surface "
                + "temperature, brightness temperature or radiance) at their acquisition times: difference maps "
                + "(simulated - observed, K = degC difference) and agreement per material and district under "
                + "RUN_DIR/observed/. The run must have kept the acquisition days (outputs.hourly_days)."})
final class ObserveCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "RUN_DIR")
    Path runDir;

    @Option(names = "--observations", required = true, paramLabel = "FILE.yaml",
            description = "YAML file with an 'observations:' list of images")
    Path observations;

    @Option(names = "--calibrate", paramLabel = "KEYS",
            description = "also fit these material parameters to the images (comma-separated: albedo, emissivity, "
                    + "moisture_availability, anthropogenic_heat) for every material that dominates an observed "
                    + "pixel, or as MATERIAL.KEY for one material (asphalt_aged.albedo); writes observed/calibrated_materials.yaml, observed/calibration.csv and "
                    + "observed/calibration.parquet")
    String calibrate;

    @Option(names = "--run-file", paramLabel = "RUN.yaml",
            description = "the run file of RUN_DIR (needed by --calibrate for the forcing and the materials)")
    Path runFile;

    @Override
    public Integer call() throws Exception {
        try (org.thermotile.jobs.storage.RunLock lock = FolderLock.hold(runDir, "observe")) {
            return work();
        }
    }

    private Integer work() throws Exception {
        ObservationSet set = ObservationSet.read(observations);
        java.util.List<String> keys = null;
        org.thermotile.jobs.city.PreparedRun prepared = null;
        if (calibrate != null) {
            keys = org.thermotile.jobs.observe.Calibrate.keys(calibrate);
            if (runFile == null) {
                throw new UserInputException("--calibrate needs --run-file RUN.yaml, the run file of " + runDir
                        + " (for its forcing and materials); fix: add it");
            }
            prepared = org.thermotile.jobs.city.RunPreparer.prepare(
                    org.thermotile.jobs.config.RunFileReader.read(runFile));
        }
        try (SparkSession spark = SparkSessions.get(null, 0)) {
            java.util.List<Observe.ImageResult> results = Observe.run(spark, runDir, set);
            for (Observe.ImageResult r : results) {
                System.out.printf(Locale.ROOT, "%s: %d pixels, bias %.2f K, RMSE %.2f K, MAE %.2f K, r %.3f%n",
                        r.name(), r.all().count(), r.all().bias(), r.all().rmse(), r.all().mae(), r.all().pearson());
            }
            if (keys != null) {
                System.out.println("calibrating " + String.join(", ", keys) + "…");
                var fit = org.thermotile.jobs.observe.Calibrate.run(spark, runDir, prepared,
                        org.thermotile.jobs.observe.Calibrate.ObserveResultView.of(results, set), keys, System.out);
                for (var e : fit.estimates()) {
                    System.out.printf(Locale.ROOT, "  %s %s: %.4f -> %.4f +/- %.4f%s%n",
                            fit.palette()[e.parameter().material()].id(), e.parameter().key(), e.start(), e.value(),
                            e.standardError(), e.identifiable() ? "" : "  WARNING: not identifiable (" + e.why() + ")");
                }
                System.out.printf(Locale.ROOT, "  sample RMSE %.2f K -> %.2f K (%d evaluations)%n", fit.rmseBeforeK(),
                        fit.rmseAfterK(), fit.evaluations());
            }
        }
        org.thermotile.jobs.catalogue.StacItem.writeAll(runDir);   // the catalogue entry lists the new files
        System.out.println("comparison written to " + runDir.resolve("observed")
                + " (agreement.csv, pairs.csv, difference_*.tif, CAUTIONS.txt)");
        System.out.println("Surface temperature is not air temperature, nor a heat-health index.");
        return 0;
    }
}
