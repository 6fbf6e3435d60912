package org.thermotile.jobs.io.raster;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;

/**
 * The first Image File Directory (IFD) of a TIFF or BigTIFF file, read without reading pixel data,
 * and a way to add or replace tags in it.
 *
 * <p>Layout from the TIFF 6.0 specification (Adobe, 1992), section 2 "TIFF Structure": an 8-byte
 * header ({@code II} or {@code MM}, 42, offset of the first IFD), then per IFD a 2-byte entry
 * count, 12-byte entries (tag, type, count, value or offset) sorted by tag, and a 4-byte offset of
 * the next IFD. BigTIFF (version 43, Aware Systems' BigTIFF design note) uses a 16-byte header,
 * an 8-byte entry count, 20-byte entries and 8-byte offsets. A value fits in the entry itself when
 * it takes at most 4 (TIFF) or 8 (BigTIFF) bytes, else the entry holds its offset.
 *
 * <p>{@link #patch} writes a new IFD at the end of the file holding every old entry unchanged plus
 * the given tags, then points the header at it, the way libtiff rewrites a directory whose size
 * changed. Pixel data and out-of-line tag values stay where they are, so their offsets stay valid;
 * the old IFD becomes a few hundred unused bytes. Only the first IFD is read or patched; the chain
 * to further IFDs is kept.
 */
final class TiffDirectory {

    static final int IMAGE_WIDTH = 256;
    static final int IMAGE_LENGTH = 257;
    static final int BITS_PER_SAMPLE = 258;
    static final int COMPRESSION = 259;
    static final int PHOTOMETRIC = 262;
    static final int STRIP_OFFSETS = 273;
    static final int SAMPLES_PER_PIXEL = 277;
    static final int ROWS_PER_STRIP = 278;
    static final int STRIP_BYTE_COUNTS = 279;
    static final int DATE_TIME = 306;
    static final int PREDICTOR = 317;
    static final int TILE_WIDTH = 322;
    static final int TILE_LENGTH = 323;
    static final int TILE_OFFSETS = 324;
    static final int TILE_BYTE_COUNTS = 325;
    static final int SAMPLE_FORMAT = 339;
    static final int GEO_KEY_DIRECTORY = 34735;
    /** GDAL's metadata tag: an XML document of items (GDAL GTiff driver documentation). */
    static final int GDAL_METADATA = 42112;
    /** GDAL's no-data tag: the value as ASCII text (GDAL GTiff driver documentation). */
    static final int GDAL_NODATA = 42113;

    static final int TYPE_ASCII = 2;
    static final int TYPE_SHORT = 3;

    /** Byte size of one value of each TIFF field type (TIFF 6.0 section 2; BigTIFF adds 16–18). */
    private static final int[] TYPE_SIZE = {0, 1, 1, 2, 4, 8, 1, 1, 2, 4, 8, 4, 8, 4, 0, 0, 8, 8, 8};

    /** Refuse directories longer than this: a real one has a few dozen entries. */
    private static final int MAX_ENTRIES = 4096;

    /**
     * One directory entry as stored.
     *
     * @param tag   tag code (unsigned 16 bits)
     * @param type  field type code
     * @param count number of values
     * @param field the raw value-or-offset field, 4 (TIFF) or 8 (BigTIFF) bytes in file byte order
     */
    record Entry(int tag, int type, long count, byte[] field) { }

    /** A tag to add or replace: its type, count and value bytes in file byte order. */
    record NewTag(int tag, int type, long count, byte[] bytes) {

        /** An ASCII tag: the text followed by a NUL, as TIFF 6.0 requires. */
        static NewTag ascii(int tag, String text) {
            byte[] t = text.getBytes(StandardCharsets.US_ASCII);
            byte[] b = Arrays.copyOf(t, t.length + 1);
            return new NewTag(tag, TYPE_ASCII, b.length, b);
        }

        /** A SHORT tag with the given values, in the byte order of the file it goes into. */
        static NewTag shorts(int tag, ByteOrder order, int... values) {
            ByteBuffer b = ByteBuffer.allocate(2 * values.length).order(order);
            for (int v : values) {
                b.putShort((short) v);
            }
            return new NewTag(tag, TYPE_SHORT, values.length, b.array());
        }
    }

    final Path file;
    final ByteOrder order;
    final boolean bigTiff;
    final long fileSize;
    final long ifdOffset;
    final long nextIfdOffset;
    final List<Entry> entries;

