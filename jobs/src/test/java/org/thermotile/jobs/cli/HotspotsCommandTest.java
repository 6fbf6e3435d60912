package org.thermotile.jobs.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.hotspots.HotspotFixture;
import picocli.CommandLine;

/**
 * The hotspots command through picocli, registered the way Main registers commands: bad input
 * exits with 2 before Spark starts; a good run exits with 0 and writes the folder.
 */
class HotspotsCommandTest {
    @TempDir
    Path dir;

    static CommandLine cli(StringWriter err) {
        CommandLine cl = Main.newCommandLine();
        cl.setErr(new PrintWriter(err, true));
        return cl;
    }

    @Test
    void badInputExitsWithTwoAndNamesTheFix() throws Exception {
        Path run = HotspotFixture.write(dir.resolve("run"));
        StringWriter err = new StringWriter();
        assertEquals(2, cli(err).execute("hotspots", run.toString(), "--distance", "2"));
        assertTrue(err.toString().contains("thermotile hotspots: --distance (distance_m) 2 m is smaller than one analysis "
                + "cell (40 m)"), err.toString());
        StringWriter err4 = new StringWriter();
        assertEquals(2, cli(err4).execute("hotspots", run.toString(), "--cell-size", "3"));
        assertTrue(err4.toString().contains("smaller than the simulation cell") && err4.toString().contains("Fix"),
                err4.toString());
        StringWriter err5 = new StringWriter();
        assertEquals(2, cli(err5).execute("hotspots", run.toString(), "--fdr-method", "holm"));
        assertTrue(err5.toString().contains("give bh or by"), err5.toString());
        StringWriter err2 = new StringWriter();
        assertEquals(2, cli(err2).execute("hotspots", run.toString(), "--weights", "gaussian"));
        assertTrue(err2.toString().contains("binary or inverse_distance"), err2.toString());
        StringWriter err3 = new StringWriter();
        assertEquals(2, cli(err3).execute("hotspots", run.toString(), "--statistic", "nightmin"));
        assertTrue(err3.toString().contains("did you mean 'night_min'?"), err3.toString());
        StringWriter err6 = new StringWriter();
        assertEquals(2, cli(err6).execute("hotspots", run.toString(), "--zone-id", "ref"));
        assertTrue(err6.toString().contains("--zone-id ref without --zones"), err6.toString());
        StringWriter err7 = new StringWriter();
        assertEquals(2, cli(err7).execute("hotspots", run.toString(), "--zones", dir.resolve("none.geojson").toString()));
        assertTrue(err7.toString().contains("none.geojson: zones file not found. Fix: check --zones"), err7.toString());
        StringWriter err8 = new StringWriter();
        assertEquals(2, cli(err8).execute("hotspots", run.toString(), "--min-coverage", "2"));
        assertTrue(err8.toString().contains("--min-coverage (min_coverage) 2.0 is outside [0, 1]"), err8.toString());
    }

    @Test
    void goodRunExitsWithZero() throws Exception {
        Path run = HotspotFixture.write(dir.resolve("run"));
        StringWriter err = new StringWriter();
        int code = cli(err).execute("hotspots", run.toString(), "--statistic", "night_min", "--cell-size", "10", "--distance", "20",
                "--fdr-method", "by",
                "--weights", "inverse_distance", "--fdr", "0.05", "--tile-size", "64", "--threads", "2");
        assertEquals(0, code, err.toString());
        assertTrue(Files.isRegularFile(run.resolve("hotspots/night_min/excess_band.tif")));
    }
}
