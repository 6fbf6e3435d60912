package org.thermotile.jobs.io.raster;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.TreeMap;
import java.util.zip.DataFormatException;
import java.util.zip.Deflater;
import java.util.zip.Inflater;

/**
 * Rewrites a tiled GeoTIFF in the Cloud-Optimised GeoTIFF layout, adding internal overviews.
 *
 * <p>Layout as GDAL's COG driver writes it and its {@code validate_cloud_optimized_geotiff.py}
 * checks (GDAL COG driver documentation, "File format details"): the full-resolution IFD right
 * after the header (byte 8, or 16 for BigTIFF), then one IFD per overview in decreasing size
 * (NewSubfileType 1, "reduced resolution", TIFF 6.0 section 8), then the tile data of the
 * smallest overview first and of the full-resolution image last. No "ghost area" of GDAL
 * structural metadata is written (the validator does not require one).
 *
 * <p>Overviews halve the previous level (sizes rounded up) until a level fits in one
 * {@value GeoTiffWriter#TILE_SIZE}×{@value GeoTiffWriter#TILE_SIZE} tile; each cell of a level
 * comes from the 2×2 block below it: {@link Resampling#AVERAGE} is the mean of the block's cells
 * that are not no-data (no-data if all are), {@link Resampling#NEAREST} takes the block's
 * top-left cell (for class codes and hours, where a mean means nothing). Overviews are built in
 * one pass over the full-resolution tiles, a tile row of one band at a time, each level holding
 * one tile row (width × 256 doubles) whatever the height; their compressed tiles go to
 * temporary files beside the map, and the final file is assembled from those and the original
 * full-resolution tiles, copied byte for byte. Deterministic: same file, same bytes.
 */
public final class CloudOptimized {
    private CloudOptimized() {}

    /** How overview cells are computed from the 2×2 cells below them. */
    public enum Resampling { AVERAGE, NEAREST }

    static final int NEW_SUBFILE_TYPE = 254;
    static final int PLANAR_CONFIG = 284;
    static final int EXTRA_SAMPLES = 338;
    private static final int TYPE_LONG = 4;
    private static final int TYPE_LONG8 = 16;

    /** One IFD to write: its entries (tag → type, count, value bytes) and its data blocks. */
    private static final class Ifd {
        final TreeMap<Integer, Object[]> tags = new TreeMap<>();
        final int offsetsTag, countsTag;
        long[] srcOffsets;           // in source, or in temp file
        long[] counts;
        Path source;

        Ifd(int offsetsTag, int countsTag) {
            this.offsetsTag = offsetsTag;
            this.countsTag = countsTag;
        }
    }

    /**
     * Rewrites {@code file} as a COG. A file whose only IFD is tiled gets overviews when it is
     * larger than one tile; a file with overviews already (e.g. after a tag patch moved its
     * first IFD) is only laid out again; a strip file is laid out with its IFD first.
     */
    public static void rewrite(Path file, Resampling resampling) {
        List<Path> temps = new ArrayList<>();
        Path out = file.resolveSibling(file.getFileName() + ".cog-tmp");
        try {
            TiffDirectory d0 = TiffDirectory.read(file);
            List<TiffDirectory> chain = new ArrayList<>();
            chain.add(d0);
            for (long next = d0.nextIfdOffset; next != 0 && chain.size() < 64; ) {
                TiffDirectory d = TiffDirectory.readAt(file, d0.order, d0.bigTiff, next);
                chain.add(d);
                next = d.nextIfdOffset;
            }
            List<Ifd> ifds = new ArrayList<>();
            for (TiffDirectory d : chain) {
                ifds.add(copyOf(d, file));
            }
            if (chain.size() == 1 && d0.entry(TiffDirectory.TILE_OFFSETS) != null) {
                ifds.get(0).tags.put(NEW_SUBFILE_TYPE, new Object[] {TYPE_LONG, 1L, le(d0.order, 4, 0)});
                ifds.addAll(overviews(d0, file, resampling, temps));
            }
            assemble(out, d0.order, d0.bigTiff, ifds);
            Files.move(out, file, StandardCopyOption.REPLACE_EXISTING);
        } catch (IOException | DataFormatException e) {
            throw new RasterFileException(file, "could not lay the GeoTIFF out as a COG: " + RasterFileException.describe(e),
                    "check that the folder is writable and the disk has free space", e);
        } finally {
            try {
                Files.deleteIfExists(out);
                for (Path t : temps) {
                    Files.deleteIfExists(t);
                }
            } catch (IOException ignored) {
                // the original outcome is the one to report
            }
        }
    }

