package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.config.RunFileReader;

/** One and two Spark threads give byte-identical outputs (the manifest's timings aside). */
class DeterminismTest {
    @TempDir
    Path dir;

    @Test
    void oneAndTwoThreadsGiveIdenticalBytes() throws Exception {
        Path rf = CityFixture.write(dir.resolve("in"), 64, "  hourly_days: [2026-07-15]");
        Path a = run(rf, 1, "a");
        Path b = run(rf, 2, "b");
        List<String> files = tree(a);
        assertEquals(files, tree(b));
        for (String f : files) {
            if (f.equals("manifest.json")) {
                assertEquals(withoutTiming(a.resolve(f)), withoutTiming(b.resolve(f)));
            } else {
                assertArrayEquals(Files.readAllBytes(a.resolve(f)), Files.readAllBytes(b.resolve(f)), f);
            }
        }
    }

    static Path run(Path runFile, int threads, String name) {
        Path out = runFile.getParent().getParent().resolve(name);
        SparkSession s = SparkSessions.get(null, threads);
        try {
            assertEquals("local[" + threads + "]", s.sparkContext().master());
            CityJob.run(s, RunPreparer.prepare(RunFileReader.read(runFile)),
                    new CityJob.Options(out, null, false, true, threads), new PrintStream(new ByteArrayOutputStream()));
        } finally {
            s.stop();
        }
        return out;
    }

    static String withoutTiming(Path manifest) throws Exception {
        ObjectNode n = (ObjectNode) new ObjectMapper().readTree(manifest.toFile());
        n.remove("timing");
        return n.toString();
    }

    static List<String> tree(Path root) throws Exception {
        try (Stream<Path> s = Files.walk(root)) {
            return s.filter(Files::isRegularFile).map(p -> root.relativize(p).toString()).sorted().toList();
        }
    }
}
