package org.thermotile.jobs.demo;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import org.junit.jupiter.api.Test;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.observe.ObservationSet;
import org.thermotile.jobs.observe.Observe;
import org.thermotile.model.observe.StoredScaling;

/** The committed invented demo images: what the generator states of them, and the demo run's block. */
class DemoObservationTest {
    static final Path DEMO = DemoCityGeneratorTest.DEMO;
    static final Path OBS = DEMO.resolve("observed");

    record Read(RasterGrid grid, int[] dn, int[] qa) {
    }

    static Read read(String name) {
        try (GeoTiffReader i = GeoTiffReader.openSingleBand(OBS.resolve("lst-" + name + ".tif"));
                GeoTiffReader q = GeoTiffReader.openSingleBand(OBS.resolve("qa-" + name + ".tif"))) {
            RasterGrid g = i.grid();
            return new Read(g, i.readIntWindow(0, 0, g.width(), g.height()), q.readIntWindow(0, 0, g.width(), g.height()));
        }
    }

    /** Mean of the clear pixels [K], decoded with the Collection 2 scale and offset. */
    static double clearMeanK(Read r) {
        StoredScaling s = new StoredScaling(DemoObservation.SCALE, DemoObservation.OFFSET, 0, false);
        double sum = 0;
        int n = 0;
        for (int i = 0; i < r.dn().length; i++) {
            if (r.qa()[i] == 1) {
                double k = s.decode(r.dn()[i]);
                // 0…87 °C: a bound wider than the demo's own peak maps and night minima (demo values).
                assertTrue(k > 273 && k < 360, "clear pixel " + i + ": " + k + " K");
                sum += k;
                n++;
            }
        }
        assertTrue(n > 1000, "clear pixels " + n);
        return sum / n;
    }

    @Test
    void imagesAre30mUInt16OnTheDemoCrsWithTheirMasks() throws Exception {
        Read day = read("day");
        Read night = read("night");
        RasterGrid run = DemoCityGenerator.grid();
        assertEquals(DemoObservation.imageGrid(run).width(), day.grid().width());
        assertEquals(30.0, day.grid().pixelWidth());
        assertEquals(run.epsg(), day.grid().epsg());
        assertTrue(day.grid().sameGridAs(night.grid()));
        int cloud = 0;
        for (int i = 0; i < day.qa().length; i++) {
            assertEquals(day.qa()[i] == 0, day.dn()[i] == 0, "no data in the image where the mask says so");
            cloud += day.qa()[i] == 2 ? 1 : 0;
        }
        // A disc of 120 m radius: about π·120²/30² ≈ 50 pixels.
        assertTrue(cloud > 35 && cloud < 65, "cloud pixels " + cloud);
        for (int q : night.qa()) {
            assertTrue(q == 0 || q == 1, "no cloud at night");
        }
        // At 12:30 local the surfaces are far warmer than at 22:15 (common knowledge of the daily cycle).
        assertTrue(clearMeanK(day) > clearMeanK(night) + 8, clearMeanK(day) + " vs " + clearMeanK(night));
        for (String f : DemoObservation.files()) {
            assertTrue(Files.size(OBS.resolve(f)) < 40_000, f + " stays small");
        }
    }

    @Test
    void truthFileGivesTheLibraryValueAndTheChange() throws Exception {
        String truth = Files.readString(OBS.resolve("truth.yaml"));
        assertTrue(truth.contains("INVENTED"));
        assertTrue(truth.contains("{material: asphalt_aged, parameter: albedo, library: "
                + fmt(DemoObservation.libraryValue(DemoObservation.TRUTH.get(0))) + ", true: "
                + fmt(DemoObservation.libraryValue(DemoObservation.TRUTH.get(0)) + 0.06) + "}"), truth);
        assertTrue(truth.contains("parameter: moisture_availability"), truth);
        String classes = DemoObservation.perturbedClasses(Files.readString(DEMO.resolve("classes.yaml")));
        assertEquals(2, classes.lines().filter(l -> l.contains("asphalt_aged") && l.contains("overrides: {albedo:"))
                .count(), "street and parking lot");
        assertEquals(1, classes.lines().filter(l -> l.contains("grass_dry")
                && l.contains("overrides: {moisture_availability:")).count());
    }

    private static String fmt(double v) {
        String s = String.format(java.util.Locale.ROOT, "%.6f", Math.round(v * 1e6) / 1e6).replaceAll("0+$", "");
        return s.endsWith(".") ? s + "0" : s;
    }

    /** The demo run's block names the committed images, and they pass the run's checks on the demo grid. */
    @Test
    void demoRunFileComparesWithTheImages() {
        RunFile rf = RunFileReader.read(DEMO.resolve("run.yaml"));
        assertEquals(2, rf.observations().size());
        assertEquals(Instant.parse("2026-07-16T10:30:00Z"), rf.observations().get(0).time());
        assertEquals(DemoObservation.NIGHT, rf.observations().get(1).time());
        assertEquals(OBS.resolve("lst-day.tif").toAbsolutePath().normalize().toString(), rf.observations().get(0).file());
        assertTrue(rf.outputs().hourlyDays().contains(java.time.LocalDate.of(2026, 7, 16)),
                "the images' hours fall on the hourly day the demo keeps anyway");
        Observe.check(ObservationSet.of(rf), DemoCityGenerator.grid());
        var file = ObservationSet.read(OBS.resolve("observations.yaml"));
        assertEquals(2, file.images().size());
    }
}
