package org.thermotile.jobs.storage;

import java.io.FileNotFoundException;
import java.io.IOException;
import java.io.PrintStream;
import java.net.InetAddress;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;
import org.apache.hadoop.conf.Configuration;
import org.apache.hadoop.fs.FSDataInputStream;
import org.apache.hadoop.fs.FSDataOutputStream;
import org.apache.hadoop.fs.FileSystem;
import org.thermotile.jobs.errors.UserInputException;

/**
 * One command at a time per output folder. A command that writes or reads a run folder
 * {@code DIR} first creates {@code .DIR.lock} beside it (next to the staging folder
 * {@code .DIR.partial}) if it is absent, in one step of the file system: of two commands started
 * at once exactly one gets the lock. The file holds the holder's PID, host, start time and
 * command line, one {@code key=value} a line.
 *
 * <p>A lock whose holder is gone is <em>stale</em>: its host is this host and no process of its
 * PID is alive (or the process of that PID started after the lock was written, so the PID was
 * reused). A stale lock is reported and taken over. A lock of another host cannot be checked from
 * here and is respected; its message says how to remove it.
 *
 * <p>Where the lock file lives is a {@link Store}: a local folder ({@link #acquire(Path, String,
 * PrintStream)}, created with {@link StandardOpenOption#CREATE_NEW}), or a Hadoop file system
 * ({@link #acquireRemote}, created with {@code FileSystem.create(path, false)}). The content, the
 * stale rules and the messages are the same for both. How atomic the Hadoop create is depends on
 * the store:
 * <ul>
 *   <li>{@code hdfs://}: atomic. The name node creates the file only if no file of that name
 *       exists, also one still being written, and refuses the second create with a
 *       {@code FileAlreadyExistsException}.</li>
 *   <li>{@code s3a://} (from memory, not checked against the connector's documentation): not
 *       atomic in the connectors before S3's conditional writes. {@code create(path, false)} looks
 *       for the object first and the object appears only when the stream is closed, so two runs
 *       started within that moment may both get the lock. Newer connectors can send the upload
 *       with {@code If-None-Match: *} (HADOOP-19256), which S3 refuses if the object exists;
 *       whether that is used depends on the connector version and its settings. On S3 the lock
 *       guards against a second run started by mistake later, not against two started in the same
 *       second.</li>
 *   <li>{@code file://} through Hadoop (the tests): Hadoop's local file system checks for the file
 *       and then creates it, not atomic either; local output folders use {@link #acquire(Path,
 *       String, PrintStream)}, which is.</li>
 * </ul>
 */
public final class RunLock implements AutoCloseable {
    /** The lock file: where it is, and the three operations a lock needs. */
    interface Store {
        /** The lock file's path or URI, for messages. */
        String location();

        /** Creates the lock file holding {@code content} if there is none; false if there is one. */
        boolean createNew(String content) throws IOException;

        /** The lock file's content, or null if there is none. */
        String read() throws IOException;

        /** Deletes the lock file if there is one. */
        void delete() throws IOException;

        /** How to remove a lock by hand, e.g. "delete /runs/.x.lock". */
        String removeHint();

        /** A failure to create, read or delete the lock file, with its fix. */
        UserInputException cannotWrite(IOException e);

        /** Lets go of what the store holds open (a Hadoop file system). */
        default void close() {}
    }

    private final Store store;
    private final String content;
    private volatile boolean released;

    private RunLock(Store store, String content) {
        this.store = store;
        this.content = content;
    }

    /** The lock file of a run folder: {@code .NAME.lock} in its parent. */
    public static Path fileOf(Path runDir) {
        Path dir = runDir.toAbsolutePath().normalize();
        Path parent = dir.getParent() == null ? dir : dir.getParent();
        return parent.resolve("." + (dir.getFileName() == null ? "root" : dir.getFileName().toString()) + ".lock");
    }

    /** The lock file of a run folder on a Hadoop file system: {@code .NAME.lock} beside it. */
    public static String uriOf(String runUri) {
        String u = runUri.endsWith("/") ? runUri.substring(0, runUri.length() - 1) : runUri;
        int slash = u.lastIndexOf('/');
        return u.substring(0, slash + 1) + "." + u.substring(slash + 1) + ".lock";
    }

    /**
     * Takes the lock of {@code runDir} for {@code command} (e.g. "run city.yaml --out x"), creating
     * the parent folder if needed.
     *
     * @param warnings where a stale lock taken over is reported
     * @throws UserInputException if a live command holds it, naming it and the fix
     */
    public static RunLock acquire(Path runDir, String command, PrintStream warnings) {
        return acquire(new LocalStore(fileOf(runDir)), runDir.toString(), command, warnings);
    }

