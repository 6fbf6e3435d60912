package org.thermotile.jobs.config;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.thermotile.model.materials.MaterialProperty;

/**
 * Reads the run file's {@code scenarios:} list and {@code sweep:} block into {@link Scenario}s,
 * collecting every problem with its key path.
 *
 * <pre>
 * scenarios:
 *   - name: cool-roofs-50
 *     changes:
 *       - targets: {materials: [roof_membrane_dark, bitumen_shingle], districts: [Old Quay], roofs_only: true}
 *         adoption: 0.5          # fraction of candidate area, default 1
 *         seed: 1                # default 1
 *         material: roof_membrane_white   # optional switch
 *         set: {albedo: 0.75}    # optional property changes
 *         aged_albedo: 0.6       # optional: also run NAME-aged with this albedo
 *         cost_per_m2: 25        # optional
 * sweep:
 *   name: roofs                  # prefix of the generated names
 *   max_scenarios: 50            # default 50; more needs --confirm-sweep
 *   change: {targets: {materials: [roof_membrane_dark]}, set: {albedo: 0.7}, cost_per_m2: 20}
 *   axes:                        # Cartesian product; keys: adoption, seed, district, or a set key
 *     albedo: [0.5, 0.7, 0.85]
 *     adoption: [0.5, 1.0]
 *   periods:                     # optional weather axis (read by RunFileReader): every scenario and
 *     - {name: july-2025, weather: weather-2025.csv, start: 2025-07-14, end: 2025-07-18}
 *     - {name: july-2026, start: 2026-07-14, end: 2026-07-18}   # the run's weather file
 * </pre>
 */
final class ScenariosReader {
    private ScenariosReader() {}

    static final List<String> SCENARIO_KEYS = List.of("name", "changes");
    static final List<String> CHANGE_KEYS = List.of("targets", "adoption", "seed", "material", "set",
            "aged_albedo", "cost_per_m2");
    static final List<String> TARGET_KEYS = List.of("materials", "codes", "districts", "roofs_only");
    static final List<String> SWEEP_KEYS = List.of("name", "max_scenarios", "change", "axes", "periods");
    static final List<String> SET_SCALARS = MaterialProperty.keys(MaterialProperty.SURFACE);
    /** What {@code set} may change: the surface properties and the layer properties of the schema. */
    static final List<MaterialProperty> SET_PROPERTIES = List.of(MaterialProperty.ALBEDO, MaterialProperty.EMISSIVITY,
            MaterialProperty.MOISTURE_AVAILABILITY, MaterialProperty.ANTHROPOGENIC_HEAT,
            MaterialProperty.LAYER_THICKNESS, MaterialProperty.LAYER_CONDUCTIVITY, MaterialProperty.LAYER_HEAT_CAPACITY);
    static final int DEFAULT_MAX_SCENARIOS = 50;

    /** Parsed scenarios plus the sweep's limit. */
    record Result(List<Scenario> scenarios, int sweepMax, int sweepSize) {
    }

