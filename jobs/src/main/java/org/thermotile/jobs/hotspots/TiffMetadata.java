package org.thermotile.jobs.hotspots;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * Adds text metadata to a GeoTIFF that {@code GeoTiffWriter} wrote: TIFF ImageDescription (tag
 * 270, TIFF 6.0 section 8) and GDAL's metadata tag GDAL_METADATA (42112: an XML document
 * {@code <GDALMetadata><Item name="KEY">value</Item>…</GDALMetadata>}, GDAL GTiff driver
 * documentation), which {@code gdalinfo} lists under "Metadata".
 *
 * <p>As libtiff does when a directory grows, a new first Image File Directory holding every old
 * entry plus the new tags is written at the end of the file and the header is pointed at it
 * (TIFF 6.0 section 2; BigTIFF: 8-byte counts and offsets, 20-byte entries). Pixel data and
 * out-of-line values stay where they are. Text must be ASCII (TIFF 6.0 type 2).
 *
 * <p>The raster package has the same step for its no-data tag, package-private; this copy keeps
 * the hotspot work inside its own package.
 */
final class TiffMetadata {
    private TiffMetadata() {}

    static final int IMAGE_DESCRIPTION = 270;
    static final int GDAL_METADATA = 42112;
    private static final int TYPE_ASCII = 2;

    /** The GDAL_METADATA XML for items in the given order, values XML-escaped. */
    static String gdalMetadataXml(Map<String, String> items) {
        StringBuilder b = new StringBuilder("<GDALMetadata>\n");
        for (Map.Entry<String, String> e : items.entrySet()) {
            b.append("  <Item name=\"").append(escape(e.getKey())).append("\">").append(escape(e.getValue()))
                    .append("</Item>\n");
        }
        return b.append("</GDALMetadata>").toString();
    }

    /**
     * As {@link #gdalMetadataXml(Map)}, with band 1's description and unit as GDAL reads them
     * ({@code DESCRIPTION} and {@code UNITTYPE} items of sample 0, as {@code GeoTiffWriter} writes them).
     */
    static String gdalMetadataXml(Map<String, String> items, org.thermotile.jobs.io.raster.GeoTiffWriter.Band band) {
        String xml = gdalMetadataXml(items);
        String bandItems = "  <Item name=\"DESCRIPTION\" sample=\"0\" role=\"description\">" + escape(band.description())
                + "</Item>\n  <Item name=\"UNITTYPE\" sample=\"0\" role=\"unittype\">" + escape(band.unit()) + "</Item>\n";
        return xml.substring(0, xml.length() - "</GDALMetadata>".length()) + bandItems + "</GDALMetadata>";
    }

    private static String escape(String s) {
        return s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("\"", "&quot;");
    }

