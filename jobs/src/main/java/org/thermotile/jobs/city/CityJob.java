package org.thermotile.jobs.city;

import java.io.IOException;
import java.io.PrintStream;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.storage.StorageLevel;
import org.thermotile.jobs.catalogue.StacItem;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.hotspots.HotspotOptions;
import org.thermotile.jobs.hotspots.Hotspots;
import org.thermotile.jobs.hotspots.ZoneHotspots;
import org.thermotile.jobs.storage.Diagnose;
import org.thermotile.jobs.storage.Folders;
import org.thermotile.jobs.storage.InputStaging;
import org.thermotile.jobs.storage.OutputStore;
import org.thermotile.jobs.storage.RunLayout;
import org.thermotile.jobs.storage.RunLock;
import org.thermotile.model.stats.GroupHourStats;

/**
 * The city job: one Spark task per tile (every variant in one pass), statistics back, maps and
 * tables written, all of it published by renaming a temporary sibling folder only when
 * everything succeeded.
 */
public final class CityJob {
    private CityJob() {}

    /** The no-data value of every float map. */
    public static final float MAP_NODATA = -9999f;

    /**
     * What a finished run reports: {@code cellHours} are the cell-hours of every variant (what the
     * outputs cover), {@code steppedCellHours} the part the kernel stepped (the variants share the
     * cells they leave unchanged, {@link TileTask#runVariants}).
     */
    public record Summary(Path outDir, long cells, long cellHours, long steppedCellHours, double wallSeconds,
            double cellHoursPerSecond, double maxClosureResidual, List<String> maps) {
    }

    /**
     * Options of a run.
     *
     * @param outDir        the output folder: a path, a {@code file:} URI, or a Hadoop URI such as
     *                      {@code hdfs://namenode:8020/runs/x} (see {@link OutputStore})
     * @param beforePublish called with the finished (still temporary) run folder just before it is
     *                      published, e.g. to add the report; null for nothing
     * @param runFile       the run file as the user gave it, for the lock file and the resume command
     *                      printed when the run is stopped; null when not known
     */
    public record Options(Path outDir, String master, boolean replace, boolean quiet, int threads, boolean resume,
            java.util.function.Consumer<Path> beforePublish, String runFile) {
        public Options(Path outDir, String master, boolean replace, boolean quiet, int threads, boolean resume,
                java.util.function.Consumer<Path> beforePublish) {
            this(outDir, master, replace, quiet, threads, resume, beforePublish, null);
        }

        public Options(Path outDir, String master, boolean replace, boolean quiet, int threads, boolean resume) {
            this(outDir, master, replace, quiet, threads, resume, null);
        }

        public Options(Path outDir, String master, boolean replace, boolean quiet, int threads) {
            this(outDir, master, replace, quiet, threads, false, null);
        }
    }

    /** Runs on a session of its own (embedded unless {@code opt.master()} is set), stopped at the end. */
    public static Summary run(PreparedRun prepared, Options opt, PrintStream console) {
        return run(null, prepared, opt, console);
    }

    /** Runs on {@code session} if not null (left running), else on a session of its own. */
    public static Summary run(SparkSession session, PreparedRun prepared, Options opt, PrintStream console) {
        return run(session, List.of(prepared), opt, console);
    }

