package org.thermotile.jobs.io.raster;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The tiny IFD reader and the no-data patch, on hand-built files of both byte orders. */
class TiffDirectoryTest {

    @TempDir
    Path dir;

    private Path tiny(String name, ByteOrder order, int w, int h) throws IOException {
        Path f = dir.resolve(name);
        float[] px = new float[w * h];
        for (int i = 0; i < px.length; i++) {
            px[i] = i;
        }
        List<TinyTiff.Tag> tags = new ArrayList<>(TinyTiff.northUp(431_000, 5_006_000, 10));
        tags.add(TinyTiff.projectedKeys(32633));
        TinyTiff.write(f, order, w, h, px, tags);
        return f;
    }

    @Test
    void readsTheDirectoryInBothByteOrders() throws IOException {
        for (ByteOrder order : new ByteOrder[] {ByteOrder.LITTLE_ENDIAN, ByteOrder.BIG_ENDIAN}) {
            TiffDirectory d = TiffDirectory.read(tiny("t.tif", order, 5, 3));
            assertEquals(order, d.order);
            assertEquals(5, d.integer(TiffDirectory.IMAGE_WIDTH, -1));
            assertEquals(3, d.integer(TiffDirectory.IMAGE_LENGTH, -1));
            assertEquals(32, d.integer(TiffDirectory.BITS_PER_SAMPLE, -1));
            assertEquals(3, d.integer(TiffDirectory.SAMPLE_FORMAT, -1), "IEEE float");
            assertArrayEquals(new long[] {1, 1, 0, 3, 1024, 0, 1, 1, 1025, 0, 1, 1, 3072, 0, 1, 32633},
                    d.integers(TinyTiff.GEO_KEY_DIRECTORY), "out-of-line SHORT values");
            assertNull(d.ascii(TiffDirectory.GDAL_NODATA));
            assertEquals(Files.size(d.file), d.pixelDataEnd(), "the strip ends the file");
        }
    }

    @Test
    void patchAddsTheNoDataTagAndKeepsEverythingElse() throws IOException {
        for (ByteOrder order : new ByteOrder[] {ByteOrder.LITTLE_ENDIAN, ByteOrder.BIG_ENDIAN}) {
            Path f = tiny("p.tif", order, 5, 3);
            TiffDirectory before = TiffDirectory.read(f);
            before.patch(List.of(TiffDirectory.NewTag.ascii(TiffDirectory.GDAL_NODATA, "-9999")));
            TiffDirectory after = TiffDirectory.read(f);
            assertEquals("-9999", after.ascii(TiffDirectory.GDAL_NODATA));
            assertEquals(before.entries.size() + 1, after.entries.size());
            for (TiffDirectory.Entry e : before.entries) {
                TiffDirectory.Entry a = after.entry(e.tag());
                assertEquals(e.type(), a.type());
                assertEquals(e.count(), a.count());
                assertArrayEquals(e.field(), a.field(), "tag " + e.tag() + " unchanged");
            }
            for (int i = 1; i < after.entries.size(); i++) {
                assertTrue(after.entries.get(i - 1).tag() < after.entries.get(i).tag(), "sorted by tag (TIFF 6.0 §2)");
            }
            assertEquals(0, after.ifdOffset % 2, "IFD on a word boundary");
            assertTrue(after.ifdOffset >= before.fileSize, "new IFD appended after the old data");
            try (GeoTiffReader r = GeoTiffReader.open(f)) {
                assertEquals(-9999, r.noDataValue().getAsDouble(), 0.0);
                assertArrayEquals(new float[] {6, 7, 8}, r.readFloatWindow(1, 1, 3, 1), "pixels untouched");
            }
        }
    }

    @Test
    void patchReplacesATagAlreadyThereAndIsDeterministic() throws IOException {
        Path a = tiny("a.tif", ByteOrder.LITTLE_ENDIAN, 7, 1);       // odd size: tests alignment too
        Path b = tiny("b.tif", ByteOrder.LITTLE_ENDIAN, 7, 1);
        for (Path f : List.of(a, b)) {
            TiffDirectory.read(f).patch(List.of(TiffDirectory.NewTag.ascii(TiffDirectory.GDAL_NODATA, "0")));
            TiffDirectory.read(f).patch(List.of(TiffDirectory.NewTag.ascii(TiffDirectory.GDAL_NODATA, "nan")));
        }
        TiffDirectory d = TiffDirectory.read(a);
        assertEquals("nan", d.ascii(TiffDirectory.GDAL_NODATA));
        assertEquals(1, d.entries.stream().filter(e -> e.tag() == TiffDirectory.GDAL_NODATA).count());
        assertArrayEquals(Files.readAllBytes(a), Files.readAllBytes(b));
    }

    @Test
    void noDataTextReadsBackAsTheSameValue() {
        // Text that C strtod (used by GDAL) and Double.parseDouble read back exactly.
        float[] values = {-9999f, 0f, 0.1f, -Float.MAX_VALUE, Float.MIN_VALUE, 273.15f, 1e20f};
        for (float v : values) {
            String t = GeoTiffWriter.noDataText(v);
            assertEquals(v, (float) GeoTiffReader.parseNoData(Path.of("x.tif"), t).getAsDouble(), 0f, t);
        }
        assertEquals("-9999", GeoTiffWriter.noDataText(-9999f));
        assertEquals("nan", GeoTiffWriter.noDataText(Float.NaN));
        assertTrue(Double.isNaN(GeoTiffReader.parseNoData(Path.of("x.tif"), " NaN ").getAsDouble()));
        assertEquals(Double.NEGATIVE_INFINITY, GeoTiffReader.parseNoData(Path.of("x.tif"), "-inf").getAsDouble());
        assertEquals(1e20, GeoTiffReader.parseNoData(Path.of("x.tif"), "1e+20").getAsDouble());
        assertTrue(GeoTiffReader.parseNoData(Path.of("x.tif"), null).isEmpty());
    }
}
