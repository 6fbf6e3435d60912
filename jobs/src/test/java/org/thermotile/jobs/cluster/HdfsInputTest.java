package org.thermotile.jobs.cluster;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.apache.hadoop.conf.Configuration;
import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.hdfs.MiniDFSCluster;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.city.CityJob;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.cli.Main;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.testing.Processes;

/**
 * Inputs on HDFS: an HDFS MiniDFSCluster (one name node, one data node) in this JVM beside Spark
 * 4.2, the demo's inputs copied to it, and a one-day copy of the demo run file naming them as
 * {@code hdfs://} URIs. The run (embedded Spark; the land cover reaches the tasks through Spark's
 * file distribution) gives the same bytes as the same run file with {@code file://} URIs for
 * the inputs and the output folder, and its manifest names the URIs with the same SHA-256 as the
 * local files. With the output folder on HDFS too, the published folder holds the bytes of a local
 * run (see OutputStore), and the run holds the lock {@code .NAME.lock} beside its target as a local
 * run does (see RunLock).
 */
class HdfsInputTest {
    static final Path DEMO_DIR = ClusterRunTest.DEMO_DIR;
    static final List<String> FILES = List.of("landcover.tif", "heights.tif", "districts.geojson", "classes.yaml",
            "weather.csv");

    @TempDir
    static Path dir;
    static MiniDFSCluster hdfs;
    static String root;

    @BeforeAll
    static void startHdfs() throws Exception {
        Configuration conf = new Configuration();
        conf.set(MiniDFSCluster.HDFS_MINIDFS_BASEDIR, dir.resolve("hdfs").toString());
        hdfs = new MiniDFSCluster.Builder(conf).numDataNodes(1).build();
        hdfs.waitClusterUp();
        root = "hdfs://127.0.0.1:" + hdfs.getNameNodePort() + "/riverside/";
        FileSystem fs = hdfs.getFileSystem();
        for (String f : FILES) {
            fs.copyFromLocalFile(new org.apache.hadoop.fs.Path(DEMO_DIR.resolve(f).toUri()),
                    new org.apache.hadoop.fs.Path(root + f));
        }
    }

    @AfterAll
    static void stopHdfs() {
        if (hdfs != null) {
            hdfs.shutdown();
        }
    }

    /** The demo run file cut to one counted day (one day of spin-up), inputs at {@code base}. */
    static Path oneDayRunFile(Path file, String base) throws Exception {
        String yaml = Files.readString(DEMO_DIR.resolve("run.yaml"));
        yaml = yaml.substring(0, yaml.indexOf("\nscenarios:")) + "\n"; // programmes and hotspots left out
        yaml = yaml.replaceAll("(?m)^  start: .*$", "  start: 2026-07-16").replaceAll("(?m)^  end: .*$", "  end: 2026-07-16")
                .replaceAll("(?m)^  spin_up_days: 2 ", "  spin_up_days: 1 ");
        for (String f : FILES) {
            yaml = yaml.replaceFirst("(?m)(:\\s*)" + java.util.regex.Pattern.quote(f) + "(\\s)", "$1" + base + f + "$2");
        }
        assertTrue(yaml.contains("start: 2026-07-16") && yaml.contains("spin_up_days: 1"), yaml);
        Files.writeString(file, yaml);
        return file;
    }

