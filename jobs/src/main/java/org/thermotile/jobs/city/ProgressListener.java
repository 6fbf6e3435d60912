package org.thermotile.jobs.city;

import java.io.PrintStream;
import java.util.concurrent.atomic.AtomicInteger;
import org.apache.spark.scheduler.SparkListener;
import org.apache.spark.scheduler.SparkListenerTaskEnd;

/**
 * A console line with tiles done of the total, cell-hours per second and the time left, fed by
 * Spark's task-end events (the job registers it only while the simulation runs).
 */
final class ProgressListener extends SparkListener {
    private final int tiles;
    private final double cellHoursPerTile;
    private final PrintStream out;
    private final AtomicInteger done = new AtomicInteger();
    private final long startNanos = System.nanoTime();
    private long lastPrintNanos;

    ProgressListener(int tiles, double cellHoursPerTile, PrintStream out) {
        this.tiles = tiles;
        this.cellHoursPerTile = cellHoursPerTile;
        this.out = out;
    }


    @Override
    public void onTaskEnd(SparkListenerTaskEnd end) {
        if (!"Success".equals(end.reason().toString())) {
            return;
        }
        int d = done.incrementAndGet();
        long now = System.nanoTime();
        synchronized (this) {
            if (d < tiles && now - lastPrintNanos < 500_000_000L) {
                return;
            }
            lastPrintNanos = now;
        }
        double elapsed = (now - startNanos) / 1e9;
        double rate = d * cellHoursPerTile / Math.max(elapsed, 1e-3);
        double left = d == 0 ? Double.NaN : elapsed / d * (tiles - d);
        out.printf("\r  tiles %d/%d  %.2e cell-hours/s  %s left   ", Math.min(d, tiles), tiles, rate,
                d >= tiles ? "0 s" : formatSeconds(left));
        if (d >= tiles) {
            out.println();
        }
        out.flush();
    }

    static String formatSeconds(double s) {
        if (!Double.isFinite(s)) {
            return "?";
        }
        if (s < 90) {
            return String.format("%.0f s", s);
        }
        return String.format("%.0f min", s / 60);
    }
}
