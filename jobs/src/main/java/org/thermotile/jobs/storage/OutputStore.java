package org.thermotile.jobs.storage;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.apache.hadoop.conf.Configuration;
import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.fs.FileUtil;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.storage.Folders;

/**
 * Outputs on a Hadoop file system ({@code hdfs://}, {@code s3a://} with the S3 connector, …).
 *
 * <p>The GeoTIFF writer needs a seekable local file and the Parquet footers are made canonical in
 * place, neither of which a write-once file system allows. So a run whose output folder is a
 * Hadoop URI builds its folder in a local <em>staging</em> folder on the driver, mirrored on the
 * target file system by a temporary sibling {@code .NAME.partial}:
 * <ul>
 *   <li>what Spark writes (the Parquet tables) goes to the mirror, through Spark's commit protocol,
 *       and is then copied into the staging folder ({@link #pull}), where the part files are
 *       renamed and their footers made canonical as in a local run;</li>
 *   <li>what the driver writes (maps, manifest, comparison, report) is written in the staging
 *       folder; a file the executors must read (a map, for hot spots) is copied to the mirror
 *       first ({@link #push}) and read from there ({@link #executorLocation});</li>
 *   <li>when everything succeeded, {@link #publish} replaces the mirror with the staging folder and
 *       renames it to the output folder: the outputs become visible at once, with the same bytes
 *       as a local run.</li>
 * </ul>
 * The driver's memory stays flat (files are streamed); its local disk holds one run's outputs.
 * Code that writes or reads through Spark asks {@link #sparkUri} for the location of a staging
 * path; for an ordinary local run that is the path itself.
 */
public final class OutputStore {
    private OutputStore() {}

    /** Staging folder → URI of its mirror on the target file system. */
    private static final Map<Path, String> MIRRORS = new ConcurrentHashMap<>();

    /** True for an output location that is a Hadoop URI (not a path, not {@code file:}). */
    public static boolean isRemote(String location) {
        return InputStaging.isRemote(location);
    }

    /** Routes Spark's reads and writes under {@code staging} to {@code remote} until {@link #forget}. */
    public static void mirror(Path staging, String remote) {
        MIRRORS.put(staging.toAbsolutePath().normalize(), trimSlash(remote));
    }

    public static void forget(Path staging) {
        MIRRORS.remove(staging.toAbsolutePath().normalize());
    }

    /** The location Spark reads or writes for {@code local}: its mirror's URI, or the local URI. */
    public static String sparkUri(Path local) {
        String m = mirrored(local);
        return m != null ? m : localUri(local);
    }

    /**
     * A local path as the location string Spark and Hadoop read: {@code file://} and the absolute
     * path as it is. Not {@link Path#toUri}: Hadoop's {@code Path(String)} would keep its
     * percent-escapes literally, so a folder with a space ({@code %20}) or a non-ASCII letter in its
     * name would be written beside, not into, the folder asked for.
     */
    public static String localUri(Path local) {
        return "file://" + local.toAbsolutePath().normalize().toString().replace('\\', '/');
    }

    /** Where a task opens a file the driver wrote under a staging folder: its mirror's URI or the path. */
    public static String executorLocation(Path local) {
        String m = mirrored(local);
        return m != null ? m : local.toString();
    }

    /** The mirror's URI for a path under a staging folder, or null. */
    private static String mirrored(Path local) {
        Path p = local.toAbsolutePath().normalize();
        for (Map.Entry<Path, String> e : MIRRORS.entrySet()) {
            if (p.startsWith(e.getKey())) {
                String rel = e.getKey().relativize(p).toString().replace('\\', '/');
                return rel.isEmpty() ? e.getValue() : e.getValue() + "/" + rel;
            }
        }
        return null;
    }