    static Result read(YamlDoc doc, JsonNode scenarios, JsonNode sweep) {
        List<Scenario> out = new ArrayList<>();
        if (scenarios != null && !scenarios.isNull()) {
            if (!scenarios.isArray()) {
                doc.at("scenarios", "expected a list of scenarios ('- name: …'), got " + YamlDoc.describe(scenarios));
            } else {
                for (int i = 0; i < scenarios.size(); i++) {
                    scenario(doc, scenarios.get(i), "scenarios[" + i + "]", out);
                }
            }
        }
        int max = DEFAULT_MAX_SCENARIOS;
        int size = 0;
        if (sweep != null && !sweep.isNull()) {
            Section s = Section.of(doc, sweep, "sweep");
            if (s != null) {
                s.checkKeys(SWEEP_KEYS, List.of(), Map.of());
                // A sweep over periods alone (sweep.periods, read with the period) needs no scenario axes.
                boolean scenarioAxes = s.has("change") || s.has("axes") || !s.has("periods");
                String prefix = s.text("name", scenarioAxes, "give the sweep a name, e.g. 'name: roofs'");
                Integer m = s.integer("max_scenarios", false, "a whole number, e.g. 50");
                if (m != null) {
                    max = m;
                }
                Section tmpl = s.section("change", scenarioAxes, "give the template change, e.g. 'change: {targets: …, set: …}'");
                Section axes = s.section("axes", scenarioAxes, "give at least one axis, e.g. 'axes: {albedo: [0.5, 0.7]}'");
                if (scenarioAxes && tmpl != null && axes != null && prefix != null) {
                    size = sweep(doc, prefix, tmpl, axes, out);
                }
            }
        }
        Set<String> names = new LinkedHashSet<>();
        for (Scenario sc : out) {
            if (!names.add(sc.name())) {
                doc.at(sc.origin(), "scenario name '" + sc.name() + "' is used twice; give each scenario its own name");
            }
        }
        return new Result(List.copyOf(out), max, size);
    }

    private static void scenario(YamlDoc doc, JsonNode n, String path, List<Scenario> out) {
        Section s = Section.of(doc, n, path);
        if (s == null) {
            return;
        }
        s.checkKeys(SCENARIO_KEYS, List.of(), Map.of("adoption", "changes[i]", "targets", "changes[i]",
                "set", "changes[i]"));
        String name = s.text("name", true, "give the scenario a name, e.g. 'name: cool-roofs'");
        if (name != null) {
            checkName(doc, s.child("name"), name);
        }
        JsonNode changes = s.list("changes", true, "give at least one change ('changes: [- targets: …]')");
        List<Scenario.Change> cs = new ArrayList<>();
        Double aged = null;
        if (changes != null) {
            for (int i = 0; i < changes.size(); i++) {
                Section c = Section.of(doc, changes.get(i), path + ".changes[" + i + "]");
                if (c == null) {
                    continue;
                }
                Scenario.Change ch = change(doc, c, Map.of());
                Double a = c.number("aged_albedo", false, "an albedo 0…1, e.g. 0.6");
                if (a != null) {
                    String problem = MaterialProperty.ALBEDO.problem(a);
                    if (problem != null) {
                        doc.at(c.child("aged_albedo"), problem);
                    }
                    aged = a;
                }
                if (ch != null) {
                    cs.add(ch);
                }
            }
        }
        if (name != null && !cs.isEmpty()) {
            out.add(new Scenario(name, List.copyOf(cs), path));
            if (aged != null) {
                // The same programme after ageing: every change that sets an albedo takes the aged one.
                List<Scenario.Change> agedChanges = new ArrayList<>();
                for (Scenario.Change ch : cs) {
                    Map<String, Double> set = new LinkedHashMap<>(ch.set());
                    if (set.containsKey("albedo") || ch.material() != null) {
                        set.put("albedo", aged);
                    }
                    agedChanges.add(new Scenario.Change(ch.targets(), ch.adoption(), ch.seed(), ch.material(),
                            Map.copyOf(set), ch.costPerM2()));
                }
                out.add(new Scenario(name + "-aged", List.copyOf(agedChanges), path + " (aged)"));
            }
        }
    }

