package org.thermotile.jobs.faults;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.List;
import java.util.function.Consumer;
import java.util.stream.Stream;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.city.CityJob;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.cli.Main;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.storage.Folders;
import org.thermotile.jobs.testing.Gdal;
import picocli.CommandLine;

/**
 * Faults of the output location and of the machine: a full disk, a read-only
 * disk, an output folder that vanishes mid-run, an input without read permission and a task out
 * of memory each give one line naming the path and the fix (exit 2), leave nothing half-written
 * and leave the user's other files alone. The full and read-only disks are real: small tmpfs
 * mounts, made when the tests run as root (else those tests are skipped); the out-of-memory case
 * is fault-injected (Spark's own failure text, thrown where the run would see it); the unreadable
 * input is real (as root, in a child JVM without the capabilities that bypass permissions).
 */
class OutputFaultsTest {
    @TempDir
    static Path dir;
    static SparkSession spark;
    static Path runFile;

    @BeforeAll
    static void inputs() throws Exception {
        Gdal.require("gdal_translate");
        spark = SparkSessions.get(null, 2);
        runFile = BadInputCatalogueTest.plain(dir.resolve("in"));
    }

    @AfterAll
    static void stop() {
        if (spark != null) {
            spark.stop();
        }
    }

    static UserInputException runFails(Path out, Consumer<Path> beforePublish) {
        return assertThrows(UserInputException.class, () -> CityJob.run(spark,
                RunPreparer.prepareAll(RunFileReader.read(runFile), false),
                new CityJob.Options(out, null, false, true, 0, false, beforePublish),
                new PrintStream(new ByteArrayOutputStream())));
    }

    /** A tmpfs of {@code size} at {@code at} (root only; the test is skipped otherwise). */
    static void mount(Path at, String options) throws Exception {
        Files.createDirectories(at);
        Process p = new ProcessBuilder("mount", "-t", "tmpfs", "-o", options, "tmpfs", at.toString())
                .redirectErrorStream(true).start();
        String msg = new String(p.getInputStream().readAllBytes());
        assumeTrue(p.waitFor() == 0, "cannot mount a tmpfs here (needs root): " + msg);
    }

    static void sh(String... cmd) throws Exception {
        assertEquals(0, new ProcessBuilder(cmd).inheritIO().start().waitFor(), String.join(" ", cmd));
    }

    static void assertNothingLeft(Path parent) throws Exception {
        try (Stream<Path> s = Files.list(parent)) {
            List<String> names = s.map(p -> p.getFileName().toString()).sorted().toList();
            assertEquals(List.of("keep.txt"), names, "only the user's own file");
        }
        assertEquals("the user's own", Files.readString(parent.resolve("keep.txt")));
    }

    @Test
    void diskFull() throws Exception {
        Path small = dir.resolve("small disk");
        mount(small, "size=16k");
        try {
            Files.writeString(small.resolve("keep.txt"), "the user's own");
            Path out = small.resolve("out");
            UserInputException e = runFails(out, null);
            String m = e.getMessage();
            assertTrue(m.startsWith("cannot write the outputs of " + out + ": the disk is full"), m);
            assertTrue(m.contains("Fix: free space on the disk of " + small), m);
            assertEquals(1, m.lines().count(), m);
            assertNothingLeft(small);
        } finally {
            sh("umount", small.toString());
        }
    }

    @Test
    void readOnlyDisk() throws Exception {
        Path ro = dir.resolve("ro disk");
        mount(ro, "size=1m");
        try {
            Files.writeString(ro.resolve("keep.txt"), "the user's own");
            sh("mount", "-o", "remount,ro", ro.toString());
            Path out = ro.resolve("out");
            String m = runFails(out, null).getMessage();
            assertTrue(m.contains("cannot write the lock file " + ro.resolve(".out.lock")), m);
            assertTrue(m.contains("(the file system is read-only)"), m);
            assertTrue(m.contains("Fix: make " + ro + " writable"), m);
            assertNothingLeft(ro);
        } finally {
            sh("umount", ro.toString());
        }
    }

