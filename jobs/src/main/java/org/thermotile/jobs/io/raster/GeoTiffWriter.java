package org.thermotile.jobs.io.raster;

import java.awt.image.DataBuffer;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.OpenOption;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.List;
import java.util.OptionalInt;
import org.apache.sis.coverage.grid.GridExtent;
import org.apache.sis.coverage.grid.GridGeometry;
import org.apache.sis.coverage.grid.PixelInCell;
import org.apache.sis.referencing.operation.matrix.Matrix3;
import org.apache.sis.referencing.operation.transform.MathTransforms;
import org.apache.sis.setup.OptionKey;
import org.apache.sis.storage.DataStoreException;
import org.apache.sis.storage.StorageConnector;
import org.apache.sis.storage.geotiff.Compression;
import org.apache.sis.storage.geotiff.FormatModifier;
import org.apache.sis.storage.geotiff.GeoTiffStore;
import org.apache.sis.storage.geotiff.GeoTiffStoreProvider;
import org.opengis.referencing.crs.CoordinateReferenceSystem;
import org.opengis.util.FactoryException;

/**
 * Writes GeoTIFF files on a {@link RasterGrid}: float32 maps (one band, or a "stack" of one band
 * per hour) and integer class maps (uint8, uint16, int16). No int8: Apache SIS 1.6 cannot read
 * signed bytes back (it fails with "The 'SHORT' type is not supported"), so uint8 or int16 it is.
 *
 * <p>Files are tiled {@value #TILE_SIZE}×{@value #TILE_SIZE} (a raster at most
 * {@value #TILE_SIZE} columns wide is written as full-width strips instead, see
 * {@link #tileWidthFor} and {@link #tileHeightFor}), DEFLATE-compressed, band-sequential (planar configuration 2), with
 * the grid's CRS (its EPSG code in the GeoTIFF keys) and geotransform, and a declared no-data
 * value in GDAL's tag 42113 so that GIS programs mask it. No date or software tag: identical data
 * give byte-identical files. Files whose uncompressed size exceeds {@value #BIG_TIFF_BYTES} bytes
 * are written as BigTIFF, which GDAL's default rule ("BIGTIFF=IF_NEEDED") reads as well.
 *
 * <p>Pixels come row-major for the whole grid, or block by block from a source called once per
 * output tile and band ({@link #writeFloatBlocks}), so a caller never needs the whole grid in
 * memory; a stack tile holds all its bands at once (256·256·bands·4 bytes).
 *
 * <p>Apache SIS 1.6 writes the pixels, CRS and geotransform; it does not write tag 42113, so
 * {@link TiffDirectory#patch} adds it afterwards. Last, {@link CloudOptimized#rewrite} lays the
 * file out as a Cloud-Optimised GeoTIFF with internal overviews (average of valid cells for
 * float maps, nearest for integer class maps and for float maps asked so). The caller chooses the path
 * (and any temporary folder); a file left half-written by a failure is deleted.
 */
public final class GeoTiffWriter {

    /** Tile edge of written files [cells]. */
    public static final int TILE_SIZE = 256;

    /** Uncompressed size above which BigTIFF is used [bytes]; a margin under 2³² (our choice). */
    static final long BIG_TIFF_BYTES = 4_000_000_000L;

    /** Integer sample types for class maps and land cover. */
    public enum IntType {
        UINT8(0, 255, DataBuffer.TYPE_BYTE),
        UINT16(0, 65535, DataBuffer.TYPE_USHORT),
        INT16(-32768, 32767, DataBuffer.TYPE_SHORT);

        /** Smallest and largest value the type holds. */
        public final int min, max;
        final int dataBufferType;

        IntType(int min, int max, int dataBufferType) {
            this.min = min;
            this.max = max;
            this.dataBufferType = dataBufferType;
        }
    }

    /** Supplies float values block by block. */
    @FunctionalInterface
    public interface FloatBlockSource {
        /**
         * Fills {@code out[r * width + c]} with the value of band {@code band} at column
         * {@code col0 + c}, row {@code row0 + r}. Called once per output tile and band, tiles in
         * row-major order; the block is the tile clipped to the grid.
         *
         * @param out an array of exactly {@code width * height} values, to fill
         */
        void fill(int band, int col0, int row0, int width, int height, float[] out);
    }

    /** Supplies integer values block by block; same contract as {@link FloatBlockSource}. */
    @FunctionalInterface
    public interface IntBlockSource {
        void fill(int band, int col0, int row0, int width, int height, int[] out);
    }

    private GeoTiffWriter() { }

    /**
     * Writes a single-band float32 GeoTIFF.
     *
     * @param values row-major, {@code values[row * width + col]}, length width·height
     * @param noData the no-data value to declare (NaN allowed); cells holding it are no-data
     */
    public static void writeFloat(Path file, RasterGrid grid, float[] values, float noData) {
        writeFloatStack(file, grid, new float[][] {values}, noData);
    }

