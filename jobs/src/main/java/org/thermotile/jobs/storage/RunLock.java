package org.thermotile.jobs.storage;

import java.io.IOException;
import java.io.PrintStream;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.nio.charset.StandardCharsets;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.thermotile.jobs.errors.UserInputException;

/**
 * One command at a time per output folder. A command that writes or reads a run folder
 * {@code DIR} first creates {@code .DIR.lock} beside it (next to the staging folder
 * {@code .DIR.partial}) with {@link StandardOpenOption#CREATE_NEW}, which the file system does
 * atomically: of two commands started at once exactly one gets the lock. The file holds the
 * holder's PID, host, start time and command line, one {@code key=value} a line.
 *
 * <p>A lock whose holder is gone is <em>stale</em>: its host is this host and no process of its
 * PID is alive (or the process of that PID started after the lock was written, so the PID was
 * reused). A stale lock is reported and taken over. A lock of another host cannot be checked from
 * here and is respected; its message says how to remove it.
 */
public final class RunLock implements AutoCloseable {
    private final Path file;
    private final String content;
    private volatile boolean released;

    private RunLock(Path file, String content) {
        this.file = file;
        this.content = content;
    }

    /** A lock that holds nothing (outputs on a Hadoop file system, where no lock file is kept). */
    public static RunLock none() {
        RunLock l = new RunLock(null, "");
        l.released = true;
        return l;
    }

    /** The lock file of a run folder: {@code .NAME.lock} in its parent. */
    public static Path fileOf(Path runDir) {
        Path dir = runDir.toAbsolutePath().normalize();
        Path parent = dir.getParent() == null ? dir : dir.getParent();
        return parent.resolve("." + (dir.getFileName() == null ? "root" : dir.getFileName().toString()) + ".lock");
    }

    /**
     * Takes the lock of {@code runDir} for {@code command} (e.g. "run city.yaml --out x"), creating
     * the parent folder if needed.
     *
     * @param warnings where a stale lock taken over is reported
     * @throws UserInputException if a live command holds it, naming it and the fix
     */
    public static RunLock acquire(Path runDir, String command, PrintStream warnings) {
        Path f = fileOf(runDir);
        String mine = describeThisProcess(command);
        for (int attempt = 0; attempt < 3; attempt++) {
            try {
                Files.createDirectories(f.getParent());
                Files.writeString(f, mine, StandardCharsets.UTF_8, StandardOpenOption.CREATE_NEW,
                        StandardOpenOption.WRITE);
                return new RunLock(f, mine);
            } catch (FileAlreadyExistsException e) {
                Map<String, String> held = read(f);
                if (held == null) {
                    continue;                      // released between our attempt and the read: try again
                }
                if (!isStale(held)) {
                    throw new UserInputException(runDir + " is in use by another thermotile command: "
                            + held.getOrDefault("command", "?") + " (PID " + held.getOrDefault("pid", "?") + " on "
                            + held.getOrDefault("host", "?") + ", since " + held.getOrDefault("started", "?")
                            + "). Fix: wait until it ends, stop it (kill " + held.getOrDefault("pid", "PID")
                            + " on that host), or choose another --out folder; if it is surely not running, delete "
                            + f);
                }
                warnings.println("warning: taking over the stale lock " + f + " of "
                        + held.getOrDefault("command", "?") + " (PID " + held.getOrDefault("pid", "?") + " on "
                        + held.getOrDefault("host", "?") + ", since " + held.getOrDefault("started", "?")
                        + "): that process is no longer running; whatever it left in its staging folder is removed");
                try {
                    Files.deleteIfExists(f);
                } catch (IOException d) {
                    throw cannotWrite(f, d);
                }
            } catch (IOException e) {
                throw cannotWrite(f, e);
            }
        }
        throw new UserInputException("cannot take the lock " + f + ": other thermotile commands keep taking it. "
                + "Fix: run one command at a time on " + runDir);
    }

    private static UserInputException cannotWrite(Path f, IOException e) {
        return new UserInputException("cannot write the lock file " + f + " (" + Diagnose.reason(e)
                + "). Fix: " + Diagnose.fix(f.getParent()), e);
    }

    /** Deletes the lock file if it is still ours; safe to call more than once and from a shutdown hook. */
    public synchronized void release() {
        if (released) {
            return;
        }
        released = true;
        try {
            if (Files.isRegularFile(file) && content.equals(Files.readString(file, StandardCharsets.UTF_8))) {
                Files.delete(file);
            }
        } catch (IOException ignored) {
            // the folder vanished or became read-only: nothing more can be done
        }
    }

    @Override
    public void close() {
        release();
    }

    public Path file() {
        return file;
    }

    /** The lock file's fields, or null if it vanished. */
    static Map<String, String> read(Path f) {
        List<String> lines;
        try {
            lines = Files.readAllLines(f, StandardCharsets.UTF_8);
        } catch (NoSuchFileException e) {
            return null;
        } catch (IOException e) {
            throw cannotWrite(f, e);
        }
        Map<String, String> m = new LinkedHashMap<>();
        for (String l : lines) {
            int eq = l.indexOf('=');
            if (eq > 0) {
                m.put(l.substring(0, eq), l.substring(eq + 1));
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
}
