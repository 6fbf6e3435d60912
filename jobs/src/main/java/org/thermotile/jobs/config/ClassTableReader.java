package org.thermotile.jobs.config;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.io.InputStream;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;
import org.thermotile.jobs.config.ClassTable.ClassEntry;
import org.thermotile.model.materials.MaterialProperty;

/**
 * Reads land-cover class tables: the built-in ones ({@link #BUILT_IN}, resources under
 * {@code org/thermotile/jobs/classes/}), and custom tables in YAML or CSV.
 *
 * <p>YAML form:
 * <pre>
 * name: riverside
 * reference: survey of 2026          # optional free text: where the codes come from
 * fallback: concrete                 # optional: material for codes the table does not map
 * classes:
 *   - {code: 1, material: asphalt_aged, label: street}
 *   - {code: 2, material: roof_membrane_dark, overrides: {albedo: 0.1}}
 *   - {code: 9, material: null, label: snow}   # declared, deliberately without a material
 * </pre>
 * CSV form: one class per line, {@code code,material,label[,overrides]} with overrides written
 * {@code key=value;key=value}; an optional header line starting with {@code code}; blank lines
 * and lines starting with {@code #} ignored; an empty material declares a class without one; a
 * line {@code fallback,<material>} sets the fallback. Fields may be double-quoted (RFC 4180).
 * The table is named after the file (its name without extension, lower case).
 *
 * <p>Every problem of a table is collected and reported together in one
 * {@link ClassTableException}: duplicate codes, codes outside 0…65535, unknown material ids
 * (with the closest valid id suggested), unknown override keys, out-of-range override values.
 * The set of valid material ids is a parameter, so this reader does not depend on the material
 * library's own reader.
 */
public final class ClassTableReader {
    /** Names of the built-in tables. */
    public static final List<String> BUILT_IN = List.of("worldcover", "nlcd");

    private static final String RESOURCE_DIR = "/org/thermotile/jobs/classes/";
    private static final Pattern NAME = Pattern.compile("[a-z0-9_-]{1,64}");
    private static final List<String> TABLE_KEYS = List.of("name", "reference", "fallback", "classes");
    private static final List<String> CLASS_KEYS = List.of("code", "material", "label", "overrides");

    private ClassTableReader() {
    }

    /** True for names ending in .yaml, .yml or .csv (any case). */
    public static boolean hasTableExtension(String location) {
        String l = location.toLowerCase(Locale.ROOT);
        return l.endsWith(".yaml") || l.endsWith(".yml") || l.endsWith(".csv");
    }

    /**
     * The table a run file names in {@code inputs.classes}: a built-in name, a local path, or a
     * {@code file:} URI. Other URI schemes are not read here (the caller reads the text and
     * uses {@link #parseYaml} or {@link #parseCsv}).
     *
     * @param materialIds the material library's valid ids
     * @throws ClassTableException listing every problem of the table
     */
    public static ClassTable resolve(String classes, Set<String> materialIds) {
        if (BUILT_IN.contains(classes)) {
            return builtIn(classes, materialIds);
        }
        if (classes.regionMatches(true, 0, "file:", 0, 5)) {
            return read(Path.of(URI.create(classes)), materialIds);
        }
        if (classes.matches("^[A-Za-z][A-Za-z0-9+.-]+:.*")) {
            throw new ClassTableException(classes, List.of(classes + ": class tables are read from "
                    + "local files only; copy the table next to the run file and name it there"));
        }
        return read(Path.of(classes), materialIds);
    }

    /**
     * A built-in table by name ({@link #BUILT_IN}).
     *
     * @throws IllegalArgumentException for an unknown name (with the closest name suggested)
     * @throws ClassTableException      if the library lacks a material the table uses
     */
    public static ClassTable builtIn(String name, Set<String> materialIds) {
        if (!BUILT_IN.contains(name)) {
            throw new IllegalArgumentException("no built-in class table '" + name + "'; built-in tables: "
                    + String.join(", ", BUILT_IN) + Suggest.didYouMean(name, BUILT_IN));
        }
        String resource = RESOURCE_DIR + name + ".yaml";
        try (InputStream in = ClassTableReader.class.getResourceAsStream(resource)) {
            if (in == null) {
                throw new IllegalStateException("built-in class table resource " + resource + " is missing");
            }
            String text = new String(in.readAllBytes(), StandardCharsets.UTF_8);
            return parseYaml(text, name + " (built-in, " + resource.substring(1) + ")", materialIds);
        } catch (IOException e) {
            throw new IllegalStateException("cannot read built-in class table " + resource, e);
        }
    }

