package org.thermotile.model.hotspot;

import java.io.Serializable;

/**
 * Area-weighted sums of a field over zones (blocks, parcels, districts) whose simulation cells are
 * weighted by their exact overlap with the zone: for zone z,
 * <pre>  x̄_z = Σ_i a_iz x_i / Σ_i a_iz,   A_z = Σ_{i valid} a_iz [m²],   coverage_z = A_z / |z|</pre>
 * with a_iz the area of the intersection of cell i with the zone's polygon [m²] and |z| the
 * polygon's area. No-data cells (NaN) are left out of both sums, so the coverage is the share of
 * the zone that holds valid data (cells outside the grid and no-data cells lower it). Because
 * x̄_z A_z = Σ a_iz x_i, the zone's area-weighted total is preserved by construction.
 *
 * <p>Parts over disjoint windows are merged by adding their sums; merging the same parts in the
 * same order gives the same bits.
 */
public final class ZoneSums implements Serializable {
    private static final long serialVersionUID = 1L;

    private final double[] weighted;
    private final double[] validArea;

    /** Empty sums for {@code zones} zones. */
    public ZoneSums(int zones) {
        weighted = new double[zones];
        validArea = new double[zones];
    }

    /** Adds cell value {@code value} with overlap {@code overlapM2} [m²] to zone {@code zone}; NaN skipped. */
    public void add(int zone, double overlapM2, double value) {
        if (Double.isNaN(value) || !(overlapM2 > 0)) {
            return;
        }
        weighted[zone] += overlapM2 * value;
        validArea[zone] += overlapM2;
    }

    /** Adds {@code o}'s sums into these. */
    public void merge(ZoneSums o) {
        if (o.weighted.length != weighted.length) {
            throw new IllegalArgumentException(o.weighted.length + " zones merged into " + weighted.length);
        }
        for (int z = 0; z < weighted.length; z++) {
            weighted[z] += o.weighted[z];
            validArea[z] += o.validArea[z];
        }
    }

    /** Number of zones. */
    public int zones() {
        return weighted.length;
    }

    /** x̄_z [unit of the field]; NaN when the zone holds no valid cell. */
    public double mean(int zone) {
        return validArea[zone] > 0 ? weighted[zone] / validArea[zone] : Double.NaN;
    }

    /** Σ a_iz x_i [unit × m²]. */
    public double weightedSum(int zone) {
        return weighted[zone];
    }

    /** A_z, the zone's area over valid cells [m²]. */
    public double validAreaM2(int zone) {
        return validArea[zone];
    }
}
