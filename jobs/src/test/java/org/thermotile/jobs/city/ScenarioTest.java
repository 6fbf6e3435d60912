package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.util.Arrays;
import java.util.List;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.config.RunFileException;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.rating.SolarReflectanceIndex;

/** Scenarios on the small test city: adoption, exactness, physical response, cost, comparison. */
class ScenarioTest {
    static SparkSession spark;
    @TempDir
    static Path dir;
    static Path out;
    static final double DARK_ALBEDO = MaterialLibrary.get("roof_membrane_dark").albedo();

    static String scenarios(int tileSize) {
        return """
                scenarios:
                  - name: zero-adoption
                    changes:
                      - {targets: {codes: [2]}, adoption: 0, set: {albedo: 0.9}}
                  - name: same-values
                    changes:
                      - {targets: {materials: [roof_membrane_dark]}, set: {albedo: %s}}
                  - name: cool-dark-roofs
                    changes:
                      - {targets: {codes: [2]}, set: {albedo: 0.75}, cost_per_m2: 25}
                  - name: partial
                    changes:
                      - {targets: {codes: [1, 2, 3, 4]}, adoption: 0.3, seed: 5, set: {albedo: 0.5}}
                  - name: west-only
                    changes:
                      - {targets: {codes: [1], districts: [West]}, set: {albedo: 0.4}, cost_per_m2: 8}
                """.formatted(DARK_ALBEDO);
    }

