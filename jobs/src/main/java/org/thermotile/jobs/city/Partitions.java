package org.thermotile.jobs.city;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.security.MessageDigest;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.thermotile.jobs.config.Scenario;
import org.thermotile.jobs.storage.RunLayout;

/**
 * The per-variant partitions of a run folder (baseline and each scenario: its maps and its
 * partition of every table), their keys and file hashes as recorded in the manifest, and what a
 * resumed run can keep.
 *
 * <p>A variant's key is the SHA-256 of everything its results depend on: the resolved run file
 * without the scenario sections and input locations, every input's hash, thermotile's version, the table
 * layout ({@link org.thermotile.jobs.storage.TableColumns#LAYOUT}) and the variant's own definition. A partition is complete when the manifest records the same key and every file it
 * lists still has the recorded SHA-256.
 */
final class Partitions {
    private Partitions() {}

    static final List<String> TABLES = List.of("cells", "cell_hours", "material_hours", "district_hours");

    /** Variant name → key. */
    static Map<String, String> keys(PreparedRun p) {
        ObjectNode tree = p.run().toTree();
        // Inputs count by content (their hashes below), not by where they are read from.
        tree.remove(List.of("scenarios", "sweep", "hotspots", "inputs"));
        if (tree.get("weather") instanceof ObjectNode w) {
            w.remove("file");
        }
        StringBuilder common = new StringBuilder(tree.toString()).append('|').append(Manifest.version())
                .append("|tables=").append(org.thermotile.jobs.storage.TableColumns.LAYOUT);
        if (p.run().inputs().classesIsBuiltIn()) {
            common.append("|classes=").append(p.run().inputs().classes());
        }
        try {
            for (Map.Entry<String, String> e : new TreeMap<>(p.inputFiles()).entrySet()) {
                common.append("|").append(e.getKey()).append("=").append(Manifest.sha256(RunPreparer.localPath(e.getValue(), e.getKey())));
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        Map<String, String> keys = new LinkedHashMap<>();
        keys.put(Scenario.BASELINE, sha256(common + "|baseline"));
        for (Scenario s : p.run().scenarios()) {
            keys.put(s.name(), sha256(common + "|" + s.name() + "|" + s.changes()));
        }
        return keys;
    }

    /**
     * Files of a variant's partition, relative to the run folder, sorted: its GeoTIFF maps (not the
     * comparison's delta maps, nor the report's PNGs) and its part of every table.
     */
    static List<String> files(RunLayout lay, String variant) throws IOException {
        List<String> out = new ArrayList<>();
        Path runDir = lay.root();
        Path maps = lay.mapsDir(variant);
        if (Files.isDirectory(maps)) {
            try (Stream<Path> s = Files.list(maps)) {
                s.filter(f -> f.getFileName().toString().endsWith(".tif")
                                && !f.getFileName().toString().startsWith(RunLayout.DELTA_PREFIX))
                        .forEach(f -> out.add(runDir.relativize(f).toString()));
            }
        }
        for (String t : TABLES) {
            Path d = lay.table(t).resolve("scenario=" + variant);
            if (Files.isDirectory(d)) {
                try (Stream<Path> s = Files.list(d)) {
                    s.forEach(f -> out.add(runDir.relativize(f).toString()));
                }
            }
        }
        out.sort(null);
        return out;
    }

    /**
     * The manifest's "partitions" block: per variant, its key and each file's SHA-256 (file names
     * relative to the run folder).
     */
    static ObjectNode record(RunLayout lay, Map<String, String> keys, Map<String, Double> closure) throws IOException {
        ObjectNode root = new ObjectMapper().createObjectNode();
        for (Map.Entry<String, String> e : keys.entrySet()) {
            ObjectNode v = root.putObject(e.getKey());
            v.put("key", e.getValue());
            v.put("max_closure_residual", closure.getOrDefault(e.getKey(), 0.0));
            ObjectNode files = v.putObject("files");
            for (String f : files(lay, e.getKey())) {
                files.put(f, Manifest.sha256(lay.root().resolve(f)));
            }
        }
        return root;
    }

    /** Variants of the existing run (or period) {@code lay} whose partitions are complete for {@code keys}. */
    static List<String> complete(RunLayout lay, Map<String, String> keys) {
        List<String> ok = new ArrayList<>();
        JsonNode parts;
        Path old = lay.root();
        try {
            parts = new ObjectMapper().readTree(lay.dir().resolve("manifest.json").toFile()).path("partitions");
        } catch (IOException e) {
            return ok;
        }
        for (Map.Entry<String, String> e : keys.entrySet()) {
            JsonNode v = parts.path(e.getKey());
            if (!e.getValue().equals(v.path("key").asText()) || v.path("files").size() == 0) {
                continue;
            }
            boolean good = true;
            try {
                List<String> now = files(lay, e.getKey());
                List<String> listed = new ArrayList<>();
                v.path("files").fieldNames().forEachRemaining(listed::add);
                listed.sort(null);
                good = now.equals(listed);
                for (String f : listed) {
                    good &= Files.isRegularFile(old.resolve(f))
                            && Manifest.sha256(old.resolve(f)).equals(v.path("files").path(f).asText());
                }
            } catch (IOException ex) {
                good = false;
            }
            if (good) {
                ok.add(e.getKey());
            }
        }
        return ok;
    }

    /** The largest closure residual each of {@code variants} had when the run {@code old} computed it. */
    static Map<String, Double> closureResiduals(RunLayout old, List<String> variants) {
        Map<String, Double> out = new LinkedHashMap<>();
        if (variants.isEmpty()) {
            return out;
        }
        try {
            JsonNode parts = new ObjectMapper().readTree(old.dir().resolve("manifest.json").toFile()).path("partitions");
            for (String v : variants) {
                out.put(v, parts.path(v).path("max_closure_residual").asDouble(0));
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return out;
    }

    /** Copies a complete variant's partition from the run {@code old} into the same place under {@code tmp}. */
    static void copy(RunLayout old, RunLayout tmp, String variant) throws IOException {
        for (String f : files(old, variant)) {
            Path dst = tmp.root().resolve(f);
            Files.createDirectories(dst.getParent());
            Files.copy(old.root().resolve(f), dst, StandardCopyOption.COPY_ATTRIBUTES);
        }
    }

    static String sha256(String s) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256")
                    .digest(s.getBytes(java.nio.charset.StandardCharsets.UTF_8)));
        } catch (java.security.NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }
}
