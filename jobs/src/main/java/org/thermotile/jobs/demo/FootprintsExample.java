package org.thermotile.jobs.demo;

import java.io.IOException;
import java.math.BigDecimal;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.opengis.referencing.operation.MathTransform;

/**
 * Writes the inputs of the footprints example ({@code data-samples/footprints-example/}), all
 * INVENTED DEMO DATA: building footprints in WGS 84 longitude/latitude (RFC 7946) over the Riverside
 * Flats grid, and the demo weather rewritten in another layout (other column names, °F, km/h, kPa,
 * cloud in %, a day-first local time) so that the run file's {@code weather.columns} mapping can be
 * shown and checked. The conversion is done on the decimal text (°F = 1.8 °C + 32, km/h = 3.6 m/s,
 * kPa = hPa / 10, % = 100 × fraction; NIST SP 811 (2008) App. B), so it is exact and reproducible.
 *
 * <p>Usage: {@code FootprintsExample RIVERSIDE_WEATHER_CSV OUT_FOLDER}.
 */
public final class FootprintsExample {
    private FootprintsExample() {}

    /** The mapped weather file's header (names of our own invention, not our layout's). */
    public static final String MAPPED_HEADER = "Observed at,Temp (F),RH %,Wind km/h,Global W/m2,Beam W/m2,"
            + "Diffuse W/m2,Cloud %,Station kPa";

    public static void main(String[] args) throws Exception {
        if (args.length != 2) {
            System.err.println("usage: FootprintsExample RIVERSIDE_WEATHER_CSV OUT_FOLDER");
            System.exit(2);
        }
        Path out = Path.of(args[1]);
        Files.createDirectories(out);
        writeMappedWeather(Path.of(args[0]), out.resolve("weather-mapped.csv"));
        writeFootprints(out.resolve("footprints.geojson"));
    }

    /** Our-layout weather {@code in} (time,air_temp_c,rel_humidity_pct,wind_ms,ghi,dni,dhi,cloud,pressure) rewritten. */
    public static void writeMappedWeather(Path in, Path target) throws IOException {
        List<String> lines = Files.readAllLines(in, StandardCharsets.UTF_8);
        List<String> outLines = new ArrayList<>();
        outLines.add("# INVENTED DEMO DATA: the Riverside Flats demo weather in another layout (degF, km/h, kPa,");
        outLines.add("# cloud in %, local day-first time at UTC+02:00). Written by org.thermotile.jobs.demo.FootprintsExample.");
        boolean header = false;
        for (String line : lines) {
            if (line.isBlank() || line.startsWith("#")) {
                continue;
            }
            if (!header) {
                if (!line.strip().equals("time,air_temp_c,rel_humidity_pct,wind_ms,ghi_wm2,dni_wm2,dhi_wm2,"
                        + "cloud_fraction,pressure_hpa")) {
                    throw new IllegalArgumentException(in + ": unexpected header " + line);
                }
                outLines.add(MAPPED_HEADER);
                header = true;
                continue;
            }
            String[] c = line.split(",", -1);
            String t = c[0];   // 2026-07-11T00:00+02:00 → 11/07/2026 00:00
            if (!t.endsWith("+02:00")) {
                throw new IllegalArgumentException(in + ": expected times at +02:00, got " + t);
            }
            String local = t.substring(8, 10) + "/" + t.substring(5, 7) + "/" + t.substring(0, 4) + " " + t.substring(11, 16);
            outLines.add(String.join(",", local,
                    affine(c[1], "1.8", "32"), c[2], affine(c[3], "3.6", "0"), c[4], c[5], c[6],
                    affine(c[7], "100", "0"), affine(c[8], "0.1", "0")));
        }
        Files.write(target, (String.join("\n", outLines) + "\n").getBytes(StandardCharsets.UTF_8));
    }

