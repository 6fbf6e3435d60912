package org.thermotile.jobs.io.raster;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;

/**
 * A hand-built, uncompressed, single-strip float32 TIFF with any extra tags, written byte by byte
 * after the TIFF 6.0 specification (Adobe, 1992, section 2) and the GeoTIFF 1.0 tags (OGC
 * 19-008r4: ModelPixelScale 33550, ModelTiepoint 33922, ModelTransformation 34264,
 * GeoKeyDirectory 34735). Independent of the production writer, so tests can make files it would
 * never make: rotated, without CRS, empty.
 */
public final class TinyTiff {

    static final int MODEL_PIXEL_SCALE = 33550;
    static final int MODEL_TIEPOINT = 33922;
    public static final int MODEL_TRANSFORMATION = 34264;
    static final int GEO_KEY_DIRECTORY = 34735;

    /** One tag; {@code values} is a short[] (SHORT), int[] (LONG), double[] (DOUBLE) or String (ASCII). */
    public record Tag(int tag, Object values) {
        int type() {
            if (values instanceof short[]) return 3;
            if (values instanceof int[]) return 4;
            if (values instanceof double[]) return 12;
            return 2;
        }

        byte[] bytes(ByteOrder order) {
            ByteBuffer b;
            if (values instanceof short[] s) {
                b = ByteBuffer.allocate(2 * s.length).order(order);
                for (short v : s) b.putShort(v);
            } else if (values instanceof int[] s) {
                b = ByteBuffer.allocate(4 * s.length).order(order);
                for (int v : s) b.putInt(v);
            } else if (values instanceof double[] s) {
                b = ByteBuffer.allocate(8 * s.length).order(order);
                for (double v : s) b.putDouble(v);
            } else {
                byte[] t = ((String) values).getBytes(StandardCharsets.US_ASCII);
                return Arrays.copyOf(t, t.length + 1);
            }
            return b.array();
        }

        int count() {
            if (values instanceof short[] s) return s.length;
            if (values instanceof int[] s) return s.length;
            if (values instanceof double[] s) return s.length;
            return ((String) values).length() + 1;
        }
    }

    private TinyTiff() { }

    /** GeoKeyDirectory for a projected CRS given by EPSG code, pixel-is-area (GeoTIFF 1.0 keys 1024, 1025, 3072). */
    public static Tag projectedKeys(int epsg) {
        return new Tag(GEO_KEY_DIRECTORY, new short[] {1, 1, 0, 3, 1024, 0, 1, 1, 1025, 0, 1, 1, 3072, 0, 1, (short) epsg});
    }

    /** GeoKeyDirectory for a geographic CRS given by EPSG code (keys 1024 = 2, 1025, 2048). */
    static Tag geographicKeys(int epsg) {
        return new Tag(GEO_KEY_DIRECTORY, new short[] {1, 1, 0, 3, 1024, 0, 1, 2, 1025, 0, 1, 1, 2048, 0, 1, (short) epsg});
    }

    /** North-up georeferencing: pixel scale and the tie point of the top-left corner. */
    public static List<Tag> northUp(double originX, double originY, double cellM) {
        return List.of(new Tag(MODEL_PIXEL_SCALE, new double[] {cellM, cellM, 0}),
                new Tag(MODEL_TIEPOINT, new double[] {0, 0, 0, originX, originY, 0}));
    }

    /**
     * Writes the file: pixels row-major (width·height float32 values), little- or big-endian.
     * A tag in {@code extra} replaces the baseline tag of the same code.
     */
    public static void write(Path file, ByteOrder order, int width, int height, float[] pixels, List<Tag> extra)
            throws IOException {
        int dataBytes = 4 * width * height;
        List<Tag> tags = new ArrayList<>(List.of(
                new Tag(256, new int[] {width}),
                new Tag(257, new int[] {height}),
                new Tag(258, new short[] {32}),
                new Tag(259, new short[] {1}),
                new Tag(262, new short[] {1}),
                new Tag(273, new int[] {0}),                 // strip offset, filled in below
                new Tag(277, new short[] {1}),
                new Tag(278, new int[] {Math.max(height, 1)}),
                new Tag(279, new int[] {dataBytes}),
                new Tag(339, new short[] {3})));
        for (Tag t : extra) {
            tags.removeIf(base -> base.tag == t.tag);         // an extra tag replaces a baseline one
            tags.add(t);
        }
        tags.sort(Comparator.comparingInt(Tag::tag));

        int ifdSize = 2 + 12 * tags.size() + 4;
        int extraStart = 8 + ifdSize;
        int extraSize = 0;
        for (Tag t : tags) {
            int n = t.bytes(order).length;
            if (n > 4) extraSize += n + (n & 1);
        }
        int dataStart = extraStart + extraSize;
        ByteBuffer out = ByteBuffer.allocate(dataStart + dataBytes).order(order);
        out.put(order == ByteOrder.LITTLE_ENDIAN ? (byte) 'I' : (byte) 'M');
        out.put(order == ByteOrder.LITTLE_ENDIAN ? (byte) 'I' : (byte) 'M');
        out.putShort((short) 42).putInt(8);
        out.putShort((short) tags.size());
        int nextExtra = extraStart;
        for (Tag t : tags) {
            byte[] v = t.tag == 273 ? new Tag(273, new int[] {dataStart}).bytes(order) : t.bytes(order);
            out.putShort((short) t.tag).putShort((short) t.type()).putInt(t.count());
            if (v.length <= 4) {
                out.put(Arrays.copyOf(v, 4));
            } else {
                out.putInt(nextExtra);
                out.put(nextExtra, v);
                nextExtra += v.length + (v.length & 1);
            }
        }
        out.putInt(0);
        out.position(dataStart);
        for (float p : pixels) out.putFloat(p);
        Files.write(file, out.array());
    }
}
