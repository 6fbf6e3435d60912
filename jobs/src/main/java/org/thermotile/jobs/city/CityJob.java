package org.thermotile.jobs.city;

import java.io.IOException;
import java.io.PrintStream;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;
import java.util.stream.Stream;
import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SaveMode;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;
import org.apache.spark.storage.StorageLevel;
import org.thermotile.jobs.cli.UserInputException;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.stats.GroupHourStats;
import org.thermotile.model.tile.TileSimulation;

/**
 * The city job: one Spark task per tile, statistics back, maps and tables written, all of it
 * published by renaming a temporary sibling folder only when everything succeeded.
 */
public final class CityJob {
    private CityJob() {}

    /** The no-data value of every float map. */
    public static final float MAP_NODATA = -9999f;

    /** What a finished run reports. */
    public record Summary(Path outDir, long cells, long cellHours, double wallSeconds,
            double cellHoursPerSecond, double maxClosureResidual, List<String> maps) {
    }

    /** Options of a run. */
    public record Options(Path outDir, String master, boolean replace, boolean quiet, int threads) {
    }

    /** Runs on a session of its own (embedded unless {@code opt.master()} is set), stopped at the end. */
    public static Summary run(PreparedRun prepared, Options opt, PrintStream console) {
        return run(null, prepared, opt, console);
    }

    /** Runs on {@code session} if not null (left running), else on a session of its own. */
    public static Summary run(SparkSession session, PreparedRun prepared, Options opt, PrintStream console) {
        long t0 = System.nanoTime();
        Path out = outputFolder(opt.outDir());
        if (Files.exists(out) && !opt.replace()) {
            throw new UserInputException(out + " already exists. Fix: choose another --out folder, "
                    + "or add --replace to overwrite it");
        }
        Path parent = out.getParent();
        Path tmp = parent.resolve("." + out.getFileName() + ".partial");
        try {
            Files.createDirectories(parent);
            deleteTree(tmp);
            Files.createDirectories(tmp);
            Summary s;
            if (session != null) {
                s = execute(session, prepared, tmp, opt, console, t0);
            } else {
                try (SparkSession spark = SparkSessions.get(opt.master(), opt.threads())) {
                    s = execute(spark, prepared, tmp, opt, console, t0);
                }
            }
            if (Files.exists(out)) {
                deleteTree(out);
            }
            Files.move(tmp, out, StandardCopyOption.ATOMIC_MOVE);
            return new Summary(out, s.cells(), s.cellHours(), s.wallSeconds(), s.cellHoursPerSecond(),
                    s.maxClosureResidual(), s.maps());
        } catch (IOException e) {
            deleteQuietly(tmp);
            throw new UncheckedIOException(e);
        } catch (RuntimeException | Error e) {
            deleteQuietly(tmp);
            throw e;
        }
    }

    private static Summary execute(SparkSession spark, PreparedRun p, Path tmp, Options opt,
            PrintStream console, long t0) throws IOException {
        JavaSparkContext jsc = JavaSparkContext.fromSparkContext(spark.sparkContext());
        SparkSessions.awaitExecutors(spark);
        if (InputStaging.isRemote(p.spec().landCover())) {
            jsc.addFile(p.spec().landCover());           // each executor fetches it once from the URI
        }
        Broadcast<TileJobSpec> spec = jsc.broadcast(p.spec());
        List<TileSpec> tiles = p.tiles();
        ProgressListener progress = null;
        if (!opt.quiet()) {
            double perTile = (double) p.cellHours() / Math.max(1, tiles.size());
            progress = new ProgressListener(tiles.size(), perTile, console);
            spark.sparkContext().addSparkListener(progress);
            console.printf("simulating %d cells × %d hours in %d tiles%n", p.activeCells(),
                    p.spec().forcing().hours() - 1, tiles.size());
        }
        // One partition per tile, in row-major tile order; the results stay on the executors.
        JavaRDD<TileOutput> results = jsc.parallelize(tiles, tiles.size())
                .map(t -> TileTask.run(t, spec.value()))
                .persist(StorageLevel.MEMORY_AND_DISK());
        results.count();
        if (progress != null) {
            spark.sparkContext().removeSparkListener(progress);
        }
        double simSeconds = (System.nanoTime() - t0) / 1e9;

        // Small per-tile totals, merged on the driver in tile order (floating-point sums in a fixed order).
        int tilesPerRow = (p.grid().width() + p.run().tiling().tileSize() - 1) / p.run().tiling().tileSize();
        GroupHourStats materialHours = null;
        GroupHourStats districtHours = null;
        double maxClosure = 0;
        long cellHours = 0;
        for (int from = 0; from < tiles.size(); from += TOTALS_BATCH) {
            for (TileTotals t : fetch(results, from, Math.min(tiles.size(), from + TOTALS_BATCH), TileTotals::of)) {
                materialHours = merge(materialHours, t.materialHours());
                districtHours = merge(districtHours, t.districtHours());
                maxClosure = Math.max(maxClosure, t.maxClosureResidual());
                cellHours += t.cellHours();
            }
        }

        Files.createDirectories(tmp.resolve("maps"));
        Files.createDirectories(tmp.resolve("tables"));
        List<String> maps = MapOutputs.write(p, (layer, tileRow) -> fetch(results, tileRow * tilesPerRow,
                Math.min(tiles.size(), (tileRow + 1) * tilesPerRow), o -> layer.of(o.result())), tmp.resolve("maps"));
        TableOutputs.writeCells(spark, p, results, tmp.resolve("tables/cells"));
        TableOutputs.writeGroupHours(spark, p, materialHours, p.paletteLabels(), "material",
                tmp.resolve("tables/material_hours"));
        if (!p.districtNames().isEmpty()) {
            TableOutputs.writeGroupHours(spark, p, districtHours, p.districtNames(), "district",
                    tmp.resolve("tables/district_hours"));
        }
        if (p.hourlyEpochSeconds().length > 0) {
            TableOutputs.writeCellHours(spark, p, results, tmp.resolve("tables/cell_hours"));
        }
        results.unpersist(false);

        double wall = (System.nanoTime() - t0) / 1e9;
        Summary s = new Summary(tmp, p.activeCells(), cellHours, wall, cellHours / Math.max(simSeconds, 1e-9),
                maxClosure, maps);
        Manifest.write(p, s, simSeconds, tmp.resolve("manifest.json"));
        return s;
    }