    /** Reads a change; {@code axisValues} override the template's values (sweeps). */
    private static Scenario.Change change(YamlDoc doc, Section c, Map<String, Object> axisValues) {
        c.checkKeys(CHANGE_KEYS, List.of(), Map.of("materials", "targets", "codes", "targets",
                "districts", "targets", "roofs_only", "targets", "albedo", "set", "emissivity", "set"));
        Section t = c.section("targets", true, "say which cells, e.g. 'targets: {materials: [asphalt_aged]}'");
        Scenario.Targets targets = t == null ? null : targets(doc, t, axisValues);
        double adoption = 1.0;
        Double a = c.number("adoption", false, "a fraction 0…1, e.g. 0.5");
        if (a != null) {
            adoption = a;
        }
        if (axisValues.containsKey("adoption")) {
            adoption = (Double) axisValues.get("adoption");
        }
        if (!(adoption >= 0 && adoption <= 1)) {
            doc.at(c.child("adoption"), "adoption " + adoption + " is outside 0…1; give the treated fraction, e.g. 0.5");
        }
        long seed = 1;
        Integer sd = c.integer("seed", false, "a whole number, e.g. 7");
        if (sd != null) {
            seed = sd;
        }
        if (axisValues.containsKey("seed")) {
            seed = ((Double) axisValues.get("seed")).longValue();
        }
        String material = c.text("material", false, "a library material id");
        Map<String, Double> set = new LinkedHashMap<>();
        Section st = c.section("set", false, "");
        if (st != null) {
            for (Iterator<String> it = st.node.fieldNames(); it.hasNext(); ) {
                String k = it.next();
                Double v = st.number(k, true, "a number");
                if (v != null) {
                    set.put(k, v);
                }
            }
        }
        for (Map.Entry<String, Object> e : axisValues.entrySet()) {
            if (!List.of("adoption", "seed", "district").contains(e.getKey())) {
                set.put(e.getKey(), (Double) e.getValue());
            }
        }
        for (Map.Entry<String, Double> e : set.entrySet()) {
            checkProperty(doc, (st != null ? st.path : c.path + ".set") + "." + e.getKey(), e.getKey(), e.getValue());
        }
        if (material == null && set.isEmpty()) {
            doc.at(c.path, "a change needs 'material:' (switch) or 'set:' (property changes), or both");
        }
        Double cost = c.number("cost_per_m2", false, "a cost per square metre, e.g. 25");
        if (cost != null && !(cost >= 0)) {
            doc.at(c.child("cost_per_m2"), "cost " + cost + " must be ≥ 0");
        }
        if (targets == null) {
            return null;
        }
        return new Scenario.Change(targets, adoption, seed, material, Map.copyOf(set),
                cost == null ? Double.NaN : cost);
    }

    private static Scenario.Targets targets(YamlDoc doc, Section t, Map<String, Object> axisValues) {
        t.checkKeys(TARGET_KEYS, List.of(), Map.of());
        List<String> materials = texts(doc, t, "materials");
        List<Integer> codes = new ArrayList<>();
        JsonNode cl = t.list("codes", false, "");
        if (cl != null) {
            for (int i = 0; i < cl.size(); i++) {
                JsonNode v = cl.get(i);
                if (!v.canConvertToInt() || v.asInt() < 0 || v.asInt() > 65535) {
                    doc.at(t.child("codes") + "[" + i + "]", "expected a land-cover code 0…65535, got " + YamlDoc.describe(v));
                } else {
                    codes.add(v.asInt());
                }
            }
        }
        List<String> districts = texts(doc, t, "districts");
        if (axisValues.containsKey("district")) {
            districts = List.of((String) axisValues.get("district"));
        }
        boolean roofs = false;
        JsonNode r = t.raw("roofs_only");
        if (r != null && !r.isNull()) {
            if (!r.isBoolean()) {
                doc.at(t.child("roofs_only"), "expected true or false, got " + YamlDoc.describe(r));
            } else {
                roofs = r.booleanValue();
            }
        }
        if (materials.isEmpty() && codes.isEmpty()) {
            doc.at(t.path, "targets need 'materials: [...]' or 'codes: [...]' (or both)");
        }
        return new Scenario.Targets(List.copyOf(materials), List.copyOf(codes), List.copyOf(districts), roofs);
    }

    private static List<String> texts(YamlDoc doc, Section t, String key) {
        List<String> out = new ArrayList<>();
        JsonNode l = t.list(key, false, "");
        if (l != null) {
            for (int i = 0; i < l.size(); i++) {
                if (!l.get(i).isTextual() || l.get(i).asText().isBlank()) {
                    doc.at(t.child(key) + "[" + i + "]", "expected a name, got " + YamlDoc.describe(l.get(i)));
                } else {
                    out.add(l.get(i).asText().strip());
                }
            }
        }
        return out;
    }

