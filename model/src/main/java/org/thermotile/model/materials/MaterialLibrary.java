package org.thermotile.model.materials;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * The built-in library of surface materials, each property with its source.
 *
 * <p><b>What the numbers are.</b> Broadband albedo and thermal emissivity come from handbook
 * tables (Oke 1987, radiative properties of natural and of urban materials) or from measured
 * roofing products (the LBNL Heat Island Group roofing table); where a handbook gives a range,
 * the value chosen inside it is said. Thermal properties (conductivity k, volumetric heat
 * capacity ρc) come from Oke's (1987) tables of thermal properties of natural and urban
 * materials, Incropera et al. and the ASHRAE Handbook. Layer thicknesses, moisture availability
 * β and anthropogenic heat Q_F are typical values of the trade, marked "common practice". Values
 * recalled rather than read are marked "(from memory)". These are defaults for comparing
 * options; override them with {@link MaterialOverrides} or a user materials file when local data
 * exist.
 *
 * <p><b>Conventions.</b> Layers are listed from the surface down. The kernel takes the surface
 * heat capacity from the top layer (ρc·d), so the top layer of every ground material is a thin
 * (2–4 cm) slice of the same material as the layer below. Roofs end at indoor air at 24 °C
 * (297.15 K, a common-practice cooling set point) through R_si = 0.17 m² K W⁻¹ (ISO 6946:2017
 * Table 7, downward heat flow, the summer-afternoon case); ground surfaces go down to 1.5 m and
 * end at deep ground (the run's mean air temperature). Sources map keys: {@code albedo},
 * {@code emissivity}, {@code moisture_availability}, {@code anthropogenic_heat}, {@code bottom},
 * and {@code layers[i]} for each layer or {@code surface_heat_capacity} for a slab.
 */
public final class MaterialLibrary {
    private MaterialLibrary() {}

    // ---- sources -------------------------------------------------------------------------
    private static final String OKE_NATURAL_RADIATIVE = "Oke (1987) Boundary Layer Climates, 2nd ed., "
            + "Table 1.1, radiative properties of natural materials (from memory)";
    private static final String OKE_URBAN_RADIATIVE = "Oke (1987) Boundary Layer Climates, 2nd ed., "
            + "table of radiative properties of typical urban materials and areas (from memory)";
    private static final String OKE_URBAN_THERMAL = "Oke (1987) Boundary Layer Climates, 2nd ed., "
            + "table of thermal properties of typical urban materials (from memory)";
    private static final String OKE_NATURAL_THERMAL = "Oke (1987) Boundary Layer Climates, 2nd ed., "
            + "Table 2.1, thermal properties of natural materials (from memory)";
    private static final String LBNL_ROOFING = "LBNL Heat Island Group roofing-materials table of solar "
            + "reflectance, thermal emittance and SRI, as reproduced in the USGBC LEED-NC 2.2 reference "
            + "guide (from memory)";
    private static final String ROOF_BOTTOM = "indoor air 297.15 K (24 °C, common-practice cooling set "
            + "point) through R_si = 0.17 m² K/W, ISO 6946:2017 Table 7, downward heat flow";
    private static final String GROUND_BOTTOM = "deep ground at 1.5 m at the run's mean air temperature "
            + "(common practice: the annual wave is damped to a few percent at 1–2 m in soil)";
    private static final String DRY_IMPERVIOUS = "common practice: dry impervious surface, evaporation of "
            + "rain left out";
    private static final String NO_QF = "common practice: no heat released at the surface itself";

    // ---- solids (k [W m⁻¹ K⁻¹], ρc [J m⁻³ K⁻¹]) ------------------------------------------
    private record Solid(String what, double conductivityWmK, double heatCapacityJm3K, String source) {}

    private static final Solid ASPHALT = new Solid("asphalt", 0.75, 1.94e6, OKE_URBAN_THERMAL + ", asphalt");
    private static final Solid CONCRETE = new Solid("dense concrete", 1.51, 2.11e6,
            OKE_URBAN_THERMAL + ", concrete (dense)");
    private static final Solid STONE = new Solid("stone", 2.19, 2.25e6, OKE_URBAN_THERMAL
            + ", stone (average), used for the compacted crushed-stone base (an upper bound of its k)");
    private static final Solid CLAY_TILE = new Solid("clay tile", 0.84, 1.77e6, OKE_URBAN_THERMAL + ", clay tiles");
    private static final Solid WOOD = new Solid("dense wood", 0.19, 1.52e6, OKE_URBAN_THERMAL
            + ", wood (dense), used for plywood/board decking");
    private static final Solid STEEL = new Solid("steel", 53.3, 3.93e6, OKE_URBAN_THERMAL + ", steel");
    private static final Solid EPS = new Solid("expanded polystyrene", 0.03, 0.02e6, OKE_URBAN_THERMAL
            + ", polystyrene (expanded)");
    private static final Solid GLASS_WOOL = new Solid("glass-fibre batt", 0.040, 16.0 * 840.0,
            "ASHRAE Handbook Fundamentals 2017 ch. 26 Table 1, glass-fibre batt insulation: k ≈ 0.04 "
            + "W/(m K), ρ ≈ 16 kg/m³, c ≈ 0.84 kJ/(kg K) (from memory)");
    private static final Solid RUBBER = new Solid("soft vulcanized rubber", 0.13, 1100.0 * 2010.0,
            "Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed., Table A.3, rubber "
            + "(vulcanized, soft): k 0.13 W/(m K), ρ 1100 kg/m³, c 2010 J/(kg K) (from memory); used for "
            + "polymer single-ply membranes");
    private static final Solid SAND_DRY = new Solid("dry sandy soil", 0.30, 1.28e6,
            OKE_NATURAL_THERMAL + ", sandy soil (40 % pore space), dry");
    private static final Solid SAND_WET = new Solid("saturated sandy soil", 2.20, 2.96e6,
            OKE_NATURAL_THERMAL + ", sandy soil (40 % pore space), saturated");

    /** Volumetric heat capacity of still water at 4 °C ρc = 4.18e6 J m⁻³ K⁻¹ (Oke 1987 Table 2.1, from memory). */
    private static final double WATER_HEAT_CAPACITY_JM3K = 4.18e6;

    private static final Map<String, Material> BY_ID = build();

    /** All built-in materials, in a fixed order (roofs, pavements, ground, vegetation, water). */
    public static List<Material> all() {
        return List.copyOf(BY_ID.values());
    }

    /** The built-in ids, in the order of {@link #all()}. */
    public static List<String> ids() {
        return List.copyOf(BY_ID.keySet());
    }

    /** The built-in material with this id, if any. */
    public static Optional<Material> find(String id) {
        return Optional.ofNullable(BY_ID.get(id));
    }

    /**
     * The built-in material with this id.
     *
     * @throws IllegalArgumentException naming the unknown id, the closest known id and all known ids
     */
    public static Material get(String id) {
        return get(id, BY_ID);
    }

    /**
     * The material with this id among {@code known} (e.g. the library merged with a user file).
     *
     * @throws IllegalArgumentException naming the unknown id, the closest known id and all known ids
     */
    public static Material get(String id, Map<String, Material> known) {
        Material m = known.get(id);
        if (m == null) {
            throw new IllegalArgumentException("unknown material '" + id + "'."
                    + NameSuggestions.didYouMean(id, known.keySet())
                    + " Known materials: " + String.join(", ", known.keySet())
                    + ". Add new materials in a materials file.");
        }
        return m;
    }

    /** The built-in materials keyed by id, in library order (unmodifiable). */
    public static Map<String, Material> byId() {
        return BY_ID;
    }

    // ---- the library ---------------------------------------------------------------------
    private static Map<String, Material> build() {
        List<Material> list = new ArrayList<>();
        BottomBoundary roofBottom = BottomBoundary.indoorAir(297.15, 0.17);

        list.add(layered("roof_membrane_dark", "dark single-ply roof membrane (black EPDM) on insulated concrete deck",
                0.06, 0.86, LBNL_ROOFING + ", black EPDM: reflectance 0.06, emittance 0.86, SRI −1",
                List.of(layer("single-ply membrane", 0.0015, RUBBER, "1.5 mm: common practice for single-ply membranes"),
                        layer("rigid foam insulation", 0.10, EPS, "0.10 m: common practice for an insulated low-slope roof"),
                        layer("concrete roof deck", 0.15, CONCRETE, "0.15 m: common practice for a concrete slab deck")),
                roofBottom, ROOF_BOTTOM, 0.0, DRY_IMPERVIOUS, 0.0, NO_QF));

        list.add(layered("roof_membrane_white", "white single-ply roof membrane (PVC/TPO) on insulated concrete deck",
                0.83, 0.92, LBNL_ROOFING + ", white PVC: reflectance 0.83, emittance 0.92, SRI 104 (initial; "
                        + "weathered membranes are lower, see the Cool Roof Rating Council's aged values)",
                List.of(layer("single-ply membrane", 0.0015, RUBBER, "1.5 mm: common practice for single-ply membranes"),
                        layer("rigid foam insulation", 0.10, EPS, "0.10 m: common practice for an insulated low-slope roof"),
                        layer("concrete roof deck", 0.15, CONCRETE, "0.15 m: common practice for a concrete slab deck")),
                roofBottom, ROOF_BOTTOM, 0.0, DRY_IMPERVIOUS, 0.0, NO_QF));

        list.add(layered("bitumen_shingle", "grey asphalt (bitumen) shingles on a wood deck over an insulated ceiling",
                0.22, 0.91, LBNL_ROOFING + ", grey asphalt shingle: reflectance 0.22, emittance 0.91, SRI 22",
                List.of(layer("asphalt shingle", 0.005, ASPHALT, "5 mm: common practice for a shingle course"),
                        layer("wood roof deck", 0.012, WOOD, "12 mm: common practice for plywood sheathing"),
                        layer("glass-fibre insulation", 0.20, GLASS_WOOL, "0.20 m: common practice; the attic air "
                                + "space is not modelled (insulation taken as on the slope)")),
                roofBottom, ROOF_BOTTOM, 0.0, DRY_IMPERVIOUS, 0.0, NO_QF));

        list.add(layered("clay_tile", "red clay roof tiles on boarding over insulation",
                0.33, 0.90, LBNL_ROOFING + ", red clay tile: reflectance 0.33, emittance 0.90, SRI 36",
                List.of(layer("clay roof tile", 0.015, CLAY_TILE, "15 mm: common practice for clay roof tiles; the "
                                + "ventilated gap under the tiles is not modelled"),
                        layer("wood boarding", 0.020, WOOD, "20 mm: common practice for battens and boarding"),
                        layer("glass-fibre insulation", 0.20, GLASS_WOOL, "0.20 m: common practice")),
                roofBottom, ROOF_BOTTOM, 0.0, DRY_IMPERVIOUS, 0.0, NO_QF));

        list.add(layered("metal_roof_bare", "bare (unpainted, weathered) corrugated steel roof over insulation",
                0.13, 0.20, OKE_URBAN_RADIATIVE + ", corrugated iron: albedo 0.10–0.16, emissivity 0.13–0.28; "
                        + "mid-range values taken",
                List.of(layer("steel sheet", 0.0007, STEEL, "0.7 mm: common practice for roofing sheet"),
                        layer("glass-fibre insulation", 0.10, GLASS_WOOL, "0.10 m: common practice")),
                roofBottom, ROOF_BOTTOM, 0.0, DRY_IMPERVIOUS, 0.0, NO_QF));

        list.add(layered("green_roof", "extensive green roof (sedum/grass on 10 cm substrate) on insulated concrete deck",
                0.20, 0.95, OKE_NATURAL_RADIATIVE + ", agricultural crops: albedo 0.18–0.25, emissivity 0.90–0.99; "
                        + "0.20 and 0.95 taken for low dense vegetation",
                List.of(layer("vegetation and top substrate", 0.03, SAND_DRY, "3 cm slice of the substrate; dry sandy "
                                + "soil used as the proxy for a light mineral growing medium (common practice)"),
                        layer("growing substrate", 0.07, SAND_DRY, "7 cm: extensive green roofs have 6–15 cm "
                                + "substrate (common practice)"),
                        layer("rigid foam insulation", 0.08, EPS, "0.08 m: common practice"),
                        layer("concrete roof deck", 0.15, CONCRETE, "0.15 m: common practice")),
                roofBottom, ROOF_BOTTOM, 0.4,
                "common practice: 0.3–0.5 for an extensive green roof in summer (the substrate dries "
                        + "between rains)", 0.0, NO_QF));

        String trafficQf = "common practice: about 10 W/m² from vehicles on a busy urban road (city-centre means "
                + "of tens of W/m² are reviewed by Sailor 2011, Int. J. Climatol. 31, 189–199, from memory)";
        list.add(layered("asphalt_fresh", "fresh asphalt road pavement",
                0.05, 0.95, OKE_URBAN_RADIATIVE + ", roads, asphalt: albedo 0.05–0.20, emissivity 0.95; "
                        + "fresh asphalt at the low end",
                pavement("asphalt wearing course", ASPHALT, "asphalt binder course", ASPHALT, 0.06),
                BottomBoundary.deepGround(), GROUND_BOTTOM, 0.0, DRY_IMPERVIOUS, 10.0, trafficQf));

        list.add(layered("asphalt_aged", "aged (weathered, grey) asphalt road pavement",
                0.12, 0.95, OKE_URBAN_RADIATIVE + ", roads, asphalt: albedo 0.05–0.20, emissivity 0.95; "
                        + "0.12 taken for weathered asphalt",
                pavement("asphalt wearing course", ASPHALT, "asphalt binder course", ASPHALT, 0.06),
                BottomBoundary.deepGround(), GROUND_BOTTOM, 0.0, DRY_IMPERVIOUS, 10.0, trafficQf));

        list.add(layered("concrete", "cast concrete paving (plazas, sidewalks)",
                0.30, 0.90, OKE_URBAN_RADIATIVE + ", concrete: albedo 0.10–0.35, emissivity 0.71–0.90; "
                        + "0.30 and 0.90 taken for light grey paving",
                pavement("concrete slab", CONCRETE, "concrete slab", CONCRETE, 0.11),
                BottomBoundary.deepGround(), GROUND_BOTTOM, 0.0, DRY_IMPERVIOUS, 0.0,
                "common practice: pedestrian paving, no traffic heat"));

        list.add(layered("concrete_pavers", "concrete block pavers on sand bedding",
                0.25, 0.90, OKE_URBAN_RADIATIVE + ", concrete: albedo 0.10–0.35, emissivity 0.71–0.90; "
                        + "0.25 and 0.90 taken for grey pavers",
                List.of(layer("concrete pavers", 0.04, CONCRETE, "top 4 cm of 8 cm pavers (common practice)"),
                        layer("concrete pavers", 0.04, CONCRETE, "lower 4 cm of 8 cm pavers"),
                        layer("sand bedding", 0.03, SAND_DRY, "3 cm: common practice"),
                        layer("crushed-stone base", 0.20, STONE, "0.20 m: common practice"),
                        layer("subgrade soil", 1.19, SAND_DRY, "to 1.5 m depth")),
                BottomBoundary.deepGround(), GROUND_BOTTOM, 0.05,
                "common practice: a little evaporation through the joints after rain", 0.0,
                "common practice: pedestrian paving, no traffic heat"));

        list.add(layered("gravel", "loose light gravel over soil",
                0.34, 0.90, LBNL_ROOFING + ", light gravel (on a built-up roof): reflectance 0.34, emittance 0.90, "
                        + "SRI 37; taken for loose light gravel on the ground",
                List.of(layer("loose gravel", 0.03, SAND_DRY, "3 cm slice; dry sandy soil (40 % pores) used as the "
                                + "proxy for a loose mineral layer (common practice)"),
                        layer("loose gravel", 0.07, SAND_DRY, "10 cm gravel layer in all (common practice)"),
                        layer("subgrade soil", 1.40, SAND_DRY, "to 1.5 m depth")),
                BottomBoundary.deepGround(), GROUND_BOTTOM, 0.05,
                "common practice: a coarse layer drains and dries fast", 0.0, NO_QF));

        list.add(layered("bare_soil_dry", "bare dry light soil",
                0.30, 0.92, OKE_NATURAL_RADIATIVE + ", soils: albedo 0.05 (dark, wet) – 0.40 (light, dry), "
                        + "emissivity 0.98–0.90; 0.30 and 0.92 taken for light dry soil",
                soil(SAND_DRY, "bare soil"),
                BottomBoundary.deepGround(), GROUND_BOTTOM, 0.05,
                "common practice: a dry surface crust limits evaporation to a few percent", 0.0, NO_QF));

        list.add(layered("bare_soil_moist", "bare moist soil",
                0.15, 0.96, OKE_NATURAL_RADIATIVE + ", soils: albedo 0.05 (dark, wet) – 0.40 (light, dry), "
                        + "emissivity 0.98–0.90; 0.15 and 0.96 taken for moist soil",
                soil(SAND_WET, "moist soil"),
                BottomBoundary.deepGround(), GROUND_BOTTOM, 0.4,
                "common practice: 0.3–0.5 for bare moist soil; the saturated thermal properties are an upper bound",
                0.0, NO_QF));

        list.add(layered("grass_irrigated", "irrigated short grass (lawns, sports fields)",
                0.23, 0.95, "albedo: Allen et al. (1998) FAO Irrigation and Drainage Paper 56, reference grass "
                        + "surface albedo 0.23; emissivity: " + OKE_NATURAL_RADIATIVE + ", grass 0.90–0.95",
                soil(SAND_WET, "grass root zone"),
                BottomBoundary.deepGround(), GROUND_BOTTOM, 0.9,
                "common practice: 0.8–1 for well-watered grass", 0.0, NO_QF));

        list.add(layered("grass_dry", "dry (unirrigated, summer-dormant) grass",
                0.26, 0.92, OKE_NATURAL_RADIATIVE + ", grass: albedo 0.16 (long) – 0.26 (short), emissivity "
                        + "0.90–0.95; 0.26 and 0.92 taken for short dry grass",
                soil(SAND_DRY, "grass root zone"),
                BottomBoundary.deepGround(), GROUND_BOTTOM, 0.15,
                "common practice: 0.1–0.2 for grass under summer drought", 0.0, NO_QF));

        list.add(slab("tree_canopy", "broadleaf tree canopy (leaves as a thin slab)",
                0.20, 0.97, OKE_NATURAL_RADIATIVE + ", deciduous forest in leaf: albedo 0.20, emissivity 0.97–0.98",
                5.0e3, "common practice estimate: a leaf is ~0.25 mm of mostly water (≈1 kJ/(m² K) per m² of leaf) "
                        + "× leaf area index 4–5 ≈ 5e3 J/(m² K); branches and trunk left out. A slab, not layers: "
                        + "leaves do not conduct heat to the ground, the canopy top is what is seen",
                BottomBoundary.adiabatic(), "adiabatic (common practice for a canopy slab): the canopy exchanges heat with the air and sky only; "
                        + "heat flux from the canopy to the shaded ground below is left out",
                0.7, "common practice: high but below 1, stomata close partly on hot afternoons", 0.0, NO_QF));

        list.add(slab("water", "shallow open water (pond, canal) as a 1 m mixed layer",
                0.06, 0.97, OKE_NATURAL_RADIATIVE + ", water: albedo 0.03–0.10 at small zenith angles "
                        + "(to 1.0 at large), emissivity 0.92–0.97; 0.06 and 0.97 taken",
                WATER_HEAT_CAPACITY_JM3K * 1.0, "ρc·d with ρc = 4.18e6 J/(m³ K) (" + OKE_NATURAL_THERMAL
                        + ", water at 4 °C) and a 1.0 m mixed layer (common practice for shallow urban water)",
                BottomBoundary.adiabatic(), "adiabatic: exchange with deeper water and sediment is left out over "
                        + "the simulated period (common practice for a well-mixed shallow layer)",
                1.0, "by definition: open water evaporates at the potential rate", 0.0, NO_QF));

        Map<String, Material> map = new LinkedHashMap<>();
        for (Material m : list) {
            if (map.put(m.id(), m) != null) {
                throw new IllegalStateException("duplicate built-in material id " + m.id());
            }
        }
        return Collections.unmodifiableMap(map);
    }

    /** A layer with the source of its thickness and of its thermal properties. */
    private record SourcedLayer(Layer layer, String source) {}

    private static SourcedLayer layer(String name, double thicknessM, Solid solid, String thicknessSource) {
        return new SourcedLayer(new Layer(name, thicknessM, solid.conductivityWmK(), solid.heatCapacityJm3K()),
                "thickness " + thicknessM + " m (" + thicknessSource + "); k and ρc: " + solid.source());
    }

    /** Paving on a crushed-stone base over subgrade soil to 1.5 m; the top course split 4 cm + rest. */
    private static List<SourcedLayer> pavement(String topName, Solid top, String secondName, Solid second,
            double secondThicknessM) {
        double baseM = 0.20;
        double subgradeM = 1.5 - 0.04 - secondThicknessM - baseM;
        return List.of(layer(topName, 0.04, top, "top 4 cm (common practice)"),
                layer(secondName, secondThicknessM, second, "common practice"),
                layer("crushed-stone base", baseM, STONE, "0.20 m: common practice"),
                layer("subgrade soil", Math.round(subgradeM * 1000) / 1000.0, SAND_DRY, "to 1.5 m depth"));
    }

    /** Soil to 1.5 m in layers of 2, 8, 40 and 100 cm. */
    private static List<SourcedLayer> soil(Solid solid, String topName) {
        return List.of(layer(topName, 0.02, solid, "2 cm surface slice (common practice)"),
                layer("topsoil", 0.08, solid, "to 10 cm"),
                layer("soil", 0.40, solid, "to 50 cm"),
                layer("subsoil", 1.00, solid, "to 1.5 m depth"));
    }

    private static Material layered(String id, String name, double albedo, double emissivity,
            String radiativeSource, List<SourcedLayer> layers, BottomBoundary bottom, String bottomSource,
            double beta, String betaSource, double qf, String qfSource) {
        Map<String, String> sources = new LinkedHashMap<>();
        sources.put("albedo", radiativeSource);
        sources.put("emissivity", radiativeSource);
        List<Layer> plain = new ArrayList<>();
        for (int i = 0; i < layers.size(); i++) {
            plain.add(layers.get(i).layer());
            sources.put("layers[" + i + "]", layers.get(i).source());
        }
        sources.put("bottom", bottomSource);
        sources.put("moisture_availability", betaSource);
        sources.put("anthropogenic_heat", qfSource);
        return new Material(id, name, albedo, emissivity, plain, Double.NaN, bottom, beta, qf, sources);
    }

    private static Material slab(String id, String name, double albedo, double emissivity, String radiativeSource,
            double heatCapacityJm2K, String heatCapacitySource, BottomBoundary bottom, String bottomSource,
            double beta, String betaSource, double qf, String qfSource) {
        Map<String, String> sources = new LinkedHashMap<>();
        sources.put("albedo", radiativeSource);
        sources.put("emissivity", radiativeSource);
        sources.put("surface_heat_capacity", heatCapacitySource);
        sources.put("bottom", bottomSource);
        sources.put("moisture_availability", betaSource);
        sources.put("anthropogenic_heat", qfSource);
        return new Material(id, name, albedo, emissivity, List.of(), heatCapacityJm2K, bottom, beta, qf, sources);
    }
}
