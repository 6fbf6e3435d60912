package org.thermotile.jobs.io.raster;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalInt;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.function.Executable;
import org.junit.jupiter.api.io.TempDir;

/** Each bad input gives a {@link RasterFileException} naming the file, the problem and the fix. */
class GeoTiffReaderErrorsTest {

    static final RasterGrid GRID = GeoTiffRoundTripTest.GRID;

    @TempDir
    Path dir;

    /** Asserts the message names the file and holds every given piece, and is no stack trace. */
    static RasterFileException assertFails(Path file, Executable open, String... pieces) {
        RasterFileException e = assertThrows(RasterFileException.class, open);
        String m = e.getMessage();
        assertTrue(m.contains(file.getFileName().toString()), "names the file: " + m);
        assertTrue(m.contains("Fix: "), "says the fix: " + m);
        assertTrue(!m.contains("\tat ") && !m.contains("Exception:"), "no raw exception text: " + m);
        for (String p : pieces) {
            assertTrue(m.contains(p), "contains \"" + p + "\": " + m);
        }
        return e;
    }

    private Path writtenFloat(String name) {
        Path f = dir.resolve(name);
        GeoTiffWriter.writeFloat(f, GRID, GeoTiffRoundTripTest.fieldBand(GRID, 0), -9999f);
        return f;
    }

    private static float[] pixels(int w, int h) {
        float[] p = new float[w * h];
        for (int i = 0; i < p.length; i++) {
            p[i] = i;
        }
        return p;
    }

    @Test
    void missingFile() {
        Path f = dir.resolve("heights.tif");
        assertFails(f, () -> GeoTiffReader.open(f), "file not found", "check the path");
    }

    @Test
    void folderInsteadOfFile() {
        assertFails(dir, () -> GeoTiffReader.open(dir), "not a readable file");
    }

    @Test
    void notATiff() throws IOException {
        Path f = dir.resolve("landcover.tif");
        Files.writeString(f, "class,albedo\nasphalt,0.12\n");
        assertFails(f, () -> GeoTiffReader.open(f), "not a TIFF file", "gdal_translate");
    }

    @Test
    void tooShortToBeATiff() throws IOException {
        Path f = dir.resolve("empty.tif");
        Files.write(f, new byte[3]);
        assertFails(f, () -> GeoTiffReader.open(f), "not a TIFF file", "3 bytes");
    }

    @Test
    void cutInsideThePixelData() throws IOException {
        Path f = writtenFloat("cut.tif");
        long size = Files.size(f);
        truncate(f, size * 6 / 10);
        assertFails(f, () -> GeoTiffReader.open(f), "truncated or damaged", "cut short", "copy or create it again");
    }

    @Test
    void cutInsideTheDirectory() throws IOException {
        Path f = writtenFloat("cut-early.tif");
        // The no-data patch moved the directory to the end: cutting 40 bytes cuts the directory.
        truncate(f, Files.size(f) - 40);
        assertFails(f, () -> GeoTiffReader.open(f), "truncated or damaged");
    }

    @Test
    void cutAfterAnIntactDirectory() throws IOException {
        // Directory first, pixels last (as GDAL writes): the cut is seen from the strip extents.
        Path f = dir.resolve("front.tif");
        List<TinyTiff.Tag> tags = new ArrayList<>(TinyTiff.northUp(431_000, 5_006_000, 10));
        tags.add(TinyTiff.projectedKeys(32633));
        TinyTiff.write(f, ByteOrder.LITTLE_ENDIAN, 40, 30, pixels(40, 30), tags);
        long size = Files.size(f);
        truncate(f, size - 100);
        assertFails(f, () -> GeoTiffReader.open(f), "pixel data runs to byte " + size, "has only " + (size - 100));
    }

