package org.thermotile.jobs.catalogue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.opengis.referencing.operation.MathTransform;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.storage.RunLayout;

/**
 * The run's catalogue entry: a STAC Item (SpatioTemporal Asset Catalog specification 1.0.0, "Item
 * Spec") in {@code item.json} at the run folder, and for a run over several periods one more in
 * each period's folder {@code periods/PERIOD/item.json}.
 *
 * <p>What an item lists ({@link #assets}): every file of its folder and below (maps, tables,
 * comparison, hot spots, observations, report, manifest, previews), sorted by path; a period's
 * item also lists its partitions of the run's tables ({@code ../../tables/TABLE/period=PERIOD/…}).
 * Each asset has an href relative to the item, a media type, roles, a title and a description;
 * each GeoTIFF also the projection extension (v1.1.0: {@code proj:epsg}, or {@code proj:wkt2} when
 * the CRS has no EPSG code, {@code proj:shape}, {@code proj:transform}, {@code proj:bbox}) and the
 * raster extension's band list (v1.1.0: {@code data_type}, {@code nodata}, {@code unit},
 * {@code spatial_resolution}), read from the file itself.
 *
 * <p>The item's geometry and bbox are the simulation grid's four corners (from the first map
 * under {@code maps/}) reprojected to WGS 84 longitude/latitude (EPSG:4326 in the axis order
 * GeoJSON uses, RFC 7946 §4) with Apache SIS. Its time is a range ({@code datetime} null,
 * {@code start_datetime}/{@code end_datetime} the manifest's {@code time_range}, UTC).
 *
 * <p>Deterministic: the same folder gives the same bytes (fixed key order, sorted files, no clock
 * time). Written by the city job into the staging folder before it is published, and written again
 * by the commands that add files to a finished run (compare, hotspots, observe, report).
 */
public final class StacItem {
    private StacItem() {}

    /** The file name of an item. */
    public static final String FILE = "item.json";

    public static final String STAC_VERSION = "1.0.0";
    public static final String PROJECTION_EXTENSION = "https://stac-extensions.github.io/projection/v1.1.0/schema.json";
    public static final String RASTER_EXTENSION = "https://stac-extensions.github.io/raster/v1.1.0/schema.json";

    /** Media type of a Cloud-Optimised GeoTIFF (STAC best practices, "Common Media Types in STAC"). */
    public static final String COG = "image/tiff; application=geotiff; profile=cloud-optimized";
    /** Media type of Apache Parquet (IANA registration, 2024). */
    public static final String PARQUET = "application/vnd.apache.parquet";
    /** Media type of an item itself: GeoJSON (RFC 7946). */
    public static final String GEOJSON = "application/geo+json";

    /**
     * Writes the item of a run folder, and of each of its periods for a run over several periods.
     * {@code dir} may also be a period's folder: the whole run's items are written then.
     */
    public static void writeAll(Path dir) {
        RunLayout lay = RunLayout.of(dir);
        Path root = lay.root();
        if (!Files.isRegularFile(root.resolve("manifest.json"))) {
            return;   // not a run folder of ours: nothing to describe
        }
        List<String> periods = RunLayout.periodsOf(root);
        for (String p : periods) {
            write(new RunLayout(root, p));
        }
        write(RunLayout.single(root));
    }

    /** Writes the item of one folder: a run folder (period null) or a period's folder. */
    static void write(RunLayout lay) {
        Path file = lay.dir().resolve(FILE);
        Path tmp = lay.dir().resolve("." + FILE + ".tmp");
        try {
            ObjectMapper om = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
            Files.writeString(tmp, om.writeValueAsString(build(lay)) + "\n");
            Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the catalogue entry " + file, e);
        }
    }

