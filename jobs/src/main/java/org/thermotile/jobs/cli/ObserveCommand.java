package org.thermotile.jobs.cli;

import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.apache.spark.sql.SparkSession;
import org.thermotile.jobs.city.SparkSessions;
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

    @Override
    public Integer call() throws Exception {
        ObservationSet set = ObservationSet.read(observations);
        try (SparkSession spark = SparkSessions.get(null, 0)) {
            for (Observe.ImageResult r : Observe.run(spark, runDir, set)) {
                System.out.printf(Locale.ROOT, "%s: %d pixels, bias %.2f K, RMSE %.2f K, MAE %.2f K, r %.3f%n",
                        r.name(), r.all().count(), r.all().bias(), r.all().rmse(), r.all().mae(), r.all().pearson());
            }
        }
        System.out.println("comparison written to " + runDir.resolve("observed")
                + " (agreement.csv, pairs.csv, difference_*.tif, CAUTIONS.txt)");
        System.out.println("Surface temperature is not air temperature, nor a heat-health index.");
        return 0;
    }
}