    /**
     * Writes a multi-band float32 GeoTIFF, one band per array (e.g. one per hour).
     *
     * @param bands {@code bands[b][row * width + col]}, each of length width·height
     */
    public static void writeFloatStack(Path file, RasterGrid grid, float[][] bands, float noData) {
        for (int b = 0; b < bands.length; b++) {
            checkLength(file, grid, bands[b].length, b);
        }
        writeFloatBlocks(file, grid, bands.length, noData, (band, c0, r0, w, h, out) -> {
            float[] src = bands[band];
            for (int r = 0; r < h; r++) {
                System.arraycopy(src, (r0 + r) * grid.width() + c0, out, r * w, w);
            }
        });
    }

    /** Writes a float32 GeoTIFF of {@code bandCount} bands whose values come from {@code source}. */
    public static void writeFloatBlocks(Path file, RasterGrid grid, int bandCount, float noData, FloatBlockSource source) {
        writeFloatBlocks(file, grid, bandCount, noData, source, false);
    }

    /**
     * As {@link #writeFloatBlocks(Path, RasterGrid, int, float, FloatBlockSource)} with the given
     * overview resampling: {@link CloudOptimized.Resampling#NEAREST} for maps whose values are
     * codes or clock hours, where a mean of neighbours means nothing.
     */
    public static void writeFloatBlocks(Path file, RasterGrid grid, int bandCount, float noData, FloatBlockSource source,
            CloudOptimized.Resampling resampling) {
        writeFloatBlocks(file, grid, bandCount, noData, source, false, resampling);
    }

    /**
     * What one band holds, for GDAL's metadata tag 42112 (GDAL GTiff driver documentation,
     * "Metadata"): {@code <Item name="DESCRIPTION" sample="b" role="description">} (gdalinfo's
     * "Description"), {@code <Item name="UNITTYPE" sample="b" role="unittype">} (gdalinfo's
     * "Unit Type") and further per-band items (e.g. {@code TIME}). ASCII text (TIFF type 2).
     *
     * @param unit a UDUNITS-style unit ("degC", "h", "K.h", "1")
     */
    public record Band(String description, String unit, java.util.Map<String, String> items) {
        public Band {
            items = java.util.Collections.unmodifiableMap(new java.util.LinkedHashMap<>(items));
        }

        public Band(String description, String unit) {
            this(description, unit, java.util.Map.of());
        }
    }

    /** The GDAL_METADATA XML for the given bands (sample numbers from 0), values XML-escaped. */
    static String bandMetadataXml(List<Band> bands) {
        StringBuilder b = new StringBuilder("<GDALMetadata>\n");
        for (int i = 0; i < bands.size(); i++) {
            Band band = bands.get(i);
            for (var e : band.items().entrySet()) {
                b.append("  <Item name=\"").append(xml(e.getKey())).append("\" sample=\"").append(i).append("\">")
                        .append(xml(e.getValue())).append("</Item>\n");
            }
            b.append("  <Item name=\"DESCRIPTION\" sample=\"").append(i).append("\" role=\"description\">")
                    .append(xml(band.description())).append("</Item>\n");
            b.append("  <Item name=\"UNITTYPE\" sample=\"").append(i).append("\" role=\"unittype\">")
                    .append(xml(band.unit())).append("</Item>\n");
        }
        return b.append("</GDALMetadata>").toString();
    }

    private static String xml(String s) {
        if (!java.nio.charset.StandardCharsets.US_ASCII.newEncoder().canEncode(s)) {
            throw new IllegalArgumentException("band metadata must be ASCII: " + s);
        }
        return s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("\"", "&quot;");
    }

    /**
     * As {@link #writeFloatBlocks(Path, RasterGrid, int, float, FloatBlockSource, CloudOptimized.Resampling)},
     * each band described by {@code bands} (one per band) in GDAL's metadata tag.
     */
    public static void writeFloatBlocks(Path file, RasterGrid grid, List<Band> bands, float noData,
            FloatBlockSource source, CloudOptimized.Resampling resampling) {
        write(file, grid, bands.size(), DataBuffer.TYPE_FLOAT, 0, 1, noDataText(noData), false, resampling,
                bandMetadataXml(bands), floatFiller(bands.size(), source));
    }

    /** As the public form; {@code forceBigTiff} writes BigTIFF whatever the size (for tests). */
    static void writeFloatBlocks(Path file, RasterGrid grid, int bandCount, float noData, FloatBlockSource source,
            boolean forceBigTiff) {
        writeFloatBlocks(file, grid, bandCount, noData, source, forceBigTiff, CloudOptimized.Resampling.AVERAGE);
    }

