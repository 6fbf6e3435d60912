package org.thermotile.jobs.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The report of a run folder whose tables still have the names from before the columns carried
 * their units: it stops naming the table, the old and the new name and the fix (run again),
 * rather than only saying that a column is missing.
 */
class OlderTablesTest {
    static final Path SOURCE = Path.of("runs", "old", "tables", "material_hours", "scenario=baseline");

    @Test
    void curvesOfAnOlderTableSayToRunAgain() {
        Table t = new Table(List.of("material", "time", "local_hour", "mean_c", "cells"),
                List.<Object[]>of(new Object[] {"asphalt", "2026-07-14T13:00+02:00", 13, 41.0, 10L}));
        var e = assertThrows(ReportException.class, () -> Curves.of(t, "material", SOURCE));
        assertTrue(e.getMessage().startsWith(SOURCE + ": column 'local_hour' is named 'local_hour_h'"), e.getMessage());
        assertTrue(e.getMessage().contains("Fix: run the run file again"), e.getMessage());
    }

    @Test
    void theCurrentNamesRead() {
        Table t = new Table(List.of("material", "time", "local_hour_h", "mean_c", "cells"),
                List.<Object[]>of(new Object[] {"asphalt", "2026-07-14T13:00+02:00", 13, 41.0, 10L}));
        assertEquals(1, Curves.of(t, "material", SOURCE).size());
    }

    @Test
    void aColumnMissingForAnotherReasonListsTheColumns() {
        Table t = new Table(List.of("material", "time", "mean_c", "cells"), List.of());
        var e = assertThrows(ReportException.class, () -> Curves.of(t, "material", SOURCE));
        assertTrue(e.getMessage().contains("column 'local_hour_h' is missing (columns: material, time, mean_c, cells)"),
                e.getMessage());
    }
}
