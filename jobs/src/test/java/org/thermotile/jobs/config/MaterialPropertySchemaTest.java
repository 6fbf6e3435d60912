package org.thermotile.jobs.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.function.Supplier;
import org.junit.jupiter.api.Test;
import org.thermotile.jobs.io.MaterialsFile;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.materials.MaterialOverrides;
import org.thermotile.model.materials.MaterialProperty;
import org.thermotile.model.observe.Calibration;

/**
 * Every reader of material properties (the material record itself, {@code --set} overrides, class
 * tables in YAML and CSV, scenario {@code set}, materials files in YAML and CSV, calibration bounds)
 * takes its valid range from the one schema, {@link MaterialProperty}, and refuses a value outside it
 * with the schema's one message.
 */
class MaterialPropertySchemaTest {
    private static final Material LAYERED_ROOF = MaterialLibrary.get("roof_membrane_dark");
    private static final Material SLAB = MaterialLibrary.get("water");
    private static final Set<String> IDS = MaterialLibrary.byId().keySet();

    /** Values just outside each end of the range (1 % of the span beyond a finite bound). */
    private static List<Double> outside(MaterialProperty p) {
        double span = Double.isInfinite(p.hi()) ? 1.0 : p.hi() - p.lo();
        List<Double> out = new ArrayList<>();
        out.add(p.lo() - 0.01 * span);
        if (!Double.isInfinite(p.hi())) {
            out.add(p.hi() + 0.01 * span);
        }
        return out;
    }

    private static Material baseFor(MaterialProperty p) {
        return p == MaterialProperty.SURFACE_HEAT_CAPACITY ? SLAB : LAYERED_ROOF;
    }

