package org.thermotile.jobs.cli;

import java.io.PrintStream;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.apache.spark.sql.SparkSession;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.hotspots.HotspotOptions;
import org.thermotile.jobs.hotspots.Hotspots;
import org.thermotile.model.hotspot.DistanceBand.Weights;
import org.thermotile.model.hotspot.HotspotClass;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code thermotile hotspots}: significant hot and cold spots of a finished run. */
@Command(name = "hotspots", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Finds statistically significant hot and cold spots in a finished run: Getis-Ord Gi* "
                + "z-scores on a fixed distance band, two-sided normal p-values, Benjamini-Hochberg false "
                + "discovery rate, classes at 90, 95 and 99 %% confidence, merged into polygons.",
                "Writes RUN_DIR/hotspots/STATISTIC/ (or RUN_DIR/scenarios/NAME/hotspots/STATISTIC/): zscore.tif, "
                        + "class.tif, hotspots.geojson (the maps' CRS), hotspots_wgs84.geojson, polygons/ and "
                        + "districts/ (Parquet), summary.json. Reads the run's maps; never re-simulates."})
public final class HotspotsCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "RUN_DIR", description = "a folder written by 'thermotile run'")
    Path runDir;

    @Option(names = "--statistic", paramLabel = "NAME", defaultValue = HotspotOptions.DEFAULT_STATISTIC,
            description = "the per-cell map: peak, mean, night_min, degree_hours, hours_above; with a scenario "
                    + "also delta_NAME (scenario minus run) (default: ${DEFAULT-VALUE})")
    String statistic;

    @Option(names = "--scenario", paramLabel = "NAME",
            description = "a scenario under RUN_DIR/scenarios/ (default: the run itself, 'baseline')")
    String scenario;

    @Option(names = "--reference", paramLabel = "WHOSE", defaultValue = "baseline",
            description = "with --scenario: compare with the run's city-wide mean and spread (baseline: hot-spot "
                    + "areas comparable with the run's) or the scenario's own (scenario) (default: ${DEFAULT-VALUE})")
    String reference;

    @Option(names = "--distance", paramLabel = "METRES", defaultValue = "100",
            description = "distance band D in metres: neighbours whose centres lie within D (default: ${DEFAULT-VALUE})")
    double distanceM;

    @Option(names = "--weights", paramLabel = "KIND", defaultValue = "binary",
            description = "binary or inverse_distance (default: ${DEFAULT-VALUE})")
    String weights;

    @Option(names = "--fdr", paramLabel = "Q", defaultValue = "0.10",
            description = "Benjamini-Hochberg false discovery rate, at most 0.10 (default: ${DEFAULT-VALUE})")
    double fdr;

    @Option(names = "--tile-size", paramLabel = "N", defaultValue = "256",
            description = "cells per tile edge of the parallel pass; results do not depend on it (default: ${DEFAULT-VALUE})")
    int tileSize;

    @Option(names = "--master", paramLabel = "URL",
            description = "Spark master, e.g. spark://host:7077 (default: embedded)")
    String master;

    @Option(names = "--threads", paramLabel = "N", defaultValue = "0",
            description = "embedded Spark threads (default: all cores)")
    int threads;

    @Option(names = "--replace", description = "overwrite an existing hotspot folder")
    boolean replace;

    /** The options as given. */
    HotspotOptions options() {
        Weights w = Weights.ofKey(weights);
        if (w == null) {
            throw new UserInputException("--weights '" + weights + "' is unknown. Fix: give binary or inverse_distance");
        }
        HotspotOptions.Reference ref = HotspotOptions.Reference.ofKey(reference);
        if (ref == null) {
            throw new UserInputException("--reference '" + reference + "' is unknown. Fix: give baseline or scenario");
        }
        return new HotspotOptions(statistic, scenario, distanceM, w, fdr, tileSize, replace,
                org.thermotile.jobs.hotspots.DistrictCells.GEOJSON, ref);
    }

    @Override
    public Integer call() {
        HotspotOptions opt = options();
        Hotspots.Prepared p = Hotspots.prepare(runDir, opt);     // every check before Spark starts
        SparkSession spark = SparkSessions.get(master, threads);
        try {
            print(Hotspots.run(spark, p), System.out);
        } finally {
            spark.stop();
        }
        return 0;
    }

    /** Runs on a given session (left running) and prints the summary; for tests and the run command. */
    public static Hotspots.Result execute(SparkSession spark, Path runDir, HotspotOptions opt, PrintStream console) {
        Hotspots.Result r = Hotspots.run(spark, runDir, opt);
        print(r, console);
        return r;
    }

    static void print(Hotspots.Result r, PrintStream out) {
        out.printf(Locale.ROOT, "%s%s: %s%d cells, mean %.3f %s, sd %.3f %s; %s%n", r.statistic(),
                r.scenario() == null ? "" : " (scenario " + r.scenario() + ")",
                r.reference().equals("baseline") ? "compared with the run's " : "", r.validCells(), r.mean(), r.unit(),
                r.sd(), r.unit(), r.band());
        StringBuilder cls = new StringBuilder();
        for (HotspotClass.Code c : HotspotClass.TABLE) {
            cls.append(String.format(Locale.ROOT, "%n  %2d %-28s %d cells", c.code(), c.label(), r.classCells().get(c.code())));
        }
        out.println("classes (FDR " + r.thresholds().fdr() + "):" + cls);
        out.printf(Locale.ROOT, "hot spots: %d polygons, %.0f m²%s; cold spots: %d polygons, %.0f m²%n",
                r.hotPolygons(), r.hotAreaM2(), Double.isNaN(r.hotMeanValue()) ? ""
                        : String.format(Locale.ROOT, ", mean %.2f %s", r.hotMeanValue(), r.unit()),
                r.coldPolygons(), r.coldAreaM2());
        if (r.hotAreaRemovedM2() != null) {
            out.printf(Locale.ROOT, "hot-spot area removed against the run itself: %.0f m²%n", r.hotAreaRemovedM2());
        }
        r.notes().forEach(n -> out.println("note: " + n));
        out.println("outputs: " + r.outDir());
        out.println("  " + String.join(" ", r.outputs()));
        out.println("Surface temperature is not air temperature nor a heat-health index.");
    }
}