    /**
     * Takes the lock of the run folder {@code runUri} on a Hadoop file system ({@code hdfs://},
     * {@code s3a://}, …), as {@link #acquire(Path, String, PrintStream)} does for a local folder;
     * the lock file is {@link #uriOf}{@code (runUri)}. See the class comment for how atomic this is
     * on each kind of store.
     *
     * @throws UserInputException if a live command holds it, or if the file system cannot be reached
     */
    public static RunLock acquireRemote(String runUri, String command, PrintStream warnings) {
        return acquire(HadoopStore.of(runUri), runUri, command, warnings);
    }

    static RunLock acquire(Store store, String what, String command, PrintStream warnings) {
        String mine = describeThisProcess(command);
        try {
            for (int attempt = 0; attempt < 3; attempt++) {
                try {
                    if (store.createNew(mine)) {
                        return new RunLock(store, mine);
                    }
                    String text = store.read();
                    if (text == null) {
                        continue;                      // released between our attempt and the read: try again
                    }
                    Map<String, String> held = parse(text);
                    if (!isStale(held)) {
                        throw new UserInputException(what + " is in use by another thermotile command: "
                                + holder(held) + ". Fix: wait until it ends, stop it (kill "
                                + held.getOrDefault("pid", "PID") + " on that host), or choose another --out folder; "
                                + "if it is surely not running, " + store.removeHint());
                    }
                    warnings.println("warning: taking over the stale lock " + store.location() + " of " + holder(held)
                            + ": that process is no longer running; whatever it left in its staging folder is removed");
                    store.delete();
                } catch (IOException e) {
                    throw store.cannotWrite(e);
                }
            }
        } catch (RuntimeException e) {
            store.close();
            throw e;
        }
        store.close();
        throw new UserInputException("cannot take the lock " + store.location() + ": other thermotile commands keep "
                + "taking it. Fix: run one command at a time on " + what);
    }

    /** "thermotile run x.yaml --out y (PID 12 on host, since 2026-07-01T10:00:00Z)". */
    private static String holder(Map<String, String> held) {
        return held.getOrDefault("command", "?") + " (PID " + held.getOrDefault("pid", "?") + " on "
                + held.getOrDefault("host", "?") + ", since " + held.getOrDefault("started", "?") + ")";
    }

    /** Deletes the lock file if it is still ours; safe to call more than once and from a shutdown hook. */
    public synchronized void release() {
        if (released) {
            return;
        }
        released = true;
        try {
            if (content.equals(store.read())) {
                store.delete();
            }
        } catch (IOException | RuntimeException ignored) {
            // the folder vanished, became read-only or cannot be reached: nothing more can be done
        } finally {
            store.close();
        }
    }

    @Override
    public void close() {
        release();
    }

    /** The local lock file, or null for a lock on a Hadoop file system (see {@link #location}). */
    public Path file() {
        return store instanceof LocalStore l ? l.file : null;
    }

    /** The lock file's path or URI. */
    public String location() {
        return store.location();
    }

    /** A lock file's fields ({@code key=value} lines; other lines are skipped). */
    static Map<String, String> parse(String text) {
        Map<String, String> m = new LinkedHashMap<>();
        for (String l : text.split("\n")) {
            int eq = l.indexOf('=');
            if (eq > 0) {
                m.put(l.substring(0, eq), l.substring(eq + 1).strip());
            }
        }
        return m;
    }

    /** Stale: written on this host by a process that is no longer alive (or whose PID was reused). */
    static boolean isStale(Map<String, String> held) {
        if (!host().equals(held.get("host"))) {
            return false;
        }
        long pid;
        try {
            pid = Long.parseLong(held.getOrDefault("pid", ""));
        } catch (NumberFormatException e) {
            return true;                                   // not a lock we can read: written half, by a crash
        }
        Optional<ProcessHandle> h = ProcessHandle.of(pid);
        if (h.isEmpty() || !h.get().isAlive()) {
            return true;
        }
        try {
            Instant started = Instant.parse(held.getOrDefault("started", ""));
            Optional<Instant> procStart = h.get().info().startInstant();
            // A process started after the lock was written cannot be its holder (PID reuse); 2 s of slack
            // for clock granularity.
            return procStart.isPresent() && procStart.get().isAfter(started.plusSeconds(2));
        } catch (RuntimeException e) {
            return false;
        }
    }

