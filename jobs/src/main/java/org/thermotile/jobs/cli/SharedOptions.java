package org.thermotile.jobs.cli;

import java.nio.file.Path;
import picocli.CommandLine.Option;

/**
 * Options that several commands share, as picocli mixins ({@code @Mixin}), so that each is named,
 * described and parsed once.
 */
final class SharedOptions {
    private SharedOptions() {
    }

    /** Where Spark runs: {@code --master URL} or embedded with {@code --threads N}. */
    static final class Spark {
        @Option(names = "--master", paramLabel = "URL",
                description = "Spark master, e.g. spark://host:7077 (default: embedded, all cores)")
        String master;

        @Option(names = "--threads", paramLabel = "N", defaultValue = "0",
                description = "embedded Spark threads (default: all cores)")
        int threads;
    }

    /** {@code --quiet}: no progress line. */
    static final class Quiet {
        @Option(names = "--quiet", description = "no progress line")
        boolean quiet;
    }

    /** {@code --replace}: overwrite an existing output folder (one that thermotile wrote). */
    static final class Replace {
        @Option(names = "--replace", description = "overwrite an existing output folder (only one that thermotile wrote)")
        boolean replace;
    }

    /** {@code --materials-file FILE}: user materials added to the library. */
    static final class MaterialsFile {
        @Option(names = "--materials-file", paramLabel = "FILE",
                description = "add a user materials file (YAML or CSV) to the library")
        Path file;
    }
}
