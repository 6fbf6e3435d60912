package org.thermotile.jobs.demo;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.List;
import java.util.Locale;
import java.util.OptionalInt;
import java.util.TreeMap;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.io.weather.WeatherCsv;
import org.thermotile.model.forcing.Site;

/**
 * Writes the inputs of the demo city Riverside Flats, an invented riverside district: the same
 * bytes on every run (fixed seed, no time stamps). Run it from the project root after changing the
 * plan, and commit what it writes ({@code DemoCityGeneratorTest} fails until the committed files
 * match a fresh run):
 * <pre>
 * mvn -q -pl jobs -am compile dependency:build-classpath -DincludeScope=runtime -Dmdep.outputFile=target/cp.txt
 * java -cp "jobs/target/classes:$(cat jobs/target/cp.txt)" \
 *     org.thermotile.jobs.demo.DemoCityGenerator [output folder, default data-samples/riverside]
 * </pre>
 *
 * <p>Files written into the folder:
 * <ul>
 * <li>{@value #LAND_COVER}: uint8 land-cover codes ({@link DemoClass}), no-data 0, on
 *     {@link #grid()}: WGS 84 / UTM zone 32N (EPSG:32632), {@value RiversideLayout#WIDTH} ×
 *     {@value RiversideLayout#HEIGHT} cells of {@value #CELL_M} m, north-up;</li>
 * <li>{@value #HEIGHTS}: float32 heights above ground [m] on the same grid, no-data −9999;</li>
 * <li>{@value #CLASSES}: the class table (codes → library materials);</li>
 * <li>{@value #DISTRICTS}: five district polygons in EPSG:32632, GeoJSON with a named-CRS member;</li>
 * <li>{@value #WEATHER}: the invented hot week ({@link RiversideWeather}).</li>
 * </ul>
 * The run file {@code run.yaml} beside them is kept by hand; its site block repeats {@link #SITE}.
 */
public final class DemoCityGenerator {
    /** File names. */
    public static final String LAND_COVER = "landcover.tif";
    public static final String HEIGHTS = "heights.tif";
    public static final String CLASSES = "classes.yaml";
    public static final String DISTRICTS = "districts.geojson";
    public static final String WEATHER = "weather.csv";
    /** All files this generator writes, in writing order. */
    public static final List<String> FILES = List.of(LAND_COVER, HEIGHTS, CLASSES, DISTRICTS, WEATHER);

    /** EPSG code of WGS 84 / UTM zone 32N. */
    public static final int EPSG = 32632;
    /** Cell size [m]. */
    public static final double CELL_M = 4.0;
    /** Top-left corner of the grid, easting and northing [m]: open countryside, chosen for the demo. */
    public static final double ORIGIN_EASTING_M = 500_800;
    public static final double ORIGIN_NORTHING_M = 4_999_600;
    /**
     * The site: latitude and longitude of the grid centre (E 501 800 m, N 4 998 900 m in zone 32N)
     * rounded to 1e-4°, and an invented elevation of 70 m.
     */
    public static final Site SITE = new Site(45.1436, 9.0229, 70);

    /** No-data value of the height raster [m]. */
    public static final float HEIGHT_NODATA_M = -9999f;

    private DemoCityGenerator() { }

    /** The demo grid. */
    public static RasterGrid grid() {
        return RasterGrid.ofEpsg(RiversideLayout.WIDTH, RiversideLayout.HEIGHT, ORIGIN_EASTING_M, ORIGIN_NORTHING_M,
                CELL_M, -CELL_M, EPSG);
    }

    /** Writes the five files ({@link #FILES}) into {@code dir}, creating it if needed. */
    public static void generate(Path dir) throws IOException {
        Files.createDirectories(dir);
        RasterGrid grid = grid();
        RiversideLayout.Plan plan = RiversideLayout.build();
        GeoTiffWriter.writeInt(dir.resolve(LAND_COVER), grid, GeoTiffWriter.IntType.UINT8, plan.codes(),
                OptionalInt.of(0));
        GeoTiffWriter.writeFloat(dir.resolve(HEIGHTS), grid, plan.heightsM(), HEIGHT_NODATA_M);
        writeText(dir.resolve(CLASSES), classTableYaml());
        writeText(dir.resolve(DISTRICTS), districtsGeoJson());
        WeatherCsv.write(RiversideWeather.build(SITE), dir.resolve(WEATHER), List.of(
                "Riverside Flats demo weather: INVENTED DEMO DATA for an invented city. Not measured;",
                "do not use it for any real study. Written by org.thermotile.jobs.demo.DemoCityGenerator.",
                String.format(Locale.ROOT, "Clear-sky irradiance (Bird & Hulstrom 1981) at %.4f N, %.4f E, %.0f m,",
                        SITE.latitudeDeg(), SITE.longitudeDeg(), SITE.elevationM()),
                "local clock UTC+02:00. Daily air temperature maximum rising 31 -> 36 C and minimum 19 -> 23 C,",
                "dew point 16 C, wind 1.5 to 3 m/s; a cloudier afternoon on " + RiversideWeather.CLOUDY_DAY + "."));
    }

