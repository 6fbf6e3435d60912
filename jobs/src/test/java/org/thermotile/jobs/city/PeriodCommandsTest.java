package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.cli.Main;
import picocli.CommandLine;

/**
 * The commands on a run over several periods: {@code run} publishes the folder with its reports,
 * {@code compare} rebuilds every period's comparison and the one across them with the same bytes,
 * and {@code hotspots} asks for one period's folder.
 */
class PeriodCommandsTest {
    @TempDir
    Path dir;

    static int cli(StringWriter err, String... args) {
        CommandLine cl = new CommandLine(new Main());
        cl.setOut(new PrintWriter(new StringWriter()));
        cl.setErr(new PrintWriter(err));
        return Main.executeWith(cl, args);
    }

    @Test
    void runCompareAndHotspotsOnAPeriodSweep() throws Exception {
        Path in = dir.resolve("in");
        PeriodSweepTest.writeInputs(in);
        Path out = dir.resolve("out");
        StringWriter err = new StringWriter();
        assertEquals(0, cli(err, "run", in.resolve("sweep.yaml").toString(), "--out", out.toString(), "--quiet"),
                err.toString());
        assertTrue(Files.isRegularFile(out.resolve("report.html")));
        for (String p : List.of("mid-july", "mid-july-warm", "late-july")) {
            assertTrue(Files.isRegularFile(out.resolve("periods/" + p + "/report.html")), p);
        }

        // compare: the same comparison files again, byte for byte.
        Map<String, byte[]> before = new LinkedHashMap<>();
        for (String f : DeterminismTest.tree(out)) {
            if (f.contains("comparison/") || f.contains("delta_")) {
                before.put(f, Files.readAllBytes(out.resolve(f)));
            }
        }
        assertTrue(before.keySet().containsAll(List.of("comparison/summary.md", "comparison/ranking_by_period.csv",
                "periods/late-july/comparison/districts.csv")), before.keySet().toString());
        for (String p : List.of("comparison", "periods/mid-july/comparison")) {
            org.thermotile.jobs.storage.Folders.deleteTree(out.resolve(p));
        }
        assertEquals(0, cli(err, "compare", out.toString()), err.toString());
        for (Map.Entry<String, byte[]> e : before.entrySet()) {
            assertArrayEquals(e.getValue(), Files.readAllBytes(out.resolve(e.getKey())), e.getKey());
        }

        // hotspots: the root names the period folders; a period's folder works.
        StringWriter herr = new StringWriter();
        assertEquals(Main.BAD_INPUT, cli(herr, "hotspots", out.toString(), "--statistic", "peak"));
        assertTrue(herr.toString().contains("several periods") && herr.toString().contains("periods/mid-july"),
                herr.toString());
        assertEquals(0, cli(err, "hotspots", out.resolve("periods/late-july").toString(), "--statistic", "peak",
                "--cell-size", "10", "--distance", "30"), err.toString());
        assertTrue(Files.isDirectory(out.resolve("periods/late-july/hotspots/peak")));
    }
}
