package org.thermotile.jobs.storage;

import java.io.IOException;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.Locale;
import org.thermotile.jobs.errors.UserInputException;

/**
 * Turns a failure to write or read a file into a one-line reason and fix: a full disk, a
 * read-only or vanished folder, a file without read permission. Java reports these as
 * {@link IOException}s whose message is the operating system's text ("No space left on device",
 * "Read-only file system"); Hadoop's and Parquet's writers wrap them, so the whole cause chain is
 * searched.
 */
public final class Diagnose {
    private Diagnose() {}

    /** What went wrong, in words, from the cause chain of {@code e}. */
    public static String reason(Throwable e) {
        return switch (kind(e)) {
            case DISK_FULL -> "the disk is full";
            case READ_ONLY -> "the file system is read-only";
            case DENIED -> "permission denied";
            case GONE -> "the folder does not exist (removed or unmounted while the run went on?)";
            case NONE -> String.valueOf(e.getMessage());
        };
    }

    /** How to fix a failure to write in {@code folder}. */
    public static String fix(Path folder) {
        Path f = folder == null ? Path.of(".") : folder;
        Path existing = f;
        while (existing != null && !Files.exists(existing)) {
            existing = existing.getParent();
        }
        if (existing != null && !existing.equals(f)) {
            return "the folder " + f + " is gone: check that its disk is mounted, or choose another --out";
        }
        if (existing != null && !Files.isWritable(existing)) {
            return "make " + existing + " writable (its permissions, or remount its disk read-write) or choose another --out";
        }
        try {
            long free = existing == null ? -1 : Files.getFileStore(existing).getUsableSpace();
            return "free space on the disk of " + f + (free >= 0 ? String.format(Locale.ROOT, " (%.1f MB free now)",
                    free / 1e6) : "") + ", make it writable, or choose another --out on a disk with room";
        } catch (IOException e) {
            return "check the disk of " + f + " or choose another --out";
        }
    }

    enum Kind { DISK_FULL, READ_ONLY, DENIED, GONE, NONE }

    static Kind kind(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause() == t ? null : t.getCause()) {
            String m = String.valueOf(t.getMessage()).toLowerCase(Locale.ROOT);
            if (m.contains("no space left") || m.contains("disk quota exceeded") || m.contains("file too large")) {
                return Kind.DISK_FULL;
            }
            if (m.contains("read-only file system")) {
                return Kind.READ_ONLY;
            }
            if (t instanceof AccessDeniedException || m.contains("permission denied")) {
                return Kind.DENIED;
            }
            if (t instanceof NoSuchFileException || m.contains("no such file or directory")) {
                return Kind.GONE;
            }
        }
        return Kind.NONE;
    }

    /**
     * The failure {@code e} of a run writing into {@code out} as a one-line {@link UserInputException}
     * naming the folder and the fix, if it is a disk or permission problem; null otherwise.
     */
    public static UserInputException ofOutput(Throwable e, Path out) {
        Kind k = kind(e);
        Path parent = out.getParent();
        // Only what is the output location's fault: a missing or unreadable input has its own message.
        boolean outputs = switch (k) {
            case DISK_FULL -> true;
            case READ_ONLY, DENIED -> parent != null && (!Files.isDirectory(parent) || !Files.isWritable(parent));
            case GONE -> parent != null && !Files.isDirectory(parent);
            case NONE -> false;
        };
        if (!outputs) {
            return null;
        }
        return new UserInputException("cannot write the outputs of " + out + ": " + reason(e)
                + "; nothing was published and the staging folder was removed. Fix: " + fix(out.getParent()), e);
    }

    /** An input that exists but cannot be read: the message names it and the fix. */
    public static void checkReadable(Path file, String what) {
        if (Files.exists(file) && !Files.isReadable(file)) {
            throw new UserInputException(what + " " + file + ": permission denied (the file cannot be read). "
                    + "Fix: chmod u+r " + file + ", or run thermotile as a user who may read it");
        }
    }
}
