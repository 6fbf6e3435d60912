package org.thermotile.jobs.testing;

import static org.junit.jupiter.api.Assertions.fail;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

/**
 * GDAL's command-line clients as an independent reader of our outputs. In CI (variable CI set)
 * a missing client fails the test; elsewhere the test is skipped.
 */
public final class Gdal {
    private Gdal() {}

    /** Skips (or, in CI, fails) the calling test when {@code tool} is not installed. */
    public static void require(String tool) {
        ExternalTool.require("apt-get install gdal-bin", tool);
    }

    /** {@code gdalinfo -json -stats} of a copy of {@code file} (so no .aux.xml lands beside it). */
    public static JsonNode info(Path file) throws IOException {
        Path dir = Files.createTempDirectory("gdal");
        Path copy = dir.resolve(file.getFileName());
        Files.copy(file, copy, StandardCopyOption.REPLACE_EXISTING);
        try {
            return new ObjectMapper().readTree(ExternalTool.succeeded(ExternalTool.run(
                    List.of("gdalinfo", "-json", "-stats", copy.toString()))).stdout());
        } finally {
            try (var s = Files.list(dir)) {
                for (Path p : s.toList()) {
                    Files.delete(p);
                }
            }
            Files.delete(dir);
        }
    }

    /** Runs a command, returns its standard output; fails on a non-zero exit. */
    public static String run(List<String> command) throws IOException {
        return ExternalTool.output(command);
    }
}
