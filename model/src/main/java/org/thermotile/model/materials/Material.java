package org.thermotile.model.materials;

import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * A surface material: its radiative, thermal and moisture properties, each with its source.
 *
 * <p>Two modes: <em>layered</em> ({@code layers} non-empty; the surface heat capacity is that of
 * the top layer, ρc·d) and <em>slab</em> ({@code layers} empty; one lumped node of heat capacity
 * {@code slabHeatCapacityJm2K}, e.g. a water body's mixed layer). Immutable.
 *
 * @param id                     stable identifier used in class tables and run files ("asphalt_aged")
 * @param name                   human name
 * <p>Valid ranges, units and sources: {@link MaterialProperty}.
 *
 * @param albedo                 broadband solar reflectance α [0…1]
 * @param emissivity             thermal emittance ε [0…1] (= thermal absorptance, Kirchhoff)
 * @param layers                 construction from the surface down; empty in slab mode
 * @param slabHeatCapacityJm2K   slab heat capacity C_s [J m⁻² K⁻¹]; NaN for layered materials
 * @param bottom                 boundary under the last layer (or under the slab)
 * @param moistureAvailability   β [0…1], the fraction of potential evaporation realised
 * @param anthropogenicHeatWm2   anthropogenic heat Q_F released at the surface [W m⁻²]
 * @param sources                source of each property, keyed by property name ("albedo", …)
 */
public record Material(String id, String name, double albedo, double emissivity, List<Layer> layers,
        double slabHeatCapacityJm2K, BottomBoundary bottom, double moistureAvailability,
        double anthropogenicHeatWm2, Map<String, String> sources) implements java.io.Serializable {

    public Material {
        Objects.requireNonNull(id, "id");
        layers = List.copyOf(layers);
        Objects.requireNonNull(bottom, "bottom");
        // Sorted, so that anything printing the sources is deterministic.
        sources = java.util.Collections.unmodifiableSortedMap(new java.util.TreeMap<>(sources));
        String owner = "material '" + id + "'";
        MaterialProperty.ALBEDO.check(owner, albedo);
        MaterialProperty.EMISSIVITY.check(owner, emissivity);
        MaterialProperty.MOISTURE_AVAILABILITY.check(owner, moistureAvailability);
        MaterialProperty.ANTHROPOGENIC_HEAT.check(owner, anthropogenicHeatWm2);
        if (layers.isEmpty()) {
            if (Double.isNaN(slabHeatCapacityJm2K)) {
                throw new IllegalArgumentException(owner + ": a slab material (no layers) needs "
                        + "surface_heat_capacity, " + MaterialProperty.SURFACE_HEAT_CAPACITY.rangeText());
            }
            MaterialProperty.SURFACE_HEAT_CAPACITY.check(owner + " (a slab)", slabHeatCapacityJm2K);
        } else if (!Double.isNaN(slabHeatCapacityJm2K)) {
            throw new IllegalArgumentException("material '" + id + "': give either layers or a slab "
                    + "heat capacity, not both");
        }
    }


    /** True for a single lumped slab (no layers). */
    public boolean isSlab() {
        return layers.isEmpty();
    }

    /** Surface heat capacity C_s [J m⁻² K⁻¹]: the top layer's ρc·d, or the slab's value. */
    public double surfaceHeatCapacityJm2K() {
        return isSlab() ? slabHeatCapacityJm2K : layers.get(0).arealHeatCapacityJm2K();
    }
}
