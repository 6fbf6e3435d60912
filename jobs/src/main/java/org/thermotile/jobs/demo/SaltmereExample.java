package org.thermotile.jobs.demo;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.opengis.referencing.operation.MathTransform;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * Writes the building footprints and the mapped weather of the Saltmere example
 * ({@code data-samples/saltmere/}), all INVENTED DEMO DATA; the two land-cover tiles stay as they
 * are. Buildings are rectangles given in WGS 84 / UTM 32N metres (EPSG:32632) with edges on the
 * 4 m working grid's cell edges, written in WGS 84 longitude/latitude (RFC 7946) to 1e-7°; before
 * writing, every cell centre of every rectangle is looked up in the geographic tiles and must carry
 * a roof code (20…26 of the class table), so footprints sit where the land cover has roofs.
 *
 * <p>The weather is the Riverside Flats demo weather of 2026-07-14 00:00 … 2026-07-17 00:00 in another layout: US-style
 * local time {@code MM/dd/yyyy HH:mm} on the UTC+02:00 clock (no offset written), °F, km/h, cloud
 * in % and pressure in mbar; converted on the decimal text (°F = 1.8 °C + 32, km/h = 3.6 m/s;
 * NIST SP 811 (2008) App. B), so it is exact and reproducible.
 *
 * <p>Usage: {@code SaltmereExample RIVERSIDE_WEATHER_CSV SALTMERE_FOLDER}.
 */
public final class SaltmereExample {
    private SaltmereExample() {}

    /** The mapped weather file's header (names of our own invention). */
    public static final String WEATHER_HEADER = "Local Time,Dry Bulb F,Rel Hum,Wind kmh,GHI,DNI,DHI,Sky Cover %,"
            + "Pressure mbar,Remarks";

    /** First and last local day written (the run's spin-up day and its two days). */
    static final String FIRST_DAY = "2026-07-14";
    static final String LAST_DAY = "2026-07-16";
    static final String AFTER_LAST_DAY = "2026-07-17";

    /**
     * The buildings: {west, south, east, north} [m, EPSG:32632], height [m] (NaN: null; negative: the
     * text "unknown"), roof material id or null. Placed on roofs of the Riverside-derived land cover.
     */
    public static final Object[][] BUILDINGS = {
        {501000, 4999324, 501084, 4999400, 15.0, null},
        {501248, 4999320, 501316, 4999392, 9.0, "clay_tile"},
        {501360, 4999320, 501440, 4999392, 10.5, null},
        {501480, 4999324, 501564, 4999392, 8.0, "bitumen_shingle"},
        {502208, 4999324, 502284, 4999400, 24.0, "roof_membrane_dark"},
        {502328, 4999320, 502396, 4999392, 18.0, "roof_membrane_white"},
        {501488, 4999196, 501556, 4999280, 27.0, "roof_membrane_white"},
        {501368, 4999200, 501388, 4999280, 12.0, "green_roof"},
        {502084, 4998964, 502156, 4999036, 30.0, "roof_membrane_white"},
        {501480, 4998724, 501560, 4998800, 7.5, "clay_tile"},
        {501732, 4998720, 501800, 4998792, 21.0, "green_roof"},
        {501840, 4999324, 501916, 4999360, Double.NaN, null},      // height null
        {502084, 4999320, 502164, 4999356, -1.0, "metal_roof_bare"}, // height "unknown"
    };

    public static void main(String[] args) throws Exception {
        if (args.length != 2) {
            System.err.println("usage: SaltmereExample RIVERSIDE_WEATHER_CSV SALTMERE_FOLDER");
            System.exit(2);
        }
        Path folder = Path.of(args[1]);
        checkOnRoofs(List.of(folder.resolve("landcover_w.tif"), folder.resolve("landcover_e.tif")), BUILDINGS);
        writeWeather(Path.of(args[0]), folder.resolve("weather-local.csv"));
        writeFootprints(folder.resolve("footprints.geojson"));
    }

    /**
     * Every cell centre of every rectangle of {@code buildings} (layout of {@link #BUILDINGS}) must fall
     * on a roof code (20…26) of one of the geographic {@code tiles}; otherwise an exception names it.
     */
    public static void checkOnRoofs(List<Path> tiles, Object[][] buildings) throws Exception {
        MathTransform toLonLat = CRS.findOperation(CommonCRS.WGS84.universal(45, 9),
                CommonCRS.WGS84.normalizedGeographic(), null).getMathTransform();
        List<int[]> codes = new ArrayList<>();
        List<RasterGrid> grids = new ArrayList<>();
        for (Path t : tiles) {
            try (GeoTiffReader r = GeoTiffReader.openSingleBandAnyCrs(t)) {
                grids.add(r.grid());
                codes.add(r.readIntWindow(0, 0, r.grid().width(), r.grid().height()));
            }
        }
        for (int i = 0; i < buildings.length; i++) {
            double w = ((Number) buildings[i][0]).doubleValue();
            double s = ((Number) buildings[i][1]).doubleValue();
            double e = ((Number) buildings[i][2]).doubleValue();
            double n = ((Number) buildings[i][3]).doubleValue();
            for (double y = s + 2; y < n; y += 4) {
                for (double x = w + 2; x < e; x += 4) {
                    double[] p = {x, y};
                    toLonLat.transform(p, 0, p, 0, 1);
                    int code = -1;
                    for (int k = 0; k < grids.size() && code < 0; k++) {
                        RasterGrid g = grids.get(k);
                        int c = (int) Math.floor((p[0] - g.originX()) / g.pixelWidth());
                        int r = (int) Math.floor((p[1] - g.originY()) / g.pixelHeight());
                        if (c >= 0 && r >= 0 && c < g.width() && r < g.height()) {
                            code = codes.get(k)[r * g.width() + c];
                        }
                    }
                    if (code < 20 || code > 26) {
                        throw new IllegalStateException("building " + (i + 1) + ": cell centre (" + x + ", " + y
                                + ") has land-cover code " + code + ", not a roof");
                    }
                }
            }
        }
    }

