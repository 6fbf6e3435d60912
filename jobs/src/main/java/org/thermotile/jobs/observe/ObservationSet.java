package org.thermotile.jobs.observe;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Set;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.model.observe.StoredScaling;

/**
 * An observations file: thermal images to compare with a run.
 *
 * <pre>
 * observations:
 *   - file: lst-20260716.tif            # relative to this file
 *     time: 2026-07-16T10:30:00Z        # acquisition time, ISO-8601 with Z or an offset
 *     kind: surface_temperature         # or brightness_temperature | radiance
 *     units: K                          # or degC (temperatures only)
 *     scale: 0.00341802                 # stored value · scale + offset; default 1 and 0
 *     offset: 149.0
 *     nodata: 0                         # stored value without observation (optional)
 *     band: {k1: 774.8853, k2: 1321.0789}   # radiance / brightness: sensor constants,
 *                                           # or {from_um: 10.6, to_um: 11.19}
 *     mask: {file: qa.tif, keep: [1]}   # optional quality mask on the image's grid
 * </pre>
 */
public record ObservationSet(Path file, List<Image> images) {

    /** One image. {@code k1}/{@code k2} or {@code fromUm}/{@code toUm} are NaN when not given. */
    public record Image(String name, Path file, Instant time, String kind, StoredScaling scaling, double k1,
            double k2, double fromUm, double toUm, Path maskFile, int[] maskKeep) {
        /** Effective wavelength of the band [m] (K2 = c₂/λ for K1/K2 constants). */
        public double wavelengthM() {
            if (!Double.isNaN(fromUm)) {
                return 0.5 * (fromUm + toUm) * 1e-6;
            }
            return org.thermotile.model.radiation.Planck.C2 / k2;
        }
    }

    private static final Set<String> KEYS = Set.of("file", "time", "kind", "units", "scale", "offset", "nodata",
            "band", "mask");
    private static final Set<String> KINDS = Set.of("surface_temperature", "brightness_temperature", "radiance");

    /** Reads {@code file}; every problem is collected and reported together (exit 2). */
    public static ObservationSet read(Path file) {
        JsonNode root;
        try {
            root = new ObjectMapper(new YAMLFactory()).readTree(Files.readString(file));
        } catch (IOException e) {
            throw new UserInputException(file + ": cannot read the observations file (" + e.getMessage()
                    + "); fix: give a YAML file with an 'observations:' list");
        }
        return fromNode(file, root == null ? null : root.get("observations"));
    }