    /**
     * A custom table from a local file, YAML or CSV by its extension.
     *
     * @throws ClassTableException listing every problem of the table (or that it cannot be read)
     */
    public static ClassTable read(Path file, Set<String> materialIds) {
        Path abs = file.toAbsolutePath().normalize();
        String source = abs.toString();
        if (!hasTableExtension(source)) {
            throw new ClassTableException(source, List.of(source + ": a class table must end in .yaml, "
                    + ".yml or .csv"));
        }
        String text;
        try {
            text = Files.readString(abs, StandardCharsets.UTF_8);
        } catch (NoSuchFileException e) {
            throw new ClassTableException(source, List.of(source + ": no such file; check inputs.classes "
                    + "(paths are relative to the run file's folder) or name a built-in table ("
                    + String.join(" | ", BUILT_IN) + ")"));
        } catch (IOException e) {
            throw new ClassTableException(source, List.of(source + ": cannot be read (" + e + ")"));
        }
        if (source.toLowerCase(Locale.ROOT).endsWith(".csv")) {
            String stem = abs.getFileName().toString();
            stem = stem.substring(0, stem.length() - 4).toLowerCase(Locale.ROOT).replaceAll("[^a-z0-9_-]+", "-");
            return parseCsv(text, source, stem, materialIds);
        }
        return parseYaml(text, source, materialIds);
    }

    // ---------------------------------------------------------------- YAML

    /**
     * A table from YAML text.
     *
     * @param source the file name to put in messages
     * @throws ClassTableException listing every problem
     */
    public static ClassTable parseYaml(String text, String source, Set<String> materialIds) {
        YamlDoc doc = YamlDoc.parse(source, text);
        ClassTable t = doc.root == null ? null : buildYaml(doc, source, materialIds);
        if (doc.hasProblems() || t == null) {
            throw new ClassTableException(source, doc.problems());
        }
        return t;
    }

    private static ClassTable buildYaml(YamlDoc doc, String source, Set<String> ids) {
        Section top = Section.of(doc, doc.root, "");
        if (top == null) {
            return null;
        }
        top.checkKeys(TABLE_KEYS, List.of(), Map.of("code", "classes[…]", "material", "classes[…]",
                "label", "classes[…]", "overrides", "classes[…]"));
        String name = top.text("name", true, "give the table a name such as 'riverside'");
        if (name != null && !NAME.matcher(name).matches()) {
            doc.at("name", "'" + name + "' may use only a-z, 0-9, '-' and '_' (1 to 64 characters)");
        }
        String reference = top.text("reference", false, "describe where the codes come from");
        String fallback = top.text("fallback", false, "name a library material id, e.g. concrete");
        if (fallback != null) {
            checkMaterial(doc::at, "fallback", fallback, ids);
        }
        List<ClassEntry> entries = new ArrayList<>();
        JsonNode list = top.list("classes", true, "list the classes, e.g. classes: [{code: 1, material: asphalt_aged}]");
        Map<Integer, String> seen = new HashMap<>();
        if (list != null) {
            if (list.isEmpty()) {
                doc.at("classes", "is empty; list at least one class");
            }
            for (int i = 0; i < list.size(); i++) {
                String path = "classes[" + i + "]";
                Section c = Section.of(doc, list.get(i), path);
                if (c == null) {
                    continue;
                }
                c.checkKeys(CLASS_KEYS, List.of(), Map.of("fallback", "top level", "name", "top level"));
                Integer code = c.integer("code", true, "give the raster code, a whole number 0…65535");
                JsonNode m = c.raw("material");
                String material = null;
                boolean materialOk = true;
                if (m == null) {
                    c.missing("material", "name a library material id, or write 'material: null' to "
                            + "declare the class without one");
                    materialOk = false;
                } else if (!m.isNull()) {
                    material = c.text("material", true, "name a library material id");
                    materialOk = material != null && checkMaterial(doc::at, c.child("material"), material, ids);
                }
                String label = c.text("label", false, "give a short label or leave it out");
                Map<String, Double> overrides = new LinkedHashMap<>();
                Section o = c.section("overrides", false, "");
                if (o != null) {
                    for (Iterator<String> it = o.node.fieldNames(); it.hasNext(); ) {
                        String key = it.next();
                        Double v = Section.number(doc, o.raw(key), o.child(key), "give a number, e.g. "
                                + key + ": 0.2");
                        if (v != null && checkOverride(doc::at, o.child(key), key, v)) {
                            overrides.put(key, v);
                        }
                    }
                    if (material == null && o.node.size() > 0 && m != null && m.isNull()) {
                        doc.at(o.path, "a class without a material cannot carry overrides; name its material");
                    }
                }
                if (code != null && checkCode(doc::at, c.child("code"), code, path, seen) && materialOk) {
                    entries.add(new ClassEntry(code, material, label, overrides));
                }
            }
        }
        if (doc.hasProblems()) {
            return null;
        }
        return new ClassTable(name, source, reference, fallback, entries);
    }

