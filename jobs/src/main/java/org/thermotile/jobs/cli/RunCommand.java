package org.thermotile.jobs.cli;

import java.io.PrintStream;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import java.util.function.Consumer;
import org.apache.spark.sql.SparkSession;
import org.thermotile.jobs.city.CityJob;
import org.thermotile.jobs.city.PreparedRun;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.observe.ObservationSet;
import org.thermotile.jobs.observe.Observe;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code thermotile run}: the city job. */
@Command(name = "run", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Runs a city job from a run file: every cell's surface energy balance through "
                + "the period, written as GeoTIFF maps, Parquet tables and a manifest.",
                "Every input is checked first (as 'thermotile check' does); nothing is written unless "
                        + "the whole run succeeds."})
final class RunCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "RUNFILE", description = "the run file (YAML)")
    Path runFile;

    @Option(names = "--out", paramLabel = "DIR", description = "output folder (default: runs/<run name>)")
    Path out;

    @Mixin
    SharedOptions.Spark spark = new SharedOptions.Spark();

    @Mixin
    SharedOptions.Replace replace = new SharedOptions.Replace();

    @Mixin
    SharedOptions.Quiet quiet = new SharedOptions.Quiet();

    @Option(names = "--confirm-sweep", description = "run a sweep larger than its max_scenarios")
    boolean confirmSweep;

    @Option(names = "--resume", description = "keep the complete scenario partitions of an existing output "
            + "folder (checked against its manifest's hashes) and compute only what is missing")
    boolean resume;

    @Override
    public Integer call() {
        RunFile run = RunFileReader.read(runFile);
        Path dir = out != null ? out : Path.of("runs", run.name());
        execute(run, dir, spark.master, spark.threads, replace.replace, quiet.quiet, confirmSweep, resume, System.out,
                runFile.toString());
        return 0;
    }

    static CityJob.Summary execute(RunFile run, Path dir, String master, int threads, boolean replace,
            boolean quiet, boolean confirmSweep, boolean resume, PrintStream console) {
        return execute(run, dir, master, threads, replace, quiet, confirmSweep, resume, console, null);
    }

    static CityJob.Summary execute(RunFile run, Path dir, String master, int threads, boolean replace,
            boolean quiet, boolean confirmSweep, boolean resume, PrintStream console, String runFileName) {
        List<PreparedRun> periods = RunPreparer.prepareAll(run, confirmSweep);
        PreparedRun p = periods.get(0);
        if (!quiet) {
            console.printf(Locale.ROOT, "%s: %d × %d cells of %.1f m (EPSG:%d), %d materials, %d counted hours%s%n",
                    run.name(), p.grid().width(), p.grid().height(), p.grid().pixelWidth(), p.grid().epsg(),
                    p.paletteLabels().size(), periods.stream().mapToInt(x -> x.sampleEpochSeconds().length).sum(),
                    run.hasPeriods() ? " in " + periods.size() + " periods" : "");
            periods.forEach(x -> x.notes().forEach(n -> console.println("note: "
                    + (x.period() == null ? "" : x.period() + ": ") + n)));
        }
        // The report is written into the finished folder before it is published, so it appears with it.
        String[] reportProblem = {null};
        Consumer<Path> report = folder -> {
            try {
                org.thermotile.jobs.report.RunReport.write(folder);
            } catch (RuntimeException e) {
                reportProblem[0] = e.getMessage();   // the run is still complete; only its report is missing
            }
        };
        CityJob.Summary s;
        CityJob.Options options = new CityJob.Options(dir, master, replace, quiet, threads, resume, report, runFileName);
        if (run.observations().isEmpty()) {
            s = CityJob.run(null, periods, options, console);
        } else {
            s = runObserved(run, periods, options, console);
        }
        String where = CityJob.remoteOutput(s.outDir()) != null ? CityJob.remoteOutput(s.outDir()) : s.outDir().toString();
        String stepped = s.steppedCellHours() < s.cellHours()
                ? String.format(Locale.ROOT, " (%.3g stepped, the scenarios sharing unchanged cells)", (double) s.steppedCellHours())
                : "";
        console.printf(Locale.ROOT, "done: %d cells, %.3g cell-hours%s in %.1f s (%.3g cell-hours/s), "
                        + "largest closure residual %.1e%n", s.cells(), (double) s.cellHours(), stepped, s.wallSeconds(),
                s.cellHoursPerSecond(), s.maxClosureResidual());
        console.println("outputs: " + where);
        if (run.hasPeriods()) {
            console.println("  periods/   " + String.join(" ", run.periods().stream().map(RunFile.NamedPeriod::name)
                    .toList()) + " (each: maps/, scenarios/, comparison/, manifest.json, report.html)");
            console.println("  tables/    cells, material_hours" + (p.districtNames().isEmpty() ? "" : ", district_hours")
                    + (periods.stream().anyMatch(x -> x.hourlyEpochSeconds().length > 0) ? ", cell_hours" : "")
                    + " (Parquet, partitioned by period and scenario)");
            if (!run.scenarios().isEmpty()) {
                console.println("  comparison/summary.md, ranking_by_period.csv (every period's ranking)");
            }
        } else {
            console.println("  maps/      " + String.join(" ", s.maps().stream().filter(m -> m.startsWith("maps/"))
                    .map(m -> m.substring("maps/".length())).toList()));
            console.println("  tables/    cells, material_hours" + (p.districtNames().isEmpty() ? "" : ", district_hours")
                    + (p.hourlyEpochSeconds().length > 0 ? ", cell_hours" : "") + " (Parquet)");
            if (!run.scenarios().isEmpty()) {
                console.println("  scenarios/ " + run.scenarios().size() + " programmes, maps and delta maps each");
                console.println("  comparison/summary.md, ranking.csv, districts.csv");
            }
        }
        if (!run.observations().isEmpty()) {
            console.println("  observed/  agreement.csv, agreement.parquet, pairs.csv, pairs.parquet, difference_*.tif, "
                    + "CAUTIONS.txt (" + run.observations().size() + " images)");
        }
        console.println("  manifest.json");
        if (reportProblem[0] == null) {
            console.println("  report:    " + where + "/" + org.thermotile.jobs.report.RunReport.FILE
                    + " (open it in a browser)");
        } else {
            console.println("  report:    not written (" + reportProblem[0] + "); retry with: thermotile report " + where);
        }
        console.println("Surface temperature is not air temperature nor a heat-health index.");
        return s;
    }

    /**
     * A run with an {@code observations:} block: the images are checked against the grid before
     * anything is simulated, and compared with the finished run inside its folder before it is
     * published (then the report), so a failed comparison leaves nothing behind.
     */
    private static CityJob.Summary runObserved(RunFile run, List<PreparedRun> periods, CityJob.Options opt,
            PrintStream console) {
        ObservationSet set = ObservationSet.of(run);
        Observe.check(set, periods.get(0).grid());
        SparkSession spark = SparkSessions.get(opt.master(),
                opt.threads());
        try {
            Consumer<Path> report = opt.beforePublish();
            Consumer<Path> both = folder -> {
                for (var r : Observe.run(spark, folder, set)) {
                    if (!opt.quiet()) {
                        console.printf(Locale.ROOT, "observed %s: %d pixels, bias %.2f K, RMSE %.2f K, MAE %.2f K%n",
                                r.name(), r.all().count(), r.all().bias(), r.all().rmse(), r.all().mae());
                    }
                }
                report.accept(folder);
            };
            return CityJob.run(spark, periods, new CityJob.Options(opt.outDir(), opt.master(), opt.replace(),
                    opt.quiet(), opt.threads(), opt.resume(), both, opt.runFile()), console);
        } finally {
            spark.stop();
        }
    }
}