    private static void writeFloatBlocks(Path file, RasterGrid grid, int bandCount, float noData,
            FloatBlockSource source, boolean forceBigTiff, CloudOptimized.Resampling resampling) {
        write(file, grid, bandCount, DataBuffer.TYPE_FLOAT, 0, 1, noDataText(noData), forceBigTiff, resampling,
                null, floatFiller(bandCount, source));
    }

    private static BlockImage.Filler floatFiller(int bandCount, FloatBlockSource source) {
        return (tile, c0, r0, w, h) -> {
                    float[] block = new float[w * h];
                    for (int b = 0; b < bandCount; b++) {
                        source.fill(b, c0, r0, w, h, block);
                        tile.setSamples(c0, r0, w, h, b, block);
                    }
                };
    }

    /**
     * Writes a single-band integer GeoTIFF (land cover, class maps).
     *
     * @param values row-major codes, each within {@code type}'s range
     * @param noData the no-data code to declare, within the type's range, or empty for none
     * @throws IllegalArgumentException naming the row and column of a value outside the range
     */
    public static void writeInt(Path file, RasterGrid grid, IntType type, int[] values, OptionalInt noData) {
        checkLength(file, grid, values.length, 0);
        writeIntBlocks(file, grid, type, 1, noData, (band, c0, r0, w, h, out) -> {
            for (int r = 0; r < h; r++) {
                System.arraycopy(values, (r0 + r) * grid.width() + c0, out, r * w, w);
            }
        });
    }

    /** Writes an integer GeoTIFF of {@code bandCount} bands whose values come from {@code source}. */
    public static void writeIntBlocks(Path file, RasterGrid grid, IntType type, int bandCount, OptionalInt noData,
            IntBlockSource source) {
        String noDataText = null;
        if (noData.isPresent()) {
            int nd = noData.getAsInt();
            if (nd < type.min || nd > type.max) {
                throw new IllegalArgumentException(file + ": no-data value " + nd + " is outside the "
                        + type.name().toLowerCase(java.util.Locale.ROOT) + " range " + type.min + "…" + type.max);
            }
            noDataText = Integer.toString(nd);
        }
        double displayMax = type.dataBufferType == DataBuffer.TYPE_BYTE ? 255 : type.max;
        double displayMin = type.dataBufferType == DataBuffer.TYPE_BYTE ? 0 : type.min;
        write(file, grid, bandCount, type.dataBufferType, displayMin, displayMax, noDataText, false,
                CloudOptimized.Resampling.NEAREST, null,
                (tile, c0, r0, w, h) -> {
                    int[] block = new int[w * h];
                    for (int b = 0; b < bandCount; b++) {
                        source.fill(b, c0, r0, w, h, block);
                        checkRange(file, type, block, c0, r0, w);
                        tile.setSamples(c0, r0, w, h, b, block);
                    }
                });
    }

    /**
     * The tile width used for a raster {@code width} cells wide: {@value #TILE_SIZE}, or the
     * whole width when it is at most {@value #TILE_SIZE}. SIS 1.6 writes a raster with a single
     * column of tiles as strips, and a strip narrower than the tile raster came out scrambled in
     * a trial (values shifted between rows); strips as wide as the raster are right.
     */
    static int tileWidthFor(int width) {
        return Math.min(width, TILE_SIZE);
    }

    /**
     * The tile height for a raster of {@code width} × {@code height} cells: {@value #TILE_SIZE}
     * when it is written as tiles; when it is written as strips ({@code width ≤ }{@value
     * #TILE_SIZE}), the largest divisor of {@code height} not above {@value #TILE_SIZE}. SIS 1.6
     * writes every strip with the full tile height, while TIFF 6.0 (section 3, RowsPerStrip)
     * wants the last strip cut to the rows left; GDAL 3.6 then read wrong values at the end of
     * the last strip in a trial. With strips that divide the height, every strip is full.
     * A prime height gives one row per strip: correct, and such narrow rasters are small.
     */
    static int tileHeightFor(int width, int height) {
        if (width > TILE_SIZE) {
            return TILE_SIZE;
        }
        for (int rows = Math.min(height, TILE_SIZE); ; rows--) {
            if (height % rows == 0) {
                return rows;
            }
        }
    }

