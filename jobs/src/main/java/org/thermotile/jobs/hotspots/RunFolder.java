package org.thermotile.jobs.hotspots;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.stream.Stream;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.Suggest;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.storage.RunLayout;

/**
 * A finished run folder as the hotspot analysis reads it: manifest.json, maps/*.tif and, when
 * present, scenarios/NAME/maps/*.tif. Opening checks that the folder is complete; every problem
 * is a {@link UserInputException} naming the folder or file and the fix.
 */
public final class RunFolder {

    /** The name that means "the run itself" for --scenario. */
    public static final String BASELINE = "baseline";

    /** Maps Gi* can be computed on, in the order listed to users. peak_hour is a clock hour. */
    public static final List<String> STATISTICS = RunFile.MapKind.keys(RunFile.MapKind::hotspots);

    /** Prefix of a scenario's difference statistics (scenario minus baseline). */
    public static final String DELTA = RunLayout.DELTA_PREFIX;

    /** The unit of a statistic as users read it ("°C", "K h"). */
    static String unit(String statistic) {
        return RunFile.MapKind.fromKey(statistic).plainUnit();
    }

    private static final String FIX_RERUN = "run it again, e.g. thermotile run RUNFILE --out %s --replace";

    private final Path dir;
    private final JsonNode manifest;

    private RunFolder(Path dir, JsonNode manifest) {
        this.dir = dir;
        this.manifest = manifest;
    }

    /**
     * One statistic of one scenario, ready to read.
     *
     * @param reference       where the global mean and S come from (the source itself, or the run's map)
     * @param referenceLabel  "own" or "baseline"
     */
    public record Field(String statistic, String scenario, String unit, FieldSource source, RasterGrid grid,
            Path outDir, String description, FieldSource reference, String referenceLabel) {
    }

    /**
     * Opens a run folder and checks it: the folder, manifest.json (valid JSON of a thermotile
     * run), maps/ and every map the manifest lists.
     */
    public static RunFolder open(Path runDir) {
        Path dir = runDir.toAbsolutePath().normalize();
        if (!Files.isDirectory(dir)) {
            throw new UserInputException(dir + ": run folder not found. Fix: give the folder 'thermotile run' "
                    + "wrote (it holds manifest.json and maps/)");
        }
        Path mf = dir.resolve("manifest.json");
        if (!Files.isRegularFile(mf)) {
            throw new UserInputException(dir + ": incomplete run folder, manifest.json is missing (the run did not "
                    + "finish, or this is not a run folder). Fix: " + FIX_RERUN.formatted(dir));
        }
        JsonNode m;
        try {
            m = new ObjectMapper().readTree(Files.readString(mf));
        } catch (JsonProcessingException e) {
            JsonLocation at = e.getLocation();
            String where = at == null ? "" : ", line " + at.getLineNr() + ", column " + at.getColumnNr();
            throw new UserInputException(mf + where + ": not valid JSON (" + e.getOriginalMessage() + "). Fix: "
                    + FIX_RERUN.formatted(dir), e);
        } catch (IOException e) {
            throw new UserInputException(mf + ": cannot be read (" + e.getMessage() + ")", e);
        }
        if (m != null && m.has("periods")) {
            List<String> ps = new ArrayList<>();
            m.path("periods").forEach(p -> ps.add(p.path("folder").asText()));
            throw new UserInputException(dir + ": this run covers several periods (" + String.join(", ", ps)
                    + "), each with its own maps. Fix: give one period's folder, e.g. " + dir.resolve(ps.get(0)));
        }
        if (m == null || !m.path("format").asText("").startsWith("thermotile-run-manifest/")) {
            throw new UserInputException(mf + ", key format: '" + (m == null ? "" : m.path("format").asText(""))
                    + "' is not a thermotile run manifest (thermotile-run-manifest/1). Fix: give the folder "
                    + "'thermotile run' wrote");
        }
        if (!Files.isDirectory(dir.resolve("maps"))) {
            throw new UserInputException(dir + ": incomplete run folder, maps/ is missing. Fix: "
                    + FIX_RERUN.formatted(dir));
        }
        List<String> missing = new ArrayList<>();
        Path base = org.thermotile.jobs.storage.RunLayout.of(dir).root();   // the run folder the outputs are listed in
        for (JsonNode o : m.path("outputs")) {
            String rel = o.asText();
            if (!Files.exists(base.resolve(rel))) {
                missing.add(rel);
            }
        }
        if (!missing.isEmpty()) {
            throw new UserInputException(dir + ": incomplete run folder, manifest.json lists "
                    + String.join(", ", missing) + " but " + (missing.size() == 1 ? "it is" : "they are")
                    + " missing. Fix: " + FIX_RERUN.formatted(dir));
        }
        return new RunFolder(dir, m);
    }

