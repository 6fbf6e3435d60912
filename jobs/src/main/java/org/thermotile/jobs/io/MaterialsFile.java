package org.thermotile.jobs.io;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Pattern;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.materials.BottomBoundary;
import org.thermotile.model.materials.Layer;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.materials.MaterialProperty;
import org.thermotile.model.materials.NameSuggestions;

/**
 * Reads user materials from a YAML or CSV file (our own format) and merges them with the
 * built-in {@link MaterialLibrary}.
 *
 * <h2>YAML ({@code .yaml}, {@code .yml})</h2>
 * A list of entries; an entry either starts from an existing material ({@code base}: a library
 * id or an id defined earlier in the same file) and changes some properties, or defines
 * everything itself:
 * <pre>
 * - id: cool_asphalt                 # required: lower case, digits, '_'
 *   name: asphalt with reflective seal coat
 *   base: asphalt_aged               # start from this material
 *   albedo: 0.33                     # [0…1]
 *   source: "seal-coat maker's data sheet, 2024"
 *
 * - id: timber_deck
 *   name: timber deck over air
 *   albedo: 0.25                     # required without base
 *   emissivity: 0.90                 # required without base
 *   layers:                          # surface first; or surface_heat_capacity for a slab
 *     - {name: timber boards, thickness_m: 0.03, conductivity: 0.15, heat_capacity: 1.2e6}
 *     - {name: joists and air, thickness_m: 0.20, conductivity: 0.30, heat_capacity: 5.0e4}
 *   bottom: {kind: deep_ground}      # deep_ground | indoor_air | adiabatic
 *   moisture_availability: 0.0       # [0…1], default 0 without base
 *   anthropogenic_heat: 0            # [W/m²], default 0 without base
 *   source: "site survey"
 * </pre>
 * Units: {@code thickness_m} [m], {@code conductivity} [W/(m K)], {@code heat_capacity}
 * volumetric ρc [J/(m³ K)], {@code surface_heat_capacity} [J/(m² K)] (slab materials, e.g. water:
 * no layers), {@code bottom.temperature_c} [°C] (optional: the run's default), and
 * {@code bottom.film_resistance} R_si [m² K/W] (required for {@code indoor_air}; ISO 6946:2017
 * Table 7 gives 0.10 upward, 0.17 downward). With a base, {@code layers} replaces all layers,
 * {@code surface_heat_capacity} turns the material into a slab, and {@code bottom} keys change only
 * what they name. The optional {@code source} is recorded for every property the entry sets.
 *
 * <h2>CSV ({@code .csv})</h2>
 * A header row, then one material per row; {@code #} lines are comments; empty cells mean "not
 * given". Columns (any subset, any order; {@code id} required): {@code id, name, base, albedo,
 * emissivity, surface_heat_capacity, moisture_availability, anthropogenic_heat, bottom_kind,
 * bottom_temperature_c, bottom_film_resistance, layers, source}. The {@code layers} cell lists
 * layers surface first as {@code name:thickness_m:conductivity:heat_capacity}, separated by
 * {@code |}, e.g. {@code "boards:0.03:0.15:1.2e6 | joists:0.2:0.3:5e4"}. Cells with commas are
 * quoted with {@code "} (RFC 4180).
 *
 * <p>Every error names the file, the entry (index from 1, line, id), the key and the fix.
 */
public final class MaterialsFile {
    private MaterialsFile() {}

