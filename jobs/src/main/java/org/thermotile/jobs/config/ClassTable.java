package org.thermotile.jobs.config;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.TreeMap;
import org.thermotile.model.materials.MaterialProperty;

/**
 * A land-cover class table: integer raster codes → library material ids, with optional
 * per-class property overrides, an optional fallback material for codes the table does not
 * list, and a name. Immutable; built and validated by {@link ClassTableReader}.
 *
 * <p>A class may be <em>declared without a material</em> ({@link ClassEntry#material()} null):
 * the code is known (it has a label) but nothing in the library represents it, e.g. snow and
 * ice. Such codes are treated like unlisted codes: they take the fallback if there is one, and
 * are an error in {@link #checkCodes(Map)} otherwise.
 *
 * @param name     table name, {@code [a-z0-9_-]}
 * @param source   where the table was read from (file path, or "built-in …")
 * @param reference the legend the codes come from (free text), or null
 * @param fallback material id for codes without a material, or null (then they are errors)
 * @param classes  the classes, sorted by code, codes unique in 0…65535
 */
public record ClassTable(String name, String source, String reference, String fallback,
        List<ClassEntry> classes) {

    /** Largest code a class table accepts (the range of an unsigned 16-bit raster). */
    public static final int MAX_CODE = 65_535;

    /**
     * Property overrides a class may carry, in a fixed order for messages: the surface properties
     * of the material schema ({@link MaterialProperty#SURFACE}), each with the valid range
     * {@link MaterialProperty} gives (the one the material record enforces).
     */
    public static final List<String> OVERRIDE_KEYS = MaterialProperty.keys(MaterialProperty.SURFACE);

    public ClassTable {
        Objects.requireNonNull(name, "name");
        List<ClassEntry> sorted = new ArrayList<>(classes);
        sorted.sort(Comparator.comparingInt(ClassEntry::code));
        for (int i = 1; i < sorted.size(); i++) {
            if (sorted.get(i).code() == sorted.get(i - 1).code()) {
                throw new IllegalArgumentException("class table '" + name + "': code "
                        + sorted.get(i).code() + " given twice");
            }
        }
        classes = List.copyOf(sorted);
    }

    /**
     * One class.
     *
     * @param code      raster code, 0…65535
     * @param material  library material id, or null when the class is declared without a material
     * @param label     human label, or null
     * @param overrides property → value replacing the material's own value for this class
     *                  (keys from {@link #OVERRIDE_KEYS}); sorted by key
     */
    public record ClassEntry(int code, String material, String label, Map<String, Double> overrides) {
        public ClassEntry {
            if (code < 0 || code > MAX_CODE) {
                throw new IllegalArgumentException("code " + code + " outside 0…" + MAX_CODE);
            }
            overrides = java.util.Collections.unmodifiableMap(new TreeMap<>(overrides));
        }

        /** "code 70 'Snow and ice'" for messages. */
        String describe() {
            return "code " + code + (label == null ? "" : " '" + label + "'");
        }
    }

    /** True when codes without a material take {@link #fallback()}. */
    public boolean hasFallback() {
        return fallback != null;
    }

    /** The class with this code, if the table lists it. */
    public Optional<ClassEntry> entry(int code) {
        int lo = 0;
        int hi = classes.size() - 1;
        while (lo <= hi) {
            int mid = (lo + hi) >>> 1;
            int c = classes.get(mid).code();
            if (c < code) {
                lo = mid + 1;
            } else if (c > code) {
                hi = mid - 1;
            } else {
                return Optional.of(classes.get(mid));
            }
        }
        return Optional.empty();
    }

    /**
     * The material id for a code: the class's material, else the fallback, else null. Build a
     * per-code lookup array from this once per tile; do not call it per cell.
     */
    public String materialFor(int code) {
        String m = entry(code).map(ClassEntry::material).orElse(null);
        return m != null ? m : fallback;
    }

    /** The overrides of a code's class (empty for unlisted codes and for the fallback). */
    public Map<String, Double> overridesFor(int code) {
        return entry(code).filter(e -> e.material() != null).map(ClassEntry::overrides).orElse(Map.of());
    }

    /**
     * Checks that every code found in a raster has a material.
     *
     * <p>Codes that are unlisted, or listed without a material, are an error unless the table has
     * a fallback; the error lists each such code with its cell count. The caller leaves the
     * raster's no-data value out of {@code codeCounts}. Codes with a count of zero are ignored.
     *
     * @param codeCounts raster code → number of cells with that code [cells]
     * @return the codes (with their counts, sorted by code) that will take the fallback; empty
     *         when every code has its own material
     * @throws ClassTableException listing every code without a material, when there is no fallback
     */
    public Map<Integer, Long> checkCodes(Map<Integer, Long> codeCounts) {
        TreeMap<Integer, Long> unmapped = new TreeMap<>();
        long mappedCells = 0;
        for (Map.Entry<Integer, Long> e : new TreeMap<>(codeCounts).entrySet()) {
            long n = e.getValue() == null ? 0 : e.getValue();
            if (n <= 0) {
                continue;
            }
            Optional<ClassEntry> c = entry(e.getKey());
            if (c.isEmpty() || c.get().material() == null) {
                unmapped.put(e.getKey(), n);
            } else {
                mappedCells += n;
            }
        }
        if (unmapped.isEmpty() || hasFallback()) {
            return java.util.Collections.unmodifiableMap(unmapped);
        }
        List<String> problems = new ArrayList<>();
        for (Map.Entry<Integer, Long> e : unmapped.entrySet()) {
            Optional<ClassEntry> c = entry(e.getKey());
            String cells = e.getValue() + (e.getValue() == 1 ? " cell" : " cells");
            if (c.isPresent()) {
                problems.add(source + ": " + c.get().describe() + " (" + cells + " in the land-cover "
                        + "raster) has no material in table '" + name + "'; use a custom class table "
                        + "that maps it, or one with a 'fallback' material");
            } else {
                problems.add(source + ": code " + e.getKey() + " (" + cells + " in the land-cover "
                        + "raster) is not in table '" + name + "'; use a class table that lists it, "
                        + "or one with a 'fallback' material");
            }
        }
        if (mappedCells == 0) {
            problems.add(source + ": none of the raster's codes has a material in table '" + name
                    + "' (table codes: " + codesText() + "); is this the right table for the raster?");
        }
        throw new ClassTableException(source, problems);
    }

    private String codesText() {
        StringBuilder sb = new StringBuilder();
        for (ClassEntry c : classes) {
            if (sb.length() > 0) {
                sb.append(", ");
            }
            sb.append(c.code());
        }
        return sb.toString();
    }
}