    private TiffDirectory(Path file, ByteOrder order, boolean bigTiff, long fileSize, long ifdOffset,
            long nextIfdOffset, List<Entry> entries) {
        this.file = file;
        this.order = order;
        this.bigTiff = bigTiff;
        this.fileSize = fileSize;
        this.ifdOffset = ifdOffset;
        this.nextIfdOffset = nextIfdOffset;
        this.entries = entries;
    }

    /**
     * Reads the header and the first IFD of {@code file}.
     *
     * @throws RasterFileException if the file is not a TIFF or its directory is cut or damaged
     * @throws IOException         if the file cannot be read at all
     */
    static TiffDirectory read(Path file) throws IOException {
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            long size = ch.size();
            ByteBuffer head = ByteBuffer.allocate(16);
            while (head.hasRemaining() && ch.read(head, head.position()) > 0) { }
            head.flip();
            if (head.remaining() < 8) {
                throw notTiff(file, "it has only " + size + " bytes");
            }
            ByteOrder order;
            int b0 = head.get(0), b1 = head.get(1);
            if (b0 == 'I' && b1 == 'I') {
                order = ByteOrder.LITTLE_ENDIAN;
            } else if (b0 == 'M' && b1 == 'M') {
                order = ByteOrder.BIG_ENDIAN;
            } else {
                throw notTiff(file, String.format("it starts with bytes %02X %02X, not 'II' or 'MM'", b0 & 0xFF, b1 & 0xFF));
            }
            head.order(order);
            int version = head.getShort(2) & 0xFFFF;
            boolean big;
            long ifd;
            if (version == 42) {
                big = false;
                ifd = head.getInt(4) & 0xFFFFFFFFL;
            } else if (version == 43 && head.remaining() >= 16) {
                big = true;
                ifd = head.getLong(8);
            } else {
                throw notTiff(file, "its version number is " + version + ", not 42 (TIFF) or 43 (BigTIFF)");
            }
            return readIfd(ch, file, order, big, size, ifd);
        }
    }

    /** Reads the IFD at byte {@code ifd} of a TIFF whose header {@link #read} has checked. */
    static TiffDirectory readAt(Path file, ByteOrder order, boolean big, long ifd) throws IOException {
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            return readIfd(ch, file, order, big, ch.size(), ifd);
        }
    }

    private static TiffDirectory readIfd(FileChannel ch, Path file, ByteOrder order, boolean big, long size, long ifd)
            throws IOException {
        {
            int countSize = big ? 8 : 2, entrySize = big ? 20 : 12, offSize = big ? 8 : 4;
            if (ifd < 8 || ifd + countSize > size) {
                throw damaged(file, "the image directory offset " + ifd + " lies outside the file of " + size + " bytes");
            }
            ByteBuffer cnt = readAt(ch, file, ifd, countSize, order, size);
            long n = big ? cnt.getLong(0) : cnt.getShort(0) & 0xFFFF;
            if (n < 1 || n > MAX_ENTRIES) {
                throw damaged(file, "the image directory claims " + n + " entries");
            }
            ByteBuffer body = readAt(ch, file, ifd + countSize, (int) n * entrySize + offSize, order, size);
            List<Entry> list = new ArrayList<>((int) n);
            for (int i = 0; i < n; i++) {
                int p = i * entrySize;
                int tag = body.getShort(p) & 0xFFFF;
                int type = body.getShort(p + 2) & 0xFFFF;
                long count = big ? body.getLong(p + 4) : body.getInt(p + 4) & 0xFFFFFFFFL;
                byte[] field = new byte[offSize];
                body.get(p + (big ? 12 : 8), field);
                list.add(new Entry(tag, type, count, field));
            }
            long next = big ? body.getLong((int) n * entrySize) : body.getInt((int) n * entrySize) & 0xFFFFFFFFL;
            return new TiffDirectory(file, order, big, size, ifd, next, List.copyOf(list));
        }
    }

    /** The entry for {@code tag}, or {@code null}. */
    Entry entry(int tag) {
        for (Entry e : entries) {
            if (e.tag == tag) {
                return e;
            }
        }
        return null;
    }

    /**
     * The integer values of an unsigned BYTE, SHORT, LONG or LONG8 tag, or {@code null} if absent.
     *
     * @throws RasterFileException if the tag has another type or its values lie outside the file
     */
    long[] integers(int tag) throws IOException {
        Entry e = entry(tag);
        if (e == null) {
            return null;
        }
        int type = e.type;
        if (type != 1 && type != 3 && type != 4 && type != 16) {
            throw damaged(file, "tag " + tag + " has field type " + type + " where an unsigned integer was expected");
        }
        ByteBuffer b = values(e);
        int size = TYPE_SIZE[type];
        long[] out = new long[(int) e.count];
        for (int i = 0; i < out.length; i++) {
            int p = i * size;
            out[i] = switch (type) {
                case 1 -> b.get(p) & 0xFFL;
                case 3 -> b.getShort(p) & 0xFFFFL;
                case 4 -> b.getInt(p) & 0xFFFFFFFFL;
                default -> b.getLong(p);
            };
        }
        return out;
    }

    /** The first value of an integer tag, or {@code fallback} if the tag is absent. */
    long integer(int tag, long fallback) throws IOException {
        long[] v = integers(tag);
        return v == null || v.length == 0 ? fallback : v[0];
    }

    /** The text of an ASCII tag without its trailing NULs, or {@code null} if absent. */
    String ascii(int tag) throws IOException {
        Entry e = entry(tag);
        if (e == null) {
            return null;
        }
        if (e.type != TYPE_ASCII) {
            throw damaged(file, "tag " + tag + " has field type " + e.type + " where ASCII text was expected");
        }
        ByteBuffer b = values(e);
        byte[] bytes = new byte[(int) e.count];
        b.get(0, bytes);
        int end = bytes.length;
        while (end > 0 && bytes[end - 1] == 0) {
            end--;
        }
        return new String(bytes, 0, end, StandardCharsets.US_ASCII);
    }

    /** The value bytes of an entry, from the entry itself or from the file. */
    ByteBuffer values(Entry e) throws IOException {
        int typeSize = e.type < TYPE_SIZE.length ? TYPE_SIZE[e.type] : 0;
        if (typeSize == 0) {
            throw damaged(file, "tag " + e.tag + " has unknown field type " + e.type);
        }
        long length = e.count * typeSize;
        if (e.count > Integer.MAX_VALUE / 8) {
            throw damaged(file, "tag " + e.tag + " claims " + e.count + " values");
        }
        if (length <= e.field.length) {
            return ByteBuffer.wrap(e.field).order(order);
        }
        long offset = fieldAsOffset(e);
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            return readAt(ch, file, offset, (int) length, order, fileSize);
        }
    }

    private long fieldAsOffset(Entry e) {
        ByteBuffer f = ByteBuffer.wrap(e.field).order(order);
        return bigTiff ? f.getLong(0) : f.getInt(0) & 0xFFFFFFFFL;
    }

    /**
     * The EPSG code the GeoTIFF keys declare for the CRS, or 0: ProjectedCSTypeGeoKey (3072), else
     * GeographicTypeGeoKey (2048), when stored inline and not "user-defined" (32767). Layout of
     * the GeoKeyDirectory (tag 34735): a 4-short header, then 4 shorts per key (id, tag location,
     * count, value), from OGC GeoTIFF 1.1 (19-008r4) section 7.1.
     */
    int declaredEpsg() throws IOException {
        long[] k = integers(GEO_KEY_DIRECTORY);
        if (k == null) {
            return 0;
        }
        int projected = 0, geographic = 0;
        for (int i = 4; i + 3 < k.length; i += 4) {
            if (k[i + 1] == 0 && k[i + 3] > 0 && k[i + 3] < 32767) {
                if (k[i] == 3072) {
                    projected = (int) k[i + 3];
                } else if (k[i] == 2048) {
                    geographic = (int) k[i + 3];
                }
            }
        }
        return projected > 0 ? projected : geographic;
    }

    /**
     * The end (exclusive byte offset) of the last tile or strip of pixel data, from the
     * TileOffsets/TileByteCounts (or StripOffsets/StripByteCounts) tags. A file shorter than this
     * has been cut.
     *
     * @throws RasterFileException if the tags are missing or inconsistent
     */
    long pixelDataEnd() throws IOException {
        long[] offsets = integers(TILE_OFFSETS);
        long[] counts = integers(TILE_BYTE_COUNTS);
        if (offsets == null) {
            offsets = integers(STRIP_OFFSETS);
            counts = integers(STRIP_BYTE_COUNTS);
        }
        if (offsets == null || counts == null || offsets.length != counts.length) {
            throw damaged(file, "the tile (or strip) offsets and byte counts are missing or of different lengths");
        }
        long end = 0;
        for (int i = 0; i < offsets.length; i++) {
            end = Math.max(end, offsets[i] + counts[i]);
        }
        return end;
    }

    /**
     * Writes a new first IFD holding every entry of this one, with {@code tags} added (or
     * replacing an entry of the same tag), at the end of the file, and points the header at it.
     * The file must not have changed since this directory was read. Deterministic: same file and
     * tags, same bytes.
     */
    void patch(List<NewTag> tags) throws IOException {
        TiffDirectory d = this;
        int fieldSize = d.bigTiff ? 8 : 4;
        List<Object> merged = new ArrayList<>();
        for (Entry e : d.entries) {
            if (tags.stream().noneMatch(t -> t.tag == e.tag)) {
                merged.add(e);
            }
        }
        merged.addAll(tags);
        merged.sort(Comparator.comparingInt(o -> o instanceof Entry e ? e.tag : ((NewTag) o).tag));

        long ifd = d.fileSize + (d.fileSize & 1);                        // word alignment (TIFF 6.0 §2)
        int countSize = d.bigTiff ? 8 : 2, entrySize = d.bigTiff ? 20 : 12;
        long ifdLength = countSize + (long) merged.size() * entrySize + fieldSize;
        long extra = ifd + ifdLength;
        ByteBuffer dir = ByteBuffer.allocate((int) ifdLength).order(d.order);
        List<byte[]> extraData = new ArrayList<>();
        if (d.bigTiff) {
            dir.putLong(merged.size());
        } else {
            dir.putShort((short) merged.size());
        }
        for (Object o : merged) {
            if (o instanceof Entry e) {
                putEntryHead(dir, e.tag, e.type, e.count, d.bigTiff);
                dir.put(e.field);
            } else {
                NewTag t = (NewTag) o;
                putEntryHead(dir, t.tag, t.type, t.count, d.bigTiff);
                if (t.bytes.length <= fieldSize) {
                    dir.put(Arrays.copyOf(t.bytes, fieldSize));
                } else {
                    putOffset(dir, extra, d.bigTiff);
                    extraData.add(t.bytes);
                    extra += t.bytes.length + (t.bytes.length & 1);
                }
            }
        }
        putOffset(dir, d.nextIfdOffset, d.bigTiff);
        dir.flip();

        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.WRITE)) {
            long pos = d.fileSize;
            if ((pos & 1) != 0) {
                pos += ch.write(ByteBuffer.wrap(new byte[1]), pos);
            }
            pos += writeFully(ch, dir, pos);
            for (byte[] b : extraData) {
                pos += writeFully(ch, ByteBuffer.wrap(Arrays.copyOf(b, b.length + (b.length & 1))), pos);
            }
            ByteBuffer head = ByteBuffer.allocate(fieldSize).order(d.order);
            putOffset(head, ifd, d.bigTiff);
            head.flip();
            writeFully(ch, head, d.bigTiff ? 8 : 4);
            ch.force(true);
        }
    }

    private static void putEntryHead(ByteBuffer b, int tag, int type, long count, boolean big) {
        b.putShort((short) tag);
        b.putShort((short) type);
        if (big) {
            b.putLong(count);
        } else {
            b.putInt((int) count);
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

    private static int writeFully(FileChannel ch, ByteBuffer b, long pos) throws IOException {
        int n = 0;
        while (b.hasRemaining()) {
            n += ch.write(b, pos + n);
        }
        return n;
    }

    private static ByteBuffer readAt(FileChannel ch, Path file, long pos, int length, ByteOrder order, long size)
            throws IOException {
        if (pos < 0 || pos + length > size) {
            throw damaged(file, "it needs bytes " + pos + "–" + (pos + length) + " but has only " + size
                    + " bytes (cut short?)");
        }
        ByteBuffer b = ByteBuffer.allocate(length);
        while (b.hasRemaining()) {
            if (ch.read(b, pos + b.position()) < 0) {
                throw damaged(file, "it ends before byte " + (pos + length));
            }
        }
        return b.flip().order(order);
    }

    static RasterFileException notTiff(Path file, String why) {
        return new RasterFileException(file, "not a TIFF file: " + why,
                "give a GeoTIFF (.tif) file; convert other formats with e.g. gdal_translate -of GTiff");
    }

    static RasterFileException damaged(Path file, String why) {
        return new RasterFileException(file, "truncated or damaged TIFF: " + why,
                "the file was probably cut short while copying or writing; copy or create it again");
    }
}