    /** a·x + b on decimal text, exactly; an empty cell stays empty. */
    static String affine(String x, String a, String b) {
        if (x.isBlank()) {
            return "";
        }
        return new BigDecimal(x.strip()).multiply(new BigDecimal(a)).add(new BigDecimal(b)).stripTrailingZeros()
                .toPlainString();
    }

    /**
     * Invented buildings over the Riverside Flats grid (E 500800…502800, N 4998200…4999600 in
     * WGS 84 / UTM 32N): rectangles given in UTM metres, written in WGS 84 lon/lat to 1e-7°.
     * Two features have no usable height on purpose (null; "unknown"), to show how they are counted.
     */
    public static void writeFootprints(Path target) throws Exception {
        // {west, south, east, north} [m UTM 32N], height [m], floors, roof material id (or null)
        Object[][] b = {
            {501000, 4999300, 501060, 4999380, 18.0, 6, "roof_membrane_dark"},
            {501100, 4999300, 501140, 4999340, 9.0, 3, "clay_tile"},
            {501180, 4999252, 501300, 4999332, 24.0, 8, "roof_membrane_white"},
            {501400, 4999100, 501452, 4999148, 12.0, 4, "roof_membrane_dark"},
            {501500, 4999100, 501560, 4999132, 6.0, 2, "metal_roof_bare"},
            {501600, 4998900, 501680, 4999000, 30.0, 10, "roof_membrane_white"},
            {501700, 4998700, 501736, 4998760, 7.5, 2, "bitumen_shingle"},
            {501800, 4998500, 501900, 4998560, 15.0, 5, null},
            {502000, 4998400, 502040, 4998440, 4.5, 1, "green_roof"},
            {502200, 4998600, 502300, 4998700, 21.0, 7, "roof_membrane_dark"},
            {501620, 4998940, 501720, 4998980, 12.0, 4, "clay_tile"},   // overlaps the 30 m block: tallest wins
            {502400, 4999200, 502440, 4999260, Double.NaN, 3, null},    // height null
            {502500, 4999200, 502530, 4999230, -1.0, 2, null},          // height "unknown"
        };
        MathTransform toLonLat = CRS.findOperation(CommonCRS.WGS84.universal(45, 9),
                CommonCRS.WGS84.normalizedGeographic(), null).getMathTransform();
        StringBuilder s = new StringBuilder();
        s.append("{\"type\": \"FeatureCollection\",\n \"name\": \"Riverside Flats buildings (INVENTED DEMO DATA)\",\n")
                .append(" \"features\": [\n");
        for (int i = 0; i < b.length; i++) {
            double w = ((Number) b[i][0]).doubleValue();
            double so = ((Number) b[i][1]).doubleValue();
            double e = ((Number) b[i][2]).doubleValue();
            double n = ((Number) b[i][3]).doubleValue();
            double[] xy = {w, so, e, so, e, n, w, n, w, so};
            toLonLat.transform(xy, 0, xy, 0, 5);
            double h = (Double) b[i][4];
            String height = Double.isNaN(h) ? "null" : h < 0 ? "\"unknown\"" : String.format(Locale.ROOT, "%.1f", h);
            s.append("  {\"type\": \"Feature\", \"properties\": {\"name\": \"building ").append(i + 1)
                    .append("\", \"height_m\": ").append(height).append(", \"levels\": ").append(b[i][5])
                    .append(", \"roof\": ").append(b[i][6] == null ? "null" : "\"" + b[i][6] + "\"")
                    .append("},\n   \"geometry\": {\"type\": \"Polygon\", \"coordinates\": [[");
            for (int k = 0; k < 5; k++) {
                s.append(k == 0 ? "" : ", ").append(String.format(Locale.ROOT, "[%.7f, %.7f]", xy[2 * k], xy[2 * k + 1]));
            }
            s.append("]]}}").append(i + 1 < b.length ? ",\n" : "\n");
        }
        s.append(" ]}\n");
        Files.writeString(target, s.toString(), StandardCharsets.UTF_8);
    }
}