    /** The images of an {@code observations:} list node, paths relative to {@code file}'s folder. */
    public static ObservationSet fromNode(Path file, JsonNode list) {
        List<String> errors = new ArrayList<>();
        List<Image> images = new ArrayList<>();
        if (list == null || !list.isArray() || list.isEmpty()) {
            throw new UserInputException(file + ": key 'observations' must be a non-empty list of images; fix: "
                    + "add e.g. '- {file: lst.tif, time: 2026-07-16T10:30:00Z, kind: surface_temperature, units: K}'");
        }
        Path base = file.toAbsolutePath().getParent();
        for (int i = 0; i < list.size(); i++) {
            JsonNode n = list.get(i);
            String at = file + ": observations[" + i + "]";
            for (Iterator<String> it = n.fieldNames(); it.hasNext(); ) {
                String k = it.next();
                if (!KEYS.contains(k)) {
                    errors.add(at + ": unknown key '" + k + "'; fix: use one of " + new java.util.TreeSet<>(KEYS));
                }
            }
            String f = text(n, "file");
            if (f == null) {
                errors.add(at + ": key 'file' is missing; fix: name the image's GeoTIFF");
                continue;
            }
            Path img = base.resolve(f);
            if (!Files.isRegularFile(img)) {
                errors.add(at + ".file: " + img + " does not exist; fix: correct the path (relative to " + base + ")");
            }
            Instant time = null;
            String t = text(n, "time");
            if (t == null) {
                errors.add(at + ": key 'time' (acquisition time) is missing; fix: add e.g. time: 2026-07-16T10:30:00Z");
            } else {
                try {
                    time = OffsetDateTime.parse(t).toInstant();
                } catch (DateTimeParseException e) {
                    errors.add(at + ".time: '" + t + "' is not an ISO-8601 time with Z or an offset; fix: write e.g. "
                            + "2026-07-16T10:30:00Z or 2026-07-16T12:30:00+02:00");
                }
            }
            String kind = text(n, "kind") == null ? "surface_temperature" : text(n, "kind");
            if (!KINDS.contains(kind)) {
                errors.add(at + ".kind: '" + kind + "' is unknown; fix: use one of " + new java.util.TreeSet<>(KINDS));
            }
            String units = text(n, "units") == null ? "K" : text(n, "units");
            if (!units.equals("K") && !units.equals("degC")) {
                errors.add(at + ".units: '" + units + "' is unknown; fix: use K or degC");
            }
            double scale = num(n, "scale", 1.0);
            double offset = num(n, "offset", 0.0);
            double nodata = num(n, "nodata", Double.NaN);
            double k1 = Double.NaN, k2 = Double.NaN, from = Double.NaN, to = Double.NaN;
            JsonNode band = n.get("band");
            if (band != null) {
                k1 = num(band, "k1", Double.NaN);
                k2 = num(band, "k2", Double.NaN);
                from = num(band, "from_um", Double.NaN);
                to = num(band, "to_um", Double.NaN);
                boolean hasK = !Double.isNaN(k1) && !Double.isNaN(k2);
                boolean hasW = !Double.isNaN(from) && !Double.isNaN(to) && to > from && from > 0;
                if (hasK == hasW) {
                    errors.add(at + ".band: give either {k1, k2} or {from_um, to_um} (to_um > from_um > 0)");
                }
            } else if (!kind.equals("surface_temperature")) {
                errors.add(at + ": kind " + kind + " needs 'band'; fix: add band: {k1: .., k2: ..} or "
                        + "band: {from_um: .., to_um: ..}");
            }
            if (kind.equals("radiance") && units.equals("degC")) {
                errors.add(at + ".units: a radiance is not in degC; fix: drop 'units' (radiance is W m-2 sr-1 um-1)");
            }
            Path maskFile = null;
            int[] keep = null;
            JsonNode mask = n.get("mask");
            if (mask != null) {
                String mf = text(mask, "file");
                JsonNode kl = mask.get("keep");
                if (mf == null || kl == null || !kl.isArray() || kl.isEmpty()) {
                    errors.add(at + ".mask: needs 'file' and a non-empty 'keep' list of codes; fix: e.g. "
                            + "mask: {file: qa.tif, keep: [1]}");
                } else {
                    maskFile = base.resolve(mf);
                    if (!Files.isRegularFile(maskFile)) {
                        errors.add(at + ".mask.file: " + maskFile + " does not exist; fix: correct the path");
                    }
                    keep = new int[kl.size()];
                    for (int j = 0; j < keep.length; j++) {
                        keep[j] = kl.get(j).asInt();
                    }
                }
            }
            String name = img.getFileName().toString().replaceFirst("\\.[A-Za-z]+$", "");
            images.add(new Image(name, img, time, kind, new StoredScaling(scale, offset, nodata,
                    units.equals("degC")), k1, k2, from, to, maskFile, keep));
        }
        if (!errors.isEmpty()) {
            throw new UserInputException(String.join("\n", errors));
        }
        return new ObservationSet(file, List.copyOf(images));
    }

    /**
     * The images of a run file's {@code observations:} block (already checked by the run-file
     * reader; paths absolute). The set's file is the run file, for messages.
     */
    public static ObservationSet of(org.thermotile.jobs.config.RunFile run) {
        List<Image> images = new ArrayList<>();
        for (org.thermotile.jobs.config.RunFile.Observation o : run.observations()) {
            Path img = Path.of(o.file());
            String name = img.getFileName().toString().replaceFirst("\\.[A-Za-z]+$", "");
            int[] keep = o.maskKeep().stream().mapToInt(Integer::intValue).toArray();
            images.add(new Image(name, img, o.time(), o.kind(), new StoredScaling(o.scale(), o.offset(), o.nodata(),
                    o.units().equals("degC")), o.k1(), o.k2(), o.fromUm(), o.toUm(),
                    o.maskFile() == null ? null : Path.of(o.maskFile()), o.maskFile() == null ? null : keep));
        }
        return new ObservationSet(Path.of(run.source()), List.copyOf(images));
    }

    private static String text(JsonNode n, String key) {
        JsonNode v = n.get(key);
        return v == null || v.isNull() ? null : v.asText();
    }

    private static double num(JsonNode n, String key, double dflt) {
        JsonNode v = n.get(key);
        return v == null || !v.isNumber() ? dflt : v.asDouble();
    }
}