    // ---------------------------------------------------------------- CSV

    /**
     * A table from CSV text ({@code code,material,label[,overrides]}).
     *
     * @param source the file name to put in messages
     * @param name   the table name (e.g. the file name without extension)
     * @throws ClassTableException listing every problem
     */
    public static ClassTable parseCsv(String text, String source, String name, Set<String> materialIds) {
        List<String> problems = new ArrayList<>();
        Reporter at = (place, msg) -> problems.add(source + " " + place + ": " + msg);
        List<ClassEntry> entries = new ArrayList<>();
        Map<Integer, String> seen = new HashMap<>();
        String fallback = null;
        String[] lines = text.replace("\uFEFF", "").split("\r\n|\n|\r", -1);
        boolean firstData = true;
        for (int ln = 0; ln < lines.length; ln++) {
            String line = lines[ln];
            String place = "line " + (ln + 1);
            if (line.isBlank() || line.stripLeading().startsWith("#")) {
                continue;
            }
            List<String> f = org.thermotile.jobs.io.Csv.split(line);
            if (f == null) {
                at.at(place, "unbalanced double quote; close the quoted field");
                continue;
            }
            if (firstData && f.get(0).strip().equalsIgnoreCase("code")) {
                firstData = false;
                List<String> want = List.of("code", "material", "label", "overrides");
                for (int i = 0; i < f.size(); i++) {
                    String h = f.get(i).strip().toLowerCase(Locale.ROOT);
                    if (i >= want.size() || !h.equals(want.get(i))) {
                        at.at(place + ", column " + (i + 1), "header '" + f.get(i).strip() + "' should be '"
                                + (i < want.size() ? want.get(i) : "(none)") + "'; the columns are "
                                + "code,material,label[,overrides]");
                    }
                }
                continue;
            }
            firstData = false;
            String codeText = f.get(0).strip();
            if (codeText.equalsIgnoreCase("fallback")) {
                String m = f.size() > 1 ? f.get(1).strip() : "";
                if (m.isEmpty()) {
                    at.at(place + ", column 2 (material)", "the fallback line needs a material id");
                } else if (fallback != null) {
                    at.at(place, "fallback given twice; keep one");
                } else if (checkMaterial(at, place + ", column 2 (material)", m, materialIds)) {
                    fallback = m;
                }
                continue;
            }
            if (f.size() < 2 || f.size() > 4) {
                at.at(place, "has " + f.size() + " field(s); write code,material,label[,overrides]"
                        + " (quote labels that contain commas)");
                continue;
            }
            Integer code = null;
            try {
                code = Integer.valueOf(codeText);
            } catch (NumberFormatException e) {
                at.at(place + ", column 1 (code)", "'" + codeText + "' is not a whole number; give the "
                        + "raster code 0…65535");
            }
            String material = f.get(1).strip();
            boolean ok = material.isEmpty() || checkMaterial(at, place + ", column 2 (material)", material,
                    materialIds);
            String label = f.size() > 2 && !f.get(2).isBlank() ? f.get(2).strip() : null;
            Map<String, Double> overrides = new LinkedHashMap<>();
            if (f.size() > 3 && !f.get(3).isBlank()) {
                if (material.isEmpty()) {
                    at.at(place + ", column 4 (overrides)", "a class without a material cannot carry "
                            + "overrides; name its material");
                    ok = false;
                }
                for (String pair : f.get(3).split(";")) {
                    if (pair.isBlank()) {
                        continue;
                    }
                    String oPlace = place + ", column 4 (overrides)";
                    int eq = pair.indexOf('=');
                    if (eq < 0) {
                        at.at(oPlace, "'" + pair.strip() + "' is not key=value; write e.g. albedo=0.2");
                        ok = false;
                        continue;
                    }
                    String key = pair.substring(0, eq).strip();
                    String val = pair.substring(eq + 1).strip();
                    double v;
                    try {
                        v = Double.parseDouble(val);
                    } catch (NumberFormatException e) {
                        at.at(oPlace, key + "='" + val + "' is not a number; write e.g. " + key + "=0.2");
                        ok = false;
                        continue;
                    }
                    if (overrides.containsKey(key)) {
                        at.at(oPlace, key + " given twice; keep one");
                        ok = false;
                    } else if (checkOverride(at, oPlace, key, v)) {
                        overrides.put(key, v);
                    } else {
                        ok = false;
                    }
                }
            }
            if (code != null && checkCode(at, place + ", column 1 (code)", code, place, seen) && ok) {
                entries.add(new ClassEntry(code, material.isEmpty() ? null : material, label, overrides));
            }
        }
        if (entries.isEmpty() && problems.isEmpty()) {
            problems.add(source + ": holds no classes; write one line per class: code,material,label");
        }
        if (!NAME.matcher(name).matches()) {
            problems.add(source + ": table name '" + name + "' (from the file name) may use only a-z, "
                    + "0-9, '-' and '_'; rename the file");
        }
        if (!problems.isEmpty()) {
            throw new ClassTableException(source, problems);
        }
        return new ClassTable(name, source, null, fallback, entries);
    }

