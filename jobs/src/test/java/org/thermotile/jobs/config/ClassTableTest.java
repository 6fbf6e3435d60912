package org.thermotile.jobs.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.config.ClassTable.ClassEntry;

class ClassTableTest {
    /** The material library's ids, as the project's material list names them. */
    private static final Set<String> IDS = Set.of("roof_membrane_dark", "roof_membrane_white",
            "bitumen_shingle", "clay_tile", "metal_roof_bare", "green_roof", "asphalt_fresh",
            "asphalt_aged", "concrete", "concrete_pavers", "gravel", "bare_soil_dry", "bare_soil_moist",
            "grass_irrigated", "grass_dry", "tree_canopy", "water");

    private static void assertContains(String text, String... parts) {
        for (String p : parts) {
            assertTrue(text.contains(p), () -> "'" + p + "' not in: " + text);
        }
    }

    private static String only(ConfigException e) {
        assertEquals(1, e.problems().size(), () -> "expected one problem, got " + e.problems());
        return e.problems().get(0);
    }

    // ---------------------------------------------------------------- built-in tables

    /**
     * Codes and class names of the ESA WorldCover 10 m map legend (Product User Manual; Zanaga et
     * al. 2021 for v100, 2022 for v200; the same eleven codes in both).
     */
    private static final Map<Integer, String> WORLDCOVER = legend(
            10, "Tree cover", 20, "Shrubland", 30, "Grassland", 40, "Cropland", 50, "Built-up",
            60, "Bare / sparse vegetation", 70, "Snow and ice", 80, "Permanent water bodies",
            90, "Herbaceous wetland", 95, "Mangroves", 100, "Moss and lichen");

    /** Codes and class names of the MRLC "NLCD Class Legend and Description" (conterminous US). */
    private static final Map<Integer, String> NLCD = legend(
            11, "Open Water", 12, "Perennial Ice/Snow", 21, "Developed, Open Space",
            22, "Developed, Low Intensity", 23, "Developed, Medium Intensity",
            24, "Developed, High Intensity", 31, "Barren Land (Rock/Sand/Clay)", 41, "Deciduous Forest",
            42, "Evergreen Forest", 43, "Mixed Forest", 52, "Shrub/Scrub", 71, "Grassland/Herbaceous",
            81, "Pasture/Hay", 82, "Cultivated Crops", 90, "Woody Wetlands",
            95, "Emergent Herbaceous Wetlands");

    private static Map<Integer, String> legend(Object... codeLabel) {
        Map<Integer, String> m = new LinkedHashMap<>();
        for (int i = 0; i < codeLabel.length; i += 2) {
            m.put((Integer) codeLabel[i], (String) codeLabel[i + 1]);
        }
        return m;
    }

    private static void assertCoversLegend(ClassTable t, Map<Integer, String> legend, Set<Integer> snowIce) {
        assertEquals(legend.size(), t.classes().size(), "exactly the legend's classes");
        legend.forEach((code, label) -> {
            ClassEntry e = t.entry(code).orElseThrow(() -> new AssertionError("code " + code + " missing"));
            assertTrue(e.label().equalsIgnoreCase(label), () -> code + ": label " + e.label() + " vs " + label);
            if (snowIce.contains(code)) {
                assertNull(e.material(), code + " has no material in the library");
            } else {
                assertTrue(IDS.contains(e.material()), code + " → " + e.material());
            }
        });
        assertFalse(t.hasFallback(), "built-in tables must not map a foreign raster silently");
    }

    @Test
    void worldCoverTableMapsEveryLegendClass() {
        ClassTable t = ClassTableReader.builtIn("worldcover", IDS);
        assertEquals("worldcover", t.name());
        assertCoversLegend(t, WORLDCOVER, Set.of(70));
        assertEquals("water", t.materialFor(80));
        assertEquals("tree_canopy", t.materialFor(10));
        assertEquals("tree_canopy", t.materialFor(95));
        assertNull(t.materialFor(0), "0 is the product's no-data value, not a class");
        assertContains(t.reference(), "Zanaga");
    }

    @Test
    void nlcdTableMapsEveryLegendClass() {
        ClassTable t = ClassTableReader.builtIn("nlcd", IDS);
        assertEquals("nlcd", t.name());
        assertCoversLegend(t, NLCD, Set.of(12));
        assertEquals("water", t.materialFor(11));
        for (int forest : new int[] {41, 42, 43, 90}) {
            assertEquals("tree_canopy", t.materialFor(forest));
        }
        assertContains(t.reference(), "MRLC");
    }

