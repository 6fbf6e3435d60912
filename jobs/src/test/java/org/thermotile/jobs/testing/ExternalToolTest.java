package org.thermotile.jobs.testing;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.opentest4j.TestAbortedException;

/** The helper every GDAL and Chromium check goes through, tried on the POSIX shell. */
class ExternalToolTest {
    @Test
    void findsProgramsOnThePathAndNotMadeUpOnes() {
        assertTrue(ExternalTool.locate("sh").isPresent(), "a POSIX system has sh on PATH");
        assertTrue(ExternalTool.locate("no-such-program-here", "sh").isPresent(), "names are tried in order");
        assertTrue(ExternalTool.locate("no-such-program-here").isEmpty());
        assertTrue(ExternalTool.locate("/bin/sh").isPresent(), "absolute paths are taken as given");
    }

    @Test
    void aMissingProgramSkipsWithItsNameAndHowToInstallIt() {
        if (System.getenv("CI") != null) {
            return; // under CI a missing program fails the test instead, by design
        }
        TestAbortedException e = assertThrows(TestAbortedException.class,
                () -> ExternalTool.require("apt-get install nothing", "no-such-program-here"));
        assertTrue(e.getMessage().contains("no-such-program-here not installed (apt-get install nothing)"),
                e.getMessage());
    }

    @Test
    void capturesOutputErrorExitCodeAndInput(@org.junit.jupiter.api.io.TempDir Path dir) throws IOException {
        ExternalTool.Result r = ExternalTool.run(List.of("sh", "-c", "pwd; echo \"$X\"; cat; echo oops >&2; exit 3"),
                dir, Map.of("X", "from env"), Duration.ofSeconds(20), "from stdin\n");
        assertEquals(3, r.exitCode());
        assertEquals(dir.toRealPath() + "\nfrom env\nfrom stdin\n", r.stdout());
        assertEquals("oops\n", r.stderr());
        IOException e = assertThrows(IOException.class, () -> ExternalTool.succeeded(r));
        assertTrue(e.getMessage().contains("exited 3") && e.getMessage().contains("oops"), e.getMessage());
        assertEquals("ok\n", ExternalTool.output(List.of("sh", "-c", "echo ok")));
    }

    @Test
    void aProgramThatHangsIsStoppedAtTheTimeout() {
        long t0 = System.nanoTime();
        IOException e = assertThrows(IOException.class, () -> ExternalTool.run(List.of("sleep", "30"), null, Map.of(),
                Duration.ofMillis(300), null));
        assertTrue(e.getMessage().contains("did not finish within"), e.getMessage());
        assertTrue((System.nanoTime() - t0) / 1e9 < 20, "returned long before the program would have ended");
    }
}