    @Test
    void hdfsInputsGiveTheBytesOfLocalInputs() throws Exception {
        Path local = dir.resolve("out-local");
        run(oneDayRunFile(dir.resolve("local.yaml"), DEMO_DIR.toUri().toString()), Path.of(local.toUri().toString()));
        Path remote = run(oneDayRunFile(dir.resolve("hdfs.yaml"), root), dir.resolve("out-hdfs"));
        List<String> files = ClusterRunTest.tree(local);
        assertEquals(files, ClusterRunTest.tree(remote));
        for (String f : files) {
            if (!f.equals("manifest.json")) {
                assertArrayEquals(Files.readAllBytes(local.resolve(f)), Files.readAllBytes(remote.resolve(f)), f);
            }
        }
        ObjectMapper om = new ObjectMapper();
        JsonNode a = om.readTree(local.resolve("manifest.json").toFile());
        JsonNode b = om.readTree(remote.resolve("manifest.json").toFile());
        for (String f : List.of("land_cover", "heights", "districts", "classes", "weather")) {
            assertEquals(root + FILES.get(List.of("land_cover", "heights", "districts", "classes", "weather").indexOf(f)),
                    b.path("inputs").path(f).path("location").asText(), f);
            assertEquals(a.path("inputs").path(f).path("sha256").asText(), b.path("inputs").path(f).path("sha256").asText(), f);
        }
        ObjectNode x = (ObjectNode) a.deepCopy();
        ObjectNode y = (ObjectNode) b.deepCopy();
        for (ObjectNode n : List.of(x, y)) {
            n.remove("timing");
            n.remove("inputs");
            n.remove("run_file");
        }
        assertEquals(x, y);
    }

    @Test
    void missingHdfsInputIsNamed() throws Exception {
        Path rf = oneDayRunFile(dir.resolve("missing.yaml"), root.replace("/riverside/", "/nowhere/"));
        UserInputException e = org.junit.jupiter.api.Assertions.assertThrows(UserInputException.class,
                () -> RunPreparer.prepare(RunFileReader.read(rf)));
        assertTrue(e.getMessage().startsWith("inputs.land_cover: " + root.replace("/riverside/", "/nowhere/")
                + "landcover.tif not found. Fix:"), e.getMessage());
    }

    /** The one-day run file with a programme and a hot-spot block, so every kind of output is written. */
    static Path fullRunFile(Path file, String base) throws Exception {
        oneDayRunFile(file, base);
        Files.writeString(file, Files.readString(file) + """
                scenarios:
                  - name: cool-pavements
                    changes:
                      - {targets: {materials: [asphalt_aged]}, set: {albedo: 0.33}, cost_per_m2: 12}
                hotspots: {statistics: [peak], distance_m: 60, weights: binary, fdr: 0.10}
                """);
        return file;
    }

    /**
     * Inputs and outputs on HDFS: the run folder appears on HDFS only when complete, and copied back
     * it holds the same files with the same bytes as the same run written to a local folder (maps,
     * Parquet tables, comparison, hot spots, map pictures); the manifests differ only in input
     * locations and timings.
     */
    @Test
    void outputsOnHdfsGiveTheBytesOfALocalRun() throws Exception {
        Path local = dir.resolve("full-local");
        run(fullRunFile(dir.resolve("full-local.yaml"), DEMO_DIR.toUri().toString()), local, true);
        String target = root + "runs/full";
        // A run of this host killed before its clean-up: its lock (a PID that has ended) and its mirror.
        FileSystem fs = hdfs.getFileSystem();
        long dead = Processes.deadPid();
        String host = java.net.InetAddress.getLocalHost().getHostName();
        try (var o = fs.create(new org.apache.hadoop.fs.Path(root + "runs/.full.lock"), false)) {
            o.write(("pid=" + dead + "\nhost=" + host + "\nstarted=2026-07-01T10:00:00Z\ncommand=thermotile run old.yaml "
                    + "--out " + target + "\n").getBytes(java.nio.charset.StandardCharsets.UTF_8));
        }
        try (var o = fs.create(new org.apache.hadoop.fs.Path(root + "runs/.full.4242.partial/maps/peak.tif"), false)) {
            o.write("half a file".getBytes(java.nio.charset.StandardCharsets.UTF_8));
        }
        ByteArrayOutputStream warnings = new ByteArrayOutputStream();
        PrintStream err = System.err;
        System.setErr(new PrintStream(warnings, true, java.nio.charset.StandardCharsets.UTF_8));
        try {
            run(fullRunFile(dir.resolve("full-hdfs.yaml"), root), Path.of(target), true);
        } finally {
            System.setErr(err);
        }
        String w = warnings.toString(java.nio.charset.StandardCharsets.UTF_8);
        assertTrue(w.contains("warning: taking over the stale lock " + root + "runs/.full.lock of thermotile run old.yaml")
                && w.contains("(PID " + dead + " on " + host + ", since 2026-07-01T10:00:00Z)"), w);

        // Published once, nothing left beside it: the stale lock and mirror are gone, the run's lock released.
        List<String> beside = new java.util.ArrayList<>();
        for (var st : fs.listStatus(new org.apache.hadoop.fs.Path(root + "runs"))) {
            beside.add(st.getPath().getName());
        }
        assertEquals(List.of("full"), beside);
        Path back = dir.resolve("full-back");
        fs.copyToLocalFile(false, new org.apache.hadoop.fs.Path(target), new org.apache.hadoop.fs.Path(back.toUri()), true);

        List<String> files = ClusterRunTest.tree(local);
        assertEquals(files, ClusterRunTest.tree(back));
        assertTrue(files.contains("comparison/ranking.csv") && files.contains("report.html")
                && files.stream().anyMatch(f -> f.startsWith("hotspots/")) && files.contains("tables/cells/scenario=baseline/"
                + "part-00000.snappy.parquet"), files.toString());
        for (String f : files) {
            if (f.endsWith("manifest.json") || f.equals("report.html")) {
                continue; // input locations differ (file:// and hdfs://); checked below
            }
            assertArrayEquals(Files.readAllBytes(local.resolve(f)), Files.readAllBytes(back.resolve(f)), f);
        }
        ObjectMapper om = new ObjectMapper();
        ObjectNode a = (ObjectNode) om.readTree(local.resolve("manifest.json").toFile());
        ObjectNode b = (ObjectNode) om.readTree(back.resolve("manifest.json").toFile());
        for (ObjectNode n : List.of(a, b)) {
            n.remove("timing");
            n.remove("inputs");
            n.remove("run_file");
        }
        assertEquals(a, b);
        assertTrue(Files.readString(back.resolve("report.html")).contains("not air temperature"));
    }

