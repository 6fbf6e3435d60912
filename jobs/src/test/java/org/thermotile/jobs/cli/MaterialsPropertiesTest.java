package org.thermotile.jobs.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import org.junit.jupiter.api.Test;
import org.thermotile.model.materials.MaterialProperty;
import picocli.CommandLine;

/** {@code thermotile materials --properties} prints the one schema: every key, unit, range and source. */
class MaterialsPropertiesTest {
    @Test
    void listsEveryPropertyWithItsRangeAndSource() {
        StringWriter out = new StringWriter();
        CommandLine cl = new CommandLine(new MaterialsCommand());
        cl.setOut(new PrintWriter(out));
        assertEquals(0, cl.execute("--properties"));
        String text = out.toString();
        for (MaterialProperty p : MaterialProperty.values()) {
            assertTrue(text.lines().anyMatch(l -> l.startsWith(p.key() + " ") && l.contains(p.rangeText())),
                    p.key() + " row missing:\n" + text);
            assertTrue(text.contains("  " + p.key() + ": " + p.source()), p.key() + " source missing:\n" + text);
        }
    }
}