    static void checkProperty(YamlDoc doc, String path, String key, double v) {
        MaterialProperty p = MaterialProperty.byKey(key).filter(SET_PROPERTIES::contains).orElse(null);
        if (p == null || (p.isLayerProperty() && !key.matches("layers\\[\\d+]\\..*"))) {
            doc.at(path, "unknown property '" + key + "'" + Suggest.didYouMean(key, SET_SCALARS)
                    + "; use " + String.join(", ", SET_SCALARS) + " or layers[i].thickness|conductivity|heat_capacity");
            return;
        }
        String problem = p.problem(v);
        if (problem != null) {
            doc.at(path, problem);
        }
    }

    private static int sweep(YamlDoc doc, String prefix, Section tmpl, Section axes, List<Scenario> out) {
        checkName(doc, "sweep.name", prefix);
        List<String> keys = new ArrayList<>();
        List<List<Object>> values = new ArrayList<>();
        for (Iterator<String> it = axes.node.fieldNames(); it.hasNext(); ) {
            String k = it.next();
            JsonNode l = axes.raw(k);
            String p = axes.child(k);
            if (!l.isArray() || l.size() == 0) {
                doc.at(p, "expected a non-empty list of values, e.g. [0.5, 0.7]");
                continue;
            }
            List<Object> vs = new ArrayList<>();
            for (int i = 0; i < l.size(); i++) {
                JsonNode v = l.get(i);
                if (k.equals("district")) {
                    if (!v.isTextual()) {
                        doc.at(p + "[" + i + "]", "expected a district name, got " + YamlDoc.describe(v));
                        continue;
                    }
                    vs.add(v.asText());
                } else {
                    Double d = Section.number(doc, v, p + "[" + i + "]", "a number");
                    if (d == null) {
                        continue;
                    }
                    if (!k.equals("adoption") && !k.equals("seed")) {
                        checkProperty(doc, p + "[" + i + "]", k, d);
                    }
                    vs.add(d);
                }
            }
            keys.add(k);
            values.add(vs);
        }
        int total = 1;
        for (List<Object> v : values) {
            total *= Math.max(1, v.size());
        }
        if (doc.hasProblems() || total > 100_000) {
            return total;
        }
        int[] idx = new int[keys.size()];
        for (int n = 0; n < total; n++) {
            Map<String, Object> combo = new LinkedHashMap<>();
            StringBuilder name = new StringBuilder(prefix);
            int rest = n;
            for (int a = keys.size() - 1; a >= 0; a--) {
                idx[a] = rest % values.get(a).size();
                rest /= values.get(a).size();
            }
            for (int a = 0; a < keys.size(); a++) {
                Object v = values.get(a).get(idx[a]);
                combo.put(keys.get(a), v);
                name.append('-').append(keys.get(a).replaceAll("[^a-z0-9]", "")).append(label(v));
            }
            Scenario.Change ch = change(doc, tmpl, combo);
            if (ch != null) {
                out.add(new Scenario(name.toString(), List.of(ch), "sweep: " + combo));
            }
        }
        return total;
    }

    private static String label(Object v) {
        if (v instanceof Double d) {
            return d == Math.rint(d) && Math.abs(d) < 1e9 ? Long.toString(d.longValue())
                    : String.format(Locale.ROOT, "%s", d);
        }
        return v.toString().toLowerCase(Locale.ROOT).replaceAll("[^a-z0-9]+", "_");
    }

    static void checkName(YamlDoc doc, String path, String name) {
        if (!name.matches("[a-z0-9][a-z0-9._-]*")) {
            doc.at(path, "scenario name '" + name + "' must use lower-case letters, digits, '.', '-' and '_'");
        }
        if (name.equals(Scenario.BASELINE)) {
            doc.at(path, "'baseline' is the unchanged city and is always run; give the scenario another name");
        }
    }
}
