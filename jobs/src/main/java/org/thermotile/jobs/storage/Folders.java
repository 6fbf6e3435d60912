package org.thermotile.jobs.storage;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Comparator;
import java.util.stream.Stream;

/** Folder chores shared by the jobs that publish a folder by renaming a temporary one. */
public final class Folders {
    private Folders() {}

    /** Deletes {@code dir} and everything in it; nothing happens when it does not exist. */
    public static void deleteTree(Path dir) throws IOException {
        if (!Files.exists(dir)) {
            return;
        }
        try (Stream<Path> s = Files.walk(dir)) {
            for (Path q : s.sorted(Comparator.reverseOrder()).toList()) {
                Files.delete(q);
            }
        }
    }

    /** {@link #deleteTree} for clean-up after a failure: the failure being reported matters more. */
    public static void deleteQuietly(Path dir) {
        try {
            deleteTree(dir);
        } catch (IOException ignored) {
            // best effort
        }
    }
}
