package org.thermotile.jobs.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.model.materials.MaterialLibrary;
import picocli.CommandLine;

/** The single-surface, rating and library commands as a user runs them. */
class CommandsTest {
    @TempDir
    Path dir;

    record Result(int status, String out, String err) {
    }

    static Result run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = new CommandLine(new Main());
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        int s = Main.executeWith(cl, args);
        return new Result(s, out.toString(), err.toString());
    }

    @Test
    void pointWritesOneRowPerReportedHourWithEveryFlux() throws Exception {
        Path csv = dir.resolve("roof.csv");
        Result r = run("point", "-m", "roof_membrane_dark", "--lat", "45.3", "--lon", "9.9", "--utc-offset",
                "+02:00", "--days", "2", "-o", csv.toString());
        assertEquals(0, r.status(), r.err());
        List<String> lines = Files.readAllLines(csv);
        assertTrue(lines.get(0).startsWith("time,surface_c,net_shortwave_wm2,"), lines.get(0));
        // 2 reported days: from hour 48 (after 2 spin-up days) to the end of the synthetic weather.
        assertTrue(lines.size() - 1 >= 47 && lines.size() - 1 <= 48, "rows " + (lines.size() - 1));
        assertTrue(r.err().contains("peak") && r.err().contains("°C"), r.err());
        // Every row's residual is tiny: the fluxes close.
        for (String l : lines.subList(1, lines.size())) {
            String[] f = l.split(",");
            assertEquals(12, f.length, l);
            assertTrue(Math.abs(Double.parseDouble(f[11])) < 1e-6, l);
        }
    }

    @Test
    void pointReadsAWeatherFileAndTakesOverrides() throws Exception {
        Path weather = Path.of("..", "data-samples", "weather", "example-hot-week.csv");
        Path a = dir.resolve("a.csv");
        Path b = dir.resolve("b.csv");
        assertEquals(0, run("point", "-m", "roof_membrane_dark", "--lat", "45.3", "--lon", "9.9",
                "--weather", weather.toString(), "-o", a.toString()).status());
        Result rb = run("point", "-m", "roof_membrane_dark", "--set", "albedo=0.65", "--lat", "45.3", "--lon",
                "9.9", "--weather", weather.toString(), "-o", b.toString());
        assertEquals(0, rb.status(), rb.err());
        assertTrue(peak(b) < peak(a) - 10, "a cool coating lowers the peak: " + peak(b) + " vs " + peak(a));
    }

    static double peak(Path csv) throws Exception {
        return Files.readAllLines(csv).stream().skip(1).mapToDouble(l -> Double.parseDouble(l.split(",")[1]))
                .max().orElseThrow();
    }

    @Test
    void pointTakesTheRunFilesColumnSpacing() throws Exception {
        // A roof is thinner than the 25 cm below which both spacings agree: the same bytes. A
        // pavement column has nodes below it: coarse gives other, nearby, temperatures.
        Path roofStd = dir.resolve("roof-standard.csv");
        Path roofCoarse = dir.resolve("roof-coarse.csv");
        Path paveStd = dir.resolve("pave-standard.csv");
        Path paveCoarse = dir.resolve("pave-coarse.csv");
        String[] site = {"--lat", "45.3", "--lon", "9.9", "--days", "2"};
        assertEquals(0, run(cat(site, "point", "-m", "roof_membrane_dark", "-o", roofStd.toString())).status());
        assertEquals(0, run(cat(site, "point", "-m", "roof_membrane_dark", "--column-spacing", "coarse", "-o",
                roofCoarse.toString())).status());
        assertEquals(Files.readString(roofStd), Files.readString(roofCoarse));
        assertEquals(0, run(cat(site, "point", "-m", "concrete", "-o", paveStd.toString())).status());
        Result rc = run(cat(site, "point", "-m", "concrete", "--column-spacing", "coarse", "-o", paveCoarse.toString()));
        assertEquals(0, rc.status(), rc.err());
        assertNotEquals(Files.readString(paveStd), Files.readString(paveCoarse));
        // Within the month-long bound ColumnSpacingTest measures (0.40 K at any hour).
        assertEquals(peak(paveStd), peak(paveCoarse), 0.5);

        Result bad = run(cat(site, "point", "-m", "concrete", "--column-spacing", "corse"));
        assertEquals(Main.BAD_INPUT, bad.status());
        assertTrue(bad.err().contains("--column-spacing 'corse'") && bad.err().contains("did you mean 'coarse'"),
                bad.err());
    }

    /** {@code head} first (the command and its options), then {@code tail}. */
    private static String[] cat(String[] tail, String... head) {
        String[] all = java.util.Arrays.copyOf(head, head.length + tail.length);
        System.arraycopy(tail, 0, all, head.length, tail.length);
        return all;
    }

    @Test
    void pointRejectsAnUnknownOverrideKeyWithASuggestion() {
        Result r = run("point", "-m", "asphalt_aged", "--set", "albdo=0.3", "--lat", "45", "--lon", "9");
        assertEquals(Main.BAD_INPUT, r.status());
        assertTrue(r.err().contains("albdo") && r.err().contains("albedo"), r.err());
    }

    @Test
    void pointRejectsAnUnknownMaterialWithASuggestion() {
        Result r = run("point", "-m", "asphalt_agd", "--lat", "45", "--lon", "9");
        assertEquals(Main.BAD_INPUT, r.status());
        assertTrue(r.err().contains("asphalt_aged"), r.err());
    }

    @Test
    void rateGivesTheStandardSurfacesTheirDefiningValues() {
        Result black = run("rate", "--reflectance", "0.05", "--emittance", "0.90");
        assertEquals(0, black.status(), black.err());
        assertEquals(3, black.out().lines().filter(l -> l.matches("(low|medium|high)\\s.*\\s0\\.0\\s.*")).count(),
                black.out());
        Result white = run("rate", "--reflectance", "0.80", "--emittance", "0.90");
        assertEquals(3, white.out().lines().filter(l -> l.matches("(low|medium|high)\\s.*\\s100\\.0\\s.*")).count(),
                white.out());
        assertEquals(Main.BAD_INPUT, run("rate", "--reflectance", "0.5").status());
    }

    @Test
    void materialsListsTheWholeLibraryWithSources() {
        Result r = run("materials", "--sources");
        assertEquals(0, r.status(), r.err());
        for (String id : MaterialLibrary.ids()) {
            assertTrue(r.out().contains(id), id);
        }
        assertTrue(r.out().contains("albedo:"), "sources printed");
        Result one = run("materials", "water");
        assertTrue(one.out().contains("surface heat capacity"), one.out());
    }
}