    @Test
    void outputFolderVanishesMidRun() throws Exception {
        Path gone = dir.resolve("usb stick");
        Path out = gone.resolve("runs").resolve("out");
        String m = runFails(out, staged -> Folders.deleteQuietly(gone)).getMessage();
        assertTrue(m.startsWith("cannot write the outputs of " + out + ": the folder does not exist"), m);
        assertTrue(m.contains("Fix: the folder " + gone.resolve("runs") + " is gone"), m);
        assertFalse(Files.exists(gone));
    }

    @Test
    void outOfMemoryInATask() throws Exception {
        Path parent = Files.createDirectories(dir.resolve("oom"));
        Files.writeString(parent.resolve("keep.txt"), "the user's own");
        Path out = parent.resolve("out");
        // What Spark's driver throws when a task died of OutOfMemoryError (the text of a SparkException).
        String m = runFails(out, staged -> {
            throw new RuntimeException("Job aborted due to stage failure: Task 0 in stage 3.0 failed 1 times, most "
                    + "recent failure: Lost task 0.0 in stage 3.0 (TID 7) (127.0.0.1 executor driver): "
                    + "java.lang.OutOfMemoryError: Java heap space");
        }).getMessage();
        assertTrue(m.startsWith("the run ran out of memory"), m);
        assertTrue(m.contains(out.toString()) && m.contains("Fix: give the JVM more heap"), m);
        assertNothingLeft(parent);
    }

    /**
     * A land cover without read permission. As root every file is readable, so there the command
     * runs in a child JVM without the capabilities that bypass permissions ({@code setpriv}).
     */
    @Test
    void inputWithoutReadPermission() throws Exception {
        Path in = dir.resolve("locked");
        Path rf = BadInputCatalogueTest.plain(in);
        Path lc = in.resolve("landcover.tif");
        Path out = in.resolve("out");
        Files.setPosixFilePermissions(lc, PosixFilePermissions.fromString("---------"));
        try {
            int status;
            String err;
            if (!Files.isReadable(lc)) {
                StringWriter w = new StringWriter();
                CommandLine cl = new CommandLine(new Main());
                cl.setErr(new PrintWriter(w));
                status = Main.executeWith(cl, "run", rf.toString(), "--out", out.toString(), "--quiet");
                err = w.toString();
            } else {
                List<String> cmd = new java.util.ArrayList<>(List.of("setpriv",
                        "--inh-caps=-dac_override,-dac_read_search", "--bounding-set=-dac_override,-dac_read_search",
                        Path.of(System.getProperty("java.home"), "bin", "java").toString(), "-Xmx256m"));
                java.lang.management.ManagementFactory.getRuntimeMXBean().getInputArguments().stream()
                        .filter(a -> a.startsWith("--add-opens") || a.startsWith("-XX:+IgnoreUnrecognizedVMOptions"))
                        .forEach(cmd::add);
                cmd.addAll(List.of("-cp", System.getProperty("surefire.test.class.path",
                        System.getProperty("java.class.path")), Main.class.getName(), "run", rf.toString(),
                        "--out", out.toString(), "--quiet"));
                Process p;
                try {
                    p = new ProcessBuilder(cmd).redirectErrorStream(true).start();
                } catch (java.io.IOException e) {
                    assumeTrue(false, "setpriv is not installed: as root this case cannot be made");
                    return;
                }
                err = new String(p.getInputStream().readAllBytes());
                status = p.waitFor();
            }
            assertEquals(Main.BAD_INPUT, status, err);
            assertTrue(err.contains(lc + ": permission denied") && err.contains("Fix: chmod u+r " + lc), err);
            assertEquals(1, err.strip().lines().count(), err);
            assertFalse(Files.exists(out));
        } finally {
            Files.setPosixFilePermissions(lc, PosixFilePermissions.fromString("rw-r--r--"));
        }
    }
}
