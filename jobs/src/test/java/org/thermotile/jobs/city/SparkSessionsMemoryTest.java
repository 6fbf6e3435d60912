package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import org.apache.spark.SparkConf;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.Test;

/**
 * The embedded session's buffer sizes stay below G1's humongous-object threshold, so a long run's
 * many jobs do not grow the heap (bench/run-memory-hours shows the effect; this holds the setting).
 */
class SparkSessionsMemoryTest {
    /**
     * Half of G1's smallest region (1 MiB): G1 allocates an object of at least half a region as
     * humongous (Oracle, "Java Platform, Standard Edition HotSpot Virtual Machine Garbage Collection
     * Tuning Guide", release 17, section "Garbage-First Garbage Collector Tuning: Humongous Objects").
     */
    static final long HUMONGOUS_BYTES = 512 * 1024;

    @Test
    void broadcastBlocksAndSortPagesAreNotHumongousAndASubmitterMayOverride() throws Exception {
        // A session left running by another test would be returned as it is, with its own settings.
        assumeTrue(SparkSession.getDefaultSession().isEmpty() && SparkSession.getActiveSession().isEmpty(),
                "another test's Spark session is still running");
        String old = System.getProperty("spark.buffer.pageSize");
        System.setProperty("spark.buffer.pageSize", "2m");
        try (SparkSession spark = SparkSessions.get(null, 1)) {
            SparkConf c = spark.sparkContext().getConf();
            long block = c.getSizeAsBytes("spark.broadcast.blockSize");
            assertTrue(block < HUMONGOUS_BYTES, "broadcast block " + block + " B");
            assertTrue(block >= 64 * 1024, "a broadcast block of " + block + " B would split the plan into thousands");
            assertEquals(2L * 1024 * 1024, c.getSizeAsBytes("spark.buffer.pageSize"),
                    "the submitter's own page size is kept");
        } finally {
            if (old == null) {
                System.clearProperty("spark.buffer.pageSize");
            } else {
                System.setProperty("spark.buffer.pageSize", old);
            }
        }
        try (SparkSession spark = SparkSessions.get(null, 1)) {
            long page = spark.sparkContext().getConf().getSizeAsBytes("spark.buffer.pageSize");
            assertTrue(page < HUMONGOUS_BYTES, "sort page " + page + " B");
        }
    }
}
