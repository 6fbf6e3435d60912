package org.thermotile.model.materials;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.thermotile.model.constants.Physical;

/**
 * The one schema of material properties: for each property its key (as written in run files,
 * class tables, materials files and {@code --set}), unit, valid range with its source, how to read
 * it from a {@link Material} and how to make a changed copy. Every reader checks values with
 * {@link #problem(double)} and every record with {@link #check(String, double)}, so a value is
 * refused everywhere with the same words.
 *
 * <p>Ranges: the three fractions (albedo, emissivity, moisture availability) are bounded by their
 * definitions; emissivity excludes 0 because every real surface emits (polished metals ≈ 0.02–0.05,
 * Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed., Table A.12, from memory).
 * The other bounds are "common practice": wide enough for any built or natural surface, narrow
 * enough to catch a unit slip (kJ for J, cm for m).
 *
 * <p>Layer properties ({@link #isLayerProperty()}) are keyed {@code layers[i].<field>}, layer
 * {@code i} counted from 0 at the surface.
 */
public enum MaterialProperty {
    /** Broadband solar reflectance α [–]. */
    ALBEDO("albedo", "broadband solar reflectance α", "–", 0, true, 1, true,
            "definition: the reflected fraction of incident solar radiation, 0 (black) to 1 (ideal reflector)"),
    /** Thermal emittance ε [–] (= thermal absorptance, Kirchhoff). */
    EMISSIVITY("emissivity", "thermal emittance ε", "–", 0, false, 1, true,
            "definition (a fraction), above 0 because every real surface emits: polished metals ≈ 0.02–0.05 "
                    + "(Incropera et al., 6th ed., Table A.12, from memory)"),
    /** Moisture availability β [–], the fraction of potential evaporation realised. */
    MOISTURE_AVAILABILITY("moisture_availability", "moisture availability β", "–", 0, true, 1, true,
            "definition: the fraction of potential evaporation realised"),
    /** Anthropogenic heat Q_F released at the surface [W m⁻²]. */
    ANTHROPOGENIC_HEAT("anthropogenic_heat", "anthropogenic heat Q_F", "W/m²", 0, true, 2000, true,
            "common practice: above the city-centre values in the literature (hundreds of W/m², "
                    + "Sailor 2011 review, from memory)"),
    /** Heat capacity C_s of a slab material (no layers) [J m⁻² K⁻¹]. */
    SURFACE_HEAT_CAPACITY("surface_heat_capacity", "slab heat capacity C_s (slab materials only)", "J/(m² K)",
            100, false, 1e9, false,
            "common practice: 1e9 is a 240 m water column (ρc 4.18e6 J/(m³ K)); 100 is under a millimetre of any solid"),
    /** Deep-ground or indoor-air temperature under the last layer [°C]. */
    BOTTOM_TEMPERATURE_C("bottom_temperature_c", "deep-ground or indoor-air temperature", "°C",
            200 - 273.15, false, 350 - 273.15, false,
            "common practice: 200…350 K, beyond any deep-ground or indoor temperature"),
    /** Inside surface (film) resistance R_si of an indoor-air bottom [m² K W⁻¹]. */
    BOTTOM_FILM_RESISTANCE("bottom_film_resistance", "inside film resistance R_si (indoor-air bottoms only)",
            "m² K/W", 0, false, Double.POSITIVE_INFINITY, false,
            "ISO 6946:2017 Table 7: 0.10 upward, 0.17 downward heat flow; any positive value accepted"),
    /** Thickness of a layer [m]. */
    LAYER_THICKNESS("layers[i].thickness", "layer thickness", "m", 0, false, 20, false,
            "common practice: below 20 m, where every construction has reached deep ground"),
    /** Thermal conductivity of a layer [W m⁻¹ K⁻¹]. */
    LAYER_CONDUCTIVITY("layers[i].conductivity", "layer conductivity k", "W/(m K)", 0, false, 500, false,
            "common practice: above copper, ≈ 400 W/(m K) (Incropera et al., 6th ed., Table A.1, from memory)"),
    /** Volumetric heat capacity ρc of a layer [J m⁻³ K⁻¹]. */
    LAYER_HEAT_CAPACITY("layers[i].heat_capacity", "layer volumetric heat capacity ρc", "J/(m³ K)", 1e3, false,
            1e8, false, "common practice: air ≈ 1.2e3 and solids and liquids 1e5…5e6 J/(m³ K) "
                    + "(Incropera et al., 6th ed., Tables A.3 and A.4, from memory)");

