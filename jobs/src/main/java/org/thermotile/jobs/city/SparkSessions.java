package org.thermotile.jobs.city;

import java.io.IOException;
import java.net.InetSocketAddress;
import java.net.Socket;
import java.util.ArrayList;
import java.util.List;
import org.apache.spark.sql.SparkSession;
import org.thermotile.jobs.errors.UserInputException;

/**
 * The one place a SparkSession is made: embedded {@code local[*]} unless a master is given, either
 * with {@code --master} or by {@code spark-submit} (which sets the {@code spark.master} property).
 */
public final class SparkSessions {
    private SparkSessions() {}

    /** How long to try to open a TCP connection to each {@code spark://} master [ms] (our choice). */
    static final int CONNECT_TIMEOUT_MS = 5_000;

    /** Broadcast block (and buffer chunk) size: below half of G1's smallest region (1 MB). */
    static final String BROADCAST_BLOCK = "256k";

    /** Tungsten page of the sorts before partitioned writes: below half of G1's smallest region. */
    static final String SORT_PAGE = "256k";

    /**
     * Spark settings that decide the output bytes; set whatever the submitter gave, so a cluster
     * run writes the same files as an embedded one.
     */
    private static final String[][] FIXED = {
        {"spark.sql.parquet.compression.codec", "snappy"},
        {"spark.sql.sources.commitProtocolClass",
            "org.apache.spark.sql.execution.datasources.SQLHadoopMapReduceCommitProtocol"},
        {"spark.hadoop.mapreduce.fileoutputcommitter.marksuccessfuljobs", "true"},
    };

    /** Defaults a submitter may override with {@code --conf} (a cluster user may want the UI). */
    private static final String[][] DEFAULTS = {
        {"spark.ui.enabled", "false"},
        {"spark.ui.showConsoleProgress", "false"},
        {"spark.sql.shuffle.partitions", "4"},
        // Memory flat in hours: Spark's defaults allocate one 4 MB buffer per broadcast (every job's
        // task binary is one) and up to 64 MB sort pages for the partitioned table writes. Under G1
        // with a few-GB heap (2 MB regions) each of these is a humongous object, which starts a
        // concurrent cycle and makes G1 grow the heap; a city run has hundreds of jobs (one per batch
        // of tile totals, per map strip), so the committed heap and the resident set grew with the
        // length of the run, not with what it holds. Below half a region they are plain young
        // objects. Neither setting changes a byte of the outputs (checked on a synthetic city's maps
        // and tables, see BENCHMARKS.md).
        {"spark.broadcast.blockSize", BROADCAST_BLOCK},
        {"spark.buffer.pageSize", SORT_PAGE},
    };


    /**
     * A session on {@code master} (null = the {@code spark.master} property if set, else embedded
     * with {@code threads} threads, 0 = all cores). Spark's UI is off unless asked for, and its
     * logging stays at WARN (log4j2.properties). Embedded sessions bind the driver to
     * {@code SPARK_LOCAL_IP} (default 127.0.0.1); on a cluster Spark's own rules apply, so
     * executors on other hosts can reach the driver.
     *
     * @throws UserInputException if a {@code spark://} master does not accept a connection
     *                            within {@value #CONNECT_TIMEOUT_MS} ms
     */
    public static SparkSession get(String master, int threads) {
        String m = master != null ? master
                : System.getProperty("spark.master") != null ? System.getProperty("spark.master")
                : threads > 0 ? "local[" + threads + "]" : "local[*]";
        boolean local = m.startsWith("local");
        if (m.startsWith("spark://")) {
            checkReachable(m);
        }
        SparkSession.Builder b = SparkSession.builder().appName("thermotile").master(m);
        for (String[] kv : DEFAULTS) {
            if (System.getProperty(kv[0]) == null) {
                b.config(kv[0], kv[1]);
            }
        }
        if (local) {
            b.config("spark.driver.host", System.getenv().getOrDefault("SPARK_LOCAL_IP", "127.0.0.1"));
        }
        for (String[] kv : FIXED) {
            b.config(kv[0], kv[1]);
        }
        return b.getOrCreate();
    }

    /** Spark setting: how long a cluster run waits for its first executor [s]. */
    static final String EXECUTOR_WAIT_KEY = "spark.thermotile.executorWaitSeconds";

    /** Default of {@value #EXECUTOR_WAIT_KEY} [s] (our choice: YARN and Kubernetes may queue a while). */
    static final long EXECUTOR_WAIT_DEFAULT_S = 180;

    /**
     * On a cluster, waits until at least one executor has registered, at most
     * {@value #EXECUTOR_WAIT_KEY} seconds; Spark alone would wait for ever when no worker can
     * give the run the cores and memory it asks for. Returns at once for embedded sessions and
     * with dynamic allocation (which starts executors only once tasks are waiting).
     *
     * @throws IllegalStateException naming the master and the resources asked for, on timeout
     */
    public static void awaitExecutors(SparkSession spark) {
        org.apache.spark.SparkContext sc = spark.sparkContext();
        if (sc.isLocal() || sc.getConf().getBoolean("spark.dynamicAllocation.enabled", false)) {
            return;
        }
        long waitS = sc.getConf().getLong(EXECUTOR_WAIT_KEY, EXECUTOR_WAIT_DEFAULT_S);
        long end = System.nanoTime() + waitS * 1_000_000_000L;
        while (sc.statusTracker().getExecutorInfos().length < 2) {     // the driver counts as one
            if (System.nanoTime() > end) {
                throw new IllegalStateException("the Spark master " + sc.master() + " gave this run no executor within "
                        + waitS + " s (asked for spark.executor.memory=" + sc.getConf().get("spark.executor.memory", "1g")
                        + ", spark.executor.cores=" + sc.getConf().get("spark.executor.cores", "all of a worker's")
                        + "). Fix: check that workers are registered and have that much free memory and cores, "
                        + "or lower the request; " + EXECUTOR_WAIT_KEY + " sets this wait");
            }
            try {
                Thread.sleep(200);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted while waiting for executors", e);
            }
        }
    }

    /**
     * Opens (and closes) a TCP connection to each master of a {@code spark://host:port[,host:port]}
     * URL; Spark itself would retry for about a minute and then leave the job waiting.
     */
    static void checkReachable(String url) {
        List<String> failures = new ArrayList<>();
        for (String hp : url.substring("spark://".length()).split(",")) {
            int colon = hp.lastIndexOf(':');
            String host = colon < 0 ? hp : hp.substring(0, colon);
            int port;
            try {
                port = colon < 0 ? 7077 : Integer.parseInt(hp.substring(colon + 1));
            } catch (NumberFormatException e) {
                throw new UserInputException("--master " + url + ": '" + hp.substring(colon + 1)
                        + "' is not a port number. Fix: write the master as spark://HOST:PORT (default port 7077)");
            }
            try (Socket s = new Socket()) {
                s.connect(new InetSocketAddress(host, port), CONNECT_TIMEOUT_MS);
                return;
            } catch (IOException e) {
                failures.add(host + ":" + port + " (" + e.getMessage() + ")");
            }
        }
        throw new UserInputException("--master " + url + ": no Spark master answered within "
                + CONNECT_TIMEOUT_MS / 1000 + " s at " + String.join(", ", failures)
                + ". Fix: check the URL against the master's log line 'Starting Spark master at spark://HOST:PORT' "
                + "and that the master is running and reachable from this machine");
    }
}