    /** The item of one folder. */
    static ObjectNode build(RunLayout lay) throws IOException {
        ObjectMapper om = new ObjectMapper();
        Path dir = lay.dir();
        JsonNode manifest = om.readTree(dir.resolve("manifest.json").toFile());
        String name = manifest.path("name").asText("run");
        List<String> files = assets(lay);
        ObjectNode item = om.createObjectNode();
        item.put("type", "Feature");
        item.put("stac_version", STAC_VERSION);
        ArrayNode ext = item.putArray("stac_extensions");
        ext.add(PROJECTION_EXTENSION);
        ext.add(RASTER_EXTENSION);
        item.put("id", lay.period() == null ? name : name + "-" + lay.period());

        Path gridMap = files.stream().filter(f -> f.startsWith("maps/") && f.endsWith(".tif")).findFirst()
                .or(() -> files.stream().filter(f -> f.endsWith(".tif")).findFirst()).map(dir::resolve).orElse(null);
        RasterGrid grid = null;
        if (gridMap == null) {
            item.putNull("geometry");
        } else {
            try (GeoTiffReader r = GeoTiffReader.open(gridMap)) {
                grid = r.grid();
                double[][] ll = cornersLonLat(r);
                ObjectNode g = item.putObject("geometry");
                g.put("type", "Polygon");
                ArrayNode ring = g.putArray("coordinates").addArray();
                for (int i : new int[] {0, 1, 2, 3, 0}) {   // counter-clockwise, as RFC 7946 §3.1.6 asks
                    ring.addArray().add(ll[i][0]).add(ll[i][1]);
                }
                double minLon = Double.POSITIVE_INFINITY, minLat = Double.POSITIVE_INFINITY;
                double maxLon = Double.NEGATIVE_INFINITY, maxLat = Double.NEGATIVE_INFINITY;
                for (double[] c : ll) {
                    minLon = Math.min(minLon, c[0]);
                    maxLon = Math.max(maxLon, c[0]);
                    minLat = Math.min(minLat, c[1]);
                    maxLat = Math.max(maxLat, c[1]);
                }
                item.putArray("bbox").add(minLon).add(minLat).add(maxLon).add(maxLat);
            }
        }

        ObjectNode props = item.putObject("properties");
        props.put("title", "thermotile run " + name + (lay.period() == null ? "" : ", period " + lay.period()));
        props.put("description", "Simulated surface temperatures of every grid cell (maps, tables, comparison, "
                + "hot spots and report). " + manifest.path("caution").asText(""));
        props.putNull("datetime");
        JsonNode t = manifest.path("time_range");
        props.put("start_datetime", t.path("start").asText(null));
        props.put("end_datetime", t.path("end").asText(null));
        if (grid != null) {
            putProjection(props, grid);
        }
        props.put("thermotile:version", manifest.path("versions").path("thermotile").asText(null));
        if (lay.period() != null) {
            props.put("thermotile:period", lay.period());
        }
        ArrayNode periods = props.putArray("thermotile:periods");
        manifest.path("periods").forEach(p -> periods.add(p.path("name").asText()));
        if (periods.isEmpty()) {
            props.remove("thermotile:periods");
        }
        ArrayNode scen = props.putArray("thermotile:scenarios");
        scen.add("baseline");
        JsonNode scenarios = manifest.has("scenarios") ? manifest.path("scenarios")
                : periodManifest(lay, manifest).path("scenarios");
        scenarios.path("list").forEach(s -> scen.add(s.path("name").asText()));
        props.put("thermotile:cell_size_m", manifest.path("grid").path("pixel_m").asDouble());
        props.put("thermotile:cells", manifest.path("simulation").path("cells").asLong());
        if (scenarios.has("threshold_c")) {
            props.put("thermotile:threshold_c", scenarios.path("threshold_c").asDouble());
        }

        ArrayNode links = item.putArray("links");
        if (lay.period() != null) {
            link(links, "../../" + FILE, "the whole run (every period)");
        }
        for (JsonNode p : manifest.path("periods")) {
            link(links, "periods/" + p.path("name").asText() + "/" + FILE, "period " + p.path("name").asText());
        }

        ObjectNode assets = item.putObject("assets");
        for (String f : files) {
            assets.set(f.startsWith("../../") ? f.substring("../../".length()) : f, asset(om, dir, f));
        }
        return item;
    }

    private static void link(ArrayNode links, String href, String title) {
        ObjectNode l = links.addObject();
        l.put("rel", "related");
        l.put("href", href);
        l.put("type", GEOJSON);
        l.put("title", title);
    }

    /** A period's manifest for the facts a run's own manifest over several periods leaves out. */
    private static JsonNode periodManifest(RunLayout lay, JsonNode manifest) throws IOException {
        JsonNode first = manifest.path("periods").path(0);
        Path f = lay.root().resolve(first.path("folder").asText("-")).resolve("manifest.json");
        return Files.isRegularFile(f) ? new ObjectMapper().readTree(f.toFile()) : new ObjectMapper().createObjectNode();
    }

