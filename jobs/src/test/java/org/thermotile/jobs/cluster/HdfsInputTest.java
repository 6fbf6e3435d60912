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
import org.thermotile.jobs.cli.UserInputException;
import org.thermotile.jobs.config.RunFileReader;

/**
 * Inputs on HDFS: an HDFS MiniDFSCluster (one name node, one data node) in this JVM beside Spark
 * 4.2, the demo's inputs copied to it, and a one-day copy of the demo run file naming them as
 * {@code hdfs://} URIs. The run (embedded Spark; the land cover reaches the tasks through Spark's
 * file distribution) gives the same bytes as the same run file with {@code file://} URIs for
 * the inputs and the output folder, and its manifest names the URIs with the same SHA-256 as the
 * local files. Outputs on {@code hdfs://} are refused with a message (see CityJob.outputFolder).
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

    @Test
    void outputOnHdfsIsRefusedWithAFix() throws Exception {
        Path rf = oneDayRunFile(dir.resolve("out-hdfs.yaml"), root);
        UserInputException e = org.junit.jupiter.api.Assertions.assertThrows(UserInputException.class,
                () -> run(rf, Path.of(root + "runs/x")));
        assertTrue(e.getMessage().startsWith("--out " + root + "runs/x: outputs are written to a local folder"),
                e.getMessage());
        assertTrue(e.getMessage().contains("Fix: "), e.getMessage());
    }

    /** Runs on a session of its own; {@code out} as a command line's path conversion gives it. */
    static Path run(Path runFile, Path out) {
        SparkSession s = SparkSessions.get(null, 2);
        try {
            CityJob.run(s, RunPreparer.prepare(RunFileReader.read(runFile)), new CityJob.Options(out, null, false, true, 2),
                    new PrintStream(new ByteArrayOutputStream()));
        } finally {
            s.stop();
        }
        return out;
    }
}