    /**
     * GDAL_NODATA text for a value: "nan", "inf"/"-inf", an integer without decimals, or the
     * shortest decimal that reads back as the same double (GDAL parses it with C {@code strtod}).
     */
    static String noDataText(double v) {
        if (Double.isNaN(v)) {
            return "nan";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "inf" : "-inf";
        }
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            return Long.toString((long) v);
        }
        return Double.toString(v);
    }

    private static void write(Path file, RasterGrid grid, int bandCount, int dataType, double displayMin,
            double displayMax, String noDataText, boolean forceBigTiff, CloudOptimized.Resampling resampling,
            String gdalMetadata, BlockImage.Filler filler) {
        if (bandCount < 1) {
            throw new IllegalArgumentException(file + ": band count " + bandCount + " must be ≥ 1");
        }
        Path parent = file.toAbsolutePath().getParent();
        if (parent != null && !Files.isDirectory(parent)) {
            throw new RasterFileException(file, "the folder " + parent + " does not exist", "create it first");
        }
        CoordinateReferenceSystem crs;
        try {
            crs = SisCrs.crsOf(grid);
        } catch (FactoryException e) {
            throw new RasterFileException(file, "the grid's CRS (" + grid.crsLabel() + ") cannot be built: "
                    + RasterFileException.describe(e), "use a WGS 84 / UTM CRS (EPSG:326xx or 327xx)", e);
        }
        GridGeometry geometry = new GridGeometry(new GridExtent(grid.width(), grid.height()), PixelInCell.CELL_CORNER,
                MathTransforms.linear(new Matrix3(
                        grid.pixelWidth(), 0, grid.originX(),
                        0, grid.pixelHeight(), grid.originY(),
                        0, 0, 1)), crs);
        BlockImage image = new BlockImage(grid.width(), grid.height(), tileWidthFor(grid.width()),
                tileHeightFor(grid.width(), grid.height()),
                bandCount, dataType, displayMin, displayMax, (tile, c0, r0, w, h) -> {
                    try {
                        filler.fill(tile, c0, r0, w, h);
                    } catch (RuntimeException e) {
                        throw new SourceFailure(e);
                    }
                });

        long bytes = grid.cellCount() * bandCount * DataBuffer.getDataTypeSize(dataType) / 8;
        StorageConnector connector = new StorageConnector(file);
        connector.setOption(OptionKey.OPEN_OPTIONS, new OpenOption[] {
            StandardOpenOption.CREATE, StandardOpenOption.WRITE, StandardOpenOption.TRUNCATE_EXISTING});
        connector.setOption(Compression.OPTION_KEY, Compression.DEFLATE);
        if (forceBigTiff || bytes > BIG_TIFF_BYTES) {
            connector.setOption(FormatModifier.OPTION_KEY, new FormatModifier[] {FormatModifier.BIG_TIFF});
        }
        boolean done = false;
        try {
            try (GeoTiffStore store = new GeoTiffStore(new GeoTiffStoreProvider(), connector)) {
                store.append(image, geometry, null);
            }
            List<TiffDirectory.NewTag> tags = new java.util.ArrayList<>();
            if (gdalMetadata != null) {
                tags.add(TiffDirectory.NewTag.ascii(TiffDirectory.GDAL_METADATA, gdalMetadata));
            }
            if (noDataText != null) {
                tags.add(TiffDirectory.NewTag.ascii(TiffDirectory.GDAL_NODATA, noDataText));
            }
            if (!tags.isEmpty()) {
                TiffDirectory.read(file).patch(tags);
            }
            CloudOptimized.rewrite(file, resampling);
            done = true;
        } catch (DataStoreException | IOException | RuntimeException e) {
            for (Throwable t = e; t != null; t = t.getCause()) {
                if (t instanceof SourceFailure s) {
                    throw s.original;                        // the caller's data, not the file, is at fault
                }
            }
            throw new RasterFileException(file, "could not write the GeoTIFF: " + RasterFileException.describe(e),
                    "check that the folder is writable and the disk has free space", e);
        } finally {
            if (!done) {
                try {
                    Files.deleteIfExists(file);
                } catch (IOException ignored) {
                    // the original failure is the one to report
                }
            }
        }
    }

    /** Carries an exception of the caller's block source through SIS, which wraps what it catches. */
    private static final class SourceFailure extends RuntimeException {
        private static final long serialVersionUID = 1L;
        final RuntimeException original;

        SourceFailure(RuntimeException original) {
            super(original);
            this.original = original;
        }
    }

    private static void checkLength(Path file, RasterGrid grid, int length, int band) {
        if (length != grid.cellCount()) {
            throw new IllegalArgumentException(file + ": band " + (band + 1) + " has " + length
                    + " values but the grid has " + grid.width() + " × " + grid.height() + " = " + grid.cellCount());
        }
    }

    private static void checkRange(Path file, IntType type, int[] block, int c0, int r0, int w) {
        for (int i = 0; i < block.length; i++) {
            int v = block[i];
            if (v < type.min || v > type.max) {
                throw new IllegalArgumentException(file + ": value " + v + " at row " + (r0 + i / w) + ", column "
                        + (c0 + i % w) + " is outside the " + type.name().toLowerCase(java.util.Locale.ROOT) + " range "
                        + type.min + "…" + type.max);
            }
        }
    }
}