    /**
     * A run holds {@code .x.lock} beside its HDFS target: a second run to the same target meanwhile
     * exits 2 naming the holder, the lock's URI and how to remove it, and stages nothing; the first
     * run then fails, and leaves nothing on HDFS, its lock included.
     */
    @Test
    void aSecondRunIsRefusedWhileTheFirstHoldsTheLockAndAFailedRunLeavesNothingOnHdfs() throws Exception {
        String target = root + "runs-failed/x";
        String lock = root + "runs-failed/.x.lock";
        Path rf = oneDayRunFile(dir.resolve("failing.yaml"), root);
        FileSystem fs = hdfs.getFileSystem();
        org.apache.hadoop.fs.Path parent = new org.apache.hadoop.fs.Path(root + "runs-failed");
        int[] second = {-1};
        String[] secondErr = {null};
        List<String> during = new java.util.ArrayList<>();
        SparkSession s = SparkSessions.get(null, 2);
        try {
            RuntimeException e = org.junit.jupiter.api.Assertions.assertThrows(RuntimeException.class,
                    () -> CityJob.run(s, RunPreparer.prepare(RunFileReader.read(rf)),
                            new CityJob.Options(Path.of(target), null, false, true, 2, false, folder -> {
                                java.io.StringWriter err = new java.io.StringWriter();
                                picocli.CommandLine cl = new picocli.CommandLine(new Main());
                                cl.setErr(new java.io.PrintWriter(err));
                                cl.setOut(new java.io.PrintWriter(new java.io.StringWriter()));
                                second[0] = Main.executeWith(cl, "run", rf.toString(), "--out", target, "--quiet");
                                secondErr[0] = err.toString();
                                try {
                                    for (var st : fs.listStatus(parent)) {
                                        during.add(st.getPath().getName());
                                    }
                                } catch (java.io.IOException x) {
                                    throw new java.io.UncheckedIOException(x);
                                }
                                throw new IllegalStateException("stop before publishing");
                            }, rf.toString()), new PrintStream(new ByteArrayOutputStream())));
            assertEquals("stop before publishing", e.getMessage());
        } finally {
            s.stop();
        }
        String pid = Long.toString(ProcessHandle.current().pid());
        assertEquals(Main.BAD_INPUT, second[0], secondErr[0]);
        assertTrue(secondErr[0].contains(target + " is in use by another thermotile command: thermotile run " + rf
                + " --out " + target + " (PID " + pid + " on "), secondErr[0]);
        assertTrue(secondErr[0].contains("if it is surely not running, remove the lock with hdfs dfs -rm " + lock),
                secondErr[0]);
        // While the first run stages: its lock and its one mirror, nothing of the refused run.
        assertEquals(2, during.size(), during.toString());
        assertTrue(during.contains(".x.lock") && during.stream().anyMatch(n -> n.matches("\\.x\\.[0-9]+\\.partial")),
                during.toString());
        assertTrue(!fs.exists(parent) || fs.listStatus(parent).length == 0, "left on HDFS: "
                + (fs.exists(parent) ? List.of(fs.listStatus(parent)) : List.of()));
    }

