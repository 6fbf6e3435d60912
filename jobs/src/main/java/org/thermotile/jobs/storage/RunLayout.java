package org.thermotile.jobs.storage;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.thermotile.jobs.config.Scenario;

/**
 * Where a run's files are. A run of one period keeps everything in its run folder:
 * {@code maps/}, {@code scenarios/NAME/maps/}, {@code tables/TABLE/scenario=NAME/},
 * {@code comparison/}, {@code hotspots/}, {@code manifest.json}. A run over several periods (the
 * weather axis, {@code sweep.periods}) gives each period a folder {@code periods/PERIOD/} with the
 * same maps, comparison, hotspots and manifest, while its tables stay in one dataset per table,
 * partitioned by period and scenario: {@code tables/TABLE/period=PERIOD/scenario=NAME/}.
 *
 * @param root   the run folder
 * @param period the period's name, or null for a run of one period
 */
public record RunLayout(Path root, String period) {

    /** File-name prefix of a comparison's difference maps: {@code delta_KEY.tif} is scenario minus baseline of map KEY. */
    public static final String DELTA_PREFIX = "delta_";

    /** The name (without {@code .tif}) of the difference map of map {@code key}. */
    public static String deltaName(String key) {
        return DELTA_PREFIX + key;
    }

    /** The map key a difference map's name (without {@code .tif}) stands for, or null when it is not one. */
    public static String deltaOf(String stem) {
        return stem.startsWith(DELTA_PREFIX) ? stem.substring(DELTA_PREFIX.length()) : null;
    }

    /** The layout of a run of one period in {@code root}. */
    public static RunLayout single(Path root) {
        return new RunLayout(root, null);
    }

    /** The folder of this period's own files (maps, scenarios, comparison, hotspots, manifest, report). */
    public Path dir() {
        return period == null ? root : root.resolve("periods").resolve(period);
    }

    /** The folder of a table's partitions for this period: the folder holding {@code scenario=NAME/}. */
    public Path table(String name) {
        Path t = root.resolve("tables").resolve(name);
        return period == null ? t : t.resolve("period=" + period);
    }

    /** A variant's GeoTIFF maps. */
    public Path mapsDir(String variant) {
        return Scenario.BASELINE.equals(variant) ? dir().resolve("maps")
                : dir().resolve("scenarios").resolve(variant).resolve("maps");
    }

    /** The same layout under another run folder (a temporary sibling, an older run). */
    public RunLayout in(Path otherRoot) {
        return new RunLayout(otherRoot, period);
    }

    /**
     * The layout of an existing folder: a run folder of one period, or one period's folder of a run
     * over several periods ({@code RUN/periods/PERIOD}, whose manifest names the period).
     */
    public static RunLayout of(Path dir) {
        JsonNode m = manifest(dir);
        String period = m.path("period").asText(null);
        if (period != null && dir.getParent() != null && dir.getParent().getFileName() != null
                && dir.getParent().getFileName().toString().equals("periods")) {
            return new RunLayout(dir.getParent().getParent(), period);
        }
        return single(dir);
    }

    /** The periods of a run over several periods (from its manifest), in run-file order; empty otherwise. */
    public static List<String> periodsOf(Path runDir) {
        List<String> out = new ArrayList<>();
        manifest(runDir).path("periods").forEach(p -> out.add(p.path("name").asText()));
        return out;
    }

    private static JsonNode manifest(Path dir) {
        Path f = dir.resolve("manifest.json");
        if (!Files.isRegularFile(f)) {
            return new ObjectMapper().createObjectNode();
        }
        try {
            return new ObjectMapper().readTree(f.toFile());
        } catch (IOException e) {
            return new ObjectMapper().createObjectNode();
        }
    }
}