    /**
     * Adds (or replaces) ASCII tags in the first IFD of {@code file}.
     *
     * @param tags tag code → ASCII text (a NUL is appended)
     * @throws IllegalArgumentException if a text is not ASCII
     * @throws IOException              if the file is not a TIFF or cannot be written
     */
    static void addAscii(Path file, Map<Integer, String> tags) throws IOException {
        Map<Integer, byte[]> add = new LinkedHashMap<>();
        for (Map.Entry<Integer, String> e : tags.entrySet()) {
            String t = e.getValue();
            if (!StandardCharsets.US_ASCII.newEncoder().canEncode(t)) {
                throw new IllegalArgumentException("TIFF tag " + e.getKey() + " text is not ASCII: " + t);
            }
            byte[] raw = t.getBytes(StandardCharsets.US_ASCII);
            add.put(e.getKey(), Arrays.copyOf(raw, raw.length + 1));
        }
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ, StandardOpenOption.WRITE)) {
            long size = ch.size();
            ByteBuffer head = read(ch, 0, 16, ByteOrder.LITTLE_ENDIAN);
            ByteOrder order;
            if (head.get(0) == 'I' && head.get(1) == 'I') {
                order = ByteOrder.LITTLE_ENDIAN;
            } else if (head.get(0) == 'M' && head.get(1) == 'M') {
                order = ByteOrder.BIG_ENDIAN;
            } else {
                throw new IOException(file + ": not a TIFF file");
            }
            head.order(order);
            int version = head.getShort(2) & 0xFFFF;
            boolean big = version == 43;
            if (!big && version != 42) {
                throw new IOException(file + ": TIFF version " + version + " is neither 42 nor 43");
            }
            long ifd = big ? head.getLong(8) : head.getInt(4) & 0xFFFFFFFFL;
            int countSize = big ? 8 : 2, entrySize = big ? 20 : 12, fieldSize = big ? 8 : 4;
            ByteBuffer cnt = read(ch, ifd, countSize, order);
            long n = big ? cnt.getLong(0) : cnt.getShort(0) & 0xFFFF;
            if (n < 1 || n > 4096) {
                throw new IOException(file + ": its image directory claims " + n + " entries");
            }
            ByteBuffer body = read(ch, ifd + countSize, (int) n * entrySize + fieldSize, order);
            TreeMap<Integer, byte[]> entries = new TreeMap<>();     // tag → raw entry after the tag code
            for (int i = 0; i < n; i++) {
                byte[] e = new byte[entrySize - 2];
                body.get(i * entrySize + 2, e);
                entries.put(body.getShort(i * entrySize) & 0xFFFF, e);
            }
            long next = big ? body.getLong((int) n * entrySize) : body.getInt((int) n * entrySize) & 0xFFFFFFFFL;

            long newIfd = size + (size & 1);
            int total = entries.size() + (int) add.keySet().stream().filter(t -> !entries.containsKey(t)).count();
            long ifdLength = countSize + (long) total * entrySize + fieldSize;
            long extra = newIfd + ifdLength;
            List<byte[]> outOfLine = new ArrayList<>();
            for (Map.Entry<Integer, byte[]> a : add.entrySet()) {
                ByteBuffer e = ByteBuffer.allocate(entrySize - 2).order(order);
                e.putShort((short) TYPE_ASCII);
                if (big) {
                    e.putLong(a.getValue().length);
                } else {
                    e.putInt(a.getValue().length);
                }
                if (a.getValue().length <= fieldSize) {
                    e.put(Arrays.copyOf(a.getValue(), fieldSize));
                } else {
                    putOffset(e, extra, big);
                    outOfLine.add(a.getValue());
                    extra += a.getValue().length + (a.getValue().length & 1);
                }
                entries.put(a.getKey(), e.array());
            }
            ByteBuffer dir = ByteBuffer.allocate((int) ifdLength).order(order);
            if (big) {
                dir.putLong(entries.size());
            } else {
                dir.putShort((short) entries.size());
            }
            for (Map.Entry<Integer, byte[]> e : entries.entrySet()) {
                dir.putShort((short) (int) e.getKey());
                dir.put(e.getValue());
            }
            putOffset(dir, next, big);
            dir.flip();
            long pos = size;
            if ((pos & 1) != 0) {
                pos += write(ch, ByteBuffer.wrap(new byte[1]), pos);
            }
            pos += write(ch, dir, pos);
            for (byte[] b : outOfLine) {
                pos += write(ch, ByteBuffer.wrap(Arrays.copyOf(b, b.length + (b.length & 1))), pos);
            }
            ByteBuffer ptr = ByteBuffer.allocate(fieldSize).order(order);
            putOffset(ptr, newIfd, big);
            ptr.flip();
            write(ch, ptr, big ? 8 : 4);
            ch.force(true);
        }
        // The new directory sits at the end: lay the file out as a COG again (directories first).
        org.thermotile.jobs.io.raster.CloudOptimized.rewrite(file, org.thermotile.jobs.io.raster.CloudOptimized.Resampling.NEAREST);
    }

    /** The ASCII text of a tag in the first IFD, or null (for tests and checks). */
    static String readAscii(Path file, int tag) throws IOException {
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            ByteBuffer head = read(ch, 0, 16, ByteOrder.LITTLE_ENDIAN);
            ByteOrder order = head.get(0) == 'M' ? ByteOrder.BIG_ENDIAN : ByteOrder.LITTLE_ENDIAN;
            head.order(order);
            boolean big = (head.getShort(2) & 0xFFFF) == 43;
            long ifd = big ? head.getLong(8) : head.getInt(4) & 0xFFFFFFFFL;
            int countSize = big ? 8 : 2, entrySize = big ? 20 : 12, fieldSize = big ? 8 : 4;
            ByteBuffer cnt = read(ch, ifd, countSize, order);
            long n = big ? cnt.getLong(0) : cnt.getShort(0) & 0xFFFF;
            ByteBuffer body = read(ch, ifd + countSize, (int) n * entrySize, order);
            for (int i = 0; i < n; i++) {
                int p = i * entrySize;
                if ((body.getShort(p) & 0xFFFF) != tag) {
                    continue;
                }
                long count = big ? body.getLong(p + 4) : body.getInt(p + 4) & 0xFFFFFFFFL;
                byte[] text;
                if (count <= fieldSize) {
                    text = new byte[(int) count];
                    body.get(p + (big ? 12 : 8), text);
                } else {
                    long off = big ? body.getLong(p + 12) : body.getInt(p + 8) & 0xFFFFFFFFL;
                    text = new byte[(int) count];
                    read(ch, off, (int) count, order).get(0, text);
                }
                int end = text.length;
                while (end > 0 && text[end - 1] == 0) {
                    end--;
                }
                return new String(text, 0, end, StandardCharsets.US_ASCII);
            }
            return null;
        }
    }

    private static void putOffset(ByteBuffer b, long offset, boolean big) {
        if (big) {
            b.putLong(offset);
        } else {
            if (offset > 0xFFFFFFFFL) {
                throw new IllegalStateException("offset " + offset + " does not fit a classic TIFF");
            }
            b.putInt((int) offset);
        }
    }

    private static ByteBuffer read(FileChannel ch, long pos, int length, ByteOrder order) throws IOException {
        ByteBuffer b = ByteBuffer.allocate(length);
        while (b.hasRemaining()) {
            if (ch.read(b, pos + b.position()) < 0) {
                if (b.position() >= 8 && pos == 0) {
                    break;                         // a header read of 16 bytes on a tiny file
                }
                throw new IOException("TIFF ends before byte " + (pos + length));
            }
        }
        return b.flip().order(order);
    }

    private static int write(FileChannel ch, ByteBuffer b, long pos) throws IOException {
        int n = 0;
        while (b.hasRemaining()) {
            n += ch.write(b, pos + n);
        }
        return n;
    }
}
