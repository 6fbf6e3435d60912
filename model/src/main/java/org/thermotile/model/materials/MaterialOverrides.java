package org.thermotile.model.materials;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Changes to a material by key, each giving a new {@link Material} (materials are immutable).
 *
 * <p>Keys and units (SI except the one °C key, named so):
 * <pre>
 *   albedo                    broadband solar reflectance [0…1]
 *   emissivity                thermal emittance [0…1]
 *   moisture_availability     β [0…1]
 *   anthropogenic_heat        Q_F [W m⁻²]
 *   surface_heat_capacity     slab heat capacity C_s [J m⁻² K⁻¹] (slab materials only)
 *   bottom_temperature_c      deep-ground or indoor-air temperature [°C]
 *   layers[i].thickness       thickness of layer i [m]
 *   layers[i].conductivity    conductivity of layer i [W m⁻¹ K⁻¹]
 *   layers[i].heat_capacity   volumetric heat capacity ρc of layer i [J m⁻³ K⁻¹]
 * </pre>
 * Layers are numbered from 0 at the surface. Each changed property's entry in
 * {@link Material#sources()} becomes "set to v by &lt;origin&gt;". Command-line form:
 * {@code albedo=0.65} (see {@link #parse}). Bad keys and values raise an
 * {@link IllegalArgumentException} naming the material, the key, the value and the fix.
 */
public final class MaterialOverrides {
    private MaterialOverrides() {}

    /** The keys that are not per layer, in documentation order. */
    public static final List<String> SCALAR_KEYS = List.of("albedo", "emissivity", "moisture_availability",
            "anthropogenic_heat", "surface_heat_capacity", "bottom_temperature_c");
    /** The per-layer fields, used as {@code layers[i].<field>}. */
    public static final List<String> LAYER_FIELDS = List.of("thickness", "conductivity", "heat_capacity");
    /** The schema properties an override may change (the film resistance only through a materials file). */
    public static final List<MaterialProperty> KEYS = List.of(MaterialProperty.ALBEDO, MaterialProperty.EMISSIVITY,
            MaterialProperty.MOISTURE_AVAILABILITY, MaterialProperty.ANTHROPOGENIC_HEAT,
            MaterialProperty.SURFACE_HEAT_CAPACITY, MaterialProperty.BOTTOM_TEMPERATURE_C,
            MaterialProperty.LAYER_THICKNESS, MaterialProperty.LAYER_CONDUCTIVITY, MaterialProperty.LAYER_HEAT_CAPACITY);

    private static final Pattern LAYER_KEY = Pattern.compile("layers\\[(\\d+)]\\.([a-z_]+)");

    /** One parsed {@code key=value}. */
    public record Setting(String key, double value) {}

    /**
     * Parses {@code key=value} (blanks around either part ignored, key lower-cased), e.g.
     * {@code albedo=0.65} or {@code layers[0].thickness=0.05}. Only the form is checked here; the
     * key is checked against a material by {@link #apply}.
     *
     * @throws IllegalArgumentException when there is no '=', the key is empty or the value is not
     *                                  a finite number
     */
    public static Setting parse(String keyEqualsValue) {
        int eq = keyEqualsValue == null ? -1 : keyEqualsValue.indexOf('=');
        if (eq < 0) {
            throw new IllegalArgumentException("override '" + keyEqualsValue + "' must look like key=value, "
                    + "e.g. albedo=0.65");
        }
        String key = keyEqualsValue.substring(0, eq).trim().toLowerCase(Locale.ROOT);
        String text = keyEqualsValue.substring(eq + 1).trim();
        if (key.isEmpty()) {
            throw new IllegalArgumentException("override '" + keyEqualsValue + "' has no key before '='; "
                    + "write e.g. albedo=0.65");
        }
        double value;
        try {
            value = Double.parseDouble(text);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("override '" + keyEqualsValue + "': '" + text
                    + "' is not a number; write a plain decimal number, e.g. " + key + "=0.65");
        }
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException("override '" + keyEqualsValue + "': the value must be a finite number");
        }
        return new Setting(key, value);
    }

    /**
     * Applies {@code key=value} strings in order (a later one wins over an earlier one).
     *
     * @param base          the material to start from
     * @param keyEqualsValues e.g. {@code ["albedo=0.65", "layers[0].thickness=0.05"]}
     * @param origin        who asks, for messages and sources ("command line")
     * @return the changed material
     */
    public static Material applyAll(Material base, List<String> keyEqualsValues, String origin) {
        Material m = base;
        for (String s : keyEqualsValues) {
            Setting o = parse(s);
            m = apply(m, o.key(), o.value(), origin);
        }
        return m;
    }

    /**
     * Applies overrides in the map's iteration order (pass a {@link LinkedHashMap} for a fixed order).
     *
     * @param base      the material to start from
     * @param overrides key → value, units as in the class comment
     * @param origin    who asks, for messages and sources
     * @return the changed material
     */
    public static Material apply(Material base, Map<String, Double> overrides, String origin) {
        Material m = base;
        for (Map.Entry<String, Double> e : overrides.entrySet()) {
            m = apply(m, e.getKey(), e.getValue(), origin);
        }
        return m;
    }

    /**
     * Applies one override.
     *
     * @param base   the material to change
     * @param key    one of the keys of the class comment
     * @param value  the new value, units as in the class comment
     * @param origin who asks, for messages and sources ("command line", "run file 'x.yaml'")
     * @return a new material with that one property changed
     * @throws IllegalArgumentException for an unknown key (with the valid keys and a suggestion),
     *                                  a key that does not apply to this material, or a value out
     *                                  of its range
     */
    public static Material apply(Material base, String key, double value, String origin) {
        String k = key == null ? "" : key.trim().toLowerCase(Locale.ROOT);
        String where = "override " + k + "=" + value + " on material '" + base.id() + "' (" + origin + ")";
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(where + ": the value must be a finite number");
        }
        Map<String, String> sources = new LinkedHashMap<>(base.sources());
        String note = "set to " + value + " by " + origin;
        MaterialProperty p = MaterialProperty.byKey(k).filter(x -> KEYS.contains(x)).orElse(null);
        Matcher lm = LAYER_KEY.matcher(k);
        if (p == null || (p.isLayerProperty() && !lm.matches())) {
            throw new IllegalArgumentException(where + ": unknown key '" + k + "'."
                    + NameSuggestions.didYouMean(k, validKeys(base)) + " Valid keys: " + describeKeys(base));
        }
        int layer = 0;
        String sourceKey = k;
        switch (p) {
            case SURFACE_HEAT_CAPACITY -> {
                if (!base.isSlab()) {
                    throw new IllegalArgumentException(where + ": surface_heat_capacity applies only to slab "
                            + "materials, and '" + base.id() + "' is layered (its surface heat capacity is "
                            + "that of its top layer); change layers[0].thickness or "
                            + "layers[0].heat_capacity instead");
                }
            }
            case BOTTOM_TEMPERATURE_C -> {
                if (base.bottom().kind() == BottomBoundary.Kind.ADIABATIC) {
                    throw new IllegalArgumentException(where + ": '" + base.id() + "' has an adiabatic "
                            + "bottom, which has no temperature; only deep-ground and indoor-air bottoms take "
                            + "bottom_temperature_c");
                }
                String old = sources.getOrDefault("bottom", "");
                note = "temperature set to " + value + " °C by " + origin + (old.isEmpty() ? "" : "; otherwise: " + old);
                sourceKey = "bottom";
            }
            default -> {
                if (p.isLayerProperty()) {
                    if (base.isSlab()) {
                        throw new IllegalArgumentException(where + ": '" + base.id() + "' is a slab material with "
                                + "no layers; use surface_heat_capacity to change its heat capacity");
                    }
                    layer = Integer.parseInt(lm.group(1));
                    if (layer >= base.layers().size()) {
                        throw new IllegalArgumentException(where + ": '" + base.id() + "' has " + base.layers().size()
                                + " layers, layers[0] … layers[" + (base.layers().size() - 1) + "]; layers[" + layer
                                + "] names no layer");
                    }
                    String old = sources.getOrDefault("layers[" + layer + "]", "");
                    note = p.field() + " " + note + (old.isEmpty() ? "" : "; otherwise: " + old);
                    sourceKey = "layers[" + layer + "]";
                }
            }
        }
        String problem = p.problem(value);
        if (problem != null) {
            throw new IllegalArgumentException(where + ": " + problem);
        }
        try {
            Material changed = p.with(base, layer, value);
            sources.put(sourceKey, note);
            return new Material(changed.id(), changed.name(), changed.albedo(), changed.emissivity(),
                    changed.layers(), changed.slabHeatCapacityJm2K(), changed.bottom(),
                    changed.moistureAvailability(), changed.anthropogenicHeatWm2(), sources);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(where + ": " + e.getMessage(), e);
        }
    }

    /** The concrete keys that apply to {@code m} (layer keys with its real indices). */
    public static List<String> validKeys(Material m) {
        List<String> keys = new ArrayList<>();
        for (String k : SCALAR_KEYS) {
            if (k.equals("surface_heat_capacity") && !m.isSlab()) {
                continue;
            }
            if (k.equals("bottom_temperature_c") && m.bottom().kind() == BottomBoundary.Kind.ADIABATIC) {
                continue;
            }
            keys.add(k);
        }
        for (int i = 0; i < m.layers().size(); i++) {
            for (String f : LAYER_FIELDS) {
                keys.add("layers[" + i + "]." + f);
            }
        }
        return keys;
    }

    /** All keys with units, for messages; layer keys as one pattern with this material's index range. */
    private static String describeKeys(Material m) {
        StringBuilder sb = new StringBuilder();
        for (MaterialProperty p : KEYS) {
            if (sb.length() > 0) {
                sb.append(", ");
            }
            sb.append(p.key()).append(" [").append(p.rangeText()).append(p.key().equals("surface_heat_capacity")
                    ? ", slab materials only" : "").append(']');
        }
        sb.append(m.isSlab() ? " ('" + m.id() + "' is a slab: no layers)"
                : " with i = 0…" + (m.layers().size() - 1) + " for '" + m.id() + "'");
        return sb.toString();
    }
}