    @Test
    void builtInTableNeedsItsMaterialsInTheLibrary() {
        Set<String> fewer = new java.util.HashSet<>(IDS);
        fewer.remove("water");
        ClassTableException e = assertThrows(ClassTableException.class,
                () -> ClassTableReader.builtIn("worldcover", fewer));
        assertContains(only(e), "classes[7].material", "'water' is not a material in the library");
        IllegalArgumentException u = assertThrows(IllegalArgumentException.class,
                () -> ClassTableReader.builtIn("worldcovr", IDS));
        assertContains(u.getMessage(), "did you mean 'worldcover'?");
    }

    @Test
    void resolveTakesBuiltInNamesPathsAndFileUris(@TempDir Path tmp) throws Exception {
        assertEquals("nlcd", ClassTableReader.resolve("nlcd", IDS).name());
        Path f = tmp.resolve("mine.csv");
        Files.writeString(f, "1,water,pond\n");
        assertEquals("mine", ClassTableReader.resolve(f.toString(), IDS).name());
        assertEquals("mine", ClassTableReader.resolve(f.toUri().toString(), IDS).name());
        assertContains(only(assertThrows(ClassTableException.class,
                () -> ClassTableReader.resolve("hdfs://nn/t.csv", IDS))), "local files only");
    }

    // ---------------------------------------------------------------- custom tables

    @Test
    void customYamlTable(@TempDir Path tmp) throws Exception {
        Path f = tmp.resolve("riverside.yaml");
        Files.writeString(f, String.join("\n",
                "name: riverside",
                "reference: invented demo classes",
                "fallback: concrete",
                "classes:",
                "  - {code: 2, material: roof_membrane_dark, overrides: {albedo: 0.1}}",
                "  - {code: 1, material: asphalt_aged, label: \"street\"}",
                "  - {code: 9, material: null, label: snow}",
                ""));
        ClassTable t = ClassTableReader.read(f, IDS);
        assertEquals("riverside", t.name());
        assertEquals("concrete", t.fallback());
        assertEquals(List.of(1, 2, 9), t.classes().stream().map(ClassEntry::code).toList(), "sorted by code");
        assertEquals("street", t.entry(1).orElseThrow().label());
        assertEquals(Map.of("albedo", 0.1), t.overridesFor(2));
        assertEquals("roof_membrane_dark", t.materialFor(2));
        assertEquals("concrete", t.materialFor(9), "declared without material → fallback");
        assertEquals("concrete", t.materialFor(77), "unlisted → fallback");
        assertEquals(Map.of(), t.overridesFor(77));
        assertEquals(f.toAbsolutePath().toString(), t.source());
    }

    @Test
    void customCsvTable(@TempDir Path tmp) throws Exception {
        Path f = tmp.resolve("Riverside.csv");
        Files.writeString(f, String.join("\r\n",
                "# Riverside Flats survey classes (invented demo data)",
                "code,material,label,overrides",
                "1,asphalt_aged,street,",
                "2,roof_membrane_dark,\"flat roof, dark\",albedo=0.1;emissivity=0.9",
                "",
                "3,grass_irrigated,park",
                "4,,reservoir ice",
                "fallback,gravel",
                ""));
        ClassTable t = ClassTableReader.read(f, IDS);
        assertEquals("riverside", t.name(), "named after the file, lower case");
        assertEquals(4, t.classes().size());
        assertEquals("flat roof, dark", t.entry(2).orElseThrow().label());
        assertEquals(Map.of("albedo", 0.1, "emissivity", 0.9), t.overridesFor(2));
        assertEquals("grass_irrigated", t.materialFor(3));
        assertNull(t.entry(4).orElseThrow().material());
        assertEquals("gravel", t.fallback());
        assertEquals("gravel", t.materialFor(4));
    }

