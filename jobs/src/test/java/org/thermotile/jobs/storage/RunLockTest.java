package org.thermotile.jobs.storage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.testing.Processes;

/**
 * The lock's contract, run against both of its stores: a local folder (CREATE_NEW) and a Hadoop
 * file system, here Hadoop's local file system through a {@code file://} URI, the code path of
 * {@code hdfs://} and {@code s3a://} outputs (HdfsInputTest runs it against HDFS itself). The same
 * content, the same refusal of a live holder, the same takeover of a stale lock, the same release.
 */
class RunLockTest {
    @TempDir
    Path dir;

    /** A run folder {@code name} under {@code dir} and its lock, on one of the two stores. */
    record Target(String what, String lockLocation, Path lockFile, RunLock.Store store) {}

    Target target(String kind, String name) {
        Path run = dir.resolve(name);
        Path lockFile = dir.resolve("." + name + ".lock");
        if (kind.equals("local")) {
            return new Target(run.toString(), lockFile.toString(), lockFile,
                    new RunLock.LocalStore(RunLock.fileOf(run)));
        }
        String uri = OutputStore.localUri(run);
        return new Target(uri, RunLock.uriOf(uri), lockFile, RunLock.HadoopStore.of(uri));
    }

    RunLock acquire(Target t, String command, PrintStream warnings) {
        return RunLock.acquire(t.store(), t.what(), command, warnings);
    }

    /**
     * Writes another command's lock as that command would: for the Hadoop store through Hadoop's
     * local file system, which keeps a checksum beside the file and checks it on reading.
     */
    static void write(Target t, String content) throws Exception {
        if (t.store() instanceof RunLock.LocalStore) {
            Files.writeString(t.lockFile(), content);
            return;
        }
        org.apache.hadoop.fs.Path p = new org.apache.hadoop.fs.Path(t.lockLocation());
        try (var out = p.getFileSystem(new org.apache.hadoop.conf.Configuration()).create(p, true)) {
            out.write(content.getBytes(StandardCharsets.UTF_8));
        }
    }

    static PrintStream quiet() {
        return new PrintStream(new ByteArrayOutputStream(), true, StandardCharsets.UTF_8);
    }

    @ParameterizedTest
    @ValueSource(strings = {"local", "hadoop"})
    void theLockHoldsThisProcessAndIsReleased(String kind) throws Exception {
        Target t = target(kind, "a");
        RunLock l = acquire(t, "run city.yaml --out a", quiet());
        assertEquals(t.lockLocation(), l.location());
        Map<String, String> m = RunLock.parse(Files.readString(t.lockFile()));
        assertEquals(List.of("pid", "host", "started", "command"), List.copyOf(m.keySet()));
        assertEquals(Long.toString(ProcessHandle.current().pid()), m.get("pid"));
        assertEquals(RunLock.host(), m.get("host"));
        assertFalse(Instant.parse(m.get("started")).isAfter(Instant.now()));
        assertEquals("thermotile run city.yaml --out a", m.get("command"));
        l.release();
        l.release();                                       // a second release (the stop hook's) does nothing
        assertEquals(List.of(), names(), "nothing left, no checksum side file either");
    }

    @ParameterizedTest
    @ValueSource(strings = {"local", "hadoop"})
    void aSecondCommandIsRefusedWithTheHolderAndTheFix(String kind) throws Exception {
        Target t = target(kind, "busy");
        try (RunLock first = acquire(t, "run city.yaml --out busy", quiet())) {
            String held = Files.readString(t.lockFile());
            UserInputException e = assertThrows(UserInputException.class,
                    () -> acquire(target(kind, "busy"), "report busy", quiet()));
            String pid = Long.toString(ProcessHandle.current().pid());
            assertEquals(t.what() + " is in use by another thermotile command: thermotile run city.yaml --out busy (PID "
                    + pid + " on " + RunLock.host() + ", since " + RunLock.parse(held).get("started") + "). Fix: wait "
                    + "until it ends, stop it (kill " + pid + " on that host), or choose another --out folder; if it is "
                    + "surely not running, " + (kind.equals("local") ? "delete " + t.lockLocation()
                    : "remove the lock with hadoop fs -rm " + t.lockLocation()), e.getMessage());
            assertEquals(held, Files.readString(t.lockFile()), "the holder's lock is untouched");
        }
        assertFalse(Files.exists(t.lockFile()));
    }