    @Test
    void corruptedTileDataFailsOnReadNotSilently() throws IOException {
        Path f = writtenFloat("corrupt.tif");
        TiffDirectory d = TiffDirectory.read(f);
        long first = d.integers(TiffDirectory.TILE_OFFSETS)[0];
        try (FileChannel ch = FileChannel.open(f, StandardOpenOption.WRITE)) {
            byte[] junk = new byte[64];
            java.util.Arrays.fill(junk, (byte) 0xFF);           // not a valid DEFLATE stream
            ch.write(java.nio.ByteBuffer.wrap(junk), first);
        }
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            assertFails(f, () -> r.readFloatWindow(0, 0, 10, 10), "reading columns 0…9, rows 0…9 failed",
                    "damaged or cut short");
        }
    }

    @Test
    void windowReadsOnlyTheTilesItTouches() throws IOException {
        // Spoil the second tile (columns 256…299): a window inside the first tile still reads,
        // so the reader did not decode the whole file; a window crossing into it fails.
        Path f = writtenFloat("partial.tif");
        long second = TiffDirectory.read(f).integers(TiffDirectory.TILE_OFFSETS)[1];
        try (FileChannel ch = FileChannel.open(f, StandardOpenOption.WRITE)) {
            byte[] junk = new byte[64];
            java.util.Arrays.fill(junk, (byte) 0xFF);
            ch.write(java.nio.ByteBuffer.wrap(junk), second);
        }
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            float[] v = r.readFloatWindow(200, 100, 56, 70);
            assertEquals(100 * 1000f + 201, v[1], "col 201, row 100");
            assertFails(f, () -> r.readFloatWindow(250, 100, 10, 10), "failed");
        }
    }

    @Test
    void noCrs() throws IOException {
        Path f = dir.resolve("nocrs.tif");
        TinyTiff.write(f, ByteOrder.LITTLE_ENDIAN, 4, 3, pixels(4, 3), TinyTiff.northUp(431_000, 5_006_000, 10));
        assertFails(f, () -> GeoTiffReader.open(f), "no coordinate reference system", "-a_srs EPSG:");
    }

    @Test
    void rotatedGeotransform() throws IOException {
        Path f = dir.resolve("rotated.tif");
        // ModelTransformation (GeoTIFF 1.0 §B.6): x = 10·cos30·col − 10·sin30·row + x0, y = −10·sin30·col − 10·cos30·row + y0.
        double c = 10 * Math.cos(Math.toRadians(30)), s = 10 * Math.sin(Math.toRadians(30));
        List<TinyTiff.Tag> tags = new ArrayList<>(List.of(
                new TinyTiff.Tag(TinyTiff.MODEL_TRANSFORMATION, new double[] {
                    c, -s, 0, 431_000,
                    -s, -c, 0, 5_006_000,
                    0, 0, 0, 0,
                    0, 0, 0, 1}),
                TinyTiff.projectedKeys(32633)));
        TinyTiff.write(f, ByteOrder.BIG_ENDIAN, 4, 3, pixels(4, 3), tags);
        assertFails(f, () -> GeoTiffReader.open(f), "rotated or sheared", "north-up", "gdalwarp");
    }

    @Test
    void southUpGrid() throws IOException {
        Path f = dir.resolve("southup.tif");
        List<TinyTiff.Tag> tags = List.of(
                new TinyTiff.Tag(TinyTiff.MODEL_TRANSFORMATION, new double[] {
                    10, 0, 0, 431_000,
                    0, 10, 0, 5_006_000,
                    0, 0, 0, 0,
                    0, 0, 0, 1}),
                TinyTiff.projectedKeys(32633));
        TinyTiff.write(f, ByteOrder.LITTLE_ENDIAN, 4, 3, pixels(4, 3), tags);
        assertFails(f, () -> GeoTiffReader.open(f), "not north-up", "gdalwarp");
    }

    @Test
    void handBuiltNorthUpFileIsAccepted() throws IOException {
        // The control for the two cases above: same helper, north-up, no rotation.
        Path f = dir.resolve("northup.tif");
        List<TinyTiff.Tag> tags = new ArrayList<>(TinyTiff.northUp(431_000, 5_006_000, 10));
        tags.add(TinyTiff.projectedKeys(32633));
        TinyTiff.write(f, ByteOrder.BIG_ENDIAN, 4, 3, pixels(4, 3), tags);
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            assertTrue(r.grid().sameGridAs(new RasterGrid(4, 3, 431_000, 5_006_000, 10, -10, 32633,
                    GRID.crsWkt())), r.grid().toString());
            assertEquals(7f, r.readFloatWindow(3, 1, 1, 1)[0], "cell (col 3, row 1) = 1·4 + 3");
        }
    }

    @Test
    void geographicCrs() throws IOException {
        Path f = dir.resolve("lonlat.tif");
        List<TinyTiff.Tag> tags = new ArrayList<>(TinyTiff.northUp(15.0, 45.0, 0.001));
        tags.add(TinyTiff.geographicKeys(4326));
        TinyTiff.write(f, ByteOrder.LITTLE_ENDIAN, 4, 3, pixels(4, 3), tags);
        assertFails(f, () -> GeoTiffReader.open(f), "not projected", "gdalwarp -t_srs EPSG:326xx");
    }

    @Test
    void crsCodeUnknownWithoutTheEpsgDatabase() throws IOException {
        Path f = dir.resolve("lv95.tif");
        List<TinyTiff.Tag> tags = new ArrayList<>(TinyTiff.northUp(2_600_000, 1_200_000, 10));
        tags.add(TinyTiff.projectedKeys(2056));
        TinyTiff.write(f, ByteOrder.LITTLE_ENDIAN, 4, 3, pixels(4, 3), tags);
        // EPSG:2056 (CH1903+ / LV95) is not among the codes SIS builds without the EPSG dataset.
        assertFails(f, () -> GeoTiffReader.open(f), "declares EPSG:2056", "gdalwarp -t_srs EPSG:326xx");
    }

    @Test
    void emptyRaster() throws IOException {
        Path f = dir.resolve("empty-raster.tif");
        List<TinyTiff.Tag> tags = new ArrayList<>(TinyTiff.northUp(431_000, 5_006_000, 10));
        tags.add(TinyTiff.projectedKeys(32633));
        TinyTiff.write(f, ByteOrder.LITTLE_ENDIAN, 0, 3, new float[0], tags);
        assertFails(f, () -> GeoTiffReader.open(f), "the raster is empty (0 × 3 cells)");
    }

    @Test
    void unreadableNoDataText() throws IOException {
        Path f = dir.resolve("badnodata.tif");
        List<TinyTiff.Tag> tags = new ArrayList<>(TinyTiff.northUp(431_000, 5_006_000, 10));
        tags.add(TinyTiff.projectedKeys(32633));
        tags.add(new TinyTiff.Tag(TiffDirectory.GDAL_NODATA, "none"));
        TinyTiff.write(f, ByteOrder.LITTLE_ENDIAN, 4, 3, pixels(4, 3), tags);
        assertFails(f, () -> GeoTiffReader.open(f), "\"none\"", "-a_nodata");
    }

    @Test
    void compressionSisCannotRead() throws IOException {
        Path f = dir.resolve("zstd.tif");
        List<TinyTiff.Tag> tags = new ArrayList<>(TinyTiff.northUp(431_000, 5_006_000, 10));
        tags.add(TinyTiff.projectedKeys(32633));
        tags.add(new TinyTiff.Tag(TiffDirectory.COMPRESSION, new short[] {(short) 50000}));
        TinyTiff.write(f, ByteOrder.LITTLE_ENDIAN, 4, 3, pixels(4, 3), tags);
        assertFails(f, () -> GeoTiffReader.open(f), "ZSTD (TIFF compression 50000)", "-co COMPRESS=DEFLATE");
    }

    @Test
    void floatingPointPredictorsAreRefused() throws IOException {
        for (short predictor : new short[] {2, 3}) {
            Path f = dir.resolve("predictor" + predictor + ".tif");
            List<TinyTiff.Tag> tags = new ArrayList<>(TinyTiff.northUp(431_000, 5_006_000, 10));
            tags.add(TinyTiff.projectedKeys(32633));
            tags.add(new TinyTiff.Tag(TiffDirectory.PREDICTOR, new short[] {predictor}));
            TinyTiff.write(f, ByteOrder.LITTLE_ENDIAN, 4, 3, pixels(4, 3), tags);
            assertFails(f, () -> GeoTiffReader.open(f), "predictor " + predictor + " on float32", "-co PREDICTOR=1");
        }
    }

    @Test
    void moreBandsThanExpected() {
        Path f = dir.resolve("two.tif");
        float[] b = GeoTiffRoundTripTest.fieldBand(GRID, 0);
        GeoTiffWriter.writeFloatStack(f, GRID, new float[][] {b, b}, -9999f);
        assertFails(f, () -> GeoTiffReader.openSingleBand(f), "2 bands where one was expected");
    }

    @Test
    void integerCodesAskedOfAFloatRaster() {
        Path f = writtenFloat("heights.tif");
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            assertFails(f, () -> r.readIntWindow(0, 0, 2, 2), "float32", "gdal_translate -ot");
        }
    }

    @Test
    void windowOutsideTheRaster() {
        Path f = dir.resolve("lc.tif");
        GeoTiffWriter.writeInt(f, GRID, GeoTiffWriter.IntType.UINT8, new int[GRID.width() * GRID.height()],
                OptionalInt.empty());
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> r.readIntWindow(290, 0, 20, 5));
            assertTrue(e.getMessage().contains("lc.tif") && e.getMessage().contains("columns 290…309")
                    && e.getMessage().contains("300 × 170"), e.getMessage());
        }
    }

    private static void truncate(Path f, long size) throws IOException {
        try (FileChannel ch = FileChannel.open(f, StandardOpenOption.WRITE)) {
            ch.truncate(size);
        }
    }
}