    /** The properties of the surface itself (no construction), which class tables and calibration change. */
    public static final List<MaterialProperty> SURFACE = List.of(ALBEDO, EMISSIVITY, MOISTURE_AVAILABILITY,
            ANTHROPOGENIC_HEAT);

    private final String key;
    private final String description;
    private final String unit;
    private final double lo;
    private final boolean loInclusive;
    private final double hi;
    private final boolean hiInclusive;
    private final String source;

    MaterialProperty(String key, String description, String unit, double lo, boolean loInclusive, double hi,
            boolean hiInclusive, String source) {
        this.key = key;
        this.description = description;
        this.unit = unit;
        this.lo = lo;
        this.loInclusive = loInclusive;
        this.hi = hi;
        this.hiInclusive = hiInclusive;
        this.source = source;
    }

    /** Key as written in files and on the command line; layer keys as {@code layers[i].field}. */
    public String key() {
        return key;
    }

    /** Layer properties only: the field after {@code layers[i].} ("thickness"); otherwise the key. */
    public String field() {
        return isLayerProperty() ? key.substring("layers[i].".length()) : key;
    }

    /** The concrete key of layer {@code i} ({@code layers[2].thickness}); the key for other properties. */
    public String key(int layer) {
        return isLayerProperty() ? "layers[" + layer + "]." + field() : key;
    }

    /** What the property is, for help texts. */
    public String description() {
        return description;
    }

    /** Unit as printed ("–" for a fraction). */
    public String unit() {
        return unit;
    }

    /** Lower bound of the valid range. */
    public double lo() {
        return lo;
    }

    /** Upper bound of the valid range (may be +∞). */
    public double hi() {
        return hi;
    }

    /** Whether {@link #lo()} itself is valid. */
    public boolean loInclusive() {
        return loInclusive;
    }

    /** Whether {@link #hi()} itself is valid. */
    public boolean hiInclusive() {
        return hiInclusive;
    }

    /** Where the valid range comes from. */
    public String source() {
        return source;
    }

    /** True for the per-layer properties. */
    public boolean isLayerProperty() {
        return key.startsWith("layers[");
    }

    /** True when {@code v} is a finite number within the valid range. */
    public boolean isValid(double v) {
        if (Double.isNaN(v) || Double.isInfinite(v)) {
            return false;
        }
        return (loInclusive ? v >= lo : v > lo) && (hiInclusive ? v <= hi : v < hi);
    }

    /** The valid range as text, e.g. "0 ≤ albedo ≤ 1" or "0 < thickness < 20 m". */
    public String rangeText() {
        String lower = num(lo) + (loInclusive ? " ≤ " : " < ") + field();
        String upper = Double.isInfinite(hi) ? "" : (hiInclusive ? " ≤ " : " < ") + num(hi);
        return lower + upper + (unit.equals("–") ? "" : " " + unit);
    }

    /**
     * The one message for a value out of range, used by every reader, or null when {@code v} is valid:
     * "albedo = 1.5 is outside its valid range 0 ≤ albedo ≤ 1".
     */
    public String problem(double v) {
        if (isValid(v)) {
            return null;
        }
        return field() + " = " + num(v) + " is outside its valid range " + rangeText();
    }

    /**
     * Checks a value in a record's constructor.
     *
     * @param owner what holds the value, for the message ("material 'asphalt_aged'")
     * @throws IllegalArgumentException with {@code owner + ": " + problem(v)} when out of range
     */
    public void check(String owner, double v) {
        String p = problem(v);
        if (p != null) {
            throw new IllegalArgumentException(owner + ": " + p);
        }
    }

