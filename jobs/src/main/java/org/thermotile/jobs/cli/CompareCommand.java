package org.thermotile.jobs.cli;

import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.apache.spark.sql.SparkSession;
import org.thermotile.jobs.city.Comparison;
import org.thermotile.jobs.city.SparkSessions;
import picocli.CommandLine.Command;
import picocli.CommandLine.Parameters;

/** {@code thermotile compare}: a finished run's scenarios against its baseline. */
@Command(name = "compare", mixinStandardHelpOptions = true,
        description = {"Compares a finished run's scenarios with its baseline: delta maps, a per-district "
                + "table and a ranking (Parquet, CSV and Markdown under RUN_DIR/comparison/). "
                + "'run' does this itself when the run file has scenarios; nothing is re-simulated."})
final class CompareCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "RUN_DIR")
    Path runDir;

    @Override
    public Integer call() throws Exception {
        try (org.thermotile.jobs.storage.RunLock lock = FolderLock.hold(runDir, "compare")) {
            return work();
        }
    }

    private Integer work() throws Exception {
        Path cmp = runDir.resolve("comparison");
        java.util.List<String> periods = org.thermotile.jobs.storage.RunLayout.periodsOf(runDir);
        try (SparkSession spark = SparkSessions.get(null, 0)) {
            // A run over several periods: each period's comparison, then the one across them.
            for (String p : periods) {
                Path dir = runDir.resolve("periods").resolve(p);
                if (java.nio.file.Files.exists(dir.resolve("comparison"))) {
                    org.thermotile.jobs.storage.Folders.deleteTree(dir.resolve("comparison"));
                }
                Comparison.write(spark, dir);
            }
            if (java.nio.file.Files.exists(cmp)) {
                org.thermotile.jobs.storage.Folders.deleteTree(cmp);
            }
            if (periods.isEmpty()) {
                Comparison.write(spark, runDir);
            } else {
                Comparison.writeAcrossPeriods(spark, runDir, periods);
            }
        }
        org.thermotile.jobs.catalogue.StacItem.writeAll(runDir);   // the catalogue entry lists the new files
        System.out.println("comparison written to " + cmp + " (summary.md, ranking.csv, districts.csv)");
        return 0;
    }
}
