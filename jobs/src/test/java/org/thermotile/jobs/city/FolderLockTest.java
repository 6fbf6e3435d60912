package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.cli.Main;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.storage.RunLock;
import picocli.CommandLine;
import org.thermotile.jobs.testing.Processes;

/**
 * One command at a time per output folder: a second run, resume, compare,
 * hot spots, report or observe on a folder that a run holds exits 2 naming the running one, and
 * the first run goes on undisturbed to the same bytes as a run alone; a stale lock is taken over
 * with a warning; the lock goes with the run, whether it succeeds or fails.
 */
class FolderLockTest {
    static SparkSession spark;
    @TempDir
    static Path dir;
    static Path runFile;
    static Path alone;

    @BeforeAll
    static void referenceRun() throws Exception {
        spark = SparkSessions.get(null, 2);
        runFile = CityFixture.write(dir.resolve("in"), 64, "");
        alone = dir.resolve("alone");
        CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(runFile)),
                new CityJob.Options(alone, null, false, true, 0), quiet());
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    static PrintStream quiet() {
        return new PrintStream(new ByteArrayOutputStream());
    }

    record Outcome(int status, String err) {}

    static Outcome cli(String... args) {
        StringWriter err = new StringWriter();
        CommandLine cl = new CommandLine(new Main());
        cl.setErr(new PrintWriter(err));
        cl.setOut(new PrintWriter(new StringWriter()));
        return new Outcome(Main.executeWith(cl, args), err.toString());
    }

    @Test
    void aSecondCommandOnAFolderInUseIsRefusedAndTheFirstRunIsUndisturbed() throws Exception {
        Path out = dir.resolve("busy");
        Path lockFile = dir.resolve(".busy.lock");
        List<Outcome> refused = new ArrayList<>();
        List<String> names = new ArrayList<>();
        // The second commands start while the first run holds the folder, its outputs staged but not published.
        CityJob.Summary s = CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(runFile)),
                new CityJob.Options(out, null, false, true, 0, false, staged -> {
                    assertTrue(Files.isRegularFile(lockFile), "the lock is held while the run stages");
                    assertTrue(Files.isRegularFile(staged.resolve("maps/peak.tif")), "outputs are staged");
                    names.add("run");
                    refused.add(cli("run", runFile.toString(), "--out", out.toString(), "--quiet"));
                    names.add("run --resume");
                    refused.add(cli("run", runFile.toString(), "--out", out.toString(), "--quiet", "--resume"));
                    names.add("run --replace");
                    refused.add(cli("run", runFile.toString(), "--out", out.toString(), "--quiet", "--replace"));
                    for (String c : List.of("compare", "report", "hotspots")) {
                        names.add(c);
                        refused.add(cli(c, out.toString()));
                    }
                    names.add("observe");
                    refused.add(cli("observe", out.toString(), "--observations", dir.resolve("none.yaml").toString()));
                }, runFile.toString()), quiet());
        String pid = Long.toString(ProcessHandle.current().pid());
        for (int i = 0; i < refused.size(); i++) {
            Outcome o = refused.get(i);
            assertEquals(Main.BAD_INPUT, o.status(), names.get(i) + ": " + o.err());
            assertTrue(o.err().contains("in use by another thermotile command"), names.get(i) + ": " + o.err());
            assertTrue(o.err().contains("PID " + pid), names.get(i) + ": " + o.err());
            assertTrue(o.err().contains("since 20"), names.get(i) + ": " + o.err());
            assertTrue(o.err().contains("thermotile run " + runFile), names.get(i) + ": " + o.err());
            assertTrue(o.err().contains("Fix: wait until it ends"), names.get(i) + ": " + o.err());
            assertEquals(1, o.err().strip().lines().count(), "one line: " + o.err());
        }
        // The first run: published, lock released, the same bytes as the run alone.
        assertEquals(out, s.outDir());
        assertFalse(Files.exists(lockFile), "lock released on success");
        assertFalse(Files.exists(dir.resolve(".busy.partial")));
        assertSameFiles(alone, out);
    }

    @Test
    void aStaleLockIsReportedAndTakenOver() throws Exception {
        Path out = dir.resolve("stale");
        Path lockFile = RunLock.fileOf(out);
        long deadPid = Processes.deadPid();
        Files.writeString(lockFile, "pid=" + deadPid + "\nhost=" + java.net.InetAddress.getLocalHost().getHostName()
                + "\nstarted=2026-07-01T10:00:00Z\ncommand=thermotile run old.yaml --out " + out + "\n");
        // What the killed run left staged is removed, not published.
        Files.createDirectories(dir.resolve(".stale.partial/maps"));
        Files.writeString(dir.resolve(".stale.partial/maps/peak.tif"), "half a file");
        ByteArrayOutputStream warn = new ByteArrayOutputStream();
        try (RunLock l = RunLock.acquire(out, "run x.yaml --out " + out, new PrintStream(warn, true,
                StandardCharsets.UTF_8))) {
            String w = warn.toString(StandardCharsets.UTF_8);
            assertTrue(w.contains("stale lock " + lockFile) && w.contains("PID " + deadPid)
                    && w.contains("since 2026-07-01T10:00:00Z") && w.contains("no longer running"), w);
            assertTrue(Files.readString(lockFile).contains("pid=" + ProcessHandle.current().pid()));
        }
        assertFalse(Files.exists(lockFile), "released by close");
        // And through a whole run: the stale lock and staging do not stop it, its outputs are the run alone's.
        Files.writeString(lockFile, "pid=" + deadPid + "\nhost=" + java.net.InetAddress.getLocalHost().getHostName()
                + "\nstarted=2026-07-01T10:00:00Z\ncommand=thermotile run old.yaml\n");
        CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(runFile)),
                new CityJob.Options(out, null, false, true, 0), quiet());
        assertFalse(Files.exists(lockFile));
        assertSameFiles(alone, out);
    }

    @Test
    void aLockOfAnotherHostIsRespected() throws Exception {
        Path out = dir.resolve("elsewhere");
        Path lockFile = RunLock.fileOf(out);
        String theirs = "pid=1\nhost=render-node-7.saltmere.example\nstarted=2026-07-01T10:00:00Z\n"
                + "command=thermotile run city.yaml --out " + out + "\n";
        Files.writeString(lockFile, theirs);
        Outcome o = cli("run", runFile.toString(), "--out", out.toString(), "--quiet");
        assertEquals(Main.BAD_INPUT, o.status(), o.err());
        assertTrue(o.err().contains("PID 1 on render-node-7.saltmere.example, since 2026-07-01T10:00:00Z"), o.err());
        assertTrue(o.err().contains("delete " + lockFile), o.err());
        assertEquals(theirs, Files.readString(lockFile), "another's lock is never removed");
        assertFalse(Files.exists(out));
        Files.delete(lockFile);
    }

    @Test
    void theLockIsReleasedWhenTheRunFails() throws Exception {
        Path out = Files.createDirectories(dir.resolve("mine"));
        Files.writeString(out.resolve("notes.txt"), "the user's own");
        try {
            CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(runFile)),
                    new CityJob.Options(out, null, true, true, 0), quiet());
        } catch (UserInputException expected) {
            assertTrue(expected.getMessage().contains("not a thermotile run folder"), expected.getMessage());
        }
        assertFalse(Files.exists(RunLock.fileOf(out)), "lock released on failure");
        assertEquals("the user's own", Files.readString(out.resolve("notes.txt")));
    }

    /** Every file of {@code a} is in {@code b} with the same bytes, and no more files. */
    static void assertSameFiles(Path a, Path b) throws Exception {
        List<String> fa = files(a), fb = files(b);
        assertEquals(fa, fb);
        for (String f : fa) {
            if (!f.equals("manifest.json")) {          // holds the wall time and the output folder
                assertArrayEquals(Files.readAllBytes(a.resolve(f)), Files.readAllBytes(b.resolve(f)), f);
            }
        }
    }

    static List<String> files(Path root) throws Exception {
        try (Stream<Path> s = Files.walk(root)) {
            return s.filter(Files::isRegularFile).map(p -> root.relativize(p).toString()).sorted().toList();
        }
    }
}