    private static String error(Supplier<?> s) {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, s::get);
        return e.getMessage();
    }

    private static String text(double v) {
        return String.format(Locale.ROOT, "%.17g", v);
    }

    @Test
    void everyPropertyHasKeyUnitRangeAndSource() {
        Set<String> keys = new HashSet<>();
        for (MaterialProperty p : MaterialProperty.values()) {
            assertTrue(keys.add(p.key()), "key given twice: " + p.key());
            assertEquals(p, MaterialProperty.byKey(p.key()).orElseThrow());
            assertFalse(p.unit().isBlank(), p.key());
            assertFalse(p.source().isBlank(), p.key());
            assertTrue(p.lo() < p.hi(), p.key());
            assertNull(p.problem((p.lo() + Math.min(p.hi(), p.lo() + 2)) / 2), p.key() + ": a value inside is valid");
            for (double v : outside(p)) {
                assertNotNull(p.problem(v), p.key() + " = " + v);
                assertTrue(p.problem(v).startsWith(p.field() + " = "), p.problem(v));
            }
            assertEquals(p.loInclusive(), p.isValid(p.lo()), p.key());
            assertFalse(p.isValid(Double.NaN));
        }
        assertEquals(MaterialProperty.LAYER_THICKNESS, MaterialProperty.byKey("layers[3].thickness").orElseThrow());
    }

    @Test
    void everyBuiltInMaterialLiesInsideTheSchema() {
        for (Material m : MaterialLibrary.all()) {
            for (MaterialProperty p : MaterialProperty.values()) {
                if (p.isLayerProperty()) {
                    for (int i = 0; i < m.layers().size(); i++) {
                        assertTrue(p.isValid(p.valueIn(m, i)), m.id() + " " + p.key(i));
                    }
                } else if (!Double.isNaN(p.valueIn(m)) && !(p == MaterialProperty.BOTTOM_FILM_RESISTANCE
                        && m.bottom().kind() != org.thermotile.model.materials.BottomBoundary.Kind.INDOOR_AIR)) {
                    assertTrue(p.isValid(p.valueIn(m)), m.id() + " " + p.key() + " = " + p.valueIn(m));
                }
            }
        }
    }

    @Test
    void withChangesOnlyThatProperty() {
        for (MaterialProperty p : MaterialProperty.values()) {
            Material base = baseFor(p);
            double v = (p.lo() + Math.min(p.hi(), p.lo() + 2)) / 2;
            Material m = p.with(base, 0, v);
            assertEquals(v, p.valueIn(m, 0), 1e-9, p.key());
            for (MaterialProperty q : MaterialProperty.values()) {
                if (q != p && !(q == MaterialProperty.SURFACE_HEAT_CAPACITY && !base.isSlab())
                        && !(q.isLayerProperty() && base.isSlab())) {
                    assertEquals(q.valueIn(base, 0), q.valueIn(m, 0), 0.0, p.key() + " changed " + q.key());
                }
            }
        }
    }

    @Test
    void theMaterialRecordRefusesWithTheSchemaMessage() {
        for (MaterialProperty p : MaterialProperty.values()) {
            for (double v : outside(p)) {
                String msg = error(() -> p.with(baseFor(p), 0, v));
                assertTrue(msg.contains(p.problem(v)), p.key() + ": " + msg);
            }
        }
    }

    @Test
    void overridesRefuseWithTheSchemaMessage() {
        for (MaterialProperty p : MaterialOverrides.KEYS) {
            for (double v : outside(p)) {
                String msg = error(() -> MaterialOverrides.apply(baseFor(p), p.key(0), v, "command line"));
                assertTrue(msg.contains(p.problem(v)), p.key() + ": " + msg);
            }
        }
    }

    @Test
    void classTablesRefuseWithTheSchemaMessage() {
        for (MaterialProperty p : MaterialProperty.SURFACE) {
            for (double v : outside(p)) {
                ConfigException y = assertThrows(ConfigException.class, () -> ClassTableReader.parseYaml(
                        "name: t\nclasses:\n  - {code: 1, material: asphalt_aged, overrides: {" + p.key() + ": " + text(v)
                                + "}}\n", "t.yaml", IDS));
                assertTrue(String.join("\n", y.problems()).contains(p.problem(v)), p.key() + ": " + y.problems());
                ConfigException c = assertThrows(ConfigException.class, () -> ClassTableReader.parseCsv(
                        "code,material,label,overrides\n1,asphalt_aged,street," + p.key() + "=" + text(v) + "\n",
                        "t.csv", "t", IDS));
                assertTrue(String.join("\n", c.problems()).contains(p.problem(v)), p.key() + ": " + c.problems());
            }
        }
    }

    private static List<String> scenarioProblems(String key, double v) {
        YamlDoc doc = YamlDoc.parse("run.yaml", "scenarios:\n  - name: a\n    changes:\n"
                + "      - {targets: {codes: [1]}, set: {\"" + key + "\": " + text(v) + "}}\n");
        ScenariosReader.read(doc, doc.root.get("scenarios"), null);
        return doc.problems();
    }

    @Test
    void scenarioSetRefusesWithTheSchemaMessage() {
        for (MaterialProperty p : ScenariosReader.SET_PROPERTIES) {
            for (double v : outside(p)) {
                List<String> problems = scenarioProblems(p.key(0), v);
                assertEquals(1, problems.size(), problems.toString());
                assertTrue(problems.get(0).contains(p.problem(v)), p.key() + ": " + problems);
                assertTrue(problems.get(0).startsWith("run.yaml line 4, column "), problems.get(0));
            }
        }
    }

    @Test
    void materialsFilesRefuseWithTheSchemaMessage() {
        for (MaterialProperty p : MaterialProperty.values()) {
            for (double v : outside(p)) {
                String yaml = switch (p) {
                    case SURFACE_HEAT_CAPACITY -> "- {id: x, base: water, surface_heat_capacity: " + text(v) + "}\n";
                    case BOTTOM_TEMPERATURE_C -> "- {id: x, base: roof_membrane_dark, bottom: {temperature_c: "
                            + text(v) + "}}\n";
                    case BOTTOM_FILM_RESISTANCE -> "- {id: x, base: roof_membrane_dark, bottom: {film_resistance: "
                            + text(v) + "}}\n";
                    case LAYER_THICKNESS, LAYER_CONDUCTIVITY, LAYER_HEAT_CAPACITY -> {
                        Map<MaterialProperty, String> l = new java.util.EnumMap<>(Map.of(
                                MaterialProperty.LAYER_THICKNESS, "0.05", MaterialProperty.LAYER_CONDUCTIVITY, "0.75",
                                MaterialProperty.LAYER_HEAT_CAPACITY, "1.9e6"));
                        l.put(p, text(v));
                        yield "- {id: x, base: asphalt_aged, layers: [{name: top, thickness_m: "
                                + l.get(MaterialProperty.LAYER_THICKNESS) + ", conductivity: "
                                + l.get(MaterialProperty.LAYER_CONDUCTIVITY) + ", heat_capacity: "
                                + l.get(MaterialProperty.LAYER_HEAT_CAPACITY) + "}]}\n";
                    }
                    default -> "- {id: x, base: asphalt_aged, " + p.key() + ": " + text(v) + "}\n";
                };
                String msg = error(() -> MaterialsFile.parseYaml(yaml, "m.yaml", MaterialLibrary.byId()));
                assertTrue(msg.contains(p.problem(v)), p.key() + ": " + msg);
                assertTrue(msg.startsWith("materials file 'm.yaml', entry 1"), msg);
                String csv = switch (p) {
                    case SURFACE_HEAT_CAPACITY -> "id,base,surface_heat_capacity\nx,water," + text(v) + "\n";
                    case BOTTOM_TEMPERATURE_C -> "id,base,bottom_temperature_c\nx,roof_membrane_dark," + text(v) + "\n";
                    case BOTTOM_FILM_RESISTANCE -> "id,base,bottom_film_resistance\nx,roof_membrane_dark," + text(v) + "\n";
                    case LAYER_THICKNESS -> "id,base,layers\nx,asphalt_aged,top:" + text(v) + ":0.75:1.9e6\n";
                    case LAYER_CONDUCTIVITY -> "id,base,layers\nx,asphalt_aged,top:0.05:" + text(v) + ":1.9e6\n";
                    case LAYER_HEAT_CAPACITY -> "id,base,layers\nx,asphalt_aged,top:0.05:0.75:" + text(v) + "\n";
                    default -> "id,base," + p.key() + "\nx,asphalt_aged," + text(v) + "\n";
                };
                String cmsg = error(() -> MaterialsFile.parseCsv(csv, "m.csv", MaterialLibrary.byId()));
                assertTrue(cmsg.contains(p.problem(v)), p.key() + ": " + cmsg);
            }
        }
    }

    @Test
    void calibrationSearchesInsideTheValidRange() {
        for (MaterialProperty p : MaterialProperty.SURFACE) {
            Calibration.Parameter c = Calibration.Parameter.of(0, p.key());
            assertTrue(p.isValid(c.lo()) && p.isValid(c.hi()), p.key() + " bounds " + c.lo() + "…" + c.hi());
            assertEquals(p.hi(), c.hi(), p.key());
        }
        assertEquals(MaterialProperty.keys(MaterialProperty.SURFACE), Calibration.KEYS);
    }

    /**
     * The disagreement once seen: a class override accepted albedo 1 and emissivity 0 while a scenario
     * {@code set} refused both. Now both follow the schema: albedo 1 (the ideal reflector, a limit of
     * the definition) is accepted everywhere, emissivity 0 (no emission) refused everywhere.
     */
    @Test
    void classOverridesAndScenarioSetAgreeAtTheBounds() {
        ClassTable t = ClassTableReader.parseYaml(
                "name: t\nclasses:\n  - {code: 1, material: asphalt_aged, overrides: {albedo: 1}}\n", "t.yaml", IDS);
        assertEquals(Map.of("albedo", 1.0), t.overridesFor(1));
        assertEquals(List.of(), scenarioProblems("albedo", 1.0));
        assertEquals(1.0, MaterialOverrides.apply(LAYERED_ROOF, "albedo", 1.0, "test").albedo());

        String problem = MaterialProperty.EMISSIVITY.problem(0.0);
        ConfigException e = assertThrows(ConfigException.class, () -> ClassTableReader.parseYaml(
                "name: t\nclasses:\n  - {code: 1, material: asphalt_aged, overrides: {emissivity: 0}}\n", "t.yaml", IDS));
        assertTrue(e.problems().get(0).contains(problem), e.problems().toString());
        assertTrue(scenarioProblems("emissivity", 0.0).get(0).contains(problem));
        assertTrue(error(() -> MaterialOverrides.apply(LAYERED_ROOF, "emissivity", 0.0, "test")).contains(problem));
    }
}
