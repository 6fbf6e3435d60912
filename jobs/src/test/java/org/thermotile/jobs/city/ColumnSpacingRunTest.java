package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.model.balance.ColumnSpacing;

/**
 * {@code physics.column_spacing} reaches the tile settings of every prepared run (one period with
 * scenarios, and each period of a weather sweep), the manifest's resolved run file, and the
 * partition keys, so a resumed run never keeps results of the other spacing. No Spark: all of this
 * is decided while the run is prepared.
 */
class ColumnSpacingRunTest {
    @TempDir
    Path dir;

    static final String SCENARIO = """
            scenarios:
              - name: cool-dark-roofs
                changes:
                  - {targets: {codes: [2]}, set: {albedo: 0.75}}
            """;

    /** The test city's run file with {@code extra} appended, written beside it as {@code name}. */
    private Path variant(Path runFile, String name, String extra) throws Exception {
        Path f = runFile.resolveSibling(name);
        Files.writeString(f, Files.readString(runFile) + extra);
        return f;
    }

    @Test
    void onePeriodWithAScenarioGetsTheSpacingAndItsKeysChange() throws Exception {
        Path base = CityFixture.write(dir, 256, "");
        PreparedRun standard = RunPreparer.prepare(RunFileReader.read(variant(base, "standard.yaml", SCENARIO)));
        PreparedRun coarse = RunPreparer.prepare(RunFileReader.read(variant(base, "coarse.yaml",
                SCENARIO + "physics: {column_spacing: coarse}\n")));

        assertEquals(ColumnSpacing.STANDARD, standard.spec().settings().columnSpacing());
        assertEquals(ColumnSpacing.COARSE, coarse.spec().settings().columnSpacing());
        // The scenarios run on the same spec (TileTask takes its settings), so they run coarse too.
        assertEquals(2, coarse.plan().variants().size(), "baseline and one scenario");

        assertFalse(Manifest.resolvedRunFile(standard).get("physics").has("column_spacing"));
        assertEquals("coarse", Manifest.resolvedRunFile(coarse).get("physics").get("column_spacing").asText());

        Map<String, String> ks = Partitions.keys(standard), kc = Partitions.keys(coarse);
        assertEquals(ks.keySet(), kc.keySet());
        for (String v : ks.keySet()) {
            assertNotEquals(ks.get(v), kc.get(v), v + ": a coarse run must not reuse a standard partition");
        }
    }

    @Test
    void everyPeriodOfAWeatherSweepGetsTheSpacing() throws Exception {
        Path in = dir.resolve("in");
        PeriodSweepTest.writeInputs(in);
        Path rf = in.resolve("coarse-sweep.yaml");
        Files.writeString(rf, PeriodSweepTest.runFile("weather.csv", PeriodSweepTest.PERIODS)
                + "physics: {column_spacing: coarse}\n");
        List<PreparedRun> periods = RunPreparer.prepareAll(RunFileReader.read(rf), false);
        assertEquals(3, periods.size());
        for (PreparedRun p : periods) {
            assertEquals(ColumnSpacing.COARSE, p.spec().settings().columnSpacing(), p.period());
        }
        assertTrue(Manifest.resolvedRunFile(periods.get(2)).get("physics").has("column_spacing"));
    }
}
