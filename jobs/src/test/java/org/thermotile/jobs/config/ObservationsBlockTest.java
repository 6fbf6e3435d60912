package org.thermotile.jobs.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import org.junit.jupiter.api.Test;

/** The run file's {@code observations:} block: parsed like an observations file, checked with the rest. */
class ObservationsBlockTest {
    private static final Path BASE = Path.of("/data/riverside");

    private static final String HEAD = String.join("\n",
            "name: test-run",
            "inputs:",
            "  land_cover: lc.tif",
            "  classes: worldcover",
            "weather:",
            "  synthetic: {t_min_c: 20, t_max_c: 33, rel_humidity_pct: 45, wind_ms: 2, utc_offset: \"+02:00\"}",
            "period:",
            "  start: 2026-07-15",
            "  end: 2026-07-16",
            "outputs:",
            "  maps: [peak, mean]",
            "");

    private static RunFile parse(String block) {
        return RunFileReader.parse(HEAD + block, BASE, "run.yaml");
    }

    private static List<String> problems(String block) {
        return assertThrows(RunFileException.class, () -> parse(block)).problems();
    }

    @Test
    void entriesReadWithDefaultsAndPathsAgainstTheRunFile() {
        RunFile rf = parse("""
                observations:
                  - file: observed/lst-day.tif
                    time: 2026-07-15T10:30:00Z
                    scale: 0.00341802
                    offset: 149.0
                    nodata: 0
                    mask: {file: observed/qa-day.tif, keep: [1, 3]}
                  - {file: /abs/bt.tif, time: "2026-07-15T23:15:00+02:00", kind: brightness_temperature,
                     band: {k1: 774.8853, k2: 1321.0789}}
                """);
        assertEquals(2, rf.observations().size());
        RunFile.Observation a = rf.observations().get(0);
        assertEquals(BASE.resolve("observed/lst-day.tif").toString(), a.file());
        assertEquals(Instant.parse("2026-07-15T10:30:00Z"), a.time());
        assertEquals("surface_temperature", a.kind());
        assertEquals("K", a.units());
        assertEquals(0.00341802, a.scale());
        assertEquals(149.0, a.offset());
        assertEquals(0.0, a.nodata());
        assertEquals(BASE.resolve("observed/qa-day.tif").toString(), a.maskFile());
        assertEquals(List.of(1, 3), a.maskKeep());
        assertTrue(a.where().contains("line 14") && a.where().contains("observations[0].time"), a.where());
        RunFile.Observation b = rf.observations().get(1);
        assertEquals(Instant.parse("2026-07-15T21:15:00Z"), b.time());
        assertEquals("brightness_temperature", b.kind());
        assertEquals(1.0, b.scale());
        assertTrue(Double.isNaN(b.nodata()));
        assertEquals(1321.0789, b.k2());
        // The resolved form reads back to the same entries (their places in the file aside).
        RunFile again = RunFileReader.parse(rf.toYaml(), BASE, "again.yaml");
        for (int i = 0; i < 2; i++) {
            RunFile.Observation x = rf.observations().get(i);
            RunFile.Observation y = again.observations().get(i);
            assertEquals(new RunFile.Observation(x.file(), x.time(), x.kind(), x.units(), x.scale(), x.offset(),
                    x.nodata(), x.k1(), x.k2(), x.fromUm(), x.toUm(), x.maskFile(), x.maskKeep(), ""),
                    new RunFile.Observation(y.file(), y.time(), y.kind(), y.units(), y.scale(), y.offset(),
                            y.nodata(), y.k1(), y.k2(), y.fromUm(), y.toUm(), y.maskFile(), y.maskKeep(), ""));
        }
    }

    @Test
    void withoutTheBlockTheResolvedFormHasNoObservations() {
        RunFile rf = parse("");
        assertTrue(rf.observations().isEmpty());
        assertTrue(!rf.toYaml().contains("observations"), rf.toYaml());
    }

    /** Every problem of the block at once, each with its line and column and the fix. */
    @Test
    void badEntriesAreReportedTogetherWithPlaceAndFix() {
        List<String> p = problems("""
                observations:
                  - {file: a.tif}
                  - {file: b.tif, time: 2026-08-01T10:00:00Z}
                  - {file: c.tif, time: 2026-07-15T10:00:00Z, kind: surface_temprature, nodta: 0}
                  - {file: d.tif, time: 2026-07-15T10:00:00Z, mask: {file: qa.tif, keep: []}}
                  - {file: e.tif, time: 2026-07-15T10:00:00Z, kind: radiance}
                  - {file: f.tif, time: "yesterday"}
                  - {file: a.tif, time: 2026-07-15T11:00:00Z}
                """);
        String all = String.join("\n", p);
        assertEquals(8, p.size(), all);
        assertTrue(p.get(0).contains("line 13, column") && p.get(0).contains("observations[0]")
                && p.get(0).contains("'time' is missing") && p.get(0).contains("2026-07-16T10:30:00Z"), all);
        assertTrue(all.contains("observations[1].time: 2026-08-01T10:00:00Z is outside the run's counted hours "
                + "2026-07-14T22:00:00Z … 2026-07-16T21:00:00Z"), all);
        assertTrue(all.contains("observations[2].kind") && all.contains("did you mean 'surface_temperature'"), all);
        assertTrue(all.contains("observations[2].nodta") && all.contains("did you mean 'nodata'"), all);
        assertTrue(all.contains("observations[3].mask.keep") && all.contains("no pixel would be kept"), all);
        assertTrue(all.contains("observations[4]") && all.contains("needs the sensor band"), all);
        assertTrue(all.contains("observations[5].time: 'yesterday' is not an ISO-8601 time"), all);
        assertTrue(all.contains("observations[6].file") && all.contains("distinct file names"), all);
    }

    @Test
    void notTogetherWithAWeatherAxis() {
        String text = HEAD.replace("period:\n  start: 2026-07-15\n  end: 2026-07-16\n", "") + """
                sweep:
                  periods:
                    - {name: a, start: 2026-07-15, end: 2026-07-15}
                observations:
                  - {file: a.tif, time: 2026-07-15T10:00:00Z}
                """;
        List<String> p = assertThrows(RunFileException.class, () -> RunFileReader.parse(text, BASE, "run.yaml"))
                .problems();
        assertTrue(String.join("\n", p).contains("together with sweep.periods"), String.join("\n", p));
    }
}
