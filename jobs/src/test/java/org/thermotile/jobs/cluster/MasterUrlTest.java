package org.thermotile.jobs.cluster;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.city.CityJob;
import org.thermotile.jobs.city.PreparedRun;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFileReader;

/** A master URL nobody answers is bad input, reported within a bounded wait, with nothing written. */
class MasterUrlTest {
    @TempDir
    Path dir;
    @TempDir
    Path inputs;

    @Test
    void unreachableMasterIsAClearErrorNotAHang() throws Exception {
        int port = StandaloneCluster.freePort();                  // nothing listens there
        String url = "spark://127.0.0.1:" + port;
        PreparedRun p = RunPreparer.prepare(RunFileReader.read(ClusterRunTest.reducedDemo(inputs)));
        Path out = dir.resolve("out");
        // The bound is the point of the check, not speed: Spark alone retries for about a minute.
        UserInputException e = assertTimeoutPreemptively(Duration.ofSeconds(30), () -> assertThrows(
                UserInputException.class, () -> CityJob.run(p, new CityJob.Options(out, url, false, true, 0),
                        new PrintStream(new ByteArrayOutputStream()))));
        assertTrue(e.getMessage().startsWith("--master " + url + ": no Spark master answered within 5 s at 127.0.0.1:"
                + port), e.getMessage());
        assertTrue(e.getMessage().contains("Fix: check the URL"), e.getMessage());
        assertFalse(Files.exists(out));
        try (var s = Files.list(dir)) {
            assertFalse(s.findAny().isPresent(), "no temporary folder left");
        }
    }

    @Test
    void masterUrlWithoutANumberPortIsNamed() {
        UserInputException e = assertThrows(UserInputException.class,
                () -> org.thermotile.jobs.city.SparkSessions.get("spark://127.0.0.1:70x7", 0));
        assertTrue(e.getMessage().contains("'70x7' is not a port number"), e.getMessage());
    }
}