    /** Tiles whose totals are fetched in one Spark job (a tile's group-hour histograms are a few MB). */
    static final int TOTALS_BATCH = 8;

    /** What the driver keeps of a tile besides its maps: group-hour statistics and two totals. */
    record TileTotals(GroupHourStats materialHours, GroupHourStats districtHours, double maxClosureResidual,
            long cellHours) implements java.io.Serializable {
        static TileTotals of(TileOutput o) {
            return new TileTotals(o.result().materialHours, o.result().districtHours,
                    o.result().maxClosureResidual, o.result().cellHours);
        }
    }

    private static GroupHourStats merge(GroupHourStats all, GroupHourStats tile) {
        if (tile == null) {
            return all;
        }
        GroupHourStats a = all != null ? all : new GroupHourStats(tile.groups, tile.hours);
        a.merge(tile);
        return a;
    }

    /**
     * {@code f} of the tiles {@code from … to−1} (one partition each), in tile order, in one Spark
     * job: only what {@code f} returns travels to the driver.
     */
    static <R> List<R> fetch(JavaRDD<TileOutput> results, int from, int to,
            org.apache.spark.api.java.function.Function<TileOutput, R> f) {
        int[] ids = new int[to - from];
        for (int i = 0; i < ids.length; i++) {
            ids[i] = from + i;
        }
        List<R>[] parts = results.map(f).collectPartitions(ids);
        List<R> out = new ArrayList<>(ids.length);
        for (List<R> part : parts) {
            out.addAll(part);
        }
        return out;
    }

    /**
     * The output folder: a path, or a {@code file:} URI (which a command line's path conversion
     * turns into "file:/…"). Other URIs are refused: the maps are written through a local,
     * seekable file and the Parquet footers are made canonical in place, neither of which a
     * Hadoop file system such as HDFS (write-once files) allows.
     */
    static Path outputFolder(Path given) {
        String s = given.toString();
        if (s.startsWith("file:")) {
            return Path.of(java.net.URI.create(s)).toAbsolutePath().normalize();
        }
        if (s.matches("^[A-Za-z][A-Za-z0-9+.-]+:/.*")) {
            throw new UserInputException("--out " + s.replaceFirst(":/+", "://") + ": outputs are written to a "
                    + "local folder or a file system every Spark host mounts (NFS, a cluster file system, a "
                    + "Kubernetes volume), not to " + s.substring(0, s.indexOf(':')) + ":// URIs. Fix: write to such "
                    + "a folder, then copy the finished folder, e.g. with hadoop fs -put");
        }
        return given.toAbsolutePath().normalize();
    }

    static void deleteQuietly(Path dir) {
        try {
            deleteTree(dir);
        } catch (IOException ignored) {
            // best effort: the failure being reported matters more
        }
    }

    static void deleteTree(Path dir) throws IOException {
        if (!Files.exists(dir)) {
            return;
        }
        try (Stream<Path> s = Files.walk(dir)) {
            for (Path q : s.sorted(Comparator.reverseOrder()).toList()) {
                Files.delete(q);
            }
        }
    }
}
