package org.thermotile.jobs.observe;

import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.stream.IntStream;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.SparkSession;
import org.thermotile.model.materials.Material;
import org.thermotile.model.observe.Calibration;
import org.thermotile.model.observe.PixelCells;
import org.thermotile.model.observe.PixelSimulation;
import scala.Tuple2;

/**
 * One Spark job per evaluation of the calibration objective: the sampled pixels (their cells and
 * geometry windows) and the forcing are broadcast once; each evaluation ships only the candidate
 * palette in its closure, runs {@link PixelSimulation} over partitions of pixels and collects one
 * row of simulated temperatures per pixel, put back in sample order on the driver (so the result
 * does not depend on the partitioning).
 */
final class CalibrationJob implements Calibration.Simulator, AutoCloseable {
    private final JavaSparkContext jsc;
    private final Broadcast<PixelSimulation> simulation;
    private final Broadcast<ArrayList<PixelCells>> pixels;
    private final int count;
    private final int slices;
    private int evaluation;

    CalibrationJob(SparkSession spark, PixelSimulation sim, List<PixelCells> sample) {
        jsc = JavaSparkContext.fromSparkContext(spark.sparkContext());
        simulation = jsc.broadcast(sim);
        pixels = jsc.broadcast(new ArrayList<>(sample));
        count = sample.size();
        slices = Math.max(1, Math.min(count, 2 * jsc.defaultParallelism()));
    }

    /** Partitions of pixels per evaluation. */
    int slices() {
        return slices;
    }

    @Override
    public double[][] simulate(Material[] palette) {
        evaluation++;
        Broadcast<PixelSimulation> sim = simulation;
        Broadcast<ArrayList<PixelCells>> px = pixels;
        Material[] candidate = palette.clone();
        jsc.setJobDescription("calibration evaluation " + evaluation);
        List<Integer> ids = IntStream.range(0, count).boxed().toList();
        List<Tuple2<Integer, double[]>> rows = jsc.parallelize(ids, slices).mapPartitions(
                (Iterator<Integer> it) -> {
                    List<Integer> mine = new ArrayList<>();
                    it.forEachRemaining(mine::add);
                    List<PixelCells> cells = new ArrayList<>(mine.size());
                    for (int i : mine) {
                        cells.add(px.value().get(i));
                    }
                    double[][] v = sim.value().simulate(candidate, cells);
                    List<Tuple2<Integer, double[]>> out = new ArrayList<>(mine.size());
                    for (int j = 0; j < mine.size(); j++) {
                        out.add(new Tuple2<>(mine.get(j), v[j]));
                    }
                    return out.iterator();
                }).collect();
        double[][] out = new double[count][];
        for (Tuple2<Integer, double[]> r : rows) {
            out[r._1()] = r._2();
        }
        return out;
    }

    @Override
    public void close() {
        jsc.setJobDescription(null);
        simulation.destroy();
        pixels.destroy();
    }
}
