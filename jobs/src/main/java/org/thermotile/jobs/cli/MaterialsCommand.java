package org.thermotile.jobs.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.Callable;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.materials.Layer;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialProperty;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code thermotile materials}: the material library as a table, with each value's source. */
@Command(name = "materials", mixinStandardHelpOptions = true,
        description = "Lists the material library: albedo, emissivity, surface heat capacity, layers, "
                + "bottom boundary, moisture availability, anthropogenic heat, and the source of each value.")
final class MaterialsCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(arity = "0..1", paramLabel = "ID", description = "show one material in full")
    String id;

    @picocli.CommandLine.Mixin
    SharedOptions.MaterialsFile materials = new SharedOptions.MaterialsFile();

    @Option(names = "--sources", description = "print every value's source under the table")
    boolean sources;

    @Option(names = "--properties", description = "list the material properties: key, unit, valid range and "
            + "its source (what class tables, scenarios, --set and materials files accept)")
    boolean properties;

    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        if (properties) {
            properties(out);
            out.flush();
            return 0;
        }
        Map<String, Material> known = Materials.known(materials.file);
        if (id != null) {
            describe(out, Materials.lookup(id, materials.file));
            out.flush();
            return 0;
        }
        out.printf(Locale.ROOT, "%-20s %6s %6s %12s %6s %6s %-11s %s%n", "id", "albedo", "emiss",
                "C_s kJ/m²K", "beta", "Q_F", "bottom", "layers (top down)");
        for (Material m : known.values()) {
            out.printf(Locale.ROOT, "%-20s %6.2f %6.2f %12.1f %6.2f %6.1f %-11s %s%n", m.id(), m.albedo(),
                    m.emissivity(), m.surfaceHeatCapacityJm2K() / 1000, m.moistureAvailability(),
                    m.anthropogenicHeatWm2(), bottom(m), layers(m));
        }
        out.println();
        out.println("C_s: surface heat capacity of the top layer (slab: the whole slab). beta: moisture "
                + "availability. Q_F: anthropogenic heat, W/m².");
        if (sources) {
            out.println();
            for (Material m : known.values()) {
                out.println(m.id() + ":");
                new TreeMap<>(m.sources()).forEach((k, v) -> out.println("  " + k + ": " + v));
            }
        } else {
            out.println("Add --sources for the source of every value, or give an id for one material in full.");
        }
        out.flush();
        return 0;
    }

    /** The property schema, one property a line, then each range's source. */
    static void properties(PrintWriter out) {
        out.printf(Locale.ROOT, "%-24s %-10s %-44s %s%n", "key", "unit", "valid range", "what it is");
        for (MaterialProperty p : MaterialProperty.values()) {
            out.printf(Locale.ROOT, "%-24s %-10s %-44s %s%n", p.key(), p.unit(), p.rangeText(), p.description());
        }
        out.println();
        out.println("Sources of the ranges:");
        for (MaterialProperty p : MaterialProperty.values()) {
            out.println("  " + p.key() + ": " + p.source());
        }
    }

    static String bottom(Material m) {
        return switch (m.bottom().kind()) {
            case DEEP_GROUND -> "deep ground";
            case INDOOR_AIR -> String.format(Locale.ROOT, "indoor %.0f°C",
                    m.bottom().temperatureK() - Physical.ZERO_CELSIUS_K);
            case ADIABATIC -> "none";
        };
    }

    static String layers(Material m) {
        if (m.isSlab()) {
            return "slab";
        }
        StringBuilder sb = new StringBuilder();
        for (Layer l : m.layers()) {
            if (sb.length() > 0) {
                sb.append(" / ");
            }
            sb.append(l.name()).append(String.format(Locale.ROOT, " %.3g m", l.thicknessM()));
        }
        return sb.toString();
    }

    static void describe(PrintWriter out, Material m) {
        out.printf(Locale.ROOT, "%s — %s%n", m.id(), m.name());
        out.printf(Locale.ROOT, "  albedo %.3f, emissivity %.3f, moisture availability %.2f, anthropogenic heat %.1f W/m²%n",
                m.albedo(), m.emissivity(), m.moistureAvailability(), m.anthropogenicHeatWm2());
        out.printf(Locale.ROOT, "  surface heat capacity %.0f J/(m² K); bottom: %s%n", m.surfaceHeatCapacityJm2K(), bottom(m));
        if (!m.isSlab()) {
            out.println("  layers, top down: thickness m, conductivity W/(m K), heat capacity J/(m³ K)");
            for (Layer l : m.layers()) {
                out.printf(Locale.ROOT, "    %-28s %8.4f %8.3f %12.3e%n", l.name(), l.thicknessM(),
                        l.conductivityWmK(), l.volumetricHeatCapacityJm3K());
            }
        }
        out.println("  sources:");
        new TreeMap<>(m.sources()).forEach((k, v) -> out.println("    " + k + ": " + v));
    }
}