    @Test
    void anExistingHdfsOutputNeedsReplaceAndResumeIsRefused() throws Exception {
        FileSystem fs = hdfs.getFileSystem();
        fs.mkdirs(new org.apache.hadoop.fs.Path(root + "runs-taken/x"));
        Path rf = oneDayRunFile(dir.resolve("taken.yaml"), root);
        UserInputException e = org.junit.jupiter.api.Assertions.assertThrows(UserInputException.class,
                () -> run(rf, Path.of(root + "runs-taken/x"), false));
        assertTrue(e.getMessage().equals("--out " + root + "runs-taken/x already exists. Fix: choose another --out "
                + "folder or add --replace to overwrite it"), e.getMessage());
        SparkSession s = SparkSessions.get(null, 2);
        try {
            UserInputException r = org.junit.jupiter.api.Assertions.assertThrows(UserInputException.class,
                    () -> CityJob.run(s, RunPreparer.prepare(RunFileReader.read(rf)),
                            new CityJob.Options(Path.of(root + "runs-taken/x"), null, false, true, 2, true),
                            new PrintStream(new ByteArrayOutputStream())));
            assertTrue(r.getMessage().contains("--resume") && r.getMessage().contains("Fix: "), r.getMessage());
        } finally {
            s.stop();
        }
    }

    /** A Hadoop scheme whose connector is not on the class path is named, with the fix, for inputs and outputs. */
    @Test
    void aMissingConnectorIsAClearErrorForInputsAndOutputs() throws Exception {
        Path rf = oneDayRunFile(dir.resolve("s3.yaml"), DEMO_DIR.toUri().toString());
        UserInputException out = org.junit.jupiter.api.Assertions.assertThrows(UserInputException.class,
                () -> CityJob.run(null, RunPreparer.prepare(RunFileReader.read(rf)),
                        new CityJob.Options(Path.of("s3a://bucket/runs/x"), null, false, true, 2),
                        new PrintStream(new ByteArrayOutputStream())));
        assertTrue(out.getMessage().startsWith("--out s3a://bucket/runs/x: the file system cannot be reached")
                && out.getMessage().contains("hadoop-aws"), out.getMessage());
        Path in = oneDayRunFile(dir.resolve("s3-in.yaml"), "s3a://bucket/riverside/");
        UserInputException e = org.junit.jupiter.api.Assertions.assertThrows(UserInputException.class,
                () -> RunPreparer.prepare(RunFileReader.read(in)));
        assertTrue(e.getMessage().startsWith("inputs.land_cover: s3a://bucket/riverside/landcover.tif cannot be read")
                && e.getMessage().contains("hadoop-aws"), e.getMessage());
    }

    /** Runs on a session of its own; {@code out} as a command line's path conversion gives it. */
    static Path run(Path runFile, Path out) {
        return run(runFile, out, false);
    }

    /** As {@link #run(Path, Path)}, with the report written into the folder before it is published. */
    static Path run(Path runFile, Path out, boolean report) {
        SparkSession s = SparkSessions.get(null, 2);
        try {
            CityJob.run(s, RunPreparer.prepare(RunFileReader.read(runFile)), new CityJob.Options(out, null, false, true, 2,
                    false, report ? org.thermotile.jobs.report.RunReport::write : null),
                    new PrintStream(new ByteArrayOutputStream()));
        } finally {
            s.stop();
        }
        return out;
    }
}
