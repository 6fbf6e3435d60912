package org.thermotile.jobs.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.io.raster.GeoTiffWriter;

/** The report's observed-images section, from an {@code observed/} folder with invented values. */
class ObservationSectionTest {
    @TempDir
    Path dir;

    static final FakeRun.Options SMALL = new FakeRun.Options(40, 30, 5, true, true, false, false);

    /** Writes observed/ as a comparison leaves it: 37 day pairs, 12 night pairs, 3 materials, 2 districts. */
    static void observed(Path run, boolean calibration) throws Exception {
        Path o = Files.createDirectories(run.resolve("observed"));
        StringBuilder pairs = new StringBuilder("image,pixel,simulated_c,observed_c\n");
        for (int i = 0; i < 37; i++) {
            pairs.append(String.format(Locale.ROOT, "day,%d,%.4f,%.4f%n", i, 30 + 0.5 * i, 29 + 0.5 * i));
        }
        for (int i = 0; i < 12; i++) {
            pairs.append(String.format(Locale.ROOT, "night,%d,%.4f,%.4f%n", i, 18 + 0.2 * i, 18.5 + 0.2 * i));
        }
        Files.writeString(o.resolve("pairs.csv"), pairs.toString());
        Files.writeString(o.resolve("agreement.csv"), """
                image,group,name,count,bias_k,rmse_k,mae_k,pearson_r
                day,all,all,37,1.0000,1.0000,1.0000,1.0000
                day,material,asphalt_aged,20,1.0000,1.0000,1.0000,1.0000
                day,material,grass_irrigated,10,1.0000,1.0000,1.0000,1.0000
                day,material,roof_membrane_dark,7,1.0000,1.0000,1.0000,
                day,district,Linden Park,17,1.0000,1.0000,1.0000,1.0000
                day,district,"Old Quay, south",20,1.0000,1.0000,1.0000,1.0000
                night,all,all,12,-0.5000,0.5000,0.5000,1.0000
                night,material,asphalt_aged,12,-0.5000,0.5000,0.5000,1.0000
                """);
        Files.writeString(o.resolve("CAUTIONS.txt"), "- view angle and thermal anisotropy\n- sub-pixel mixing\n");
        float[] d = new float[SMALL.width() * SMALL.height()];
        for (int i = 0; i < d.length; i++) {
            d[i] = i % 5 == 0 ? -9999f : (float) ((i % 9) - 4) * 0.5f;
        }
        GeoTiffWriter.writeFloat(o.resolve("difference_day.tif"), FakeRun.grid(SMALL), d, -9999f);
        GeoTiffWriter.writeFloat(o.resolve("difference_night.tif"), FakeRun.grid(SMALL), d, -9999f);
        if (calibration) {
            Files.writeString(o.resolve("calibration.csv"), """
                    quantity,material,before,after,standard_error,identifiable,note
                    albedo,asphalt_aged,0.12,0.15,0.004,true,
                    moisture_availability,grass_irrigated,0.4,0.4,,false,"flat cost, one image"
                    rmse_k,,1.2,0.6,,,"sample of 200 cells"
                    """);
        }
    }

    static int count(String html, String regex) {
        Matcher m = Pattern.compile(regex).matcher(html);
        int n = 0;
        while (m.find()) {
            n++;
        }
        return n;
    }

    static String between(String html, String start, String end) {
        int a = html.indexOf(start);
        assertTrue(a >= 0, start + " not in the page");
        return html.substring(a, html.indexOf(end, a));
    }

    @Test
    void sectionDrawsEveryPairTheTablesAndTheCalibration() throws Exception {
        observed(dir, true);
        ObservationSection.Drawn d = ObservationSection.html(dir, List.of());
        assertEquals(37, d.points().get("day"));
        assertEquals(12, d.points().get("night"));
        String day = between(d.html(), "id=\"scatter-day\"", "</figure>");
        assertEquals(37, count(day, "<circle "), "one dot per pair");
        assertTrue(day.contains("<title>1:1</title>"), "the 1:1 line");
        // 2 image rows, 4 material rows, 2 district rows; the quoted district name kept whole.
        assertEquals(8, d.agreementRows());
        String material = between(d.html(), "data-group=\"material\"", "</table>");
        assertEquals(4, count(material, "<tr><td>"));
        assertTrue(material.contains("<th class=\"n\">bias (K)</th><th class=\"n\">RMSE (K)</th>"), material);
        assertTrue(d.html().contains("<td>Old Quay, south</td>"), "quoted CSV cell");
        assertEquals(2, count(d.html(), "<figure class=\"map\" id=\"difference-"));
        assertTrue(d.html().contains("sub-pixel mixing") && d.html().contains("not air temperature"));
        assertTrue(d.calibration());
        String cal = between(d.html(), "<table class=\"calibration\">", "</table>");
        assertEquals(3, count(cal, "<tr><td>"));
        assertTrue(cal.contains("<td>flat cost, one image</td>") && cal.contains("standard error"), cal);
    }

    @Test
    void noObservedFolderNoSection() {
        assertNull(ObservationSection.html(dir, List.of()));
    }

    /** In the page: the section is listed only for a run folder with observed/. */
    @Test
    void reportShowsTheSectionOnlyWithObserved() throws Exception {
        SparkSession spark = SparkSessions.get(null, 1);
        try {
            Path with = dir.resolve("with");
            Path without = dir.resolve("without");
            FakeRun.write(with, SMALL, spark);
            FakeRun.write(without, SMALL, spark);
            observed(with, false);
            RunReport.Result a = RunReport.build(with);
            RunReport.Result b = RunReport.build(without);
            assertTrue(a.sections().contains("observed"), a.sections().toString());
            assertFalse(b.sections().contains("observed"), b.sections().toString());
            String page = Files.readString(a.html());
            assertFalse(page.contains("class=\"calibration\""), "no calibration.csv, no table");
            assertEquals(37 + 12, count(between(page, "<section id=\"observed\"", "</section>"), "<circle "));
        } finally {
            spark.stop();
        }
    }
}
