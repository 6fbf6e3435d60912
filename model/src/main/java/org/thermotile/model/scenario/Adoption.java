package org.thermotile.model.scenario;

/**
 * Deterministic choice of the treated part of a programme: every candidate unit (a cell, or a
 * whole building) gets a pseudo-random key from the programme's seed and the unit's position in
 * the grid, and the units with the smallest keys are treated until the requested fraction of the
 * candidate area is reached. The keys depend on nothing else, so the same seed picks the same
 * cells on any tile size and any cluster.
 *
 * <p>Key: SplitMix64's finaliser (Steele, Lea &amp; Flood 2014, "Fast splittable pseudorandom
 * number generators", OOPSLA) applied to {@code seed·φ64 + unitId}, φ64 the 64-bit golden-ratio
 * constant 0x9E3779B97F4A7C15.
 */
public final class Adoption {
    private Adoption() {}

    private static final long GOLDEN = 0x9E3779B97F4A7C15L;

    /** The key of unit {@code unitId} (e.g. row·width + col of a cell) under {@code seed}. */
    public static long key(long seed, long unitId) {
        long z = seed * GOLDEN + unitId;
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }

    /** True when a unit whose key is {@code key} is treated under the cut {@code threshold} (unsigned order). */
    public static boolean treated(long key, long threshold, boolean all) {
        return all || Long.compareUnsigned(key, threshold) < 0;
    }
}
