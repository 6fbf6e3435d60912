package org.thermotile.jobs.report;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * The report's grouping of materials by kind of surface, for the diurnal chart's panels: roofs,
 * pavements, vegetation, bare ground, water, then other (user materials whose id says none of
 * these). The kind is read from the material's label (its id, e.g. {@code roof_membrane_dark},
 * possibly followed by overrides), by the words the built-in library's ids use.
 */
final class MaterialKinds {
    private MaterialKinds() {}

    static final String ROOFS = "Roofs", PAVEMENTS = "Pavements", VEGETATION = "Vegetation",
            BARE_GROUND = "Bare ground", WATER = "Water", OTHER = "Other surfaces";

    /** Panel order. */
    static final List<String> ORDER = List.of(ROOFS, PAVEMENTS, VEGETATION, BARE_GROUND, WATER, OTHER);

    /** The kind of a material label. */
    static String of(String label) {
        String id = label.toLowerCase(Locale.ROOT);
        int space = id.indexOf(' ');
        if (space > 0) {
            id = id.substring(0, space);       // "roof_membrane_white {albedo=0.65}": the id
        }
        if (id.contains("roof") || id.contains("shingle") || id.contains("tile")) {
            return ROOFS;
        }
        if (id.contains("asphalt") || id.contains("concrete") || id.contains("paver") || id.contains("gravel")
                || id.contains("pavement") || id.contains("stone") || id.contains("brick") || id.contains("street")
                || id.contains("road") || id.contains("parking") || id.contains("sidewalk")) {
            return PAVEMENTS;
        }
        if (id.contains("grass") || id.contains("tree") || id.contains("canopy") || id.contains("shrub")
                || id.contains("lawn") || id.contains("forest")) {
            return VEGETATION;
        }
        if (id.contains("soil") || id.contains("sand") || id.contains("bare")) {
            return BARE_GROUND;
        }
        if (id.contains("water") || id.contains("pond") || id.contains("river")) {
            return WATER;
        }
        return OTHER;
    }

    /** The groups by kind, kinds in {@link #ORDER}, groups in their given order; empty kinds left out. */
    static Map<String, List<Curves.Group>> byKind(List<Curves.Group> groups) {
        Map<String, List<Curves.Group>> out = new LinkedHashMap<>();
        for (String k : ORDER) {
            List<Curves.Group> g = new ArrayList<>();
            for (Curves.Group x : groups) {
                if (of(x.key()).equals(k)) {
                    g.add(x);
                }
            }
            if (!g.isEmpty()) {
                out.put(k, g);
            }
        }
        return out;
    }

    /** Lowest and highest hourly mean over all groups (the panels' shared axis); NaN, NaN when none. */
    static double[] range(List<Curves.Group> groups) {
        double lo = Double.POSITIVE_INFINITY, hi = Double.NEGATIVE_INFINITY;
        for (Curves.Group g : groups) {
            for (double v : g.meanByHour()) {
                if (Double.isFinite(v)) {
                    lo = Math.min(lo, v);
                    hi = Math.max(hi, v);
                }
            }
        }
        return lo <= hi ? new double[] {lo, hi} : new double[] {Double.NaN, Double.NaN};
    }

    /** An HTML id fragment for a kind ("Bare ground" → "bare-ground"). */
    static String id(String kind) {
        return kind.toLowerCase(Locale.ROOT).replace(' ', '-');
    }
}
