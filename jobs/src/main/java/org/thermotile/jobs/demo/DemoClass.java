package org.thermotile.jobs.demo;

/**
 * The land-cover classes of the demo city Riverside Flats: raster code, library material id,
 * label, and an optional albedo override. The codes are our own; they group by kind (1x paved,
 * 2x roofs, 3x bare ground, 4x vegetation, 50 water). Code 0 is no-data and is not a class.
 */
enum DemoClass {
    STREET(10, "asphalt_aged", "street"),
    AVENUE(11, "asphalt_fresh", "avenue, repaved this year"),
    PARKING(12, "asphalt_aged", "parking lot"),
    PLAZA_CONCRETE(13, "concrete", "plaza, concrete"),
    PLAZA_PAVERS(14, "concrete_pavers", "plaza, pavers"),
    SIDEWALK(15, "concrete", "sidewalk, quay and courtyard"),
    GRAVEL(16, "gravel", "gravel path and track"),
    ROOF_DARK(20, "roof_membrane_dark", "flat roof, dark membrane"),
    ROOF_WHITE(21, "roof_membrane_white", "flat roof, white membrane"),
    ROOF_WHITE_WEATHERED(22, "roof_membrane_white", "flat roof, weathered white membrane", 0.65),
    ROOF_SHINGLE(23, "bitumen_shingle", "pitched roof, bitumen shingle"),
    ROOF_CLAY(24, "clay_tile", "pitched roof, clay tile"),
    ROOF_METAL(25, "metal_roof_bare", "shed roof, bare metal"),
    ROOF_GREEN(26, "green_roof", "green roof"),
    SOIL_DRY(30, "bare_soil_dry", "bare soil, dry"),
    MUD(31, "bare_soil_moist", "river edge, moist soil"),
    LAWN(40, "grass_irrigated", "park lawn, irrigated"),
    GRASS_DRY(41, "grass_dry", "grass, dry (yards, banks, meadows)"),
    TREES(42, "tree_canopy", "trees"),
    WATER(50, "water", "river");

    /** Raster code, 1…255 (uint8; 0 is no-data). */
    final int code;
    /** Library material id. */
    final String material;
    /** Label written to the class table. */
    final String label;
    /** Albedo override [0…1], or NaN for the material's own value. */
    final double albedo;

    DemoClass(int code, String material, String label) {
        this(code, material, label, Double.NaN);
    }

    DemoClass(int code, String material, String label, double albedo) {
        this.code = code;
        this.material = material;
        this.label = label;
        this.albedo = albedo;
    }

    /** True for the roof classes (codes 20–29), the cells that carry a building height. */
    boolean isRoof() {
        return code >= 20 && code < 30;
    }
}
