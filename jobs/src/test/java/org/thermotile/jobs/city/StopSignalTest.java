package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.InputStream;
import java.lang.management.ManagementFactory;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.cli.Main;

/**
 * A real {@code thermotile run} in a child JVM, stopped by SIGINT and by SIGTERM once it reports
 * progress: the exit status is 128 + the signal's number, the message names the
 * signal, what was removed and kept and the exact resume command, nothing is published, the
 * staging folder and the lock are gone and an earlier run in the folder is untouched.
 */
class StopSignalTest {
    @TempDir
    Path dir;

    @Test
    void sigtermStopsARunIntoANewFolder() throws Exception {
        Path rf = longRun(dir.resolve("in"));
        Path out = dir.resolve("out");
        Stopped s = runAndStop(rf, out, "TERM");
        assertEquals(Main.STOPPED_TERM, s.status(), s.err());
        assertTrue(s.err().contains("stopped by SIGTERM; nothing of this run was published"), s.err());
        assertTrue(s.err().contains("removed: " + dir.resolve(".out.partial")), s.err());
        assertTrue(s.err().contains("kept:    nothing (" + out + " held no earlier run)"), s.err());
        assertTrue(s.err().contains("resume:  thermotile run " + rf + " --out " + out + " --resume"), s.err());
        assertFalse(s.err().contains("failed:"), "a stop is not reported as a failure: " + s.err());
        assertFalse(Files.exists(out), "nothing published");
        assertFalse(Files.exists(dir.resolve(".out.partial")), "no staging left");
        assertFalse(Files.exists(dir.resolve(".out.lock")), "lock released");
    }

    @Test
    void sigintKeepsTheEarlierRunUntouched() throws Exception {
        Path rf = longRun(dir.resolve("in"));
        Path out = Files.createDirectories(dir.resolve("earlier run"));
        // An earlier run's folder (as far as --replace is concerned: it has our manifest).
        Files.writeString(out.resolve("manifest.json"), "{\"name\": \"test-city\"}\n");
        Files.writeString(out.resolve("marker.txt"), "earlier");
        Stopped s = runAndStop(rf, out, "INT", "--replace");
        assertEquals(Main.STOPPED_INT, s.status(), s.err());
        assertTrue(s.err().contains("stopped by SIGINT"), s.err());
        assertTrue(s.err().contains("kept:    " + out + ", the earlier run, untouched"), s.err());
        assertTrue(s.err().contains("resume:  thermotile run " + rf + " --out '" + out + "' --resume"), s.err());
        assertEquals("earlier", Files.readString(out.resolve("marker.txt")));
        try (var files = Files.list(out)) {
            assertEquals(2, files.count(), "the earlier run's files only");
        }
        assertFalse(Files.exists(dir.resolve(".earlier run.partial")), "no staging left");
        assertFalse(Files.exists(dir.resolve(".earlier run.lock")), "lock released");
    }

    record Stopped(int status, String out, String err) {}

    /** The fixture city in 16-cell tiles (70 tasks) over ten days: long enough to be stopped mid-way. */
    static Path longRun(Path in) throws IOException {
        Path rf = CityFixture.write(in, 16, "");
        Files.writeString(rf, Files.readString(rf).replace("end: 2026-07-16", "end: 2026-07-25"));
        return rf;
    }

    static Stopped runAndStop(Path rf, Path out, String signal, String... extra) throws Exception {
        List<String> cmd = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-Xmx512m"));
        ManagementFactory.getRuntimeMXBean().getInputArguments().stream()
                .filter(a -> a.startsWith("--add-opens") || a.startsWith("-XX:+IgnoreUnrecognizedVMOptions")
                        || a.startsWith("-Djdk.reflect.useDirectMethodHandle") || a.startsWith("-Dio.netty."))
                .forEach(cmd::add);
        cmd.addAll(List.of("-cp", System.getProperty("surefire.test.class.path", System.getProperty("java.class.path")),
                Main.class.getName(), "run", rf.toString(), "--out", out.toString(), "--threads", "1"));
        cmd.addAll(List.of(extra));
        Process p = new ProcessBuilder(cmd).start();
        StringBuffer stdout = new StringBuffer(), stderr = new StringBuffer();
        Thread o = drain(p.getInputStream(), stdout), e = drain(p.getErrorStream(), stderr);
        long end = System.nanoTime() + TimeUnit.MINUTES.toNanos(4);
        while (!stdout.toString().contains("tiles ") && p.isAlive() && System.nanoTime() < end) {
            Thread.sleep(100);
        }
        assertTrue(p.isAlive(), "the run ended before it could be stopped: " + stdout + stderr);
        assertTrue(stdout.toString().contains("tiles "), "no progress within 4 minutes: " + stdout + stderr);
        new ProcessBuilder("kill", "-" + signal, Long.toString(p.pid())).start().waitFor();
        assertTrue(p.waitFor(2, TimeUnit.MINUTES), "the run did not stop: " + stdout + stderr);
        o.join(5000);
        e.join(5000);
        return new Stopped(p.exitValue(), stdout.toString(), stderr.toString());
    }

    static Thread drain(InputStream in, StringBuffer into) {
        Thread t = new Thread(() -> {
            byte[] b = new byte[4096];
            try {
                for (int n; (n = in.read(b)) > 0; ) {
                    into.append(new String(b, 0, n, StandardCharsets.UTF_8));
                }
            } catch (IOException ignored) {
                // the process ended
            }
        });
        t.setDaemon(true);
        t.start();
        return t;
    }
}