    /** After Spark wrote {@link #sparkUri}{@code (localDir)}: copies it into {@code localDir}. No-op for local runs. */
    public static void pull(Path localDir) {
        String remote = mirrored(localDir);
        if (remote == null) {
            return;
        }
        try {
            Configuration conf = InputStaging.configuration();
            FileSystem fs = FileSystem.get(URI.create(remote), conf);
            Folders.deleteTree(localDir);
            Files.createDirectories(localDir.getParent());
            // The raw local file system: no .crc side files in the staging folder.
            FileSystem local = FileSystem.getLocal(conf).getRawFileSystem();
            if (!FileUtil.copy(fs, new org.apache.hadoop.fs.Path(remote), local,
                    new org.apache.hadoop.fs.Path(localDir.toUri()), false, conf)) {
                throw new IOException("copy returned false");
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot copy " + remote + " into the staging folder " + localDir, e);
        }
    }

    /** Copies a file (or folder) the driver wrote under a staging folder to its mirror. No-op for local runs. */
    public static void push(Path local) {
        String remote = mirrored(local);
        if (remote == null) {
            return;
        }
        try {
            FileSystem fs = FileSystem.get(URI.create(remote), InputStaging.configuration());
            fs.copyFromLocalFile(false, true, new org.apache.hadoop.fs.Path(local.toUri()),
                    new org.apache.hadoop.fs.Path(remote));
        } catch (IOException e) {
            throw new UncheckedIOException("cannot copy " + local + " to " + remote, e);
        }
    }

    /** Whether {@code uri} exists on its file system. */
    public static boolean exists(String uri) {
        try {
            return fileSystem(uri).exists(new org.apache.hadoop.fs.Path(uri));
        } catch (IOException | RuntimeException e) {   // Hadoop wraps a missing connector class in a RuntimeException
            throw unreachable(uri, e);
        }
    }

    /** Deletes {@code uri} (recursively) if it exists. */
    public static void delete(String uri) {
        try {
            fileSystem(uri).delete(new org.apache.hadoop.fs.Path(uri), true);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot delete " + uri, e);
        }
    }

    /**
     * Deletes the mirrors {@code .NAME.N.partial} (N: a run's number) beside {@code target} that
     * runs killed before their clean-up left behind. Only for a caller holding {@code target}'s lock
     * ({@link RunLock#acquireRemote}): no live run of {@code target} owns one then.
     */
    public static void deleteStaleMirrors(String target) {
        String name = target.substring(target.lastIndexOf('/') + 1);
        org.apache.hadoop.fs.Path parent = new org.apache.hadoop.fs.Path(target).getParent();
        // The run's own number only (digits, from its local staging folder's name): not .NAME.x.N.partial,
        // which is the mirror of the folder NAME.x, under a lock of its own.
        java.util.regex.Pattern mirror = java.util.regex.Pattern.compile("\\." + java.util.regex.Pattern.quote(name)
                + "\\.[0-9]+\\.partial");
        try {
            FileSystem fs = fileSystem(target);
            if (parent == null || !fs.exists(parent)) {
                return;
            }
            for (org.apache.hadoop.fs.FileStatus st : fs.listStatus(parent)) {
                String n = st.getPath().getName();
                if (mirror.matcher(n).matches()) {
                    fs.delete(st.getPath(), true);
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot remove the unfinished mirrors beside " + target, e);
        }
    }

    /**
     * Replaces {@code partial} with the staging folder's content and renames it to {@code target}
     * (deleting an older {@code target} first): the last step of a run on a Hadoop file system.
     */
    public static void publish(Path staging, String partial, String target) {
        try {
            FileSystem fs = fileSystem(target);
            org.apache.hadoop.fs.Path p = new org.apache.hadoop.fs.Path(partial);
            org.apache.hadoop.fs.Path t = new org.apache.hadoop.fs.Path(target);
            fs.delete(p, true);
            fs.mkdirs(p.getParent());
            fs.copyFromLocalFile(false, true, new org.apache.hadoop.fs.Path(staging.toUri()), p);
            if (fs.exists(t)) {
                fs.delete(t, true);
            }
            if (!fs.rename(p, t)) {
                throw new IOException("rename " + partial + " → " + target + " refused");
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot publish the run to " + target, e);
        }
    }

    private static FileSystem fileSystem(String uri) throws IOException {
        return FileSystem.get(URI.create(uri), InputStaging.configuration());
    }

    static UserInputException unreachable(String uri, Exception e) {
        return new UserInputException("--out " + uri + ": the file system cannot be reached (" + e.getMessage()
                + "). Fix: check the URI, that the name node is up and reachable from the driver, and for s3a:// "
                + "that the S3 connector (hadoop-aws) is on the class path", e);
    }

    private static String trimSlash(String s) {
        return s.endsWith("/") ? s.substring(0, s.length() - 1) : s;
    }
}