    /**
     * This property's value in {@code m}; for layer properties that of layer {@code layer}, for
     * bottom properties NaN where the bottom has none.
     */
    public double valueIn(Material m, int layer) {
        return switch (this) {
            case ALBEDO -> m.albedo();
            case EMISSIVITY -> m.emissivity();
            case MOISTURE_AVAILABILITY -> m.moistureAvailability();
            case ANTHROPOGENIC_HEAT -> m.anthropogenicHeatWm2();
            case SURFACE_HEAT_CAPACITY -> m.slabHeatCapacityJm2K();
            case BOTTOM_TEMPERATURE_C -> m.bottom().temperatureK() - Physical.ZERO_CELSIUS_K;
            case BOTTOM_FILM_RESISTANCE -> m.bottom().filmResistanceM2KW();
            case LAYER_THICKNESS -> m.layers().get(layer).thicknessM();
            case LAYER_CONDUCTIVITY -> m.layers().get(layer).conductivityWmK();
            case LAYER_HEAT_CAPACITY -> m.layers().get(layer).volumetricHeatCapacityJm3K();
        };
    }

    /** {@link #valueIn(Material, int)} for the properties that are not per layer. */
    public double valueIn(Material m) {
        return valueIn(m, 0);
    }

    /**
     * A copy of {@code m} with this property set to {@code v} (layer {@code layer} for layer
     * properties); sources unchanged (the caller records its own). Whether the property applies to
     * {@code m} is checked by the caller ({@link MaterialOverrides} says why not).
     *
     * @throws IllegalArgumentException when {@code v} is out of range
     */
    public Material with(Material m, int layer, double v) {
        double albedo = m.albedo();
        double emissivity = m.emissivity();
        double beta = m.moistureAvailability();
        double qf = m.anthropogenicHeatWm2();
        double slab = m.slabHeatCapacityJm2K();
        BottomBoundary bottom = m.bottom();
        List<Layer> layers = new ArrayList<>(m.layers());
        switch (this) {
            case ALBEDO -> albedo = v;
            case EMISSIVITY -> emissivity = v;
            case MOISTURE_AVAILABILITY -> beta = v;
            case ANTHROPOGENIC_HEAT -> qf = v;
            case SURFACE_HEAT_CAPACITY -> slab = v;
            case BOTTOM_TEMPERATURE_C -> bottom = new BottomBoundary(bottom.kind(), v + Physical.ZERO_CELSIUS_K,
                    bottom.filmResistanceM2KW());
            case BOTTOM_FILM_RESISTANCE -> bottom = new BottomBoundary(bottom.kind(), bottom.temperatureK(), v);
            default -> {
                Layer l = layers.get(layer);
                layers.set(layer, switch (this) {
                    case LAYER_THICKNESS -> new Layer(l.name(), v, l.conductivityWmK(), l.volumetricHeatCapacityJm3K());
                    case LAYER_CONDUCTIVITY -> new Layer(l.name(), l.thicknessM(), v, l.volumetricHeatCapacityJm3K());
                    default -> new Layer(l.name(), l.thicknessM(), l.conductivityWmK(), v);
                });
            }
        }
        return new Material(m.id(), m.name(), albedo, emissivity, layers, slab, bottom, beta, qf, m.sources());
    }

    /** {@link #with(Material, int, double)} for the properties that are not per layer. */
    public Material with(Material m, double v) {
        return with(m, 0, v);
    }

    /**
     * The property of a key: {@code albedo}, … or a layer key {@code layers[3].thickness} (any index)
     * or its pattern {@code layers[i].thickness}; case and blanks ignored.
     */
    public static Optional<MaterialProperty> byKey(String key) {
        if (key == null) {
            return Optional.empty();
        }
        String k = key.trim().toLowerCase(Locale.ROOT).replaceFirst("^layers\\[\\d+]\\.", "layers[i].");
        for (MaterialProperty p : values()) {
            if (p.key.equals(k)) {
                return Optional.of(p);
            }
        }
        return Optional.empty();
    }

    /** The keys of {@code props}, in order. */
    public static List<String> keys(List<MaterialProperty> props) {
        List<String> out = new ArrayList<>();
        for (MaterialProperty p : props) {
            out.add(p.key());
        }
        return List.copyOf(out);
    }

    /** A number as people write it: 1 not 1.0, 1e+09 kept short, −73.15 without binary noise. */
    static String num(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e7) {
            return Long.toString((long) v);
        }
        String s = String.format(Locale.ROOT, "%.6g", v);
        if (s.contains("e")) {
            String[] parts = s.split("e");
            return parts[0].replaceAll("\\.?0+$", "") + "e" + Integer.parseInt(parts[1]);
        }
        return s.contains(".") ? s.replaceAll("\\.?0+$", "") : s;
    }
}
