package org.thermotile.model.materials;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.thermotile.model.constants.Physical;

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
        double albedo = base.albedo();
        double emissivity = base.emissivity();
        double beta = base.moistureAvailability();
        double qf = base.anthropogenicHeatWm2();
        double slab = base.slabHeatCapacityJm2K();
        BottomBoundary bottom = base.bottom();
        List<Layer> layers = new ArrayList<>(base.layers());
        try {
            switch (k) {
                case "albedo" -> albedo = value;
                case "emissivity" -> emissivity = value;
                case "moisture_availability" -> beta = value;
                case "anthropogenic_heat" -> qf = value;
                case "surface_heat_capacity" -> {
                    if (!base.isSlab()) {
                        throw new IllegalArgumentException(where + ": surface_heat_capacity applies only to slab "
                                + "materials, and '" + base.id() + "' is layered (its surface heat capacity is "
                                + "that of its top layer); change layers[0].thickness or "
                                + "layers[0].heat_capacity instead");
                    }
                    slab = value;
                }
                case "bottom_temperature_c" -> {
                    if (bottom.kind() == BottomBoundary.Kind.ADIABATIC) {
                        throw new IllegalArgumentException(where + ": '" + base.id() + "' has an adiabatic "
                                + "bottom, which has no temperature; only deep-ground and indoor-air bottoms take "
                                + "bottom_temperature_c");
                    }
                    bottom = new BottomBoundary(bottom.kind(), value + Physical.ZERO_CELSIUS_K,
                            bottom.filmResistanceM2KW());
                    String old = sources.getOrDefault("bottom", "");
                    note = "temperature set to " + value + " °C by " + origin + (old.isEmpty() ? "" : "; otherwise: " + old);
                    k = "bottom";
                }
                default -> {
                    Matcher lm = LAYER_KEY.matcher(k);
                    if (!lm.matches() || !LAYER_FIELDS.contains(lm.group(2))) {
                        throw new IllegalArgumentException(where + ": unknown key '" + k + "'."
                                + NameSuggestions.didYouMean(k, validKeys(base))
                                + " Valid keys: " + describeKeys(base));
                    }
                    if (base.isSlab()) {
                        throw new IllegalArgumentException(where + ": '" + base.id() + "' is a slab material with "
                                + "no layers; use surface_heat_capacity to change its heat capacity");
                    }
                    int i = Integer.parseInt(lm.group(1));
                    if (i >= layers.size()) {
                        throw new IllegalArgumentException(where + ": '" + base.id() + "' has " + layers.size()
                                + " layers, layers[0] … layers[" + (layers.size() - 1) + "]; layers[" + i
                                + "] names no layer");
                    }
                    Layer l = layers.get(i);
                    Layer changed = switch (lm.group(2)) {
                        case "thickness" -> new Layer(l.name(), value, l.conductivityWmK(), l.volumetricHeatCapacityJm3K());
                        case "conductivity" -> new Layer(l.name(), l.thicknessM(), value, l.volumetricHeatCapacityJm3K());
                        default -> new Layer(l.name(), l.thicknessM(), l.conductivityWmK(), value);
                    };
                    layers.set(i, changed);
                    String old = sources.getOrDefault("layers[" + i + "]", "");
                    note = lm.group(2) + " " + note + (old.isEmpty() ? "" : "; otherwise: " + old);
                    k = "layers[" + i + "]";
                }
            }
            sources.put(k, note);
            return new Material(base.id(), base.name(), albedo, emissivity, layers, slab, bottom, beta, qf, sources);
        } catch (IllegalArgumentException e) {
            if (e.getMessage() != null && e.getMessage().startsWith(where)) {
                throw e;
            }
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
        StringBuilder sb = new StringBuilder("albedo [0…1], emissivity [0…1], moisture_availability [0…1], "
                + "anthropogenic_heat [W/m²], surface_heat_capacity [J/(m² K), slab materials only], "
                + "bottom_temperature_c [°C], layers[i].thickness [m], layers[i].conductivity [W/(m K)], "
                + "layers[i].heat_capacity [J/(m³ K)]");
        sb.append(m.isSlab() ? " ('" + m.id() + "' is a slab: no layers)"
                : " with i = 0…" + (m.layers().size() - 1) + " for '" + m.id() + "'");
        return sb.toString();
    }
}
