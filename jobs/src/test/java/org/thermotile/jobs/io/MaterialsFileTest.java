package org.thermotile.jobs.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.model.materials.BottomBoundary;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;

class MaterialsFileTest {

    private static final String GOOD_YAML = """
            # demo materials for an invented city (invented data)
            - id: cool_asphalt
              name: asphalt with reflective seal coat
              base: asphalt_aged
              albedo: 0.33
              source: "demo seal-coat data sheet"

            - id: timber_deck
              name: timber deck over air
              albedo: 0.25
              emissivity: 0.90
              layers:
                - {name: timber boards, thickness_m: 0.03, conductivity: 0.15, heat_capacity: 1.2e6}
                - {name: joists and air, thickness_m: 0.20, conductivity: 0.30, heat_capacity: 5.0e4}
              bottom: {kind: deep_ground}

            - id: deep_pond
              base: water
              surface_heat_capacity: 8.36e6
              bottom: {kind: deep_ground, temperature_c: 12}

            - id: cool_asphalt_wet
              base: cool_asphalt
              moisture_availability: 0.2

            - id: roof_membrane_white
              base: roof_membrane_white
              albedo: 0.65
              source: "3-year aged value, demo"
            """;

    private static List<Material> yaml(String text) {
        return MaterialsFile.parseYaml(text, "city.yaml", MaterialLibrary.byId());
    }

    private static String yamlError(String text) {
        return assertThrows(IllegalArgumentException.class, () -> yaml(text)).getMessage();
    }

    private static String csvError(String text) {
        return assertThrows(IllegalArgumentException.class,
                () -> MaterialsFile.parseCsv(text, "city.csv", MaterialLibrary.byId())).getMessage();
    }

    private static void assertContains(String message, String... parts) {
        for (String p : parts) {
            assertTrue(message.contains(p), "expected '" + p + "' in: " + message);
        }
    }

    @Test
    void yamlHappyPath() {
        List<Material> ms = yaml(GOOD_YAML);
        assertEquals(List.of("cool_asphalt", "timber_deck", "deep_pond", "cool_asphalt_wet", "roof_membrane_white"),
                ms.stream().map(Material::id).toList());

        Material cool = ms.get(0);
        Material aged = MaterialLibrary.get("asphalt_aged");
        assertEquals(0.33, cool.albedo());
        assertEquals(aged.emissivity(), cool.emissivity());
        assertEquals(aged.layers(), cool.layers());
        assertEquals(aged.anthropogenicHeatWm2(), cool.anthropogenicHeatWm2());
        assertEquals("demo seal-coat data sheet (city.yaml, entry 'cool_asphalt')", cool.sources().get("albedo"));
        assertEquals(aged.sources().get("emissivity"), cool.sources().get("emissivity"));

        Material deck = ms.get(1);
        assertEquals(2, deck.layers().size());
        assertEquals(1.2e6, deck.layers().get(0).volumetricHeatCapacityJm3K());
        assertEquals(0.03 * 1.2e6, deck.surfaceHeatCapacityJm2K(), 1e-6);
        assertEquals(BottomBoundary.Kind.DEEP_GROUND, deck.bottom().kind());
        assertEquals(0.0, deck.moistureAvailability());
        assertTrue(deck.sources().get("moisture_availability").startsWith("default 0"));
        assertTrue(deck.sources().get("layers[1]").contains("no source stated"));

        Material pond = ms.get(2);
        assertTrue(pond.isSlab());
        assertEquals(8.36e6, pond.surfaceHeatCapacityJm2K());
        assertEquals(285.15, pond.bottom().temperatureK(), 1e-9);
        assertEquals(1.0, pond.moistureAvailability());

        Material wet = ms.get(3);
        assertEquals(0.33, wet.albedo(), "an earlier entry can be a base");
        assertEquals(0.2, wet.moistureAvailability());
    }

    @Test
    void mergeReplacesInPlaceAndAppends() {
        Map<String, Material> merged = MaterialsFile.mergeWithLibrary(yaml(GOOD_YAML));
        List<String> ids = List.copyOf(merged.keySet());
        assertEquals(MaterialLibrary.ids(), ids.subList(0, MaterialLibrary.ids().size()));
        assertEquals(List.of("cool_asphalt", "timber_deck", "deep_pond", "cool_asphalt_wet"),
                ids.subList(MaterialLibrary.ids().size(), ids.size()));
        assertEquals(0.65, merged.get("roof_membrane_white").albedo());
        assertEquals(0.83, MaterialLibrary.get("roof_membrane_white").albedo(), "library itself unchanged");
        var e = assertThrows(IllegalArgumentException.class, () -> MaterialLibrary.get("timber_dek", merged));
        assertContains(e.getMessage(), "Did you mean 'timber_deck'?");
    }