    /**
     * Runs every period of a run ({@link RunPreparer#prepareAll}) on {@code session} if not null
     * (left running), else on a session of its own, and publishes them together: one period gives
     * a run folder as {@link RunLayout#single}, several give a folder per period and tables
     * partitioned by period ({@link RunLayout}).
     */
    public static Summary run(SparkSession session, List<PreparedRun> periods, Options opt, PrintStream console) {
        long t0 = System.nanoTime();
        String remote = remoteOutput(opt.outDir());
        if (remote != null) {
            return runToHadoop(session, periods, opt, console, remote, t0);
        }
        Path out = outputFolder(opt.outDir());
        Path parent = out.getParent();
        Path tmp = parent.resolve("." + out.getFileName() + ".partial");
        // The lock first: a second command on this folder is refused before it looks at, or stages, anything.
        RunLock lock = RunLock.acquire(out, "run " + shellWord(opt.runFile() == null ? "RUNFILE" : opt.runFile())
                + " --out " + shellWord(out.toString()), System.err);
        RunStop stop = null;
        try {
            if (Files.exists(out) && !opt.replace() && !opt.resume()) {
                throw new UserInputException(out + " already exists. Fix: choose another --out folder, "
                        + "add --replace to overwrite it, or --resume to keep its complete scenario partitions");
            }
            if (Files.exists(out) && opt.replace() && !Files.isRegularFile(out.resolve("manifest.json"))) {
                // --replace deletes the folder: never one that is not a run of ours (the user's own files).
                throw new UserInputException(out + " is not a thermotile run folder (no manifest.json), so --replace "
                        + "will not delete it. Fix: choose another --out folder, or empty or remove it yourself");
            }
            stop = RunStop.register(out, tmp, null, lock, resumeCommand(opt, out.toString()), System.err);
            RunStop st = stop;
            try {
                Files.createDirectories(parent);
                deleteTree(tmp);
                Files.createDirectories(tmp);
                Summary s = inSession(session, opt, spark -> {
                    st.attach(spark);
                    return executeAll(spark, periods, tmp, out, opt, console, t0);
                });
                if (opt.beforePublish() != null) {
                    opt.beforePublish().accept(tmp);
                }
                StacItem.writeAll(tmp);   // the catalogue entry lists every file, the report's included
                if (Files.exists(out)) {
                    deleteTree(out);
                }
                Files.move(tmp, out, StandardCopyOption.ATOMIC_MOVE);
                return new Summary(out, s.cells(), s.cellHours(), s.steppedCellHours(), s.wallSeconds(),
                        s.cellHoursPerSecond(), s.maxClosureResidual(), s.maps());
            } catch (IOException e) {
                deleteQuietly(tmp);
                UserInputException disk = Diagnose.ofOutput(e, out);
                throw disk != null ? disk : new UncheckedIOException(e);
            } catch (OutOfMemoryError e) {
                deleteQuietly(tmp);
                throw outOfMemory(e, out);
            } catch (RuntimeException | Error e) {
                deleteQuietly(tmp);
                if (isOutOfMemory(e)) {
                    throw outOfMemory(e, out);
                }
                UserInputException disk = e instanceof UserInputException ? null : Diagnose.ofOutput(e, out);
                if (disk != null) {
                    throw disk;
                }
                throw e;
            }
        } finally {
            if (stop != null) {
                stop.done();
            }
            lock.release();
        }
    }

    /** True while the run is being stopped by a signal (its failure then is the stop, not an error). */
    public static boolean isStopping() {
        return RunStop.stopping;
    }

    /** Records the signal a stop comes from, for its message ("SIGINT", "SIGTERM"). */
    public static void stoppedBy(String signal) {
        RunStop.signal = signal;
        RunStop.stopping = true;
    }

    /** The command that resumes this run, as printed when it is stopped. */
    static String resumeCommand(Options opt, String out) {
        return "thermotile run " + shellWord(opt.runFile() == null ? "RUNFILE" : opt.runFile()) + " --out "
                + shellWord(out) + " --resume";
    }

    /** {@code w} quoted for a POSIX shell when it holds anything but plain characters. */
    static String shellWord(String w) {
        return w.matches("[A-Za-z0-9_./:=@%+,-]+") ? w : "'" + w.replace("'", "'\\''") + "'";
    }