    /** Our-layout weather {@code in} rewritten for {@link #FIRST_DAY} 00:00 … {@link #AFTER_LAST_DAY} 00:00 (local). */
    public static void writeWeather(Path in, Path target) throws IOException {
        List<String> outLines = new ArrayList<>();
        outLines.add("# INVENTED DEMO DATA: the Riverside Flats demo weather of 14-16 July 2026 (to 17 July 00:00) in another layout");
        outLines.add("# (local time on UTC+02:00 without offset, degF, km/h, sky cover in %, mbar).");
        outLines.add("# Written by org.thermotile.jobs.demo.SaltmereExample.");
        outLines.add(WEATHER_HEADER);
        boolean header = false;
        for (String line : Files.readAllLines(in, StandardCharsets.UTF_8)) {
            if (line.isBlank() || line.startsWith("#")) {
                continue;
            }
            if (!header) {
                if (!line.strip().equals("time,air_temp_c,rel_humidity_pct,wind_ms,ghi_wm2,dni_wm2,dhi_wm2,"
                        + "cloud_fraction,pressure_hpa")) {
                    throw new IllegalArgumentException(in + ": unexpected header " + line);
                }
                header = true;
                continue;
            }
            String[] c = line.split(",", -1);
            String t = c[0];   // 2026-07-14T00:00+02:00 → 07/14/2026 00:00
            if (!t.endsWith("+02:00")) {
                throw new IllegalArgumentException(in + ": expected times at +02:00, got " + t);
            }
            String day = t.substring(0, 10);
            boolean endHour = t.equals(AFTER_LAST_DAY + "T00:00+02:00");   // closes the last day
            if (!endHour && (day.compareTo(FIRST_DAY) < 0 || day.compareTo(LAST_DAY) > 0)) {
                continue;
            }
            String local = t.substring(5, 7) + "/" + t.substring(8, 10) + "/" + t.substring(0, 4) + " " + t.substring(11, 16);
            outLines.add(String.join(",", local,
                    FootprintsExample.affine(c[1], "1.8", "32"), c[2], FootprintsExample.affine(c[3], "3.6", "0"),
                    c[4], c[5], c[6], FootprintsExample.affine(c[7], "100", "0"), c[8],
                    t.substring(11, 13).equals("12") ? "\"noon, not read\"" : ""));
        }
        Files.write(target, (String.join("\n", outLines) + "\n").getBytes(StandardCharsets.UTF_8));
    }

    /** The buildings of {@link #BUILDINGS} as a GeoJSON FeatureCollection in WGS 84 lon/lat. */
    public static void writeFootprints(Path target) throws Exception {
        MathTransform toLonLat = CRS.findOperation(CommonCRS.WGS84.universal(45, 9),
                CommonCRS.WGS84.normalizedGeographic(), null).getMathTransform();
        StringBuilder s = new StringBuilder();
        s.append("{\"type\": \"FeatureCollection\",\n \"name\": \"Saltmere buildings (INVENTED DEMO DATA)\",\n")
                .append(" \"features\": [\n");
        for (int i = 0; i < BUILDINGS.length; i++) {
            double w = ((Number) BUILDINGS[i][0]).doubleValue();
            double so = ((Number) BUILDINGS[i][1]).doubleValue();
            double e = ((Number) BUILDINGS[i][2]).doubleValue();
            double n = ((Number) BUILDINGS[i][3]).doubleValue();
            double[] xy = {w, so, e, so, e, n, w, n, w, so};
            toLonLat.transform(xy, 0, xy, 0, 5);
            double h = (Double) BUILDINGS[i][4];
            String height = Double.isNaN(h) ? "null" : h < 0 ? "\"unknown\"" : String.format(Locale.ROOT, "%.1f", h);
            s.append("  {\"type\": \"Feature\", \"properties\": {\"name\": \"Saltmere building ").append(i + 1)
                    .append("\", \"height\": ").append(height)
                    .append(", \"roof\": ").append(BUILDINGS[i][5] == null ? "null" : "\"" + BUILDINGS[i][5] + "\"")
                    .append("},\n   \"geometry\": {\"type\": \"Polygon\", \"coordinates\": [[");
            for (int k = 0; k < 5; k++) {
                s.append(k == 0 ? "" : ", ").append(String.format(Locale.ROOT, "[%.7f, %.7f]", xy[2 * k], xy[2 * k + 1]));
            }
            s.append("]]}}").append(i + 1 < BUILDINGS.length ? ",\n" : "\n");
        }
        s.append(" ]}\n");
        Files.writeString(target, s.toString(), StandardCharsets.UTF_8);
    }
}