    static String describeThisProcess(String command) {
        return "pid=" + ProcessHandle.current().pid() + "\nhost=" + host() + "\nstarted="
                + Instant.now().truncatedTo(ChronoUnit.SECONDS) + "\ncommand=thermotile "
                + command.replace('\n', ' ') + "\n";
    }

    static String host() {
        try {
            return InetAddress.getLocalHost().getHostName();
        } catch (IOException e) {
            return "localhost";
        }
    }

    /** A lock file in a local folder. */
    static final class LocalStore implements Store {
        final Path file;

        LocalStore(Path file) {
            this.file = file;
        }

        @Override
        public String location() {
            return file.toString();
        }

        @Override
        public boolean createNew(String content) throws IOException {
            Files.createDirectories(file.getParent());
            try {
                Files.writeString(file, content, StandardCharsets.UTF_8, StandardOpenOption.CREATE_NEW,
                        StandardOpenOption.WRITE);
                return true;
            } catch (FileAlreadyExistsException e) {
                return false;
            }
        }

        @Override
        public String read() throws IOException {
            try {
                return Files.readString(file, StandardCharsets.UTF_8);
            } catch (NoSuchFileException e) {
                return null;
            }
        }

        @Override
        public void delete() throws IOException {
            Files.deleteIfExists(file);
        }

        @Override
        public String removeHint() {
            return "delete " + file;
        }

        @Override
        public UserInputException cannotWrite(IOException e) {
            return new UserInputException("cannot write the lock file " + file + " (" + Diagnose.reason(e)
                    + "). Fix: " + Diagnose.fix(file.getParent()), e);
        }
    }

    /**
     * A lock file on a Hadoop file system. Its {@code FileSystem} is an instance of its own, not
     * Hadoop's shared cached one, so that Hadoop's shutdown hook (which closes the cached ones)
     * cannot close it under a stopped run's release; {@link #close} closes it.
     */
    static final class HadoopStore implements Store {
        final String uri;
        private final FileSystem fs;
        private final org.apache.hadoop.fs.Path path;

        private HadoopStore(String uri, FileSystem fs) {
            this.uri = uri;
            this.fs = fs;
            this.path = new org.apache.hadoop.fs.Path(uri);
        }

        /** The store of the lock of {@code runUri}; a file system that cannot be reached is named with the fix. */
        static HadoopStore of(String runUri) {
            String lock = uriOf(runUri);
            URI u = URI.create(lock);
            Configuration conf = new Configuration(InputStaging.configuration());
            if (u.getScheme() != null) {
                conf.setBoolean("fs." + u.getScheme() + ".impl.disable.cache", true);
            }
            try {
                return new HadoopStore(lock, FileSystem.get(u, conf));
            } catch (IOException | RuntimeException e) {   // a missing connector comes as either
                throw OutputStore.unreachable(runUri, e);
            }
        }

        @Override
        public String location() {
            return uri;
        }

        @Override
        public boolean createNew(String content) throws IOException {
            try (FSDataOutputStream out = fs.create(path, false)) {
                out.write(content.getBytes(StandardCharsets.UTF_8));
                return true;
            } catch (org.apache.hadoop.fs.FileAlreadyExistsException e) {
                return false;
            } catch (IOException e) {
                // HDFS refuses a file another client is still writing with AlreadyBeingCreatedException
                // (an HDFS client class, not named here): that lock exists too.
                if (fs.exists(path)) {
                    return false;
                }
                throw e;
            }
        }

        @Override
        public String read() throws IOException {
            try (FSDataInputStream in = fs.open(path)) {
                return new String(in.readAllBytes(), StandardCharsets.UTF_8);
            } catch (FileNotFoundException e) {
                return null;
            }
        }

        @Override
        public void delete() throws IOException {
            fs.delete(path, false);
        }

        @Override
        public String removeHint() {
            String tool = "hdfs".equalsIgnoreCase(path.toUri().getScheme()) ? "hdfs dfs" : "hadoop fs";
            return "remove the lock with " + tool + " -rm " + uri;
        }

        @Override
        public UserInputException cannotWrite(IOException e) {
            String parent = uri.substring(0, uri.lastIndexOf('/') + 1);
            return new UserInputException("cannot write the lock file " + uri + " (" + e.getMessage() + "). Fix: check "
                    + "that the file system is reachable from the driver and that you may write in " + parent
                    + " (hadoop fs -ls " + parent + ")", e);
        }

        @Override
        public void close() {
            try {
                fs.close();
            } catch (IOException ignored) {
                // nothing is left to write through it
            }
        }
    }
}