    @Test
    void csvHappyPath() {
        String csv = """
                # demo data, invented city
                id,base,albedo,emissivity,layers,bottom_kind,bottom_temperature_c,bottom_film_resistance,source
                cool_roof,roof_membrane_dark,0.70,,,,,,"coating sheet, demo"
                shed_roof,,0.40,0.88,"sheet:0.0007:53.3:3.93e6 | boards:0.02:0.19:1.52e6",indoor_air,26,0.10,
                """;
        List<Material> ms = MaterialsFile.parseCsv(csv, "city.csv", MaterialLibrary.byId());
        assertEquals(2, ms.size());
        assertEquals(0.70, ms.get(0).albedo());
        assertEquals(0.86, ms.get(0).emissivity());
        assertEquals("coating sheet, demo (city.csv, entry 'cool_roof')", ms.get(0).sources().get("albedo"));
        Material shed = ms.get(1);
        assertEquals(2, shed.layers().size());
        assertEquals("boards", shed.layers().get(1).name());
        assertEquals(53.3, shed.layers().get(0).conductivityWmK());
        assertEquals(BottomBoundary.Kind.INDOOR_AIR, shed.bottom().kind());
        assertEquals(299.15, shed.bottom().temperatureK(), 1e-9);
        assertEquals(0.10, shed.bottom().filmResistanceM2KW());
    }

    @Test
    void readsByExtension(@TempDir Path dir) throws Exception {
        Path y = dir.resolve("m.yml");
        Files.writeString(y, GOOD_YAML);
        assertEquals(5, MaterialsFile.read(y).size());
        Path c = dir.resolve("m.CSV");
        Files.writeString(c, "id,base\nmy_grass,grass_dry\n");
        assertEquals("my_grass", MaterialsFile.read(c).get(0).id());
        Path t = dir.resolve("m.txt");
        Files.writeString(t, "x");
        assertContains(assertThrows(IllegalArgumentException.class, () -> MaterialsFile.read(t)).getMessage(),
                "m.txt", "name it .yaml, .yml or .csv");
        Path missing = dir.resolve("none.yaml");
        assertContains(assertThrows(IllegalArgumentException.class, () -> MaterialsFile.read(missing)).getMessage(),
                "none.yaml", "cannot be read", "check the path");
    }

    @Test
    void unknownKeysAreNamedWithSuggestion() {
        String msg = yamlError("- id: a\n  base: concrete\n  albdo: 0.3\n");
        assertContains(msg, "materials file 'city.yaml', entry 1 (line 1, id 'a')", "key 'albdo'",
                "Did you mean 'albedo'?", "Valid keys: id, name, base");
        msg = yamlError("- id: a\n  base: concrete\n  layers:\n    - {name: x, thickness: 0.1, conductivity: 1, heat_capacity: 2e6}\n");
        assertContains(msg, "key 'layers[0].thickness'", "Did you mean 'thickness_m'?", "Valid keys of 'layers[0]'");
        msg = yamlError("- id: a\n  base: concrete\n  bottom: {kind: deep_ground, temp_c: 10}\n");
        assertContains(msg, "key 'bottom.temp_c'", "Did you mean 'temperature_c'?");
    }

    @Test
    void idErrors() {
        assertContains(yamlError("- name: nameless\n  base: concrete\n"), "entry 1 (line 1)", "key 'id': missing");
        assertContains(yamlError("- id: Cool Roof\n  base: concrete\n"), "'Cool Roof' is not a valid id",
                "lower case letters");
        assertContains(yamlError("- id: a\n  base: concrete\n- id: a\n  base: gravel\n"),
                "entry 2 (line 3, id 'a')", "already used by entry 1 (line 1)");
    }

    @Test
    void baseErrors() {
        assertContains(yamlError("- id: a\n  base: asphalt_agd\n"), "key 'base'", "unknown material 'asphalt_agd'",
                "Did you mean 'asphalt_aged'?", "known: roof_membrane_dark");
    }