    private static Ifd copyOf(TiffDirectory d, Path file) throws IOException {
        boolean tiled = d.entry(TiffDirectory.TILE_OFFSETS) != null;
        Ifd ifd = tiled ? new Ifd(TiffDirectory.TILE_OFFSETS, TiffDirectory.TILE_BYTE_COUNTS)
                : new Ifd(TiffDirectory.STRIP_OFFSETS, TiffDirectory.STRIP_BYTE_COUNTS);
        for (TiffDirectory.Entry e : d.entries) {
            if (e.tag() == ifd.offsetsTag || e.tag() == ifd.countsTag) {
                continue;
            }
            ByteBuffer v = d.values(e);
            int len = (int) (e.count() * typeSize(e.type()));
            byte[] b = new byte[len];
            v.get(0, b);
            ifd.tags.put(e.tag(), new Object[] {e.type(), e.count(), b});
        }
        ifd.srcOffsets = d.integers(ifd.offsetsTag);
        ifd.counts = d.integers(ifd.countsTag);
        ifd.source = file;
        return ifd;
    }

    private static int typeSize(int type) {
        return switch (type) {
            case 1, 2, 6, 7 -> 1;
            case 3, 8 -> 2;
            case 4, 9, 11, 13 -> 4;
            default -> 8;
        };
    }

    private static byte[] le(ByteOrder order, int size, long v) {
        ByteBuffer b = ByteBuffer.allocate(size).order(order);
        if (size == 2) {
            b.putShort((short) v);
        } else if (size == 4) {
            b.putInt((int) v);
        } else {
            b.putLong(v);
        }
        return b.array();
    }

    /** Sample layout of a map: bits and format (1 uint, 2 int, 3 float). */
    private record Sample(int bits, int format, double noData) {
        double get(ByteBuffer b, int i) {
            return switch (bits) {
                case 8 -> b.get(i) & 0xFF;
                case 16 -> format == 2 ? b.getShort(2 * i) : b.getShort(2 * i) & 0xFFFF;
                default -> b.getFloat(4 * i);
            };
        }

        void put(ByteBuffer b, int i, double v) {
            switch (bits) {
                case 8 -> b.put(i, (byte) (int) v);
                case 16 -> b.putShort(2 * i, (short) (int) v);
                default -> b.putFloat(4 * i, (float) v);
            }
        }

        boolean valid(double v) {
            return !Double.isNaN(v) && v != noData;
        }
    }

    /** The value of GDAL_NODATA text ("nan", "inf", "-inf" or a number), NaN when absent. */
    static double noDataValue(String text) {
        if (text == null) {
            return Double.NaN;
        }
        return switch (text.trim().toLowerCase(java.util.Locale.ROOT)) {
            case "nan" -> Double.NaN;
            case "inf", "+inf" -> Double.POSITIVE_INFINITY;
            case "-inf" -> Double.NEGATIVE_INFINITY;
            default -> Double.parseDouble(text.trim());
        };
    }