    /** Number of cells per code, sorted by code. */
    static TreeMap<Integer, Long> codeCounts(int[] codes) {
        TreeMap<Integer, Long> counts = new TreeMap<>();
        for (int c : codes) {
            counts.merge(c, 1L, Long::sum);
        }
        return counts;
    }

    /** The class table of {@link DemoClass}, as YAML for {@code ClassTableReader}. */
    static String classTableYaml() {
        StringBuilder s = new StringBuilder();
        s.append("# Class table of Riverside Flats, the invented demo city: land-cover codes of our own to\n");
        s.append("# library materials. Written by org.thermotile.jobs.demo.DemoCityGenerator; change the\n");
        s.append("# generator, not this file. Codes: 1x paved, 2x roofs, 3x bare ground, 4x vegetation,\n");
        s.append("# 50 water; 0 is the raster's no-data value and not a class.\n");
        s.append("name: riverside\n");
        s.append("reference: \"Riverside Flats demo land cover (invented), codes of our own\"\n");
        s.append("classes:\n");
        for (DemoClass c : DemoClass.values()) {
            if (!Double.isNaN(c.albedo)) {
                s.append("  # Demo choice: a white membrane dulled by years of dirt; invented albedo, lower than\n");
                s.append("  # the new membrane's (aged roofs rate lower than new ones).\n");
            }
            s.append("  - {code: ").append(c.code).append(", material: ").append(c.material)
                    .append(", label: \"").append(c.label).append('"');
            if (!Double.isNaN(c.albedo)) {
                s.append(", overrides: {albedo: ").append(c.albedo).append('}');
            }
            s.append("}\n");
        }
        return s.toString();
    }

    /**
     * The districts as GeoJSON: a FeatureCollection with a named-CRS member (EPSG:32632), one
     * Polygon feature per district with properties {@code id} and {@code name}, rings counter-
     * clockwise, coordinates in whole metres. West and east districts meet on the avenue's centre
     * line, north and south ones on the river's centre line; East Meadows is the fringe east of
     * the street grid. Together they cover the grid exactly.
     */
    static String districtsGeoJson() {
        int w = RiversideLayout.WIDTH;
        int h = RiversideLayout.HEIGHT;
        double split = RiversideLayout.AVENUE_CENTRE_X;
        double fringe = RiversideLayout.FRINGE_COL;
        double[][][] rings = new double[5][][];
        rings[RiversideLayout.OLD_QUAY] = concat(new double[][] {{split, 0}, {0, 0}}, river(0, split));
        rings[RiversideLayout.MILL_QUARTER] = concat(new double[][] {{fringe, 0}, {split, 0}}, river(split, fringe));
        rings[RiversideLayout.PARKSIDE] = concat(new double[][] {{0, h}, {split, h}}, reverse(river(0, split)));
        rings[RiversideLayout.SOUTH_BANK] = concat(new double[][] {{split, h}, {fringe, h}},
                reverse(river(split, fringe)));
        rings[RiversideLayout.EAST_MEADOWS] = new double[][] {{fringe, 0}, {fringe, h}, {w, h}, {w, 0}};

        JsonNodeFactory f = JsonNodeFactory.instance;
        ObjectMapper json = new ObjectMapper();
        StringBuilder s = new StringBuilder();
        s.append("{\n\"type\": \"FeatureCollection\",\n\"name\": \"riverside-districts\",\n");
        s.append("\"crs\": {\"type\": \"name\", \"properties\": {\"name\": \"urn:ogc:def:crs:EPSG::").append(EPSG)
                .append("\"}},\n\"features\": [\n");
        for (int d = 0; d < rings.length; d++) {
            ObjectNode feature = f.objectNode();
            feature.put("type", "Feature");
            ObjectNode props = feature.putObject("properties");
            props.put("id", RiversideLayout.DISTRICT_IDS[d]);
            props.put("name", RiversideLayout.DISTRICT_NAMES[d]);
            ObjectNode geometry = feature.putObject("geometry");
            geometry.put("type", "Polygon");
            ArrayNode ring = geometry.putArray("coordinates").addArray();
            double[][] pts = rings[d];
            for (int k = 0; k <= pts.length; k++) {
                double[] p = pts[k % pts.length];              // closed: first point repeated
                ring.addArray().add(metresLong(easting(p[0]))).add(metresLong(northing(p[1])));
            }
            try {
                s.append(json.writeValueAsString(feature));
            } catch (IOException e) {
                throw new IllegalStateException("cannot serialise district " + d, e);
            }
            s.append(d + 1 < rings.length ? ",\n" : "\n");
        }
        s.append("]\n}\n");
        return s.toString();
    }