    @Test
    void valueErrors() {
        assertContains(yamlError("- id: a\n  base: concrete\n  albedo: high\n"), "key 'albedo'",
                "'high' is not a number", "no units");
        assertContains(yamlError("- id: a\n  base: concrete\n  albedo: 1.4\n"), "entry 1 (line 1, id 'a')",
                "albedo = 1.4 is outside its valid range 0 ≤ albedo ≤ 1", "fix the value");
        assertContains(yamlError("- id: a\n  base: concrete\n  albedo: [1, 2]\n"), "key 'albedo'", "expected a number");
        assertContains(yamlError("- id: a\n  base: concrete\n  layers:\n    - {thickness_m: -1, conductivity: 1, heat_capacity: 2e6}\n"),
                "key 'layers[0].thickness_m'", "thickness = -1 is outside its valid range 0 < thickness < 20 m");
        assertContains(yamlError("- id: a\n  base: concrete\n  layers:\n    - {thickness_m: 0.1, heat_capacity: 2e6}\n"),
                "key 'layers[0].conductivity': missing", "W/(m K)");
    }

    @Test
    void completenessErrorsWithoutBase() {
        assertContains(yamlError("- id: a\n  emissivity: 0.9\n  surface_heat_capacity: 1e5\n  bottom: {kind: adiabatic}\n"),
                "key 'albedo': missing", "base: <id>");
        assertContains(yamlError("- id: a\n  albedo: 0.2\n  emissivity: 0.9\n  bottom: {kind: adiabatic}\n"),
                "missing 'layers'", "surface_heat_capacity");
        assertContains(yamlError("- id: a\n  albedo: 0.2\n  emissivity: 0.9\n  surface_heat_capacity: 1e5\n"),
                "key 'bottom': missing", "kind: deep_ground");
        assertContains(yamlError("- id: a\n  base: water\n  surface_heat_capacity: 1e5\n  layers:\n    - {thickness_m: 0.1, conductivity: 1, heat_capacity: 2e6}\n"),
                "either 'layers' or 'surface_heat_capacity'");
        assertContains(yamlError("- id: a\n  base: concrete\n  layers: []\n"), "non-empty list of layers");
    }

    @Test
    void bottomErrors() {
        assertContains(yamlError("- id: a\n  base: concrete\n  bottom: {kind: deep_grond}\n"),
                "key 'bottom'.kind", "Did you mean 'deep_ground'?", "deep_ground, indoor_air, adiabatic");
        assertContains(yamlError("- id: a\n  base: concrete\n  bottom: {kind: indoor_air, temperature_c: 24}\n"),
                "film resistance", "add film_resistance, e.g. 0.17");
        assertContains(yamlError("- id: a\n  base: water\n  bottom: {temperature_c: 10}\n"),
                "adiabatic bottom has no temperature");
        assertContains(yamlError("- id: a\n  base: concrete\n  bottom: {temperature_c: 95}\n"),
                "bottom_temperature_c = 95 is outside its valid range");
    }

    @Test
    void yamlShapeAndSyntaxErrors() {
        assertContains(yamlError(""), "city.yaml", "is empty");
        assertContains(yamlError("id: a\nbase: concrete\n"), "line 1", "top level must be a YAML list", "mapping");
        assertContains(yamlError("- id: a\n  base: concrete\n  albedo: [0.3\n"), "not valid YAML", "line ", "column ");
        assertContains(yamlError("- id: a\n  base: concrete\n  albedo: 0.3\n  albedo: 0.4\n"), "not valid YAML",
                "albedo");
        assertContains(yamlError("- just a string\n"), "entry 1 (line 1)", "must be a mapping");
    }

    @Test
    void csvErrors() {
        assertContains(csvError("id,albdo\na,0.3\n"), "city.csv", "line 1", "unknown column 'albdo'",
                "Did you mean 'albedo'?");
        assertContains(csvError("base,albedo\nconcrete,0.3\n"), "no 'id' column");
        assertContains(csvError("id,base,albedo\na,concrete\n"), "line 2", "2 cells but the header (line 1) has 3");
        assertContains(csvError("id,base,layers\na,concrete,x:0.1:1\n"), "line 2", "column 'layers', layer 1",
                "name:thickness_m:conductivity:heat_capacity");
        assertContains(csvError("id,base,name\na,concrete,\"open\n"), "line 2", "quoted cell is not closed");
        assertContains(csvError("id,base,albedo\na,concrete,0.3\nb,concrete,x\n"), "entry 2 (line 3, id 'b')",
                "key 'albedo'", "'x' is not a number");
        assertContains(csvError("id,id\na,b\n"), "column 'id' appears twice");
        assertContains(csvError("# only a comment\n"), "is empty");
    }
}