    @Test
    void yamlTableErrorsAreAllCollected() {
        String text = String.join("\n",
                "name: bad",
                "fallback: concret",
                "clases: []",
                "classes:",
                "  - {code: 1, material: asphalt_agd}",
                "  - {code: 1, material: concrete}",
                "  - {code: 70000, material: water}",
                "  - {code: 3, material: water, overrides: {albdo: 0.2}}",
                "  - {code: 4, material: water, overrides: {albedo: 1.5}}",
                "  - {code: 5, label: no material key}",
                "  - {code: \"6\", material: water}",
                "");
        ClassTableException e = assertThrows(ClassTableException.class,
                () -> ClassTableReader.parseYaml(text, "bad.yaml", IDS));
        List<String> ps = e.problems();
        String all = String.join("\n", ps);
        assertEquals(9, ps.size(), all);
        assertContains(all,
                "fallback: 'concret' is not a material in the library; did you mean 'concrete'?",
                "unknown key 'clases' at top level; did you mean 'classes'?",
                "classes[0].material: 'asphalt_agd' is not a material in the library; did you mean 'asphalt_aged'?",
                "classes[1].code: code 1 is given twice (first at classes[0])",
                "classes[2].code: 70000 is outside 0…65535",
                "classes[3].overrides.albdo: 'albdo' is not a property a class can override; did you mean 'albedo'?",
                "classes[4].overrides.albedo: albedo = 1.5 is outside its valid range 0 ≤ albedo ≤ 1",
                "classes[5]: required key 'material' is missing",
                "classes[6].code: expected a number, got the text '6'");
        for (String p : ps) {
            assertTrue(p.startsWith("bad.yaml line "), p);
        }
    }

    @Test
    void csvTableErrorsNameLineAndColumn() {
        String text = String.join("\n",
                "code,material,label",
                "1,asphalt_aged,street",
                "1,concrete,again",
                "x,water,pond",
                "2,roof_membrane_drak,roof",
                "3,water,pond,albedo:0.1",
                "4,water,\"open quote",
                "");
        ClassTableException e = assertThrows(ClassTableException.class,
                () -> ClassTableReader.parseCsv(text, "t.csv", "t", IDS));
        String all = String.join("\n", e.problems());
        assertEquals(5, e.problems().size(), all);
        assertContains(all,
                "t.csv line 3, column 1 (code): code 1 is given twice (first at line 2)",
                "t.csv line 4, column 1 (code): 'x' is not a whole number",
                "t.csv line 5, column 2 (material): 'roof_membrane_drak' is not a material in the library; "
                        + "did you mean 'roof_membrane_dark'?",
                "t.csv line 6, column 4 (overrides): 'albedo:0.1' is not key=value",
                "t.csv line 7: unbalanced double quote");
    }

    // ---------------------------------------------------------------- raster codes

    @Test
    void unknownCodesListEachCodeAndItsCellCount() {
        ClassTable t = ClassTableReader.builtIn("worldcover", IDS);
        Map<Integer, Long> counts = new LinkedHashMap<>();
        counts.put(50, 1200L);
        counts.put(70, 15L);
        counts.put(7, 3L);
        counts.put(10, 800L);
        counts.put(33, 0L);
        ClassTableException e = assertThrows(ClassTableException.class, () -> t.checkCodes(counts));
        assertEquals(2, e.problems().size(), e.problems()::toString);
        assertContains(e.problems().get(0), "code 7 (3 cells in the land-cover raster) is not in table "
                + "'worldcover'", "fallback");
        assertContains(e.problems().get(1), "code 70 'Snow and ice' (15 cells in the land-cover raster) "
                + "has no material in table 'worldcover'");
        assertContains(e.getMessage(), "class table worldcover (built-in, ");
        // Every code mapped: nothing falls back.
        assertEquals(Map.of(), t.checkCodes(Map.of(10, 5L, 80, 1L)));
    }

    @Test
    void rasterFromAnotherSchemeIsCalledOut() {
        ClassTable t = ClassTableReader.builtIn("worldcover", IDS);
        ClassTableException e = assertThrows(ClassTableException.class,
                () -> t.checkCodes(Map.of(21, 10L, 41, 20L)));
        assertContains(e.problems().get(e.problems().size() - 1), "none of the raster's codes has a material",
                "right table");
    }

    @Test
    void fallbackAcceptsUnknownCodesAndReportsThem() {
        ClassTable t = ClassTableReader.parseYaml("name: f\nfallback: concrete\nclasses:\n"
                + "  - {code: 1, material: asphalt_aged}\n  - {code: 2, material: null}\n", "f.yaml", IDS);
        Map<Integer, Long> fallen = t.checkCodes(Map.of(1, 10L, 2, 4L, 99, 7L));
        assertEquals(Map.of(2, 4L, 99, 7L), fallen);
        assertEquals(List.of(2, 99), List.copyOf(fallen.keySet()), "sorted by code");
    }
}
