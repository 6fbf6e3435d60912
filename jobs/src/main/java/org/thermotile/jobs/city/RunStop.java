package org.thermotile.jobs.city;

import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.apache.spark.sql.SparkSession;
import org.thermotile.jobs.storage.Folders;
import org.thermotile.jobs.storage.OutputStore;
import org.thermotile.jobs.storage.RunLock;

/**
 * What a run does when it is stopped (SIGINT, SIGTERM: the JVM runs its shutdown hooks): cancel
 * the Spark jobs, wait a moment for the run's own clean-up, remove the staging folder and its
 * mirror, release the folder's lock, and say what was kept and how to go on.
 *
 * <p>The staging folder is removed, not kept for {@code --resume}: {@code --resume} trusts only
 * partitions listed, with their input hashes, in a published run's {@code manifest.json}, and the
 * staging folder of an unfinished run has no manifest. What {@code --resume} can use is the
 * published run already in the output folder (if any), which a stopped run never touches: the
 * older run is deleted only at the publishing rename.
 */
final class RunStop {
    /** How long the hook waits for the run's thread to clean up after the cancel [s] (our choice). */
    static final long WAIT_S = 20;

    /** The signal being handled ("SIGINT", "SIGTERM"), set by the command line's handlers; null if none. */
    static volatile String signal;

    /** True while a stop is being handled, so the command line does not report the cancelled job as a failure. */
    static volatile boolean stopping;

    private final Path out;
    private final Path staging;
    private final String mirror;
    private final RunLock lock;
    private final String resumeCommand;
    private final PrintStream err;
    private final boolean hadOlderRun;
    private final CountDownLatch finished = new CountDownLatch(1);
    private final Thread hook;
    private volatile SparkSession spark;

    private RunStop(Path out, Path staging, String mirror, RunLock lock, String resumeCommand, PrintStream err) {
        this.out = out;
        this.staging = staging;
        this.mirror = mirror;
        this.lock = lock;
        this.resumeCommand = resumeCommand;
        this.err = err;
        this.hadOlderRun = out != null && Files.isRegularFile(out.resolve("manifest.json"));
        this.hook = new Thread(this::onStop, "thermotile-stop");
    }

    /**
     * Registers the stop handling of a run building {@code staging} (and its {@code mirror} URI, or
     * null) for {@code out}; {@link #done} unregisters it.
     */
    static RunStop register(Path out, Path staging, String mirror, RunLock lock, String resumeCommand,
            PrintStream err) {
        RunStop s = new RunStop(out, staging, mirror, lock, resumeCommand, err);
        Runtime.getRuntime().addShutdownHook(s.hook);
        return s;
    }

    /** The session whose jobs a stop cancels. */
    void attach(SparkSession session) {
        this.spark = session;
    }

    /** The run ended (published or failed, its own clean-up done): a later JVM exit is not a stop. */
    void done() {
        finished.countDown();
        try {
            Runtime.getRuntime().removeShutdownHook(hook);
        } catch (IllegalStateException shuttingDown) {
            // the hook is running or about to: it sees the latch and finishes quickly
        }
    }

    private void onStop() {
        if (finished.getCount() == 0) {
            return;                                   // the run had finished; nothing to stop
        }
        stopping = true;
        String sig = signal != null ? signal : "a stop signal";
        err.println("thermotile run: stopping (" + sig + "): cancelling the Spark jobs …");
        err.flush();
        SparkSession s = spark;
        if (s != null) {
            try {
                s.sparkContext().cancelAllJobs();
            } catch (RuntimeException alreadyStopped) {
                // Spark's own shutdown hook may have stopped the context first: the jobs are gone either way
            }
        }
        try {
            finished.await(WAIT_S, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        Folders.deleteQuietly(staging);
        if (mirror != null) {
            try {
                OutputStore.delete(mirror);
            } catch (RuntimeException ignored) {
                // the file system may be unreachable now; the mirror is a hidden sibling, named below
            }
        }
        lock.release();
        StringBuilder m = new StringBuilder();
        m.append("thermotile run: stopped by ").append(sig).append("; nothing of this run was published.\n");
        m.append("  removed: ").append(staging).append(mirror != null ? " and " + mirror : "")
                .append(" (the unfinished outputs: they have no manifest, so --resume could not check them)\n");
        if (out == null) {
            m.append("  kept:    whatever the target held before, untouched (it is replaced only by the publishing "
                    + "rename at the end)\n");
        } else if (hadOlderRun) {
            m.append("  kept:    ").append(out).append(", the earlier run, untouched; --resume keeps its complete "
                    + "scenario partitions whose inputs are unchanged\n");
        } else {
            m.append("  kept:    nothing (").append(out).append(" held no earlier run); the run starts afresh\n");
        }
        m.append("  resume:  ").append(resumeCommand);
        err.println(m);
        err.flush();
    }
}