    /** The projection extension's fields of a grid (v1.1.0). */
    private static void putProjection(ObjectNode o, RasterGrid g) {
        if (g.epsg() > 0) {
            o.put("proj:epsg", g.epsg());
        } else {
            o.putNull("proj:epsg");
            o.put("proj:wkt2", g.crsWkt());
        }
        o.putArray("proj:shape").add(g.height()).add(g.width());
        // Affine coefficients a, b, c, d, e, f: x = a·col + b·row + c, y = d·col + e·row + f.
        o.putArray("proj:transform").add(g.pixelWidth()).add(0.0).add(g.originX())
                .add(0.0).add(g.pixelHeight()).add(g.originY());
        double x1 = g.originX() + g.width() * g.pixelWidth();
        double y1 = g.originY() + g.height() * g.pixelHeight();
        o.putArray("proj:bbox").add(Math.min(g.originX(), x1)).add(Math.min(g.originY(), y1))
                .add(Math.max(g.originX(), x1)).add(Math.max(g.originY(), y1));
    }

    /**
     * The grid's corners (lower left, lower right, upper right, upper left: the outer edges of the
     * corner cells) in WGS 84 longitude, latitude [°], by Apache SIS's coordinate operation from the
     * map's CRS.
     */
    static double[][] cornersLonLat(GeoTiffReader r) {
        RasterGrid g = r.grid();
        double x0 = g.originX(), y0 = g.originY();
        double x1 = x0 + g.width() * g.pixelWidth(), y1 = y0 + g.height() * g.pixelHeight();
        double[] pts = {x0, y1, x1, y1, x1, y0, x0, y0};
        try {
            MathTransform mt = CRS.findOperation(r.crs(), CommonCRS.WGS84.normalizedGeographic(), null).getMathTransform();
            double[] out = new double[8];
            mt.transform(pts, 0, out, 0, 4);
            return new double[][] {{out[0], out[1]}, {out[2], out[3]}, {out[4], out[5]}, {out[6], out[7]}};
        } catch (org.opengis.util.FactoryException | org.opengis.referencing.operation.TransformException e) {
            throw new IllegalStateException(r.file() + ": its corners cannot be transformed to WGS 84 ("
                    + e.getMessage() + ")", e);
        }
    }

    /**
     * The files an item lists, as hrefs relative to its folder, sorted: every file of the folder and
     * below except items, hidden files, checksums and Spark's {@code _SUCCESS} markers; a run over
     * several periods' own item leaves the periods' items out; a period's item adds its partitions
     * of the run's tables.
     */
    static List<String> assets(RunLayout lay) throws IOException {
        Path dir = lay.dir();
        List<String> out = new ArrayList<>(listed(dir, ""));
        if (lay.period() != null) {
            Path tables = lay.root().resolve("tables");
            if (Files.isDirectory(tables)) {
                try (Stream<Path> s = Files.list(tables)) {
                    for (Path t : s.sorted().toList()) {
                        Path part = lay.table(t.getFileName().toString());
                        if (Files.isDirectory(part)) {
                            out.addAll(listed(part, "../../" + lay.root().relativize(part).toString().replace('\\', '/') + "/"));
                        }
                    }
                }
            }
        }
        return out;
    }

    private static List<String> listed(Path dir, String prefix) throws IOException {
        try (Stream<Path> s = Files.walk(dir)) {
            return s.filter(Files::isRegularFile)
                    .map(p -> dir.relativize(p).toString().replace('\\', '/'))
                    .filter(StacItem::isAsset)
                    .sorted()
                    .map(p -> prefix + p)
                    .toList();
        }
    }

    private static boolean isAsset(String rel) {
        String base = rel.substring(rel.lastIndexOf('/') + 1);
        if (base.startsWith(".") || base.startsWith("_") || base.endsWith(".crc") || base.equals(FILE)) {
            return false;
        }
        for (String part : rel.split("/")) {
            if (part.startsWith(".")) {
                return false;
            }
        }
        return true;
    }