    /** The folder (absolute). */
    public Path dir() {
        return dir;
    }

    /** The parsed manifest. */
    public JsonNode manifest() {
        return manifest;
    }

    /** The districts file of the run (manifest run_file.inputs.districts), if any. */
    public Optional<Path> districtsFile() {
        JsonNode d = manifest.path("run_file").path("inputs").path("districts");
        // A path, a file: URI, or a Hadoop URI (this JVM's local copy of it).
        return d.isTextual() && !d.asText().isBlank()
                ? Optional.of(org.thermotile.jobs.storage.InputStaging.localPath(d.asText(), "run_file.inputs.districts"))
                : Optional.empty();
    }

    /** Scenario names: the folders under scenarios/ that hold maps/, sorted. */
    public List<String> scenarios() {
        Path s = dir.resolve("scenarios");
        if (!Files.isDirectory(s)) {
            return List.of();
        }
        try (Stream<Path> l = Files.list(s)) {
            return l.filter(p -> Files.isDirectory(p.resolve("maps"))).map(p -> p.getFileName().toString())
                    .sorted().toList();
        } catch (IOException e) {
            throw new UserInputException(s + ": cannot be listed (" + e.getMessage() + ")", e);
        }
    }

    /** The statistics available for a scenario (null = baseline), in {@link #STATISTICS} order. */
    public List<String> statistics(String scenario) {
        List<String> out = new ArrayList<>();
        Path maps = mapsDir(scenario);
        for (String s : STATISTICS) {
            if (Files.isRegularFile(maps.resolve(s + ".tif"))) {
                out.add(s);
            }
        }
        if (scenario != null) {
            for (String s : STATISTICS) {
                boolean file = Files.isRegularFile(maps.resolve(DELTA + s + ".tif"));
                boolean both = out.contains(s) && Files.isRegularFile(mapsDir(null).resolve(s + ".tif"));
                if (file || both) {
                    out.add(DELTA + s);
                }
            }
        }
        return out;
    }

