package org.thermotile.jobs.io.raster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.ObjectInputStream;
import java.io.ObjectOutputStream;
import org.junit.jupiter.api.Test;

class RasterGridTest {

    static final RasterGrid G = RasterGrid.ofEpsg(300, 170, 431_000.0, 5_006_000.0, 10.0, -10.0, 32633);

    @Test
    void cellCentresAndArea() {
        assertEquals(431_005.0, G.cellCentreX(0), 0.0);
        assertEquals(431_000.0 + 299.5 * 10, G.cellCentreX(299), 0.0);
        assertEquals(5_005_995.0, G.cellCentreY(0), 0.0);
        assertEquals(5_006_000.0 - 169.5 * 10, G.cellCentreY(169), 0.0);
        assertEquals(100.0, G.pixelAreaM2(), 0.0);
        assertEquals(51_000, G.cellCount());
    }

    @Test
    void differencesAreSpelledOut() {
        assertTrue(G.sameGridAs(G));
        RasterGrid nearlySame = new RasterGrid(300, 170, 431_000.0 + 1e-9, 5_006_000.0, 10.0, -10.0, 32633, G.crsWkt());
        assertTrue(G.sameGridAs(nearlySame), "1e-9 m is within 1e-6 of a cell");
        RasterGrid other = RasterGrid.ofEpsg(301, 170, 431_005.0, 5_006_000.0, 10.0, -10.0, 32632);
        String d = G.differenceFrom(other).orElseThrow();
        assertTrue(d.contains("width 300 vs 301 cells"), d);
        assertTrue(d.contains("origin x 431000.0 vs 431005.0 m"), d);
        assertTrue(d.contains("CRS EPSG:32633 vs EPSG:32632"), d);
        assertFalse(d.contains("height"), d);
        assertFalse(G.sameGridAs(other));
    }

    @Test
    void onlyNorthUpGridsAreBuilt() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> new RasterGrid(3, 3, 0, 0, 10, 10, 32633, G.crsWkt()));
        assertTrue(e.getMessage().contains("pixelHeight < 0"), e.getMessage());
        assertThrows(IllegalArgumentException.class, () -> new RasterGrid(0, 3, 0, 0, 10, -10, 32633, G.crsWkt()));
        assertThrows(IllegalArgumentException.class, () -> new RasterGrid(3, 3, 0, 0, 10, -10, 32633, " "));
    }

    @Test
    void wktCarriesTheEpsgCode() {
        assertTrue(G.crsWkt().startsWith("PROJCRS[\"WGS 84 / UTM zone 33N\""), G.crsWkt());
        assertTrue(G.crsWkt().matches(".*ID\\[\"EPSG\", ?32633\\b.*"), G.crsWkt());
        assertFalse(G.crsWkt().contains("\n"), "one line");
    }

    @Test
    void utmZones() {
        // UTM zone = floor((lon + 180) / 6) + 1; 326zz north, 327zz south; zone 32 is widened over
        // south-western Norway (56–64° N, 3–12° E) (UTM grid definition, from memory).
        assertEquals(32633, RasterGrid.utmEpsg(45.2, 15.1));
        assertEquals(32734, RasterGrid.utmEpsg(-33.9, 18.4));
        assertEquals(32632, RasterGrid.utmEpsg(60.0, 5.0));
    }

    @Test
    void serialisesForSparkTasks() throws Exception {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        try (ObjectOutputStream out = new ObjectOutputStream(bytes)) {
            out.writeObject(G);
        }
        try (ObjectInputStream in = new ObjectInputStream(new ByteArrayInputStream(bytes.toByteArray()))) {
            assertEquals(G, in.readObject());
        }
    }
}
