package org.thermotile.jobs.observe;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.io.MaterialsFile;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.materials.MaterialOverrides;
import org.thermotile.model.observe.Calibration;

/** The calibrated materials file reads back through MaterialsFile; the CSV is deterministic. */
class CalibrationFilesTest {
    @TempDir
    Path dir;

    private static Calibration.Fit fit() {
        Material asphalt = MaterialOverrides.apply(MaterialLibrary.get("asphalt_aged"), "albedo", 0.2031, "calibration");
        Material grass = MaterialOverrides.apply(MaterialLibrary.get("grass_irrigated"), "moisture_availability", 0.31,
                "calibration");
        var a = new Calibration.Estimate(Calibration.Parameter.of(0, "albedo"), 0.12, 0.2031, 0.0028, true, "");
        var g = new Calibration.Estimate(Calibration.Parameter.of(1, "moisture_availability"), 0.9, 0.31,
                Double.POSITIVE_INFINITY, false, "the observations constrain it only together with other parameters");
        return new Calibration.Fit(new Material[] {asphalt, grass}, List.of(a, g), new int[] {1, 2, 3}, 6, 2.3, 0.48,
                -0.42, -0.03, 41);
    }

    @Test
    void calibratedMaterialsReadBackAndNonIdentifiableKeepTheirStart() throws Exception {
        Path f = dir.resolve("calibrated.yaml");
        CalibrationFiles.writeMaterials(f, fit(), "image night.tif");
        List<Material> read = MaterialsFile.read(f);
        assertEquals(2, read.size(), Files.readString(f));
        Material asphalt = MaterialsFile.mergeWithLibrary(read).get("asphalt_aged");
        assertEquals(0.2031, asphalt.albedo(), 1e-12);
        assertTrue(asphalt.sources().get("albedo").contains("albedo 0.203100 ± 0.00280000"), asphalt.sources().toString());
        assertEquals(MaterialLibrary.get("asphalt_aged").emissivity(), asphalt.emissivity(), 0.0);
        Material grass = MaterialsFile.mergeWithLibrary(read).get("grass_irrigated");
        assertEquals(0.9, grass.moistureAvailability(), 0.0, "not identifiable: kept at the start");
        assertTrue(Files.readString(f).contains("not identifiable"));
        assertTrue(Files.list(dir).noneMatch(p -> p.toString().endsWith(".tmp")));
    }

    @Test
    void statisticsCsvIsDeterministic() throws Exception {
        Path a = dir.resolve("a.csv");
        Path b = dir.resolve("b.csv");
        CalibrationFiles.writeStatistics(a, fit());
        CalibrationFiles.writeStatistics(b, fit());
        assertEquals(Files.readString(a), Files.readString(b));
        List<String> lines = Files.readAllLines(a);
        assertEquals(String.join(",", CalibrationFiles.CSV_COLUMNS), lines.get(0));
        assertEquals("albedo,asphalt_aged,0.120000,0.203100,0.00280000,true,", lines.get(1));
        assertTrue(lines.get(2).startsWith("moisture_availability,grass_irrigated,0.900000,0.310000,inf,false,"),
                lines.get(2));
        assertEquals("rmse_k,,2.30000,0.480000,,,\"stratified random sample by dominant material, equal allocation "
                + "(up to 30 pixels per material, without replacement), seed 20260714: 3 pixels, 6 residuals\"",
                lines.get(3));
    }
}