    /** River vertices with x in [x0, x1], west to east, in cell units; x0 and x1 must be vertices. */
    private static double[][] river(double x0, double x1) {
        double[] xs = RiversideLayout.RIVER_X;
        double[] ys = RiversideLayout.RIVER_Y;
        int n = 0;
        for (double x : xs) {
            n += x >= x0 && x <= x1 ? 1 : 0;
        }
        double[][] out = new double[n][];
        int k = 0;
        for (int i = 0; i < xs.length; i++) {
            if (xs[i] >= x0 && xs[i] <= x1) {
                out[k++] = new double[] {xs[i], ys[i]};
            }
        }
        if (out[0][0] != x0 || out[n - 1][0] != x1) {
            throw new IllegalStateException("district edges must fall on river vertices: " + x0 + ", " + x1);
        }
        return out;
    }

    private static double[][] reverse(double[][] a) {
        double[][] r = new double[a.length][];
        for (int i = 0; i < a.length; i++) {
            r[i] = a[a.length - 1 - i];
        }
        return r;
    }

    private static double[][] concat(double[][] a, double[][] b) {
        double[][] r = new double[a.length + b.length][];
        System.arraycopy(a, 0, r, 0, a.length);
        System.arraycopy(b, 0, r, a.length, b.length);
        return r;
    }

    /** Easting of grid x (cell units) [m]: E = E₀ + x·cell. */
    static double easting(double x) {
        return ORIGIN_EASTING_M + x * CELL_M;
    }

    /** Northing of grid y (cell units, southwards) [m]: N = N₀ − y·cell. */
    static double northing(double y) {
        return ORIGIN_NORTHING_M - y * CELL_M;
    }

    private static long metresLong(double v) {
        long m = Math.round(v);
        if (m != v) {
            throw new IllegalStateException("district vertex " + v + " m is not on a whole metre");
        }
        return m;
    }

    private static void writeText(Path file, String text) throws IOException {
        Path tmp = file.resolveSibling(file.getFileName() + ".tmp");
        Files.writeString(tmp, text, StandardCharsets.UTF_8);
        Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
    }

    /** Writes the demo inputs into {@code args[0]} (default {@code data-samples/riverside}) and prints a summary. */
    public static void main(String[] args) throws IOException {
        if (args.length > 1) {
            System.err.println("usage: DemoCityGenerator [output folder, default data-samples/riverside]");
            System.exit(2);
        }
        Path dir = Path.of(args.length == 1 ? args[0] : "data-samples/riverside");
        generate(dir);
        System.out.println("Riverside Flats written to " + dir.toAbsolutePath().normalize());
        System.out.println("grid: " + grid());
        TreeMap<Integer, Long> counts = codeCounts(RiversideLayout.build().codes());
        long cells = grid().cellCount();
        for (DemoClass c : DemoClass.values()) {
            long n = counts.getOrDefault(c.code, 0L);
            System.out.printf(Locale.ROOT, "  %3d %-22s %7d cells %5.1f %%  %s%n", c.code, c.material, n,
                    100.0 * n / cells, c.label);
        }
        for (String name : FILES) {
            System.out.printf(Locale.ROOT, "  %-18s %8d bytes%n", name, Files.size(dir.resolve(name)));
        }
    }
}
