package org.thermotile.jobs.cli;

import java.nio.file.Path;
import org.thermotile.jobs.storage.RunLayout;
import org.thermotile.jobs.storage.RunLock;

/** The commands that read and write a finished run folder hold its lock while they work. */
final class FolderLock {
    private FolderLock() {}

    /**
     * The lock of the run that {@code dir} belongs to (a run folder, or a period's folder
     * {@code RUN/periods/P} of a run over several periods, whose lock is the run's).
     */
    static RunLock hold(Path dir, String command) {
        Path root = RunLayout.of(dir.toAbsolutePath().normalize()).root();
        return RunLock.acquire(root, command + " " + dir, System.err);
    }
}