    /** One asset: href, type, title, description, roles, and for a GeoTIFF its grid and bands. */
    private static ObjectNode asset(ObjectMapper om, Path dir, String href) throws IOException {
        ObjectNode a = om.createObjectNode();
        a.put("href", href);
        a.put("type", mediaType(href));
        OutputDescriptions.Entry d = OutputDescriptions.of(href.startsWith("../../") ? href.substring(6) : href);
        GeoTiffReader opened = null;
        if (href.endsWith(".tif")) {
            try {
                opened = GeoTiffReader.open(dir.resolve(href));
            } catch (org.thermotile.jobs.io.raster.RasterFileException e) {
                opened = null;   // listed all the same, without grid and bands (a map the run did not write)
            }
        }
        if (opened != null) {
            try (GeoTiffReader r = opened) {
                List<String[]> bands = bandTexts(r.gdalMetadata(), r.bandCount());
                a.put("title", d.title());
                a.put("description", mapDescription(d.description(), bands));
                a.putArray("roles").add("data");
                putProjection(a, r.grid());
                ArrayNode rb = a.putArray("raster:bands");
                for (int b = 0; b < r.bandCount(); b++) {
                    ObjectNode o = rb.addObject();
                    o.put("data_type", r.sampleType().label());
                    if (r.noDataValue().isPresent()) {
                        double nd = r.noDataValue().getAsDouble();
                        if (Double.isNaN(nd)) {
                            o.put("nodata", "nan");
                        } else if (nd == Math.rint(nd)) {
                            o.put("nodata", (long) nd);
                        } else {
                            o.put("nodata", nd);
                        }
                    }
                    if (bands.get(b)[1] != null) {
                        o.put("unit", bands.get(b)[1]);
                    }
                    o.put("spatial_resolution", r.grid().pixelWidth());
                }
            }
        } else {
            a.put("title", d.title());
            a.put("description", d.description());
            ArrayNode roles = a.putArray("roles");
            d.roles().forEach(roles::add);
        }
        return a;
    }

    /** A map's description: what it holds, then its band's description and unit (or the band count). */
    private static String mapDescription(String what, List<String[]> bands) {
        StringBuilder b = new StringBuilder(what);
        if (bands.size() == 1 && bands.get(0)[0] != null) {
            b.append(" Band 1: ").append(bands.get(0)[0]);
            if (bands.get(0)[1] != null) {
                b.append(" [").append(bands.get(0)[1]).append("]");
            }
            b.append('.');
        } else if (bands.size() > 1) {
            b.append(String.format(Locale.ROOT, " %d bands", bands.size()));
            if (bands.get(0)[0] != null) {
                b.append(", from \"").append(bands.get(0)[0]).append("\" to \"")
                        .append(bands.get(bands.size() - 1)[0]).append('"');
            }
            b.append('.');
        }
        return b.toString();
    }

    private static final Pattern ITEM = Pattern.compile(
            "<Item name=\"(DESCRIPTION|UNITTYPE)\" sample=\"(\\d+)\"[^>]*>([^<]*)</Item>");

    /** Each band's [description, unit] from GDAL's metadata XML (nulls where absent). */
    static List<String[]> bandTexts(String xml, int bandCount) {
        List<String[]> out = new ArrayList<>();
        for (int b = 0; b < bandCount; b++) {
            out.add(new String[2]);
        }
        if (xml != null) {
            Matcher m = ITEM.matcher(xml);
            while (m.find()) {
                int b = Integer.parseInt(m.group(2));
                if (b < bandCount) {
                    out.get(b)[m.group(1).equals("DESCRIPTION") ? 0 : 1] = unescape(m.group(3));
                }
            }
        }
        return out;
    }

    private static String unescape(String s) {
        return s.replace("&lt;", "<").replace("&gt;", ">").replace("&quot;", "\"").replace("&apos;", "'")
                .replace("&amp;", "&");
    }

    /** The media type of a file by its name (STAC best practices; IANA). */
    static String mediaType(String href) {
        String f = href.toLowerCase(Locale.ROOT);
        if (f.endsWith(".tif") || f.endsWith(".tiff")) {
            return COG;
        } else if (f.endsWith(".parquet")) {
            return PARQUET;
        } else if (f.endsWith(".csv")) {
            return "text/csv";
        } else if (f.endsWith(".html")) {
            return "text/html";
        } else if (f.endsWith(".geojson")) {
            return GEOJSON;
        } else if (f.endsWith(".json")) {
            return "application/json";
        } else if (f.endsWith(".png")) {
            return "image/png";
        } else if (f.endsWith(".md")) {
            return "text/markdown";
        } else if (f.endsWith(".yaml") || f.endsWith(".yml")) {
            return "application/yaml";
        } else if (f.endsWith(".txt")) {
            return "text/plain";
        }
        return "application/octet-stream";
    }
}