    /** Keys of an entry. */
    public static final List<String> ENTRY_KEYS = List.of("id", "name", "base", "albedo", "emissivity", "layers",
            "surface_heat_capacity", "bottom", "moisture_availability", "anthropogenic_heat", "source");
    /** Keys of a layer. */
    public static final List<String> LAYER_KEYS = List.of("name", "thickness_m", "conductivity", "heat_capacity");
    /** Keys of a bottom. */
    public static final List<String> BOTTOM_KEYS = List.of("kind", "temperature_c", "film_resistance");
    /** Bottom kinds as written in files. */
    public static final List<String> BOTTOM_KINDS = List.of("deep_ground", "indoor_air", "adiabatic");
    /** CSV columns. */
    public static final List<String> CSV_COLUMNS = List.of("id", "name", "base", "albedo", "emissivity",
            "surface_heat_capacity", "moisture_availability", "anthropogenic_heat", "bottom_kind",
            "bottom_temperature_c", "bottom_film_resistance", "layers", "source");

    private static final Pattern ID = Pattern.compile("[a-z][a-z0-9_]*");

    /**
     * Reads a materials file, YAML or CSV by its extension, with the built-in library as bases.
     *
     * @param file the file
     * @return the file's materials in file order
     * @throws IllegalArgumentException for an unreadable file or any bad entry (file, place, fix)
     */
    public static List<Material> read(Path file) {
        String name = file.toString();
        String text;
        try {
            text = Files.readString(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new IllegalArgumentException("materials file '" + name + "' cannot be read (" + e
                    + "); check the path and permissions");
        }
        String lower = name.toLowerCase(Locale.ROOT);
        if (lower.endsWith(".yaml") || lower.endsWith(".yml")) {
            return parseYaml(text, name, MaterialLibrary.byId());
        }
        if (lower.endsWith(".csv")) {
            return parseCsv(text, name, MaterialLibrary.byId());
        }
        throw new IllegalArgumentException("materials file '" + name + "': unknown extension; name it .yaml, "
                + ".yml or .csv");
    }

    /**
     * The library merged with user materials: library order, a user id equal to a library id
     * replaces that material in place, new ids follow in file order.
     *
     * @param user materials from {@link #read}
     * @return id → material, unmodifiable, deterministic order
     */
    public static Map<String, Material> mergeWithLibrary(List<Material> user) {
        Map<String, Material> merged = new LinkedHashMap<>(MaterialLibrary.byId());
        for (Material m : user) {
            merged.put(m.id(), m);
        }
        return Collections.unmodifiableMap(merged);
    }

    // ---- YAML ----------------------------------------------------------------------------

    /**
     * Parses YAML text (see the class comment).
     *
     * @param text     file contents
     * @param fileName for messages and sources
     * @param bases    materials an entry may name as {@code base} (earlier entries are added)
     * @return the materials in file order
     */
    public static List<Material> parseYaml(String text, String fileName, Map<String, Material> bases) {
        ObjectMapper mapper = new ObjectMapper(new YAMLFactory());
        mapper.enable(JsonParser.Feature.STRICT_DUPLICATE_DETECTION);
        List<Entry> entries = new ArrayList<>();
        try (JsonParser p = mapper.getFactory().createParser(text)) {
            JsonToken t = p.nextToken();
            if (t == null) {
                throw new IllegalArgumentException("materials file '" + fileName + "' is empty; write a YAML list "
                        + "of materials, each starting with '- id: …'");
            }
            if (t != JsonToken.START_ARRAY) {
                throw new IllegalArgumentException("materials file '" + fileName + "', line "
                        + p.currentTokenLocation().getLineNr() + ": the top level must be a YAML list of "
                        + "materials (entries starting with '- id: …'), not a " + describe(t));
            }
            while ((t = p.nextToken()) != JsonToken.END_ARRAY && t != null) {
                int line = p.currentTokenLocation().getLineNr();
                JsonNode node = mapper.readTree(p);
                entries.add(new Entry(fileName, entries.size() + 1, "line " + line, node));
            }
        } catch (JsonProcessingException e) {
            JsonLocation loc = e.getLocation();
            String where = loc == null ? "" : ", line " + loc.getLineNr() + ", column " + loc.getColumnNr();
            throw new IllegalArgumentException("materials file '" + fileName + "'" + where + ": not valid YAML ("
                    + e.getOriginalMessage() + "); fix the syntax there", e);
        } catch (IOException e) {
            throw new IllegalArgumentException("materials file '" + fileName + "' cannot be read: " + e, e);
        }
        return build(entries, bases);
    }

    // ---- CSV -----------------------------------------------------------------------------

    /**
     * Parses CSV text (see the class comment).
     *
     * @param text     file contents
     * @param fileName for messages and sources
     * @param bases    materials an entry may name as {@code base} (earlier rows are added)
     * @return the materials in file order
     */
    public static List<Material> parseCsv(String text, String fileName, Map<String, Material> bases) {
        List<String> header = null;
        int headerLine = 0;
        List<Entry> entries = new ArrayList<>();
        String[] lines = text.split("\r?\n", -1);
        for (int i = 0; i < lines.length; i++) {
            String raw = lines[i];
            if (raw.isBlank() || raw.stripLeading().startsWith("#")) {
                continue;
            }
            int lineNr = i + 1;
            List<String> cells = splitCsvLine(raw, fileName, lineNr);
            if (header == null) {
                header = new ArrayList<>();
                for (String c : cells) {
                    String col = c.trim().toLowerCase(Locale.ROOT);
                    if (!CSV_COLUMNS.contains(col)) {
                        throw new IllegalArgumentException("materials file '" + fileName + "', line " + lineNr
                                + ": unknown column '" + col + "'." + NameSuggestions.didYouMean(col, CSV_COLUMNS)
                                + " Valid columns: " + String.join(", ", CSV_COLUMNS));
                    }
                    if (header.contains(col)) {
                        throw new IllegalArgumentException("materials file '" + fileName + "', line " + lineNr
                                + ": column '" + col + "' appears twice; keep one");
                    }
                    header.add(col);
                }
                if (!header.contains("id")) {
                    throw new IllegalArgumentException("materials file '" + fileName + "', line " + lineNr
                            + ": the header has no 'id' column; add one (valid columns: "
                            + String.join(", ", CSV_COLUMNS) + ")");
                }
                headerLine = lineNr;
                continue;
            }
            if (cells.size() != header.size()) {
                throw new IllegalArgumentException("materials file '" + fileName + "', line " + lineNr + ": "
                        + cells.size() + " cells but the header (line " + headerLine + ") has " + header.size()
                        + " columns; quote cells that contain commas");
            }
            entries.add(new Entry(fileName, entries.size() + 1, "line " + lineNr,
                    csvRowToNode(header, cells, fileName, lineNr)));
        }
        if (header == null) {
            throw new IllegalArgumentException("materials file '" + fileName + "' is empty; write a header row "
                    + "(e.g. id,base,albedo) and one row per material");
        }
        return build(entries, bases);
    }

    private static ObjectNode csvRowToNode(List<String> header, List<String> cells, String fileName, int lineNr) {
        JsonNodeFactory f = JsonNodeFactory.instance;
        ObjectNode node = f.objectNode();
        ObjectNode bottom = null;
        for (int c = 0; c < header.size(); c++) {
            String col = header.get(c);
            String v = cells.get(c).trim();
            if (v.isEmpty()) {
                continue;
            }
            switch (col) {
                case "bottom_kind", "bottom_temperature_c", "bottom_film_resistance" -> {
                    if (bottom == null) {
                        bottom = node.putObject("bottom");
                    }
                    bottom.put(col.substring("bottom_".length()), v);
                }
                case "layers" -> {
                    ArrayNode layers = node.putArray("layers");
                    String[] parts = v.split("\\|");
                    for (int k = 0; k < parts.length; k++) {
                        String[] fields = parts[k].trim().split(":", -1);
                        if (fields.length != 4) {
                            throw new IllegalArgumentException("materials file '" + fileName + "', line " + lineNr
                                    + ", column 'layers', layer " + (k + 1) + " '" + parts[k].trim()
                                    + "': write name:thickness_m:conductivity:heat_capacity, layers separated by |");
                        }
                        ObjectNode l = layers.addObject();
                        for (int j = 0; j < 4; j++) {
                            l.put(LAYER_KEYS.get(j), fields[j].trim());
                        }
                    }
                }
                default -> node.put(col, v);
            }
        }
        return node;
    }

    /** Splits one CSV line (RFC 4180 quotes; a quoted cell may not span lines here). */
    static List<String> splitCsvLine(String line, String fileName, int lineNr) {
        List<String> cells = Csv.split(line);
        if (cells == null) {
            throw new IllegalArgumentException("materials file '" + fileName + "', line " + lineNr
                    + ": a quoted cell is not closed; add the closing \"");
        }
        return cells;
    }

    // ---- entries to materials ------------------------------------------------------------

    /** One entry (YAML item or CSV row) with its place in the file. */
    private record Entry(String fileName, int index, String line, JsonNode node) {
        String where(String id) {
            return "materials file '" + fileName + "', entry " + index + " (" + line
                    + (id == null ? "" : ", id '" + id + "'") + ")";
        }
    }

    private static List<Material> build(List<Entry> entries, Map<String, Material> bases) {
        Map<String, Material> known = new LinkedHashMap<>(bases);
        Map<String, Entry> seen = new LinkedHashMap<>();
        List<Material> out = new ArrayList<>();
        for (Entry e : entries) {
            Material m = buildOne(e, known);
            Entry first = seen.putIfAbsent(m.id(), e);
            if (first != null) {
                throw new IllegalArgumentException(e.where(m.id()) + ", key 'id': the id is already used by entry "
                        + first.index() + " (" + first.line() + "); give each material its own id");
            }
            known.put(m.id(), m);
            out.add(m);
        }
        return List.copyOf(out);
    }

    private static Material buildOne(Entry e, Map<String, Material> known) {
        JsonNode n = e.node();
        if (!n.isObject()) {
            throw new IllegalArgumentException(e.where(null) + ": an entry must be a mapping of keys (id: …, "
                    + "albedo: …), not a " + n.getNodeType().toString().toLowerCase(Locale.ROOT));
        }
        String id = text(n, "id", e, null);
        if (id == null) {
            throw new IllegalArgumentException(e.where(null) + ", key 'id': missing; every material needs an id "
                    + "(lower case letters, digits and '_', e.g. cool_asphalt)");
        }
        if (!ID.matcher(id).matches()) {
            throw new IllegalArgumentException(e.where(id) + ", key 'id': '" + id + "' is not a valid id; use "
                    + "lower case letters, digits and '_', starting with a letter (e.g. cool_asphalt)");
        }
        checkKeys(n, ENTRY_KEYS, e, id, "");
        String where = e.where(id);
        String stated = text(n, "source", e, id);
        String given = stated != null ? stated + " (" + e.fileName() + ", entry '" + id + "')"
                : "given in " + e.fileName() + ", entry '" + id + "' (no source stated)";

        String baseId = text(n, "base", e, id);
        Material base = null;
        if (baseId != null) {
            base = known.get(baseId);
            if (base == null) {
                throw new IllegalArgumentException(where + ", key 'base': unknown material '" + baseId + "'."
                        + NameSuggestions.didYouMean(baseId, known.keySet()) + " A base must be a library id or an "
                        + "id defined earlier in the file; known: " + String.join(", ", known.keySet()));
            }
        }
        Map<String, String> sources = new LinkedHashMap<>();
        if (base != null) {
            sources.putAll(base.sources());
        }

        String name = text(n, "name", e, id);
        if (name == null) {
            name = base != null ? base.name() : id;
        }
        double albedo = number(n, "albedo", e, id, base == null ? Double.NaN : base.albedo(), sources, given);
        double emissivity = number(n, "emissivity", e, id, base == null ? Double.NaN : base.emissivity(), sources, given);
        double beta = number(n, "moisture_availability", e, id, base == null ? Double.NaN
                : base.moistureAvailability(), sources, given);
        double qf = number(n, "anthropogenic_heat", e, id, base == null ? Double.NaN
                : base.anthropogenicHeatWm2(), sources, given);
        if (base == null) {
            requireGiven(albedo, "albedo", "a broadband solar reflectance 0…1, e.g. albedo: 0.25", where);
            requireGiven(emissivity, "emissivity", "a thermal emittance 0…1, e.g. emissivity: 0.90", where);
            if (Double.isNaN(beta)) {
                beta = 0.0;
                sources.put("moisture_availability", "default 0: not given in " + e.fileName() + ", entry '" + id + "'");
            }
            if (Double.isNaN(qf)) {
                qf = 0.0;
                sources.put("anthropogenic_heat", "default 0: not given in " + e.fileName() + ", entry '" + id + "'");
            }
        }

        // Construction: layers or slab.
        boolean hasLayers = n.has("layers");
        boolean hasSlab = n.has("surface_heat_capacity");
        if (hasLayers && hasSlab) {
            throw new IllegalArgumentException(where + ": give either 'layers' or 'surface_heat_capacity' (a slab), "
                    + "not both");
        }
        List<Layer> layers = base == null ? List.of() : base.layers();
        double slab = base == null ? Double.NaN : base.slabHeatCapacityJm2K();
        if (hasLayers) {
            layers = layers(n.get("layers"), e, id);
            slab = Double.NaN;
            sources.keySet().removeIf(k -> k.startsWith("layers[") || k.equals("surface_heat_capacity"));
            for (int i = 0; i < layers.size(); i++) {
                sources.put("layers[" + i + "]", given);
            }
        } else if (hasSlab) {
            slab = number(n, "surface_heat_capacity", e, id, Double.NaN, sources, given);
            layers = List.of();
            sources.keySet().removeIf(k -> k.startsWith("layers["));
        } else if (base == null) {
            throw new IllegalArgumentException(where + ": missing 'layers' (surface first, each {name, thickness_m, "
                    + "conductivity, heat_capacity}) or 'surface_heat_capacity' [J/(m² K)] for a slab material");
        }

        BottomBoundary bottom = bottom(n.get("bottom"), e, id, base == null ? null : base.bottom());
        if (n.has("bottom")) {
            sources.put("bottom", given);
        }

        try {
            return new Material(id, name, albedo, emissivity, layers, slab, bottom, beta, qf, sources);
        } catch (IllegalArgumentException ex) {
            throw new IllegalArgumentException(where + ": " + ex.getMessage() + "; fix the value in the file", ex);
        }
    }

    private static List<Layer> layers(JsonNode node, Entry e, String id) {
        String where = e.where(id) + ", key 'layers'";
        if (!node.isArray() || node.isEmpty()) {
            throw new IllegalArgumentException(where + ": expected a non-empty list of layers, surface first, e.g. "
                    + "- {name: boards, thickness_m: 0.03, conductivity: 0.15, heat_capacity: 1.2e6}");
        }
        List<Layer> out = new ArrayList<>();
        for (int i = 0; i < node.size(); i++) {
            JsonNode l = node.get(i);
            String place = "layers[" + i + "].";
            if (!l.isObject()) {
                throw new IllegalArgumentException(where + ", layer " + i + ": expected {name, thickness_m, "
                        + "conductivity, heat_capacity}");
            }
            checkKeys(l, LAYER_KEYS, e, id, place);
            String name = text(l, "name", e, id, place);
            double d = requiredNumber(l, "thickness_m", e, id, place, "[m], e.g. thickness_m: 0.05");
            double k = requiredNumber(l, "conductivity", e, id, place, "[W/(m K)], e.g. conductivity: 0.75");
            double c = requiredNumber(l, "heat_capacity", e, id, place,
                    "volumetric ρc [J/(m³ K)], e.g. heat_capacity: 1.94e6");
            checkRange(MaterialProperty.LAYER_THICKNESS, d, e, id, place + "thickness_m");
            checkRange(MaterialProperty.LAYER_CONDUCTIVITY, k, e, id, place + "conductivity");
            checkRange(MaterialProperty.LAYER_HEAT_CAPACITY, c, e, id, place + "heat_capacity");
            try {
                out.add(new Layer(name == null ? "layer " + i : name, d, k, c));
            } catch (IllegalArgumentException ex) {
                throw new IllegalArgumentException(e.where(id) + ", key '" + place.substring(0, place.length() - 1)
                        + "': " + ex.getMessage() + "; fix the value in the file", ex);
            }
        }
        return out;
    }

    private static BottomBoundary bottom(JsonNode node, Entry e, String id, BottomBoundary base) {
        String where = e.where(id) + ", key 'bottom'";
        if (node == null) {
            if (base == null) {
                throw new IllegalArgumentException(where + ": missing; write e.g. bottom: {kind: deep_ground} or "
                        + "bottom: {kind: indoor_air, temperature_c: 24, film_resistance: 0.17}");
            }
            return base;
        }
        if (!node.isObject()) {
            throw new IllegalArgumentException(where + ": expected {kind, temperature_c, film_resistance}");
        }
        checkKeys(node, BOTTOM_KEYS, e, id, "bottom.");
        String kindText = text(node, "kind", e, id, "bottom.");
        BottomBoundary.Kind kind;
        if (kindText == null) {
            if (base == null) {
                throw new IllegalArgumentException(where + ".kind: missing; one of " + String.join(", ", BOTTOM_KINDS));
            }
            kind = base.kind();
        } else {
            String k = kindText.toLowerCase(Locale.ROOT);
            if (!BOTTOM_KINDS.contains(k)) {
                throw new IllegalArgumentException(where + ".kind: '" + kindText + "' is not a bottom kind."
                        + NameSuggestions.didYouMean(k, BOTTOM_KINDS) + " Use one of " + String.join(", ", BOTTOM_KINDS));
            }
            kind = BottomBoundary.Kind.valueOf(k.toUpperCase(Locale.ROOT));
        }
        boolean sameKind = base != null && base.kind() == kind;
        double tempC = optionalNumber(node, "temperature_c", e, id, "bottom.");
        if (!Double.isNaN(tempC)) {
            checkRange(MaterialProperty.BOTTOM_TEMPERATURE_C, tempC, e, id, "bottom.temperature_c");
        }
        double tempK = !Double.isNaN(tempC) ? tempC + Physical.ZERO_CELSIUS_K
                : sameKind ? base.temperatureK() : Double.NaN;
        double film = optionalNumber(node, "film_resistance", e, id, "bottom.");
        if (Double.isNaN(film)) {
            film = sameKind ? base.filmResistanceM2KW() : 0.0;
        }
        if (kind != BottomBoundary.Kind.INDOOR_AIR) {
            film = 0.0;
        }
        if (kind == BottomBoundary.Kind.ADIABATIC && !Double.isNaN(tempC)) {
            throw new IllegalArgumentException(where + ".temperature_c: an adiabatic bottom has no temperature; "
                    + "remove temperature_c or use kind deep_ground");
        }
        try {
            return new BottomBoundary(kind, tempK, film);
        } catch (IllegalArgumentException ex) {
            throw new IllegalArgumentException(where + ": " + ex.getMessage()
                    + (kind == BottomBoundary.Kind.INDOOR_AIR && !(film > 0)
                            ? "; add film_resistance, e.g. 0.17 (ISO 6946 R_si, downward heat flow)"
                            : "; fix the value in the file"), ex);
        }
    }

    // ---- small readers -------------------------------------------------------------------

    private static void checkKeys(JsonNode n, List<String> valid, Entry e, String id, String prefix) {
        Iterator<String> it = n.fieldNames();
        while (it.hasNext()) {
            String k = it.next();
            if (!valid.contains(k)) {
                throw new IllegalArgumentException(e.where(id) + ", key '" + prefix + k + "': unknown key."
                        + NameSuggestions.didYouMean(k, valid) + " Valid keys"
                        + (prefix.isEmpty() ? "" : " of '" + prefix.substring(0, prefix.length() - 1) + "'") + ": "
                        + String.join(", ", valid));
            }
        }
    }

    private static String text(JsonNode n, String key, Entry e, String id) {
        return text(n, key, e, id, "");
    }

    private static String text(JsonNode n, String key, Entry e, String id, String prefix) {
        JsonNode v = n.get(key);
        if (v == null || v.isNull()) {
            return null;
        }
        if (!v.isValueNode() || v.isBoolean()) {
            throw new IllegalArgumentException(e.where(id) + ", key '" + prefix + key + "': expected a plain text "
                    + "value, got a " + v.getNodeType().toString().toLowerCase(Locale.ROOT));
        }
        String s = v.asText().trim();
        return s.isEmpty() ? null : s;
    }

    /** A number if present (numeric or numeric text), recording the source; else the fallback. */
    private static double number(JsonNode n, String key, Entry e, String id, double fallback,
            Map<String, String> sources, String given) {
        double v = optionalNumber(n, key, e, id, "");
        if (Double.isNaN(v)) {
            return fallback;
        }
        MaterialProperty.byKey(key).ifPresent(p -> checkRange(p, v, e, id, key));
        sources.put(key, given);
        return v;
    }

    private static double requiredNumber(JsonNode n, String key, Entry e, String id, String prefix, String hint) {
        double v = optionalNumber(n, key, e, id, prefix);
        if (Double.isNaN(v)) {
            throw new IllegalArgumentException(e.where(id) + ", key '" + prefix + key + "': missing; give it in "
                    + hint);
        }
        return v;
    }

    /** NaN when absent; an error naming the key when present but not a finite number. */
    private static double optionalNumber(JsonNode n, String key, Entry e, String id, String prefix) {
        JsonNode v = n.get(key);
        if (v == null || v.isNull()) {
            return Double.NaN;
        }
        double d;
        if (v.isNumber()) {
            d = v.asDouble();
        } else if (v.isTextual()) {
            try {
                d = Double.parseDouble(v.asText().trim());
            } catch (NumberFormatException ex) {
                throw new IllegalArgumentException(e.where(id) + ", key '" + prefix + key + "': '" + v.asText()
                        + "' is not a number; write a plain decimal number (e.g. " + key + ": 0.5), no units");
            }
        } else {
            throw new IllegalArgumentException(e.where(id) + ", key '" + prefix + key + "': expected a number, got a "
                    + v.getNodeType().toString().toLowerCase(Locale.ROOT));
        }
        if (!Double.isFinite(d)) {
            throw new IllegalArgumentException(e.where(id) + ", key '" + prefix + key + "': " + v.asText()
                    + " is not a finite number");
        }
        return d;
    }

    /** The schema's one out-of-range message, placed at the entry and key. */
    private static void checkRange(MaterialProperty p, double v, Entry e, String id, String keyPath) {
        String problem = p.problem(v);
        if (problem != null) {
            throw new IllegalArgumentException(e.where(id) + ", key '" + keyPath + "': " + problem
                    + "; fix the value in the file");
        }
    }

    private static void requireGiven(double v, String key, String hint, String where) {
        if (Double.isNaN(v)) {
            throw new IllegalArgumentException(where + ", key '" + key + "': missing; without a 'base' give " + hint
                    + " (or start from a library material with base: <id>)");
        }
    }

    private static String describe(JsonToken t) {
        return switch (t) {
            case START_OBJECT -> "mapping (write '- id: …' list items instead)";
            default -> "single value";
        };
    }
}