    static Path runWith(String name, int tileSize) throws Exception {
        Path in = dir.resolve("in-" + name);
        Path rf = CityFixture.write(in, tileSize, "");
        Files.writeString(rf, Files.readString(rf) + scenarios(tileSize));
        Path o = dir.resolve(name);
        CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(rf)), new CityJob.Options(o, null, false, true, 0),
                new PrintStream(new ByteArrayOutputStream()));
        return o;
    }

    @BeforeAll
    static void runOnce() throws Exception {
        spark = SparkSessions.get(null, 2);
        out = runWith("s256", 256);
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    static long count(String sql) {
        return spark.sql(sql).first().getLong(0);
    }

    static void view() {
        spark.read().parquet(out.resolve("tables/cells").toString()).createOrReplaceTempView("c");
    }

    /** Adoption 0, or a change that sets the values a material already has, equals the baseline exactly. */
    @Test
    void zeroAdoptionAndUnchangedValuesEqualTheBaselineExactly() {
        view();
        for (String s : List.of("zero-adoption", "same-values")) {
            long differ = count("select count(*) from c b join c s using (col, row) where b.scenario = 'baseline'"
                    + " and s.scenario = '" + s + "' and (b.peak_c <> s.peak_c or b.mean_c <> s.mean_c"
                    + " or b.degree_hours_k_h <> s.degree_hours_k_h or b.night_min_c <> s.night_min_c)");
            assertEquals(0, differ, s);
            assertEquals(count("select count(*) from c where scenario = 'baseline'"),
                    count("select count(*) from c where scenario = '" + s + "'"), s);
        }
    }

    /** The treated fraction is within ±1 % of the requested adoption over ≥ 10,000 candidate cells. */
    @Test
    void treatedFractionMatchesTheAdoption() {
        view();
        long candidates = count("select count(*) from c where scenario = 'baseline' and land_cover in (1, 2, 3, 4)");
        long treated = count("select count(*) from c where scenario = 'partial' and material like '%(treated)'");
        assertTrue(candidates >= 10_000, "candidates " + candidates);
        assertEquals(0.3, (double) treated / candidates, 0.01);
    }

    /** The same seed treats the same cells on tile sizes 64 and 256. */
    @Test
    void sameCellsAreTreatedOnAnyTileSize() throws Exception {
        Path o64 = runWith("s64", 64);
        var a = spark.read().parquet(out.resolve("tables/cells").toString())
                .where("material like '%(treated)'").select("scenario", "col", "row");
        var b = spark.read().parquet(o64.resolve("tables/cells").toString())
                .where("material like '%(treated)'").select("scenario", "col", "row");
        assertEquals(0, a.exceptAll(b).count());
        assertEquals(0, b.exceptAll(a).count());
        assertTrue(a.count() > 1000);
        for (String m : List.of("peak", "delta_peak")) {
            Path f = Path.of("scenarios", "partial", "maps", m + ".tif");
            assertTrue(Arrays.equals(Files.readAllBytes(out.resolve(f)), Files.readAllBytes(o64.resolve(f))), m);
        }
    }

    /** Per treated cell a higher roof albedo never raises the peak; untreated cells are unchanged. */
    @Test
    void higherRoofAlbedoNeverRaisesThePeakAndUntreatedCellsAreUnchanged() {
        view();
        assertEquals(0, count("select count(*) from c b join c s using (col, row) where b.scenario = 'baseline'"
                + " and s.scenario = 'cool-dark-roofs' and s.material like '%(treated)' and s.peak_c > b.peak_c"));
        assertTrue(count("select count(*) from c where scenario = 'cool-dark-roofs' and material like '%(treated)'") > 0);
        assertEquals(0, count("select count(*) from c b join c s using (col, row) where b.scenario = 'baseline'"
                + " and s.scenario = 'cool-dark-roofs' and s.material not like '%(treated)' and s.peak_c <> b.peak_c"));
    }

    /**
     * The peak reduction of fully treated dark roofs (albedo 0.06 → 0.75) agrees in sign and size
     * with the ASTM E1980 steady state for the same change at medium wind (h_c = 12): the steady
     * state (1000 W/m², no storage) is an upper bound that the simulated roof approaches but does
     * not reach, since its noon sun is weaker than 1000 W/m² and its deck stores heat; we require
     * 40–100 % of it.
     */
    @Test
    void coolRoofPeakReductionAgreesWithTheSteadyStateBalance() {
        view();
        double sim = spark.sql("select avg(b.peak_c - s.peak_c) from c b join c s using (col, row)"
                + " where b.scenario = 'baseline' and s.scenario = 'cool-dark-roofs' and s.material like '%(treated)'")
                .first().getDouble(0);
        double eps = MaterialLibrary.get("roof_membrane_dark").emissivity();
        double steady = SolarReflectanceIndex.steadyStateTempK(1 - DARK_ALBEDO, eps, 12)
                - SolarReflectanceIndex.steadyStateTempK(1 - 0.75, eps, 12);
        assertTrue(sim > 0.4 * steady && sim < steady, "simulated " + sim + " K vs steady state " + steady + " K");
    }

    /**
     * Cost, worked by hand: every dark-roof cell (code 2) is treated; each is 5 m × 5 m = 25 m² at 25 per m², so
     * cost = n × 25 × 25 = 625·n; and cost per degree-hour avoided = cost / Σ ΔDH·25 m².
     */
    @Test
    void costArithmeticFollowsTheWorkedExample() throws Exception {
        long n = Arrays.stream(CityFixture.codes()).filter(c -> c == 2).count();
        Row all = spark.read().parquet(out.resolve("comparison/districts.parquet").toString())
                .where("scenario = 'cool-dark-roofs' and district = '(all)'").first();
        assertEquals(625.0 * n, all.<Double>getAs("cost"), 1e-6);
        assertEquals(25.0 * n, all.<Double>getAs("treated_area_m2"), 1e-9);
        view();
        double dh = spark.sql("select sum(b.degree_hours_k_h - s.degree_hours_k_h) * 25 from c b join c s using (col, row)"
                + " where b.scenario = 'baseline' and s.scenario = 'cool-dark-roofs'").first().getDouble(0);
        assertEquals(625.0 * n / dh, all.<Double>getAs("cost_per_k_h_m2"), 1e-9 * (625.0 * n / dh));
        // West-only street treatment: cost only in West.
        Row west = spark.read().parquet(out.resolve("comparison/districts.parquet").toString())
                .where("scenario = 'west-only' and district = 'East'").first();
        assertEquals(0.0, west.<Double>getAs("treated_area_m2"));
        assertEquals(0.0, west.<Double>getAs("cost"));
    }

    /** The comparison folder has its tables and summary, and the ranking lists every scenario once per district. */
    @Test
    void comparisonRanksEveryScenario() throws Exception {
        for (String f : List.of("comparison/districts.csv", "comparison/ranking.csv", "comparison/summary.md",
                "scenarios/cool-dark-roofs/maps/delta_peak.tif", "scenarios/cool-dark-roofs/maps/delta_degree_hours.tif")) {
            assertTrue(Files.exists(out.resolve(f)), f);
        }
        Class.forName("org.duckdb.DuckDBDriver");
        try (Connection c = DriverManager.getConnection("jdbc:duckdb:"); Statement st = c.createStatement();
                ResultSet rs = st.executeQuery("select district, count(*), count(distinct scenario), min(rank), max(rank)"
                        + " from read_parquet('" + out.resolve("comparison/ranking.parquet") + "/*.parquet') group by district")) {
            int districts = 0;
            while (rs.next()) {
                districts++;
                assertEquals(5, rs.getLong(2));
                assertEquals(5, rs.getLong(3));
                assertEquals(1, rs.getInt(4));
                assertEquals(5, rs.getInt(5));
            }
            assertEquals(4, districts, "(all), West, East and outside districts");
        }
        assertTrue(Files.readString(out.resolve("comparison/summary.md")).contains("| 1 | "));
    }

    /**
     * A resumed run gives the same bytes as a run from scratch and recomputes only the deleted
     * partition (the manifest says which it kept; the timing block aside, manifests are equal).
     */
    @Test
    void resumeRecomputesOnlyTheMissingPartitionAndGivesTheSameBytes() throws Exception {
        Path copy = dir.resolve("resumed");
        copyTree(out, copy);
        org.thermotile.jobs.storage.Folders.deleteTree(copy.resolve("scenarios/partial"));
        org.thermotile.jobs.storage.Folders.deleteTree(copy.resolve("tables/cells/scenario=partial"));
        Path rf = dir.resolve("in-s256/run.yaml");
        CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(rf)),
                new CityJob.Options(copy, null, false, true, 0, true), new PrintStream(new ByteArrayOutputStream()));
        List<String> files = DeterminismTest.tree(out);
        assertEquals(files, DeterminismTest.tree(copy));
        for (String f : files) {
            if (f.equals("manifest.json")) {
                assertEquals(DeterminismTest.withoutTiming(out.resolve(f)), DeterminismTest.withoutTiming(copy.resolve(f)));
            } else {
                assertTrue(Arrays.equals(Files.readAllBytes(out.resolve(f)), Files.readAllBytes(copy.resolve(f))), f);
            }
        }
        var timing = new com.fasterxml.jackson.databind.ObjectMapper().readTree(copy.resolve("manifest.json").toFile())
                .path("timing");
        assertEquals(List.of("baseline", "zero-adoption", "same-values", "cool-dark-roofs", "west-only"),
                java.util.stream.StreamSupport.stream(timing.path("resumed_partitions").spliterator(), false)
                        .map(com.fasterxml.jackson.databind.JsonNode::asText).toList());
        long perVariant = RunPreparer.prepare(RunFileReader.read(rf)).cellHours();
        assertEquals(perVariant, timing.path("computed_cell_hours").asLong());
        // The one variant computed in the resumed run is the pass's reference: all its cells stepped.
        assertEquals(perVariant, timing.path("stepped_cell_hours").asLong());
        // The full run stepped the baseline whole and each programme's changed cells only (zero
        // adoption and the same values change none), so fewer cell-hours than its outputs cover.
        var full = new com.fasterxml.jackson.databind.ObjectMapper().readTree(out.resolve("manifest.json").toFile())
                .path("timing");
        long stepped = full.path("stepped_cell_hours").asLong();
        assertTrue(stepped > perVariant && stepped < 2 * perVariant,
                stepped + " stepped of " + full.path("computed_cell_hours").asLong());
        assertTrue(full.path("tile_pass_seconds").asDouble() > 0, "the tile passes' time is recorded");
    }

    static void copyTree(Path from, Path to) throws Exception {
        try (var s = Files.walk(from)) {
            for (Path f : s.toList()) {
                Path t = to.resolve(from.relativize(f).toString());
                if (Files.isDirectory(f)) {
                    Files.createDirectories(t);
                } else {
                    Files.copy(f, t);
                }
            }
        }
    }

    // ---- bad inputs

    static Exception prepareFails(String scenarioYaml) throws Exception {
        Path in = dir.resolve("bad-" + Math.abs(scenarioYaml.hashCode()));
        Path rf = CityFixture.write(in, 256, "");
        Files.writeString(rf, Files.readString(rf) + scenarioYaml);
        return assertThrows(RuntimeException.class, () -> RunPreparer.prepare(RunFileReader.read(rf)));
    }

    @Test
    void unknownDistrictListsTheAvailableNames() throws Exception {
        Exception e = prepareFails("scenarios:\n  - name: x\n    changes:\n      - {targets: {codes: [1], districts: [North]}, set: {albedo: 0.3}}\n");
        assertTrue(e instanceof UserInputException && e.getMessage().contains("North")
                && e.getMessage().contains("West, East"), e.getMessage());
    }

    @Test
    void impossibleValuesAndDuplicatesAreRefusedTogether() throws Exception {
        Exception e = prepareFails("""
                scenarios:
                  - name: a
                    changes:
                      - {targets: {codes: [1]}, adoption: 1.5, set: {albedo: 1.2}}
                  - name: a
                    changes:
                      - {targets: {codes: [2]}, set: {emissivity: 0}}
                """);
        assertTrue(e instanceof RunFileException, e.toString());
        String m = e.getMessage();
        assertTrue(m.contains("adoption 1.5"), m);
        assertTrue(m.contains("albedo = 1.2 is outside its valid range"), m);
        assertTrue(m.contains("emissivity = 0 is outside its valid range"), m);
        assertTrue(m.contains("'a' is used twice"), m);
    }

    /**
     * A sweep of nine variants on one 256-cell tile on 2 cores runs as two groups of a tile's
     * variants (CityJob.variantGroups), the 64-cell tiling of the same city as one pass per tile:
     * every variant's maps are the same bytes and its cells the same rows.
     */
    @Test
    void aSweepSplitOverTasksOfOneTileGivesTheBytesOfOnePass() throws Exception {
        String sweep = """
                sweep:
                  name: grid
                  change: {targets: {codes: [2]}, set: {albedo: 0.6}}
                  axes:
                    albedo: [0.3, 0.45, 0.6, 0.75]
                    adoption: [0.5, 1.0]
                """;
        Path[] outs = new Path[2];
        int[] sizes = {256, 64};
        for (int i = 0; i < 2; i++) {
            Path in = dir.resolve("sweep-groups-" + sizes[i]);
            Path rf = CityFixture.write(in, sizes[i], "");
            Files.writeString(rf, Files.readString(rf) + sweep);
            PreparedRun p = RunPreparer.prepare(RunFileReader.read(rf));
            assertEquals(9, p.plan().variants().size());
            outs[i] = dir.resolve("sweep-groups-out-" + sizes[i]);
            CityJob.run(spark, p, new CityJob.Options(outs[i], null, false, true, 0),
                    new PrintStream(new ByteArrayOutputStream()));
            if (i == 0) {
                assertEquals(2, CityJob.variantGroups(p.plan().variants().stream().map(ScenarioVariant::name).toList(),
                        p.tiles().size(), spark.sparkContext().defaultParallelism()).size(), "two groups of one tile");
            }
        }
        List<String> maps = DeterminismTest.tree(outs[0]).stream().filter(f -> f.endsWith(".tif")).toList();
        assertTrue(maps.size() >= 9 * 5, maps.toString());
        for (String f : maps) {
            assertTrue(Arrays.equals(Files.readAllBytes(outs[0].resolve(f)), Files.readAllBytes(outs[1].resolve(f))), f);
        }
        var a = spark.read().parquet(outs[0].resolve("tables/cells").toString());
        var b = spark.read().parquet(outs[1].resolve("tables/cells").toString());
        assertEquals(0, a.exceptAll(b).count());
        assertEquals(0, b.exceptAll(a).count());
        assertTrue(a.count() > 9 * 10_000);
    }

    @Test
    void aSweepLargerThanItsMaximumNeedsConfirmation() throws Exception {
        String sweep = """
                sweep:
                  name: grid
                  max_scenarios: 3
                  change: {targets: {codes: [2]}, set: {albedo: 0.6}}
                  axes:
                    albedo: [0.5, 0.6]
                    adoption: [0.5, 1.0]
                """;
        Exception e = prepareFails(sweep);
        assertTrue(e.getMessage().contains("4 scenarios") && e.getMessage().contains("--confirm-sweep"), e.getMessage());
        Path in = dir.resolve("sweep-ok");
        Path rf = CityFixture.write(in, 256, "");
        Files.writeString(rf, Files.readString(rf) + sweep);
        PreparedRun p = RunPreparer.prepare(RunFileReader.read(rf), true);
        assertEquals(List.of("baseline", "grid-albedo0.5-adoption0.5", "grid-albedo0.5-adoption1",
                "grid-albedo0.6-adoption0.5", "grid-albedo0.6-adoption1"),
                p.plan().variants().stream().map(ScenarioVariant::name).toList());
    }

    /**
     * A run folder written before the columns carried their units (its cells table still has
     * degree_hours): the comparison stops naming the table, the old and the new name and the fix,
     * not with Spark's unresolved-column error.
     */
    @Test
    void comparisonOfAnOlderRunFolderSaysToRunAgain() throws Exception {
        Path old = dir.resolve("older-layout");
        Files.createDirectories(old);
        Files.copy(out.resolve("manifest.json"), old.resolve("manifest.json"));
        spark.read().parquet(out.resolve("tables/cells").toString())
                .withColumnRenamed(org.thermotile.jobs.config.RunFile.MapKind.DEGREE_HOURS.column(), "degree_hours")
                .write().partitionBy("scenario").parquet(old.resolve("tables/cells").toString());
        var e = assertThrows(UserInputException.class, () -> Comparison.write(spark, old));
        assertTrue(e.getMessage().startsWith(old.resolve("tables/cells") + ": column 'degree_hours' is named "
                + "'degree_hours_k_h'"), e.getMessage());
        assertTrue(e.getMessage().contains("Fix: run the run file again"), e.getMessage());
        assertTrue(!Files.exists(old.resolve("comparison")), "nothing written");
    }
}