    // ---------------------------------------------------------------- shared checks

    @FunctionalInterface
    private interface Reporter {
        void at(String place, String message);
    }

    private static boolean checkCode(Reporter at, String place, int code, String where, Map<Integer, String> seen) {
        if (code < 0 || code > ClassTable.MAX_CODE) {
            at.at(place, code + " is outside 0…" + ClassTable.MAX_CODE + "; raster codes are unsigned "
                    + "16-bit at most");
            return false;
        }
        String first = seen.putIfAbsent(code, where);
        if (first != null) {
            at.at(place, "code " + code + " is given twice (first at " + first + "); keep one");
            return false;
        }
        return true;
    }

    private static boolean checkMaterial(Reporter at, String place, String id, Set<String> ids) {
        if (ids.contains(id)) {
            return true;
        }
        List<String> sorted = new ArrayList<>(new java.util.TreeSet<>(ids));
        String hint = Suggest.didYouMean(id, sorted);
        at.at(place, "'" + id + "' is not a material in the library" + (hint.isEmpty()
                ? "; valid ids: " + String.join(", ", sorted) : hint));
        return false;
    }

    private static boolean checkOverride(Reporter at, String place, String key, double v) {
        MaterialProperty p = MaterialProperty.byKey(key).filter(MaterialProperty.SURFACE::contains).orElse(null);
        if (p == null) {
            String hint = Suggest.didYouMean(key, ClassTable.OVERRIDE_KEYS);
            at.at(place, "'" + key + "' is not a property a class can override" + (hint.isEmpty()
                    ? "; overridable: " + String.join(", ", ClassTable.OVERRIDE_KEYS) : hint));
            return false;
        }
        String problem = p.problem(v);
        if (problem != null) {
            at.at(place, problem);
            return false;
        }
        return true;
    }
}
