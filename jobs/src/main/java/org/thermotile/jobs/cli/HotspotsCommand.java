package org.thermotile.jobs.cli;

import java.io.PrintStream;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.apache.spark.sql.SparkSession;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.hotspots.HotspotOptions;
import org.thermotile.jobs.hotspots.Hotspots;
import org.thermotile.jobs.hotspots.ZoneHotspots;
import org.thermotile.model.hotspot.DistanceBand.Weights;
import org.thermotile.model.hotspot.ExcessBand;
import org.thermotile.model.hotspot.FalseDiscovery;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code thermotile hotspots}: significant hot and cold spots of a finished run. */
@Command(name = "hotspots", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Finds hot and cold areas of a finished run at planning scale: the map is aggregated to "
                + "analysis cells (area-weighted means), Getis-Ord Gi* z-scores on a distance band (by default at the "
                + "peak of Moran's I), Benjamini-Hochberg or -Yekutieli q-values, and an area counts when it is "
                + "significant and warmer (cooler) than the city's median by at least the minimum excess.",
                "Writes RUN_DIR/hotspots/STATISTIC/ (or RUN_DIR/scenarios/NAME/hotspots/STATISTIC/): excess_band.tif, "
                        + "excess_k.tif, qvalue.tif, zscore.tif, hotspots.geojson (the maps' CRS), "
                        + "hotspots_wgs84.geojson, polygons/ and districts/ (Parquet), summary.json. Reads the run's "
                        + "maps; never re-simulates."})
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

    @Option(names = {"--cell-size-m", "--cell-size"}, paramLabel = "METRES",
            description = "analysis cell, a whole multiple of the simulation cell (default: 40 m rounded up to a "
                    + "multiple of the simulation cell)")
    Double cellSizeM;

    @Option(names = {"--distance-m", "--distance"}, paramLabel = "METRES",
            description = "distance band D in metres: neighbours whose centres lie within D, at least one analysis "
                    + "cell (default: the distance of the largest Moran's I z-score)")
    Double distanceM;

    @Option(names = "--weights", paramLabel = "KIND", defaultValue = "binary",
            description = "binary or inverse_distance (default: ${DEFAULT-VALUE})")
    String weights;

    @Option(names = "--fdr", paramLabel = "Q", defaultValue = "0.05",
            description = "false discovery rate, at most 0.20 (default: ${DEFAULT-VALUE})")
    double fdr;

    @Option(names = "--fdr-method", paramLabel = "M", defaultValue = "bh",
            description = "bh (Benjamini-Hochberg 1995) or by (Benjamini-Yekutieli 2001, valid under any "
                    + "dependence) (default: ${DEFAULT-VALUE})")
    String fdrMethod;

    @Option(names = {"--min-excess-k", "--min-excess"}, paramLabel = "KELVIN", defaultValue = "1",
            description = "smallest excess over the city's median that counts, in K (default: ${DEFAULT-VALUE})")
    double minExcessK;

    @Option(names = {"--min-area-m2", "--min-area"}, paramLabel = "M2", defaultValue = "3200",
            description = "smallest hot or cold area kept, in m² (default: ${DEFAULT-VALUE})")
    double minAreaM2;

    @Option(names = "--min-coverage", paramLabel = "SHARE", defaultValue = "0.5",
            description = "smallest share of an analysis cell or zone that must hold valid simulation cells; units "
                    + "below it (grid edge, no-data) are left out (default: ${DEFAULT-VALUE})")
    double minCoverage;

    @Option(names = "--zones", paramLabel = "FILE",
            description = "GeoJSON polygons (blocks, parcels, districts) in the run's CRS: Gi* on these zones instead "
                    + "of the analysis grid; writes RUN_DIR/zones/STEM/STATISTIC/ (zones table, CSV, GeoJSON, summary)")
    Path zones;

    @Option(names = "--zone-id", paramLabel = "PROPERTY",
            description = "with --zones: the property holding each zone's unique id (default: id)")
    String zoneId;

    @Option(names = "--tile-size", paramLabel = "N", defaultValue = "256",
            description = "cells per tile edge of the parallel pass; results do not depend on it (default: ${DEFAULT-VALUE})")
    int tileSize;

    @Mixin
    SharedOptions.Spark sparkOptions = new SharedOptions.Spark();

    @Mixin
    SharedOptions.Replace replace = new SharedOptions.Replace();

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
        FalseDiscovery fm = FalseDiscovery.ofKey(fdrMethod);
        if (fm == null) {
            throw new UserInputException("--fdr-method '" + fdrMethod + "' is unknown. Fix: give bh or by");
        }
        return new HotspotOptions(statistic, scenario, distanceM == null ? Double.NaN : distanceM, w, fdr, tileSize,
                replace.replace, org.thermotile.jobs.hotspots.DistrictCells.GEOJSON, ref,
                cellSizeM == null ? Double.NaN : cellSizeM, fm, minExcessK, minAreaM2, minCoverage);
    }

    /** The zones as given, or null for the grid mode. */
    ZoneHotspots.ZoneOptions zoneOptions() {
        if (zones == null) {
            if (zoneId != null) {
                throw new UserInputException("--zone-id " + zoneId + " without --zones. Fix: add --zones FILE.geojson, "
                        + "or leave --zone-id out");
            }
            return null;
        }
        return new ZoneHotspots.ZoneOptions(zones, zoneId, "--zones");
    }

    @Override
    public Integer call() {
        try (org.thermotile.jobs.storage.RunLock lock = FolderLock.hold(runDir, "hotspots")) {
            return work();
        }
    }

    private Integer work() {
        HotspotOptions opt = options();
        ZoneHotspots.ZoneOptions zo = zoneOptions();
        if (zo != null) {
            ZoneHotspots.Prepared zp = ZoneHotspots.prepare(runDir, opt, zo);   // every check before Spark starts
            SparkSession spark = SparkSessions.get(sparkOptions.master, sparkOptions.threads);
            try {
                printZones(ZoneHotspots.run(spark, zp), System.out);
            } finally {
                spark.stop();
            }
            return 0;
        }
        Hotspots.Prepared p = Hotspots.prepare(runDir, opt);     // every check before Spark starts
        SparkSession spark = SparkSessions.get(sparkOptions.master, sparkOptions.threads);
        try {
            print(Hotspots.run(spark, p), System.out);
        } finally {
            spark.stop();
        }
        org.thermotile.jobs.catalogue.StacItem.writeAll(runDir);   // the catalogue entry lists the new files
        return 0;
    }

    /** Runs on a given session (left running) and prints the summary; for tests and the run command. */
    public static Hotspots.Result execute(SparkSession spark, Path runDir, HotspotOptions opt, PrintStream console) {
        Hotspots.Result r = Hotspots.run(spark, runDir, opt);
        print(r, console);
        return r;
    }

    /** Hot zones listed at most on the console (all are in summary.json and the tables). */
    static final int ZONES_LISTED = 20;

    static void printZones(ZoneHotspots.Result r, PrintStream out) {
        out.printf(Locale.ROOT, "%s%s: %d zones, %d with enough coverage, %d tested; city median %.2f %s; %s m band "
                + "between centroids (%s)%n", r.statistic(), r.scenario() == null ? "" : " (scenario " + r.scenario() + ")",
                r.zones(), r.included(), r.tested(), r.referenceK(), r.unit(), num(r.distanceM()),
                r.distanceRule().equals("given") ? "given" : "peak of Moran's I");
        out.printf(Locale.ROOT, "hot zones (%s q <= %s), largest first: %d; cold zones: %d%n",
                r.fdrMethod().toUpperCase(Locale.ROOT), r.fdr(), r.hot().size(), r.cold().size());
        for (int i = 0; i < Math.min(ZONES_LISTED, r.hot().size()); i++) {
            ZoneHotspots.ZoneRow z = r.hot().get(i);
            out.printf(Locale.ROOT, "  %-16s %10.0f m²  excess %+.2f K  q %.3g  %s%n", z.id(), z.areaM2(), z.excessK(),
                    z.q(), z.label());
        }
        if (r.hot().size() > ZONES_LISTED) {
            out.println("  … " + (r.hot().size() - ZONES_LISTED) + " more in summary.json");
        }
        r.notes().forEach(n -> out.println("note: " + n));
        out.println("outputs: " + r.outDir());
        out.println("Surface temperature is not air temperature nor a heat-health index.");
    }

    private static String num(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : String.format(Locale.ROOT, "%.1f", v);
    }

    static void print(Hotspots.Result r, PrintStream out) {
        out.printf(Locale.ROOT, "%s%s: %s%d analysis cells of %.0f m, median %.2f %s, sd %.3f %s; %s (%s)%n",
                r.statistic(), r.scenario() == null ? "" : " (scenario " + r.scenario() + ")",
                r.reference().equals("baseline") ? "compared with the run's " : "", r.validCells(), r.analysisCellM(),
                r.referenceK(), r.unit(), r.sd(), r.unit(), r.band(),
                r.distanceRule().equals("given") ? "given" : "peak of Moran's I");
        StringBuilder cls = new StringBuilder();
        for (ExcessBand.Band b : ExcessBand.table(r.minExcessK())) {
            cls.append(String.format(Locale.ROOT, "%n  %4d %-22s %d cells", b.code(), b.label(), r.bandCells().get(b.code())));
        }
        out.println("excess bands (" + r.fdrMethod().toUpperCase(Locale.ROOT) + " q <= " + r.fdr() + "):" + cls);
        double city = r.cityAreaM2() > 0 ? r.cityAreaM2() : 1;
        out.printf(Locale.ROOT, "warmer areas: %d polygons, %.0f m² (%.1f %% of the city); cooler: %d polygons, %.0f m² "
                + "(%.1f %%); largest %.0f m²%n", r.hotPolygons(), r.hotAreaM2(), 100 * r.hotAreaM2() / city,
                r.coldPolygons(), r.coldAreaM2(), 100 * r.coldAreaM2() / city, r.largestPolygonM2());
        if (r.hotAreaRemovedM2() != null) {
            out.printf(Locale.ROOT, "hot area removed against the run itself: %.0f m²%n", r.hotAreaRemovedM2());
        }
        r.notes().forEach(n -> out.println("note: " + n));
        out.println("outputs: " + r.outDir());
        out.println("  " + String.join(" ", r.outputs()));
        out.println("Surface temperature is not air temperature nor a heat-health index.");
    }
}
