package org.thermotile.model.balance;

import java.util.List;

/**
 * How a construction's conduction segments are spaced ({@link ColumnGrid}): the first segment's
 * thickness, its growth with depth, and from {@code deepFromM} down a second, usually larger,
 * growth (where the daily wave has mostly died out the nodes can be far apart).
 *
 * <p>Named spacings, chosen with the run file's {@code physics.column_spacing}:
 * {@link #STANDARD} (1 cm growing by 1.3 all the way down) and {@link #COARSE} (the same down to
 * 25 cm, then growing by 3: ground and pavement columns lose about a quarter of their nodes, roofs,
 * thinner than 25 cm, none). Both pass the Carslaw &amp; Jaeger periodic-conduction check of
 * {@code BalanceKernelTest} with the same tolerance; a single growth of 1.5 to 2 or a first
 * segment of 1.5 to 3 cm does not (it over-damps the wave by 2.2–3.9 % within one damping depth).
 * What the coarse spacing costs at the surface over a summer month is measured in
 * {@code ColumnSpacingTest} and stated in the README.
 *
 * @param name          the name a run file gives, or null for an unnamed spacing
 * @param firstSegmentM thickness of the first segment below the surface [m], &gt; 0
 * @param growth        ratio of successive segment thicknesses above {@code deepFromM}, ≥ 1
 * @param deepFromM     depth [m] from which segments grow by {@code deepGrowth}; +∞ = never
 * @param deepGrowth    ratio of successive segment thicknesses below {@code deepFromM}, ≥ 1
 */
public record ColumnSpacing(String name, double firstSegmentM, double growth, double deepFromM,
        double deepGrowth) implements java.io.Serializable {

    /** 1 cm at the surface growing by 1.3 with depth: every run's spacing unless another is named. */
    public static final ColumnSpacing STANDARD = new ColumnSpacing("standard", 0.01, 1.3,
            Double.POSITIVE_INFINITY, 1.3);
    /** As {@link #STANDARD} down to 25 cm, then each segment three times the one above: fewer deep nodes. */
    public static final ColumnSpacing COARSE = new ColumnSpacing("coarse", 0.01, 1.3, 0.25, 3.0);
    /** Every named spacing, the default first. */
    public static final List<ColumnSpacing> NAMED = List.of(STANDARD, COARSE);

    public ColumnSpacing {
        if (!(firstSegmentM > 0) || !(growth >= 1) || !(deepGrowth >= 1) || !(deepFromM >= 0)) {
            throw new IllegalArgumentException("segment spacing must be > 0 m with growth ≥ 1");
        }
    }

    /** One growth all the way down, unnamed. */
    public static ColumnSpacing uniform(double firstSegmentM, double growth) {
        return new ColumnSpacing(null, firstSegmentM, growth, Double.POSITIVE_INFINITY, growth);
    }

    /** The names of {@link #NAMED}, in order. */
    public static List<String> names() {
        return NAMED.stream().map(ColumnSpacing::name).toList();
    }

    /** The named spacing called {@code name}, or null if there is none. */
    public static ColumnSpacing named(String name) {
        for (ColumnSpacing s : NAMED) {
            if (s.name().equals(name)) {
                return s;
            }
        }
        return null;
    }
}