    /** Whether {@code e} or a cause of it is the JVM running out of heap (a task's, reported through Spark). */
    static boolean isOutOfMemory(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause() == t ? null : t.getCause()) {
            if (t instanceof OutOfMemoryError || String.valueOf(t.getMessage()).contains("java.lang.OutOfMemoryError")) {
                return true;
            }
        }
        return false;
    }

    static UserInputException outOfMemory(Throwable e, Path out) {
        return new UserInputException("the run ran out of memory (java.lang.OutOfMemoryError in a task) while writing "
                + out + "; nothing was published and the staging folder was removed. Fix: give the JVM more heap "
                + "(THERMOTILE_JAVA_OPTS=-Xmx8g, or spark.executor.memory on a cluster), lower tiling.tile_size, or "
                + "drop outputs.hourly_days", e);
    }

    /** Work on a Spark session. */
    private interface SessionWork {
        Summary on(SparkSession spark) throws IOException;
    }

    /** {@code work} on {@code session}, or on a session of its own (stopped afterwards) if null. */
    private static Summary inSession(SparkSession session, Options opt, SessionWork work) throws IOException {
        if (session != null) {
            return work.on(session);
        }
        try (SparkSession spark = SparkSessions.get(opt.master(), opt.threads())) {
            return work.on(spark);
        }
    }

    /**
     * A run whose output folder is a Hadoop URI: built in a local staging folder mirrored on the
     * target file system, then published there by one rename ({@link OutputStore}).
     */
    private static Summary runToHadoop(SparkSession session, List<PreparedRun> periods, Options opt,
            PrintStream console, String target, long t0) {
        if (opt.resume()) {
            throw new UserInputException("--resume with --out " + target + ": resuming reads the older run's files in "
                    + "place, which is done for local output folders only. Fix: copy the run folder to a local "
                    + "folder (hadoop fs -get), resume there, or run again with --replace");
        }
        // The lock first, as for a local folder: a second command on this target is refused before it stages anything.
        RunLock lock = RunLock.acquireRemote(target, "run " + shellWord(opt.runFile() == null ? "RUNFILE"
                : opt.runFile()) + " --out " + shellWord(target), System.err);
        try {
            return runToHadoopLocked(session, periods, opt, console, target, t0, lock);
        } finally {
            lock.release();
        }
    }

    private static Summary runToHadoopLocked(SparkSession session, List<PreparedRun> periods, Options opt,
            PrintStream console, String target, long t0, RunLock lock) {
        if (OutputStore.exists(target) && !opt.replace()) {
            throw new UserInputException("--out " + target + " already exists. Fix: choose another --out folder or "
                    + "add --replace to overwrite it");
        }
        // What a killed run of this target left beside it: with the lock held, no live run owns it.
        OutputStore.deleteStaleMirrors(target);
        String name = target.substring(target.lastIndexOf('/') + 1);
        Path stagingRoot;
        try {
            stagingRoot = Files.createTempDirectory("thermotile-out-");
        } catch (IOException e) {
            throw new UncheckedIOException("cannot make a local staging folder in " + System.getProperty("java.io.tmpdir")
                    + " (set java.io.tmpdir to a disk with room for one run's outputs)", e);
        }
        // Unique per run: tasks cache the files they fetch from it by location.
        String partial = target.substring(0, target.lastIndexOf('/') + 1) + "." + name + "."
                + stagingRoot.getFileName().toString().replace("thermotile-out-", "") + ".partial";
        // The stop hook cleans up and releases the lock (.NAME.lock beside the target, see RunLock).
        RunStop stop = RunStop.register(null, stagingRoot, partial, lock,
                resumeCommand(opt, target).replace(" --resume", " --replace"), System.err);
        try {
            Path staging = Files.createDirectories(stagingRoot.resolve(name));
            OutputStore.delete(partial);
            OutputStore.mirror(staging, partial);
            Path none = stagingRoot.resolve("no-older-run");
            Summary s = inSession(session, opt, spark -> {
                stop.attach(spark);
                return executeAll(spark, periods, staging, none, opt, console, t0);
            });
            if (opt.beforePublish() != null) {
                opt.beforePublish().accept(staging);
            }
            StacItem.writeAll(staging);
            OutputStore.publish(staging, partial, target);
            return new Summary(opt.outDir(), s.cells(), s.cellHours(), s.steppedCellHours(), s.wallSeconds(),
                    s.cellHoursPerSecond(), s.maxClosureResidual(), s.maps());
        } catch (IOException e) {
            OutputStore.delete(partial);
            throw new UncheckedIOException(e);
        } catch (RuntimeException | Error e) {
            try {
                OutputStore.delete(partial);
            } catch (RuntimeException ignored) {
                // the first failure is the one to report
            }
            throw e;
        } finally {
            OutputStore.forget(stagingRoot.resolve(name));
            deleteQuietly(stagingRoot);
            stop.done();
        }
    }

    /** One period as a run of its own, or each period in turn and a manifest and comparison over them. */
    private static Summary executeAll(SparkSession spark, List<PreparedRun> periods, Path tmp, Path old,
            Options opt, PrintStream console, long t0) throws IOException {
        if (periods.size() == 1 && periods.get(0).period() == null) {
            return execute(spark, periods.get(0), RunLayout.single(tmp), RunLayout.single(old), opt, console, t0);
        }
        List<Summary> each = new ArrayList<>();
        for (int i = 0; i < periods.size(); i++) {
            PreparedRun p = periods.get(i);
            if (!opt.quiet()) {
                console.printf("period %s (%d of %d): %s … %s%n", p.period(), i + 1, periods.size(),
                        p.run().period().start(), p.run().period().end());
            }
            each.add(execute(spark, p, new RunLayout(tmp, p.period()), new RunLayout(old, p.period()), opt, console,
                    System.nanoTime()));
        }
        long cellHours = each.stream().mapToLong(Summary::cellHours).sum();
        long stepped = each.stream().mapToLong(Summary::steppedCellHours).sum();
        double maxClosure = each.stream().mapToDouble(Summary::maxClosureResidual).max().orElse(0);
        List<String> maps = each.stream().flatMap(x -> x.maps().stream()).toList();
        double wall = (System.nanoTime() - t0) / 1e9;
        double simSeconds = each.stream().mapToDouble(Summary::wallSeconds).sum();
        Summary all = new Summary(tmp, each.get(0).cells(), cellHours, stepped, wall,
                cellHours / Math.max(simSeconds, 1e-9), maxClosure, maps);
        Manifest.writePeriods(periods, each, all, tmp.resolve("manifest.json"));
        if (periods.get(0).plan().variants().size() > 1) {
            Comparison.writeAcrossPeriods(spark, tmp, periods.stream().map(PreparedRun::period).toList());
        }
        return all;
    }

    private static Summary execute(SparkSession spark, PreparedRun p, RunLayout lay, RunLayout oldLay, Options opt,
            PrintStream console, long t0) throws IOException {
        JavaSparkContext jsc = JavaSparkContext.fromSparkContext(spark.sparkContext());
        SparkSessions.awaitExecutors(spark);
        if (p.spec().heights() != null && InputStaging.isRemote(p.spec().heights())) {
            jsc.addFile(p.spec().heights());             // geometry reads heights windows on the executors
        }
        if (InputStaging.isRemote(p.spec().landCover())) {
            jsc.addFile(p.spec().landCover());           // each executor fetches it once from the URI
        }
        Broadcast<TileJobSpec> spec = jsc.broadcast(p.spec());
        ScenarioPlanner.Plan plan = p.plan();
        Broadcast<ScenarioPlanner.Plan> planB = jsc.broadcast(plan);
        List<TileSpec> tiles = p.tiles();
        Map<String, String> keys = Partitions.keys(p);
        List<String> reuse = opt.resume() && Files.isDirectory(oldLay.root()) ? Partitions.complete(oldLay, keys)
                : List.of();
        List<ScenarioVariant> variants = plan.variants().stream().filter(v -> !reuse.contains(v.name())).toList();
        if (!reuse.isEmpty() && !opt.quiet()) {
            console.println("resume: keeping " + reuse.size() + " complete partitions (" + String.join(", ", reuse)
                    + "), computing " + variants.size());
        }
        // One task per tile, running every variant in one pass (TileTask.runVariants): the
        // tile's rasters are read once and the cells a programme leaves alone are stepped once.
        // With fewer tiles than cores and enough variants (variantGroups) they are split into
        // groups, a task per tile and group, so that the cores are used; each group steps its
        // first variant whole.
        int nt = tiles.size();
        int cores = spark.sparkContext().defaultParallelism();
        List<List<String>> groups = variantGroups(variants.stream().map(ScenarioVariant::name).toList(), nt, cores);
        int tasks = groups.size() * nt;
        ProgressListener progress = null;
        if (!opt.quiet()) {
            double perTask = (double) p.cellHours() * variants.size() / Math.max(1, tasks);
            progress = new ProgressListener(tasks, perTask, console);
            spark.sparkContext().addSparkListener(progress);
            console.printf("simulating %d cells × %d hours in %d tiles%s%n", p.activeCells(),
                    p.spec().forcing().hours() - 1, nt,
                    variants.size() > 1 ? " × " + variants.size() + " variants (baseline and "
                            + (variants.size() - 1) + " scenarios)" : "");
            if (tasks < cores && !variants.isEmpty()) {
                int idle = cores - tasks;
                console.printf("  %d task%s for %d cores, so %d of the cores %s idle; a smaller tiling.tile_size "
                        + "(now %d) would keep every core busy (the values do not change)%n", tasks,
                        tasks == 1 ? "" : "s", cores, idle, idle == 1 ? "is" : "are", p.run().tiling().tileSize());
            }
        }
        // Per group, one partition per tile holding the tile's outputs of the group's variants.
        List<JavaRDD<List<TileOutput>>> perGroup = new ArrayList<>();
        for (List<String> names : groups) {
            perGroup.add(jsc.parallelize(tiles, Math.max(1, nt))
                    .map(tile -> {
                        ScenarioPlanner.Plan pl = planB.value();
                        List<ScenarioVariant> vs = names.stream().map(n -> pl.variants().stream()
                                .filter(x -> x.name().equals(n)).findFirst().orElseThrow()).toList();
                        return TileTask.runVariants(tile, spec.value(), vs, pl.units(), pl.roofs());
                    })
                    .persist(StorageLevel.MEMORY_AND_DISK()));
        }
        if (!perGroup.isEmpty()) {
            // All groups in one Spark job (a union computes each cached group's partitions).
            union(jsc, perGroup).count();
        }
        if (progress != null) {
            spark.sparkContext().removeSparkListener(progress);
        }
        // The outputs one partition per (variant, tile), variants in plan order and tiles
        // row-major inside: partition v·tiles + t, as the maps and tables are read and named.
        // A union of narrow views of the cached tiles: nothing is shuffled or recomputed.
        List<JavaRDD<TileOutput>> byVariant = new ArrayList<>();
        for (int g = 0; g < groups.size(); g++) {
            for (int vi = 0; vi < groups.get(g).size(); vi++) {
                int v = vi;
                byVariant.add(perGroup.get(g).map(outs -> outs.get(v)));
            }
        }
        JavaRDD<TileOutput> results = byVariant.isEmpty() ? jsc.parallelize(new ArrayList<TileOutput>(), 1)
                : union(jsc, byVariant);
        double simSeconds = (System.nanoTime() - t0) / 1e9;

        // Small per-tile totals, merged on the driver in tile order (floating-point sums in a fixed
        // order), and maps streamed from tile rows fetched on demand: the driver never holds a grid.
        int tilesPerRow = (p.grid().width() + p.run().tiling().tileSize() - 1) / p.run().tiling().tileSize();
        Files.createDirectories(lay.root().resolve("tables"));
        List<String> maps = new ArrayList<>();
        Map<String, GroupHourStats> materialHours = new java.util.LinkedHashMap<>();
        Map<String, GroupHourStats> districtHours = new java.util.LinkedHashMap<>();
        // Largest closure residual per variant: computed now, or as recorded for a kept partition.
        Map<String, Double> closure = new java.util.HashMap<>(Partitions.closureResiduals(oldLay, reuse));
        long cellHours = 0;
        long stepped = 0;
        double tileSeconds = 0;
        for (int vi = 0; vi < variants.size(); vi++) {
            ScenarioVariant v = variants.get(vi);
            int base = vi * nt;
            GroupHourStats mh = null;
            GroupHourStats dh = null;
            double vmax = 0;
            for (int from = 0; from < nt; from += TOTALS_BATCH) {
                for (TileTotals t : fetch(results, base + from, base + Math.min(nt, from + TOTALS_BATCH), TileTotals::of)) {
                    mh = merge(mh, t.materialHours());
                    dh = merge(dh, t.districtHours());
                    vmax = Math.max(vmax, t.maxClosureResidual());
                    cellHours += t.cellHours();
                    stepped += t.steppedCellHours();
                    tileSeconds += t.seconds();
                }
            }
            closure.put(v.name(), vmax);
            materialHours.put(v.name(), mh);
            districtHours.put(v.name(), dh);
            Path mapsDir = lay.mapsDir(v.name());
            Files.createDirectories(mapsDir);
            MapOutputs.write(p, (layer, tileRow) -> fetch(results, base + tileRow * tilesPerRow,
                    base + Math.min(nt, (tileRow + 1) * tilesPerRow), o -> layer.of(o.result())), mapsDir);
        }
        List<String> variantNames = variants.stream().map(ScenarioVariant::name).toList();
        TableOutputs.writeCells(spark, p, variantNames, results, lay.table("cells"));
        TableOutputs.writeMaterialHours(spark, p, variants, materialHours, lay.table("material_hours"));
        if (!p.districtNames().isEmpty()) {
            TableOutputs.writeDistrictHours(spark, p, variantNames, districtHours, lay.table("district_hours"));
        }
        if (p.hourlyEpochSeconds().length > 0) {
            TableOutputs.writeCellHours(spark, p, results, lay.table("cell_hours"));
        }
        perGroup.forEach(r -> r.unpersist(false));
        for (String v : reuse) {
            Partitions.copy(oldLay, lay, v);
        }
        // Every variant's maps, computed now or kept, in plan order.
        maps.clear();
        for (ScenarioVariant v : plan.variants()) {
            for (String f : Partitions.files(lay, v.name())) {
                if (f.endsWith(".tif")) {
                    maps.add(f.replace('\\', '/'));
                }
            }
        }

        double wall = (System.nanoTime() - t0) / 1e9;
        double maxClosure = closure.values().stream().mapToDouble(Double::doubleValue).max().orElse(0);
        Summary s = new Summary(lay.root(), p.activeCells(), cellHours, stepped, wall,
                cellHours / Math.max(simSeconds, 1e-9), maxClosure, maps);
        Files.createDirectories(lay.dir());
        Manifest.write(p, s, simSeconds, tileSeconds, Partitions.record(lay, keys, closure), reuse, lay.dir().resolve("manifest.json"));
        if (plan.variants().size() > 1) {
            Comparison.write(spark, lay.dir());
        }
        HotspotsBlock hs = HotspotsBlock.of(p.run(), p.grid().pixelWidth());
        if (hs != null) {
            for (String stat : hs.statistics()) {
                HotspotOptions options = hs.options(stat, p.run().tiling().tileSize());
                Hotspots.run(spark, lay.dir(), options);
                if (hs.zoneOptions() != null) {
                    ZoneHotspots.run(spark, lay.dir(), options, hs.zoneOptions());
                }
            }
        }
        return s;
    }

    /**
     * Fewest variants a group of a tile's variants holds. Each group steps its first variant
     * whole, so a group of few variants costs more than it saves: measured on a 250² city of one
     * tile on 2 cores, 4 variants in two groups ran 8 % longer than in one pass.
     */
    static final int MIN_VARIANTS_PER_GROUP = 4;

    /**
     * The variants split into groups run by separate tasks of one tile: one group (every variant
     * in one pass) unless there are fewer tiles than cores; then as many groups as fill the cores,
     * each of at least {@link #MIN_VARIANTS_PER_GROUP} variants, contiguous in plan order (a sweep
     * over a small area). Outputs do not depend on the grouping.
     */
    static List<List<String>> variantGroups(List<String> variants, int tiles, int cores) {
        if (variants.isEmpty()) {
            return List.of();
        }
        int fill = (cores + Math.max(1, tiles) - 1) / Math.max(1, tiles);
        int g = tiles >= cores ? 1 : Math.max(1, Math.min(fill, variants.size() / MIN_VARIANTS_PER_GROUP));
        List<List<String>> out = new ArrayList<>();
        for (int i = 0; i < g; i++) {
            int from = (int) ((long) variants.size() * i / g);
            int to = (int) ((long) variants.size() * (i + 1) / g);
            out.add(List.copyOf(variants.subList(from, to)));
        }
        return out;
    }

    /** One RDD whose partitions are those of {@code rdds}, in order (no shuffle). */
    @SuppressWarnings("unchecked")
    private static <T> JavaRDD<T> union(JavaSparkContext jsc, List<JavaRDD<T>> rdds) {
        return rdds.size() == 1 ? rdds.get(0) : jsc.union(rdds.toArray(new JavaRDD[0]));
    }

    /** Tiles whose totals are fetched in one Spark job (a tile's group-hour histograms are a few MB). */
    static final int TOTALS_BATCH = 8;

    /** What the driver keeps of a tile besides its maps: group-hour statistics and two totals. */
    record TileTotals(GroupHourStats materialHours, GroupHourStats districtHours, double maxClosureResidual,
            long cellHours, long steppedCellHours, double seconds) implements java.io.Serializable {
        static TileTotals of(TileOutput o) {
            return new TileTotals(o.result().materialHours, o.result().districtHours,
                    o.result().maxClosureResidual, o.result().cellHours, o.result().steppedCellHours, o.seconds());
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
     * The Hadoop URI of an output folder given as one ({@code hdfs://…}, {@code s3a://…}; a command
     * line's path conversion turns "hdfs://nn:8020/x" into "hdfs:/nn:8020/x"), or null for a local
     * folder or a {@code file:} URI.
     */
    public static String remoteOutput(Path given) {
        String s = given.toString().replace('\\', '/');
        if (!s.matches("^[A-Za-z][A-Za-z0-9+.-]+:/.*") || s.regionMatches(true, 0, "file:", 0, 5)) {
            return null;
        }
        String uri = s.replaceFirst(":/+", "://");
        return uri.endsWith("/") ? uri.substring(0, uri.length() - 1) : uri;
    }

    /** The local output folder: a path, or a {@code file:} URI. */
    static Path outputFolder(Path given) {
        String s = given.toString();
        if (s.startsWith("file:")) {
            return Path.of(java.net.URI.create(s)).toAbsolutePath().normalize();
        }
        return given.toAbsolutePath().normalize();
    }

    static void deleteQuietly(Path dir) {
        Folders.deleteQuietly(dir);
    }

    static void deleteTree(Path dir) throws IOException {
        Folders.deleteTree(dir);
    }
}