    @ParameterizedTest
    @ValueSource(strings = {"local", "hadoop"})
    void aStaleLockOfThisHostIsReportedAndTakenOver(String kind) throws Exception {
        Target t = target(kind, "stale");
        long dead = Processes.deadPid();
        write(t, "pid=" + dead + "\nhost=" + RunLock.host()
                + "\nstarted=2026-07-01T10:00:00Z\ncommand=thermotile run old.yaml --out stale\n");
        ByteArrayOutputStream warn = new ByteArrayOutputStream();
        try (RunLock l = acquire(t, "run new.yaml --out stale", new PrintStream(warn, true, StandardCharsets.UTF_8))) {
            assertEquals("warning: taking over the stale lock " + t.lockLocation() + " of thermotile run old.yaml --out "
                    + "stale (PID " + dead + " on " + RunLock.host() + ", since 2026-07-01T10:00:00Z): that process is "
                    + "no longer running; whatever it left in its staging folder is removed",
                    warn.toString(StandardCharsets.UTF_8).strip());
            assertEquals("thermotile run new.yaml --out stale",
                    RunLock.parse(Files.readString(t.lockFile())).get("command"));
        }
        assertFalse(Files.exists(t.lockFile()));
    }

    /** This process's PID with a start time before it started: the PID was reused, the lock is stale. */
    @ParameterizedTest
    @ValueSource(strings = {"local", "hadoop"})
    void aLockOfAReusedPidIsStale(String kind) throws Exception {
        Target t = target(kind, "reused");
        write(t, "pid=" + ProcessHandle.current().pid() + "\nhost=" + RunLock.host()
                + "\nstarted=2001-01-01T00:00:00Z\ncommand=thermotile run old.yaml\n");
        acquire(t, "run new.yaml", quiet()).release();
        assertFalse(Files.exists(t.lockFile()));
    }

    @ParameterizedTest
    @ValueSource(strings = {"local", "hadoop"})
    void aLockOfAnotherHostIsRespectedAndKept(String kind) throws Exception {
        Target t = target(kind, "elsewhere");
        String theirs = "pid=1\nhost=render-node-7.saltmere.example\nstarted=2026-07-01T10:00:00Z\n"
                + "command=thermotile run city.yaml --out elsewhere\n";
        write(t, theirs);
        UserInputException e = assertThrows(UserInputException.class, () -> acquire(t, "run x.yaml", quiet()));
        assertTrue(e.getMessage().contains("(PID 1 on render-node-7.saltmere.example, since 2026-07-01T10:00:00Z)"),
                e.getMessage());
        assertEquals(theirs, Files.readString(t.lockFile()));
    }

    /** A lock no longer ours (taken over after we were thought gone) is left to its new holder. */
    @ParameterizedTest
    @ValueSource(strings = {"local", "hadoop"})
    void releaseLeavesALockThatIsNoLongerOurs(String kind) throws Exception {
        Target t = target(kind, "taken");
        RunLock l = acquire(t, "run x.yaml", quiet());
        write(t, "pid=1\nhost=elsewhere\nstarted=2026-07-01T10:00:00Z\ncommand=thermotile x\n");
        l.release();
        assertTrue(Files.readString(t.lockFile()).contains("host=elsewhere"));
    }

    @Test
    void theLockOfAFolderOnAHadoopFileSystemIsItsHiddenSibling() {
        assertEquals("hdfs://nn:8020/runs/.x.lock", RunLock.uriOf("hdfs://nn:8020/runs/x"));
        assertEquals("hdfs://nn:8020/runs/.x.lock", RunLock.uriOf("hdfs://nn:8020/runs/x/"));
        assertEquals("s3a://bucket/.x.lock", RunLock.uriOf("s3a://bucket/x"));
    }

    @Test
    void anUnreachableFileSystemIsNamedWithTheFix() {
        UserInputException e = assertThrows(UserInputException.class,
                () -> RunLock.acquireRemote("nosuchscheme://host/runs/x", "run x.yaml", quiet()));
        assertTrue(e.getMessage().startsWith("--out nosuchscheme://host/runs/x: the file system cannot be reached")
                && e.getMessage().contains("Fix: "), e.getMessage());
    }

    List<String> names() throws Exception {
        try (Stream<Path> s = Files.list(dir)) {
            return s.map(p -> p.getFileName().toString()).sorted().toList();
        }
    }
}
