package org.thermotile.jobs.storage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.lang.reflect.Field;
import java.lang.reflect.Method;
import java.lang.reflect.Modifier;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.apache.spark.sql.types.StructType;
import org.junit.jupiter.api.Test;
import org.thermotile.jobs.errors.UserInputException;

/**
 * Every column the jobs write follows the unit-suffix rule of {@link TableColumns} (our rule,
 * README "Column names and units"): the schemas are found by scanning the compiled classes for
 * static {@link StructType} fields, static methods building one from a key column, static
 * {@code *COLUMNS} lists of CSV columns and {@code HEADER} strings of CSV files, so a table added
 * later is checked without being listed here. Input formats are not output tables and keep their
 * keys: {@link #INPUT_FORMATS} lists the classes left out, each with its reason.
 */
class TableColumnsTest {

    /**
     * Classes whose column lists describe files the user writes: MaterialsFile's CSV columns are
     * the material property keys of the run file's materials (their units in the materials file section of the README),
     * read, not written, by the jobs.
     */
    static final java.util.Set<String> INPUT_FORMATS = java.util.Set.of("org.thermotile.jobs.io.MaterialsFile");

    /** Written schemas: "Class.FIELD" → column names. */
    static Map<String, List<String>> writtenSchemas() throws Exception {
        Path root = Path.of(TableColumns.class.getProtectionDomain().getCodeSource().getLocation().toURI());
        Map<String, List<String>> out = new TreeMap<>();
        List<Path> classes;
        try (Stream<Path> s = Files.walk(root)) {
            classes = s.filter(p -> p.toString().endsWith(".class")).sorted().toList();
        }
        for (Path c : classes) {
            String name = root.relativize(c).toString().replace(java.io.File.separatorChar, '.')
                    .replaceAll("\\.class$", "");
            if (INPUT_FORMATS.contains(name)) {
                continue;
            }
            Class<?> k = Class.forName(name, false, TableColumnsTest.class.getClassLoader());
            for (Field f : k.getDeclaredFields()) {
                if (!Modifier.isStatic(f.getModifiers())) {
                    continue;
                }
                String id = k.getSimpleName() + "." + f.getName();
                if (StructType.class.isAssignableFrom(f.getType())) {
                    f.setAccessible(true);
                    out.put(id, List.of(((StructType) f.get(null)).fieldNames()));
                } else if (List.class.isAssignableFrom(f.getType()) && f.getName().endsWith("COLUMNS")) {
                    f.setAccessible(true);
                    List<String> cols = new ArrayList<>();
                    for (Object o : (List<?>) f.get(null)) {
                        cols.add((String) o);
                    }
                    out.put(id, cols);
                } else if (f.getType() == String.class && f.getName().equals("HEADER")) {
                    f.setAccessible(true);
                    out.put(id, List.of(((String) f.get(null)).split(",")));
                }
            }
            for (Method m : k.getDeclaredMethods()) {
                if (Modifier.isStatic(m.getModifiers()) && m.getReturnType() == StructType.class
                        && m.getParameterCount() == 1 && m.getParameterTypes()[0] == String.class) {
                    m.setAccessible(true);   // a table keyed by its column (material_hours, district_hours)
                    out.put(k.getSimpleName() + "." + m.getName() + "(material)",
                            List.of(((StructType) m.invoke(null, "material")).fieldNames()));
                }
            }
        }
        return out;
    }

    @Test
    void everyWrittenColumnWithAUnitEndsInIt() throws Exception {
        Map<String, List<String>> schemas = writtenSchemas();
        // The scan found the tables it is meant to guard (so it cannot pass by finding nothing).
        for (String t : List.of("TableOutputs.CELLS", "TableOutputs.CELL_HOURS", "TableOutputs.groupHours(material)",
                "Comparison.DISTRICTS", "Comparison.RANKING", "Comparison.RANKING_BY_PERIOD", "HotspotTables.POLYGONS",
                "HotspotTables.DISTRICTS", "HotspotTables.CHANGE", "HotspotTables.ZONES", "ZoneHotspots.COLUMNS",
                "Observe.AGREEMENT", "Observe.PAIRS", "CalibrationFiles.PARQUET_SCHEMA", "CalibrationFiles.CSV_COLUMNS",
                "PointCommand.HEADER")) {
            assertTrue(schemas.containsKey(t), t + " not found among " + schemas.keySet());
        }
        List<String> bad = new ArrayList<>();
        schemas.forEach((t, cols) -> cols.stream().filter(c -> !TableColumns.followsRule(c))
                .forEach(c -> bad.add(t + ": " + c)));
        assertEquals(List.of(), bad, "columns without a unit suffix that are not in TableColumns.UNITLESS");
        // Every new name of the rename list is written somewhere, none of the old ones is.
        List<String> all = schemas.values().stream().flatMap(List::stream).toList();
        TableColumns.RENAMED.forEach((now, old) -> {
            assertTrue(all.contains(now), now + " is in the rename list but no table writes it");
            assertFalse(all.contains(old), old + " is still written");
        });
    }

    @Test
    void theRuleRejectsTheOldNames() {
        // The old names the rename list replaces fail the rule, except cost_per_degree_hour_m2, whose
        // suffix (_m2) was there but incomplete: the rule checks that a unit ends the name, not which.
        TableColumns.RENAMED.forEach((now, old) -> {
            assertTrue(TableColumns.followsRule(now), now);
            if (!old.equals("cost_per_degree_hour_m2")) {
                assertFalse(TableColumns.followsRule(old), old);
            }
        });
        assertFalse(TableColumns.followsRule("surface_temperature"));
        assertTrue(TableColumns.followsRule("surface_c"));
    }

    @Test
    void anOlderRunFolderIsNamedWithTheFix() {
        Path t = Path.of("runs", "old", "tables", "cells");
        var e = assertThrows(UserInputException.class, () -> TableColumns.require(t,
                List.of("scenario", "col", "row", "peak_c", "degree_hours"), List.of("peak_c", "degree_hours_k_h")));
        assertTrue(e.getMessage().startsWith(t + ": column 'degree_hours' is named 'degree_hours_k_h'"), e.getMessage());
        assertTrue(e.getMessage().contains("Fix: run the run file again"), e.getMessage());
        // A column missing for another reason lists what is there.
        e = assertThrows(UserInputException.class, () -> TableColumns.require(t, List.of("scenario", "col"),
                List.of("peak_c")));
        assertTrue(e.getMessage().contains("column 'peak_c' is missing (columns: scenario, col)"), e.getMessage());
        TableColumns.require(t, List.of("peak_c", "degree_hours_k_h"), List.of("peak_c", "degree_hours_k_h"));
    }
}