    private static List<Ifd> overviews(TiffDirectory d, Path file, Resampling resampling, List<Path> temps)
            throws IOException, DataFormatException {
        int w = (int) d.integer(TiffDirectory.IMAGE_WIDTH, 0), h = (int) d.integer(TiffDirectory.IMAGE_LENGTH, 0);
        int tw = (int) d.integer(TiffDirectory.TILE_WIDTH, 0), th = (int) d.integer(TiffDirectory.TILE_LENGTH, 0);
        int bands = (int) d.integer(TiffDirectory.SAMPLES_PER_PIXEL, 1);
        int bits = (int) d.integer(TiffDirectory.BITS_PER_SAMPLE, 8);
        int format = (int) d.integer(TiffDirectory.SAMPLE_FORMAT, 1);
        if (d.integer(TiffDirectory.COMPRESSION, 1) != 8 || d.integer(TiffDirectory.PREDICTOR, 1) != 1
                || (bands > 1 && d.integer(PLANAR_CONFIG, 1) != 2)) {
            throw new IOException("only DEFLATE, no predictor, band-sequential files get overviews");
        }
        String nd = d.ascii(TiffDirectory.GDAL_NODATA);
        Sample sample = new Sample(bits, format, noDataValue(nd));
        List<int[]> sizes = new ArrayList<>();
        for (int lw = w, lh = h; lw > tw || lh > th; ) {
            lw = (lw + 1) / 2;
            lh = (lh + 1) / 2;
            sizes.add(new int[] {lw, lh});
        }
        if (sizes.isEmpty()) {
            return List.of();
        }
        List<Level> levels = new ArrayList<>();
        for (int[] s : sizes) {
            Path t = file.resolveSibling(file.getFileName() + ".ovr" + levels.size() + "-tmp");
            temps.add(t);
            levels.add(new Level(s[0], s[1], tw, th, sample, resampling, t, d.order));
        }
        long[] offsets = d.integers(TiffDirectory.TILE_OFFSETS);
        long[] counts = d.integers(TiffDirectory.TILE_BYTE_COUNTS);
        int across = (w + tw - 1) / tw, down = (h + th - 1) / th;
        int bytesPerSample = bits / 8;
        Inflater inflater = new Inflater();
        byte[] raw = new byte[tw * th * bytesPerSample];
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ)) {
            for (Level l : levels) {
                l.open();
            }
            for (int b = 0; b < bands; b++) {
                for (int tr = 0; tr < down; tr++) {
                    double[][] rows = new double[Math.min(th, h - tr * th)][w];
                    for (int tc = 0; tc < across; tc++) {
                        int i = b * across * down + tr * across + tc;
                        ByteBuffer comp = ByteBuffer.allocate((int) counts[i]);
                        while (comp.hasRemaining()) {
                            if (ch.read(comp, offsets[i] + comp.position()) < 0) {
                                throw new IOException("tile " + i + " is cut short");
                            }
                        }
                        inflater.reset();
                        inflater.setInput(comp.array());
                        int n = 0;
                        while (n < raw.length && !inflater.finished()) {
                            int k = inflater.inflate(raw, n, raw.length - n);
                            if (k == 0 && (inflater.needsInput() || inflater.needsDictionary())) {
                                break;
                            }
                            n += k;
                        }
                        ByteBuffer px = ByteBuffer.wrap(raw).order(d.order);
                        int cw = Math.min(tw, w - tc * tw);
                        for (int r = 0; r < rows.length; r++) {
                            for (int c = 0; c < cw; c++) {
                                rows[r][tc * tw + c] = sample.get(px, r * tw + c);
                            }
                        }
                    }
                    for (double[] r : rows) {
                        levels.get(0).push(r, levels, 0);
                    }
                }
                levels.get(0).finishBand(levels, 0);
            }
            for (Level l : levels) {
                l.close();
            }
        } finally {
            inflater.end();
        }
        List<Ifd> out = new ArrayList<>();
        for (Level l : levels) {
            Ifd ifd = new Ifd(TiffDirectory.TILE_OFFSETS, TiffDirectory.TILE_BYTE_COUNTS);
            ifd.tags.put(NEW_SUBFILE_TYPE, new Object[] {TYPE_LONG, 1L, le(d.order, 4, 1)});
            ifd.tags.put(TiffDirectory.IMAGE_WIDTH, new Object[] {TYPE_LONG, 1L, le(d.order, 4, l.w)});
            ifd.tags.put(TiffDirectory.IMAGE_LENGTH, new Object[] {TYPE_LONG, 1L, le(d.order, 4, l.h)});
            for (int tag : new int[] {TiffDirectory.BITS_PER_SAMPLE, TiffDirectory.COMPRESSION,
                TiffDirectory.PHOTOMETRIC, TiffDirectory.SAMPLES_PER_PIXEL, PLANAR_CONFIG, TiffDirectory.PREDICTOR,
                TiffDirectory.TILE_WIDTH, TiffDirectory.TILE_LENGTH, EXTRA_SAMPLES, TiffDirectory.SAMPLE_FORMAT,
                TiffDirectory.GDAL_NODATA}) {
                TiffDirectory.Entry e = d.entry(tag);
                if (e != null) {
                    byte[] v = new byte[(int) (e.count() * typeSize(e.type()))];
                    d.values(e).get(0, v);
                    ifd.tags.put(tag, new Object[] {e.type(), e.count(), v});
                }
            }
            ifd.srcOffsets = l.offsets.stream().mapToLong(Long::longValue).toArray();
            ifd.counts = l.counts.stream().mapToLong(Long::longValue).toArray();
            ifd.source = l.temp;
            out.add(ifd);
        }
        return out;
    }

    /** One overview level being built: rows arrive from the level below, tiles leave compressed. */
    private static final class Level {
        final int w, h, tw, th;
        final Sample sample;
        final Resampling resampling;
        final Path temp;
        final ByteOrder order;
        final List<Long> offsets = new ArrayList<>();
        final List<Long> counts = new ArrayList<>();
        final double[][] tileRows;
        double[] pending;
        int filled;
        int rowsDone;
        long written;
        OutputStream stream;
        final Deflater deflater = new Deflater(Deflater.DEFAULT_COMPRESSION);

        Level(int w, int h, int tw, int th, Sample sample, Resampling resampling, Path temp, ByteOrder order) {
            this.w = w;
            this.h = h;
            this.tw = tw;
            this.th = th;
            this.sample = sample;
            this.resampling = resampling;
            this.temp = temp;
            this.order = order;
            this.tileRows = new double[th][w];
        }

        void open() throws IOException {
            stream = new java.io.BufferedOutputStream(Files.newOutputStream(temp));
        }

        void close() throws IOException {
            stream.close();
            deflater.end();
        }

        /** Takes one row of the level below (width ≤ 2w). */
        void push(double[] below, List<Level> levels, int index) throws IOException {
            if (pending == null) {
                pending = below.clone();
                return;
            }
            emit(pending, below, levels, index);
            pending = null;
        }

        /** The end of a band: an unpaired last row makes a row alone; the last tile row is written. */
        void finishBand(List<Level> levels, int index) throws IOException {
            if (pending != null) {
                emit(pending, null, levels, index);
                pending = null;
            }
            if (filled > 0) {
                writeTileRow();
            }
            rowsDone = 0;
            if (index + 1 < levels.size()) {
                levels.get(index + 1).finishBand(levels, index + 1);
            }
        }

        private void emit(double[] a, double[] b, List<Level> levels, int index) throws IOException {
            double[] row = tileRows[filled];
            int belowWidth = a.length;
            for (int c = 0; c < w; c++) {
                int c0 = 2 * c, c1 = Math.min(2 * c + 1, belowWidth - 1);
                if (resampling == Resampling.NEAREST) {
                    row[c] = a[c0];
                    continue;
                }
                double sum = 0;
                int n = 0;
                for (double v : new double[] {a[c0], c1 != c0 ? a[c1] : Double.NaN,
                    b != null ? b[c0] : Double.NaN, b != null && c1 != c0 ? b[c1] : Double.NaN}) {
                    if (sample.valid(v)) {
                        sum += v;
                        n++;
                    }
                }
                row[c] = n == 0 ? sample.noData : sum / n;
            }
            filled++;
            rowsDone++;
            if (index + 1 < levels.size()) {
                levels.get(index + 1).push(row, levels, index + 1);
            }
            if (filled == th) {
                writeTileRow();
            }
        }

        private void writeTileRow() throws IOException {
            int bps = sample.bits / 8;
            ByteBuffer px = ByteBuffer.allocate(tw * th * bps).order(order);
            byte[] comp = new byte[tw * th * bps + 1024];
            double pad = Double.isNaN(sample.noData) ? 0 : sample.noData;
            for (int tc = 0; tc * tw < w; tc++) {
                for (int r = 0; r < th; r++) {
                    for (int c = 0; c < tw; c++) {
                        int col = tc * tw + c;
                        sample.put(px, r * tw + c, r < filled && col < w ? tileRows[r][col] : pad);
                    }
                }
                deflater.reset();
                deflater.setInput(px.array());
                deflater.finish();
                java.io.ByteArrayOutputStream tile = new java.io.ByteArrayOutputStream();
                while (!deflater.finished()) {
                    int k = deflater.deflate(comp);
                    tile.write(comp, 0, k);
                }
                byte[] t = tile.toByteArray();
                stream.write(t);
                offsets.add(written);
                counts.add((long) t.length);
                written += t.length;
            }
            filled = 0;
        }
    }

    /** Writes header, every IFD (with its out-of-line values), then the data, last IFD's first. */
    private static void assemble(Path out, ByteOrder order, boolean big, List<Ifd> ifds) throws IOException {
        int countSize = big ? 8 : 2, entrySize = big ? 20 : 12, field = big ? 8 : 4;
        int offType = big ? TYPE_LONG8 : TYPE_LONG;
        int offSize = big ? 8 : 4;
        // Sizes of each IFD block (directory + out-of-line values), with placeholder offset arrays.
        long pos = big ? 16 : 8;
        long[] ifdAt = new long[ifds.size()];
        for (int i = 0; i < ifds.size(); i++) {
            Ifd f = ifds.get(i);
            f.tags.put(f.offsetsTag, new Object[] {offType, (long) f.counts.length, new byte[f.counts.length * offSize]});
            f.tags.put(f.countsTag, new Object[] {offType, (long) f.counts.length, new byte[f.counts.length * offSize]});
            ifdAt[i] = pos;
            pos += countSize + (long) f.tags.size() * entrySize + field;
            for (Object[] t : f.tags.values()) {
                int len = ((byte[]) t[2]).length;
                if (len > field) {
                    pos += len + (len & 1);
                }
            }
        }
        // Data positions: smallest overview first, full resolution last.
        long[][] dataAt = new long[ifds.size()][];
        for (int i = ifds.size() - 1; i >= 0; i--) {
            Ifd f = ifds.get(i);
            dataAt[i] = new long[f.counts.length];
            for (int k = 0; k < f.counts.length; k++) {
                dataAt[i][k] = pos;
                pos += f.counts[k];
            }
        }
        try (FileChannel ch = FileChannel.open(out, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                StandardOpenOption.TRUNCATE_EXISTING)) {
            ByteBuffer head = ByteBuffer.allocate(big ? 16 : 8).order(order);
            head.put(order == ByteOrder.LITTLE_ENDIAN ? (byte) 'I' : (byte) 'M');
            head.put(order == ByteOrder.LITTLE_ENDIAN ? (byte) 'I' : (byte) 'M');
            if (big) {
                head.putShort((short) 43).putShort((short) 8).putShort((short) 0).putLong(ifdAt[0]);
            } else {
                head.putShort((short) 42).putInt((int) ifdAt[0]);
            }
            long p = write(ch, head.flip(), 0);
            for (int i = 0; i < ifds.size(); i++) {
                Ifd f = ifds.get(i);
                ByteBuffer offs = ByteBuffer.allocate(f.counts.length * offSize).order(order);
                ByteBuffer cnts = ByteBuffer.allocate(f.counts.length * offSize).order(order);
                for (int k = 0; k < f.counts.length; k++) {
                    if (big) {
                        offs.putLong(dataAt[i][k]);
                        cnts.putLong(f.counts[k]);
                    } else {
                        offs.putInt((int) dataAt[i][k]);
                        cnts.putInt((int) f.counts[k]);
                    }
                }
                f.tags.get(f.offsetsTag)[2] = offs.array();
                f.tags.get(f.countsTag)[2] = cnts.array();
                long dirLen = countSize + (long) f.tags.size() * entrySize + field;
                ByteBuffer dir = ByteBuffer.allocate((int) dirLen).order(order);
                java.io.ByteArrayOutputStream extra = new java.io.ByteArrayOutputStream();
                long extraAt = p + dirLen;
                if (big) {
                    dir.putLong(f.tags.size());
                } else {
                    dir.putShort((short) f.tags.size());
                }
                for (var e : f.tags.entrySet()) {
                    Object[] t = e.getValue();
                    byte[] v = (byte[]) t[2];
                    dir.putShort((short) (int) e.getKey()).putShort((short) (int) (Integer) t[0]);
                    if (big) {
                        dir.putLong((Long) t[1]);
                    } else {
                        dir.putInt((int) (long) (Long) t[1]);
                    }
                    if (v.length <= field) {
                        dir.put(Arrays.copyOf(v, field));
                    } else {
                        long at = extraAt + extra.size();
                        dir.put(le(order, field, at));
                        extra.write(v);
                        if ((v.length & 1) != 0) {
                            extra.write(0);
                        }
                    }
                }
                dir.put(le(order, field, i + 1 < ifds.size() ? ifdAt[i + 1] : 0));
                p += write(ch, dir.flip(), p);
                p += write(ch, ByteBuffer.wrap(extra.toByteArray()), p);
            }
            for (int i = ifds.size() - 1; i >= 0; i--) {
                Ifd f = ifds.get(i);
                try (FileChannel src = FileChannel.open(f.source, StandardOpenOption.READ)) {
                    for (int k = 0; k < f.counts.length; k++) {
                        long n = 0;
                        while (n < f.counts[k]) {
                            n += src.transferTo(f.srcOffsets[k] + n, f.counts[k] - n, ch.position(p + n));
                        }
                        p += f.counts[k];
                    }
                }
            }
            ch.force(true);
        }
    }

    private static long write(FileChannel ch, ByteBuffer b, long pos) throws IOException {
        long n = 0;
        while (b.hasRemaining()) {
            n += ch.write(b, pos + n);
        }
        return n;
    }
}