    /**
     * Resolves the statistic of the options' scenario, checks the map's grid against the
     * manifest, and names the output folder.
     */
    public Field field(HotspotOptions opt) {
        String scenario = opt.isBaseline() ? null : opt.scenario();
        if (scenario != null) {
            List<String> names = scenarios();
            if (!names.contains(scenario)) {
                String valid = names.isEmpty() ? "this run has no scenarios (" + dir.resolve("scenarios")
                        + " holds none); leave out --scenario for the run itself"
                        : "valid: " + BASELINE + " (the run itself), " + String.join(", ", names)
                                + Suggest.closest(scenario, names).map(c -> "; did you mean '" + c + "'?").orElse("");
                throw new UserInputException(dir + ": unknown scenario '" + scenario + "'. Fix: " + valid);
            }
        }
        String stat = opt.statistic();
        List<String> valid = statistics(scenario);
        if (!valid.contains(stat)) {
            RunFile.MapKind kind = RunFile.MapKind.fromKey(stat);
            boolean notSummable = kind != null && !kind.hotspots();
            String why = notSummable ? stat + " is a clock hour, not a quantity Gi* can sum"
                    : "unknown statistic '" + stat + "'";
            String hint = Suggest.closest(stat, valid).filter(c -> !notSummable)
                    .map(c -> "; did you mean '" + c + "'?").orElse("");
            throw new UserInputException(mapsDir(scenario) + ": " + why + ". Fix: give --statistic "
                    + (valid.isEmpty() ? "of a map the run wrote (this run has none Gi* can use)"
                            : "one of " + String.join(", ", valid)) + hint);
        }
        FieldSource src;
        String unit;
        String description;
        Path maps = mapsDir(scenario);
        if (stat.startsWith(DELTA)) {
            String base = stat.substring(DELTA.length());
            unit = unit(base).equals("°C") ? "K" : unit(base);
            Path file = maps.resolve(stat + ".tif");
            if (Files.isRegularFile(file)) {
                src = new FieldSource(file.toString(), null);
                description = "maps/" + stat + ".tif of scenario " + scenario;
            } else {
                src = new FieldSource(maps.resolve(base + ".tif").toString(),
                        mapsDir(null).resolve(base + ".tif").toString());
                description = "scenario " + scenario + " maps/" + base + ".tif minus the run's maps/" + base + ".tif";
            }
        } else {
            unit = unit(stat);
            src = new FieldSource(maps.resolve(stat + ".tif").toString(), null);
            description = scenario == null ? "maps/" + stat + ".tif" : "maps/" + stat + ".tif of scenario " + scenario;
        }
        RasterGrid grid = checkedGrid(src);
        FieldSource ref = src;
        String refLabel = "own";
        if (scenario != null && !stat.startsWith(DELTA) && opt.reference() == HotspotOptions.Reference.BASELINE) {
            Path base = mapsDir(null).resolve(stat + ".tif");
            if (!Files.isRegularFile(base)) {
                throw new UserInputException(base + " is missing: the run's own map gives the city-wide mean and "
                        + "spread a scenario is compared with. Fix: add --reference scenario to use the scenario's own");
            }
            ref = new FieldSource(base.toString(), null);
            refLabel = "baseline";
            RasterGrid bg = checkedGrid(ref);
            grid.differenceFrom(bg).ifPresent(d -> {
                throw new UserInputException(src.map() + ": its grid differs from " + base + ": " + d
                        + ". Fix: write the scenario on the run's grid");
            });
        }
        Path out = (scenario == null ? dir : dir.resolve("scenarios").resolve(scenario)).resolve("hotspots").resolve(stat);
        return new Field(stat, scenario, unit, src, grid, out, description, ref, refLabel);
    }

    private Path mapsDir(String scenario) {
        return scenario == null ? dir.resolve("maps") : dir.resolve("scenarios").resolve(scenario).resolve("maps");
    }

    /** The grid of the source map(s): one band, float, same grid for both, sizes as in the manifest. */
    private RasterGrid checkedGrid(FieldSource src) {
        RasterGrid g;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(Path.of(src.map()))) {
            g = r.grid();
        }
        if (src.baseline() != null) {
            try (GeoTiffReader r = GeoTiffReader.openSingleBand(Path.of(src.baseline()))) {
                g.differenceFrom(r.grid()).ifPresent(d -> {
                    throw new UserInputException(src.map() + ": its grid differs from " + src.baseline() + ": " + d
                            + ". Fix: write the scenario on the run's grid");
                });
            }
        }
        JsonNode mg = manifest.path("grid");
        if (mg.has("width") && mg.has("height")
                && (mg.path("width").asInt() != g.width() || mg.path("height").asInt() != g.height())) {
            throw new UserInputException(src.map() + ": " + g.width() + " × " + g.height() + " cells, but "
                    + dir.resolve("manifest.json") + " (grid) says " + mg.path("width").asInt() + " × "
                    + mg.path("height").asInt() + ". Fix: " + FIX_RERUN.formatted(dir));
        }
        return g;
    }
}
