package org.thermotile.model.balance;

/**
 * Working arrays of the kernel's surface solve for one chunk of slots: the right-hand sides and
 * every lockstep Newton iterate, so each iteration is one simple loop across the chunk
 * ({@link BalanceKernel}). Sized once per block; small enough to stay in the first-level cache.
 */
final class SurfaceScratch {
    /** Slots per chunk of the surface solve. */
    static final int CHUNK = 256;
    /** Newton iterations run across a whole chunk before each cell is finished on its own. */
    static final int LOCKSTEP = 4;

    final double[] rhs = new double[CHUNK];
    final double[] es = new double[CHUNK];
    final double[] bq = new double[CHUNK];
    final double[] shortwave = new double[CHUNK];
    final double[] longwaveIn = new double[CHUNK];
    /** t[k]: the iterate before iteration k (t[0] the temperature before the step) [K]. */
    final double[][] t = new double[LOCKSTEP + 1][CHUNK];
    /** d[k]: the Newton update of iteration k [K]. */
    final double[][] d = new double[LOCKSTEP][CHUNK];
    /** q_sat and its slope at t[k], iteration k (evaporating cells only). */
    final double[][] qs = new double[LOCKSTEP][CHUNK];
    final double[][] dqs = new double[LOCKSTEP][CHUNK];
    /** Work rows of the evaporating Newton step: the Magnus exponent, then e_w; the slope factor. */
    final double[] work0 = new double[CHUNK];
    final double[] work1 = new double[CHUNK];
}
