package org.thermotile.jobs.city;

import org.apache.spark.sql.SparkSession;

/** The one place a SparkSession is made: embedded {@code local[*]} unless a master is given. */
public final class SparkSessions {
    private SparkSessions() {}

    /**
     * A session on {@code master} (null = embedded with {@code threads} threads, 0 = all cores).
     * Spark's UI is off and its logging stays at WARN (log4j2.properties).
     */
    public static SparkSession get(String master, int threads) {
        String m = master != null ? master : threads > 0 ? "local[" + threads + "]" : "local[*]";
        return SparkSession.builder()
                .appName("thermotile")
                .master(m)
                .config("spark.ui.enabled", "false")
                .config("spark.ui.showConsoleProgress", "false")
                .config("spark.sql.shuffle.partitions", "4")
                .config("spark.driver.host", System.getenv().getOrDefault("SPARK_LOCAL_IP", "127.0.0.1"))
                .config("spark.sql.parquet.compression.codec", "snappy")
                .config("spark.sql.sources.commitProtocolClass",
                        "org.apache.spark.sql.execution.datasources.SQLHadoopMapReduceCommitProtocol")
                .config("spark.hadoop.mapreduce.fileoutputcommitter.marksuccessfuljobs", "true")
                .getOrCreate();
    }
}
