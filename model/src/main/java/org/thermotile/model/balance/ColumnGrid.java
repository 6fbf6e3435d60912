package org.thermotile.model.balance;

import java.util.ArrayList;
import java.util.List;
import org.thermotile.model.materials.BottomBoundary;
import org.thermotile.model.materials.Layer;
import org.thermotile.model.materials.Material;

/**
 * A material's construction discretised into conduction nodes: node 0 is the surface, node
 * {@code n−1} the last unknown; below it lies the bottom boundary.
 *
 * <p>Vertex-centred finite volumes (Patankar 1980, Numerical Heat Transfer and Fluid Flow, §4.2):
 * nodes sit at segment ends, each segment lies inside one layer, a node's heat capacity is half of
 * each adjacent segment's ρc·Δz, and the conductance between neighbours is k/Δz of the segment
 * between them. Segment thickness grows geometrically from {@code firstSegmentM} by
 * {@code growth} with depth, and by {@code deepGrowth} once the segments reach {@code deepFromM}
 * ({@link ColumnSpacing}: fine where the daily wave is strong, coarse where it has died out), and
 * never crosses a layer interface, so interfaces are nodes.
 *
 * <p>Bottom: {@link BottomBoundary.Kind#DEEP_GROUND} fixes the temperature at the bottom of the
 * last layer (that node is not an unknown); {@link BottomBoundary.Kind#INDOOR_AIR} keeps the
 * bottom node as the inside surface and couples it to indoor air through {@code 1/R_si};
 * {@link BottomBoundary.Kind#ADIABATIC} gives no flux. A slab material is a single node of
 * capacity C_s; it has no conduction path, so its bottom is adiabatic unless it is indoor air.
 */
public final class ColumnGrid {
    /** Default thickness of the first segment below the surface [m] (resolves the diurnal wave). */
    public static final double DEFAULT_FIRST_SEGMENT_M = ColumnSpacing.STANDARD.firstSegmentM();
    /** Default growth of segment thickness with depth. */
    public static final double DEFAULT_GROWTH = ColumnSpacing.STANDARD.growth();

    /** Heat capacity of each unknown node [J m⁻² K⁻¹]. */
    public final double[] capacityJm2K;
    /**
     * Conductance from each node to the one below [W m⁻² K⁻¹]; for the last node, the conductance
     * to the bottom boundary (0 when adiabatic).
     */
    public final double[] conductanceDownWm2K;
    /** Depth of each node below the surface [m]. */
    public final double[] depthM;
    /** True when the bottom is held at a temperature (deep ground or indoor air). */
    public final boolean bottomFixed;

    private ColumnGrid(double[] cap, double[] kDown, double[] depth, boolean bottomFixed) {
        this.capacityJm2K = cap;
        this.conductanceDownWm2K = kDown;
        this.depthM = depth;
        this.bottomFixed = bottomFixed;
    }

    /** Number of unknown nodes. */
    public int nodes() {
        return capacityJm2K.length;
    }

    /** The grid of {@code material} with the default segment spacing. */
    public static ColumnGrid of(Material material) {
        return of(material, ColumnSpacing.STANDARD);
    }

    /**
     * The grid of {@code material} with one growth all the way down.
     *
     * @param firstSegmentM thickness of the first segment [m], &gt; 0
     * @param growth        ratio of successive segment thicknesses, ≥ 1
     */
    public static ColumnGrid of(Material material, double firstSegmentM, double growth) {
        return of(material, ColumnSpacing.uniform(firstSegmentM, growth));
    }

    /** The grid of {@code material} with {@code spacing}. */
    public static ColumnGrid of(Material material, ColumnSpacing spacing) {
        double firstSegmentM = spacing.firstSegmentM();
        double growth = spacing.growth();
        double deepFromM = spacing.deepFromM();
        double deepGrowth = spacing.deepGrowth();
        BottomBoundary.Kind bottom = material.bottom().kind();
        if (material.isSlab()) {
            double kBot = bottom == BottomBoundary.Kind.INDOOR_AIR
                    ? 1.0 / material.bottom().filmResistanceM2KW() : 0.0;
            return new ColumnGrid(new double[] {material.slabHeatCapacityJm2K()},
                    new double[] {kBot}, new double[] {0.0}, kBot > 0);
        }
        // Segments, top-down: thickness, k, rho*c.
        List<double[]> segments = new ArrayList<>();
        double target = firstSegmentM;
        double bottomOfSegments = 0;
        for (Layer layer : material.layers()) {
            double left = layer.thicknessM();
            while (left > 1e-12) {
                double dz;
                if (left <= target * 1.5) {
                    dz = left; // absorb a short remainder rather than leave a sliver
                } else {
                    dz = target;
                }
                segments.add(new double[] {dz, layer.conductivityWmK(), layer.volumetricHeatCapacityJm3K()});
                left -= dz;
                bottomOfSegments += dz;
                target *= bottomOfSegments >= deepFromM ? deepGrowth : growth;
            }
        }
        int nodesAll = segments.size() + 1; // vertex nodes at each segment end, surface included
        double[] cap = new double[nodesAll];
        double[] kDown = new double[nodesAll];
        double[] depth = new double[nodesAll];
        double z = 0;
        for (int s = 0; s < segments.size(); s++) {
            double[] seg = segments.get(s);
            double half = 0.5 * seg[0] * seg[2];
            cap[s] += half;
            cap[s + 1] += half;
            kDown[s] = seg[1] / seg[0];
            depth[s] = z;
            z += seg[0];
        }
        depth[nodesAll - 1] = z;
        switch (bottom) {
            case DEEP_GROUND: {
                // The last vertex is held at the deep-ground temperature: drop it as an unknown;
                // the last unknown's kDown (already k/Δz of the last segment) couples to it.
                int n = nodesAll - 1;
                return new ColumnGrid(java.util.Arrays.copyOf(cap, n), java.util.Arrays.copyOf(kDown, n),
                        java.util.Arrays.copyOf(depth, n), true);
            }
            case INDOOR_AIR:
                kDown[nodesAll - 1] = 1.0 / material.bottom().filmResistanceM2KW();
                return new ColumnGrid(cap, kDown, depth, true);
            case ADIABATIC:
            default:
                kDown[nodesAll - 1] = 0.0;
                return new ColumnGrid(cap, kDown, depth, false);
        }
    }
}
