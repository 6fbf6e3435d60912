package org.thermotile.jobs.storage;

import java.io.IOException;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Comparator;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.stream.Stream;
import org.apache.hadoop.conf.Configuration;
import org.apache.hadoop.fs.FileSystem;
import org.thermotile.jobs.errors.UserInputException;

/**
 * Inputs on a Hadoop file system ({@code hdfs://}, {@code s3a://} with the S3 connector, …): the
 * driver copies each once into a local folder of this JVM, so the readers (which need a local,
 * seekable file: Apache SIS's GeoTIFF store and the TIFF directory reader take a
 * {@link java.nio.file.Path}) work unchanged. Executors get the land cover through Spark's own
 * file distribution ({@code SparkContext.addFile}, fetched from the same URI by each executor
 * once) and read their tiles' windows from that copy.
 *
 * <p>The Hadoop configuration is the default one (core-site.xml and hdfs-site.xml on the class
 * path, i.e. {@code HADOOP_CONF_DIR} under spark-submit) plus every {@code spark.hadoop.*}
 * property this JVM was given.
 */
public final class InputStaging {
    private InputStaging() {}

    private static final Map<String, Path> STAGED = new ConcurrentHashMap<>();
    private static Path folder;

    /** True for a URI with a scheme other than {@code file:} (a location the readers cannot open). */
    public static boolean isRemote(String location) {
        return location.matches("^[A-Za-z][A-Za-z0-9+.-]+://.*") && !location.regionMatches(true, 0, "file:", 0, 5);
    }

    /** The last path element of a URI (the name Spark's file distribution keeps). */
    public static String fileName(String location) {
        String p = URI.create(location).getPath();
        return p.substring(p.lastIndexOf('/') + 1);
    }

    /** A local copy of {@code location} (copied on the first call for that location in this JVM). */
    public static Path local(String location, String key) {
        return STAGED.computeIfAbsent(location, l -> copy(l, key));
    }

    private static Path copy(String location, String key) {
        URI uri = URI.create(location);
        try {
            Path dir = Files.createDirectories(folder().resolve(Integer.toString(STAGED.size())));
            Path target = dir.resolve(fileName(location));
            FileSystem fs = FileSystem.get(uri, configuration());
            org.apache.hadoop.fs.Path src = new org.apache.hadoop.fs.Path(uri);
            if (!fs.exists(src)) {
                throw new UserInputException(key + ": " + location + " not found. Fix: check the URI, e.g. with "
                        + "hadoop fs -ls " + location);
            }
            fs.copyToLocalFile(false, src, new org.apache.hadoop.fs.Path(target.toUri()), true);
            return target;
        } catch (IOException | RuntimeException e) {   // a missing connector class comes as a RuntimeException
            if (e instanceof UserInputException u) {
                throw u;
            }
            throw new UserInputException(key + ": " + location + " cannot be read: " + e.getMessage()
                    + ". Fix: check the URI, that the file system is reachable from the driver and, for s3a://, "
                    + "that the S3 connector (hadoop-aws) is on the class path", e);
        }
    }

    /** The default Hadoop configuration plus this JVM's {@code spark.hadoop.*} properties. */
    public static Configuration configuration() {
        Configuration c = new Configuration();
        for (String k : System.getProperties().stringPropertyNames()) {
            if (k.startsWith("spark.hadoop.")) {
                c.set(k.substring("spark.hadoop.".length()), System.getProperty(k));
            }
        }
        return c;
    }

    private static synchronized Path folder() throws IOException {
        if (folder == null) {
            Path f = Files.createTempDirectory("thermotile-inputs-");
            Runtime.getRuntime().addShutdownHook(new Thread(() -> {
                try (Stream<Path> s = Files.walk(f)) {
                    s.sorted(Comparator.reverseOrder()).forEach(q -> q.toFile().delete());
                } catch (IOException ignored) {
                    // best effort at exit
                }
            }));
            folder = f;
        }
        return folder;
    }

    /**
     * A local path from a run-file location: a path, a {@code file:} URI, or a Hadoop URI
     * ({@code hdfs://}, {@code s3a://}, …) whose file is copied to a local folder first
     * ({@link #local}); {@code key} names the run-file key in messages.
     */
    public static Path localPath(String location, String key) {
        if (location == null) {
            throw new UserInputException("run file: " + key + " is missing");
        }
        if (location.startsWith("file:")) {
            return readable(Path.of(java.net.URI.create(location)), key);
        }
        if (isRemote(location)) {
            return local(location, key);
        }
        return readable(Path.of(location), key);
    }

    /** {@code p}, after checking that a file that is there may be read (a missing one has its own message). */
    private static Path readable(Path p, String key) {
        Diagnose.checkReadable(p, "run file: " + key);
        return p;
    }
}
