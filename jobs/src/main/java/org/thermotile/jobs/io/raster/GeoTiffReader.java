package org.thermotile.jobs.io.raster;

import java.awt.Rectangle;
import java.awt.image.Raster;
import java.awt.image.RenderedImage;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import org.apache.sis.coverage.grid.GridCoverage;
import org.apache.sis.coverage.grid.GridExtent;
import org.apache.sis.coverage.grid.GridGeometry;
import org.apache.sis.coverage.grid.PixelInCell;
import org.apache.sis.referencing.operation.transform.MathTransforms;
import org.apache.sis.storage.DataStoreException;
import org.apache.sis.storage.GridCoverageResource;
import org.apache.sis.storage.StorageConnector;
import org.apache.sis.storage.event.WarningEvent;
import org.apache.sis.storage.geotiff.GeoTiffStore;
import org.apache.sis.storage.geotiff.GeoTiffStoreProvider;
import org.opengis.referencing.crs.CoordinateReferenceSystem;
import org.opengis.referencing.operation.Matrix;

/**
 * Reads GeoTIFF rasters window by window: land cover as integer codes, heights and other fields
 * as float. Only the tiles (or strips) a window touches are read (Apache SIS
 * {@code GridCoverageResource.read(subgrid)}, which returns whole tiles; the reader crops them).
 *
 * <p>Opening checks the whole file's structure once, so a run can be validated before it starts:
 * missing file, not a TIFF, cut-short or damaged file (the pixel data must fit in the file), empty
 * raster, unsupported sample type, compression or predictor, missing CRS, a CRS that is not projected in metres, and a
 * rotated, sheared or south-up geotransform are each reported as a {@link RasterFileException}
 * naming the file and the fix. The no-data value is GDAL's tag 42113, read from the TIFF directory.
 *
 * <p>Integer windows hold the codes as stored, the no-data code included; float windows hold NaN
 * in no-data cells. One reader per thread.
 */
public final class GeoTiffReader implements AutoCloseable {

    /** Sample types a GeoTIFF band may hold (TIFF BitsPerSample with SampleFormat). */
    public enum SampleType {
        UINT8, UINT16, INT16, UINT32, INT32, FLOAT32, FLOAT64;

        /** True for the integer types. */
        public boolean isInteger() {
            return this != FLOAT32 && this != FLOAT64;
        }

        /** Lower-case name as GDAL users write it ("uint8", "float32"). */
        public String label() {
            return name().toLowerCase(Locale.ROOT);
        }
    }

    /** Largest shear/rotation term accepted as zero, relative to the pixel size (our choice). */
    private static final double SHEAR_TOLERANCE = 1e-9;

    private static final String FIX_ROTATED = "resample to a north-up grid, e.g. with gdalwarp "
            + "(gdalwarp -t_srs EPSG:<code> in.tif out.tif writes a north-up grid)";

    private final Path file;
    private final GeoTiffStore store;
    private final GridCoverageResource resource;
    private final GridGeometry geometry;
    private final RasterGrid grid;
    private final int bandCount;
    private final SampleType sampleType;
    private final OptionalDouble noData;
    private final String gdalMetadata;
    private final List<String> warnings = new ArrayList<>();

    private final boolean requireProjected;

    private GeoTiffReader(Path file, TiffDirectory dir, boolean requireProjected) throws IOException {
        this.requireProjected = requireProjected;
        this.file = file;
        int width = (int) dir.integer(TiffDirectory.IMAGE_WIDTH, 0);
        int height = (int) dir.integer(TiffDirectory.IMAGE_LENGTH, 0);
        if (width <= 0 || height <= 0) {
            throw new RasterFileException(file, "the raster is empty (" + width + " × " + height + " cells)",
                    "write the raster again with at least one row and one column");
        }
        bandCount = (int) dir.integer(TiffDirectory.SAMPLES_PER_PIXEL, 1);
        sampleType = sampleType(file, dir);
        checkCompression(file, dir, sampleType);
        long end = dir.pixelDataEnd();
        if (end > dir.fileSize) {
            throw TiffDirectory.damaged(file, "its pixel data runs to byte " + end + " but the file has only "
                    + dir.fileSize + " bytes (cut short?)");
        }
        noData = parseNoData(file, dir.ascii(TiffDirectory.GDAL_NODATA));
        gdalMetadata = dir.ascii(TiffDirectory.GDAL_METADATA);
        int declaredEpsg = dir.declaredEpsg();

        try {
            store = new GeoTiffStore(new GeoTiffStoreProvider(), new StorageConnector(file));
        } catch (DataStoreException | RuntimeException e) {
            throw new RasterFileException(file, "cannot be opened as a GeoTIFF: " + RasterFileException.describe(e),
                    "check that it is a valid GeoTIFF, e.g. with gdalinfo", e);
        }
        store.addListener(WarningEvent.class, e -> warnings.add(e.getDescription().getMessage()));
        try {
            List<GridCoverageResource> images = store.components();
            if (images.isEmpty()) {
                throw new RasterFileException(file, "holds no image", "write the raster again");
            }
            resource = images.get(0);
            geometry = resource.getGridGeometry();
        } catch (DataStoreException | RuntimeException e) {
            closeQuietly();
            if (e instanceof RasterFileException r) {
                throw r;
            }
            throw new RasterFileException(file, "its georeferencing cannot be read: " + RasterFileException.describe(e) + warningText(),
                    "check the CRS with gdalinfo; reproject to a WGS 84 / UTM zone with gdalwarp -t_srs EPSG:326xx", e);
        }
        try {
            grid = gridOf(file, geometry, width, height, declaredEpsg);
        } catch (RuntimeException e) {
            closeQuietly();
            throw e;
        }
    }

    /** Opens a GeoTIFF of any number of bands and checks its structure. */
    public static GeoTiffReader open(Path file) {
        return open(file, true);
    }

    /**
     * Opens a single-band GeoTIFF in any CRS, geographic ones included: the input of a
     * reprojection onto a working grid ({@code org.thermotile.jobs.ingest}). Its {@link #grid()}
     * is then in the CRS's own units (degrees for a geographic CRS, x = longitude); use
     * {@link #crs()} for the CRS object with the axis order of the grid.
     */
    public static GeoTiffReader openSingleBandAnyCrs(Path file) {
        GeoTiffReader r = open(file, false);
        if (r.bandCount != 1) {
            r.close();
            throw new RasterFileException(file, "has " + r.bandCount + " bands where one was expected",
                    "extract the band you mean, e.g. gdal_translate -b 1 in.tif out.tif");
        }
        return r;
    }

    private static GeoTiffReader open(Path file, boolean requireProjected) {
        if (!Files.exists(file)) {
            throw new RasterFileException(file, "file not found", "check the path (relative paths start at "
                    + Path.of("").toAbsolutePath() + ")");
        }
        if (!Files.isRegularFile(file) || !Files.isReadable(file)) {
            throw new RasterFileException(file, "is not a readable file", "give the path of a GeoTIFF file");
        }
        TiffDirectory dir;
        try {
            dir = TiffDirectory.read(file);
        } catch (IOException e) {
            throw new RasterFileException(file, "cannot be read: " + RasterFileException.describe(e), "check the file's permissions", e);
        }
        try {
            return new GeoTiffReader(file, dir, requireProjected);
        } catch (IOException e) {
            throw new RasterFileException(file, "cannot be read: " + RasterFileException.describe(e), "check the file's permissions", e);
        }
    }

    /** Opens a GeoTIFF that must have exactly one band (land cover, heights). */
    public static GeoTiffReader openSingleBand(Path file) {
        GeoTiffReader r = open(file);
        if (r.bandCount != 1) {
            r.close();
            throw new RasterFileException(file, "has " + r.bandCount + " bands where one was expected",
                    "extract the band you mean, e.g. gdal_translate -b 1 in.tif out.tif");
        }
        return r;
    }

    /** The file, as given. */
    public Path file() {
        return file;
    }

    /** The raster's grid, geotransform and CRS. */
    public RasterGrid grid() {
        return grid;
    }

    /** The raster's CRS as Apache SIS read it, its axes in the order of {@link #grid()}'s x and y. */
    public CoordinateReferenceSystem crs() {
        return geometry.getCoordinateReferenceSystem();
    }

    /** Number of bands. */
    public int bandCount() {
        return bandCount;
    }

    /** The stored sample type of the bands. */
    public SampleType sampleType() {
        return sampleType;
    }

    /** The declared no-data value (GDAL tag 42113), or empty when the file declares none. */
    public OptionalDouble noDataValue() {
        return noData;
    }

    /**
     * GDAL's metadata XML (tag 42112: band descriptions, units, times, class tables) as stored, or
     * null when the file has none.
     */
    public String gdalMetadata() {
        return gdalMetadata;
    }

    /** Integer codes of band 1 in a window; see {@link #readIntWindow(int, int, int, int, int)}. */
    public int[] readIntWindow(int col0, int row0, int width, int height) {
        return readIntWindow(0, col0, row0, width, height);
    }

    /**
     * Integer codes of one band in the window of columns {@code col0…col0+width−1} and rows
     * {@code row0…row0+height−1}, row-major: {@code out[r * width + c]} is the cell at column
     * {@code col0 + c}, row {@code row0 + r}.
     *
     * @param band 0-based band index
     * @throws RasterFileException      if the band holds floating-point values, or reading fails
     * @throws IllegalArgumentException if the window is not inside the raster
     */
    public int[] readIntWindow(int band, int col0, int row0, int width, int height) {
        if (!sampleType.isInteger()) {
            throw new RasterFileException(file, "holds " + sampleType.label() + " values where integer codes were "
                    + "expected", "convert it, e.g. gdal_translate -ot Byte (or Int16) in.tif out.tif");
        }
        Raster r = window(band, col0, row0, width, height);
        return r.getSamples(0, 0, width, height, 0, new int[width * height]);
    }

    /** Float values of band 1 in a window; see {@link #readFloatWindow(int, int, int, int, int)}. */
    public float[] readFloatWindow(int col0, int row0, int width, int height) {
        return readFloatWindow(0, col0, row0, width, height);
    }

    /**
     * Values of one band in a window as float, row-major as in
     * {@link #readIntWindow(int, int, int, int, int)}. No-data cells come back as NaN, whatever
     * the declared no-data value (SIS already does this for float bands). Integer bands are
     * converted (exact up to 2²⁴).
     */
    public float[] readFloatWindow(int band, int col0, int row0, int width, int height) {
        Raster r = window(band, col0, row0, width, height);
        float[] out = r.getSamples(0, 0, width, height, 0, new float[width * height]);
        if (noData.isPresent() && !Double.isNaN(noData.getAsDouble())) {
            float nd = (float) noData.getAsDouble();
            for (int i = 0; i < out.length; i++) {
                if (out[i] == nd) {
                    out[i] = Float.NaN;
                }
            }
        }
        return out;
    }

    /** A raster of the window alone, its (0, 0) at the window's top-left cell. */
    private Raster window(int band, int col0, int row0, int width, int height) {
        if (band < 0 || band >= bandCount) {
            throw new IllegalArgumentException(file + ": band index " + band + " is outside 0…" + (bandCount - 1));
        }
        if (width < 1 || height < 1 || col0 < 0 || row0 < 0
                || (long) col0 + width > grid.width() || (long) row0 + height > grid.height()) {
            throw new IllegalArgumentException(file + ": window columns " + col0 + "…" + ((long) col0 + width - 1)
                    + ", rows " + row0 + "…" + ((long) row0 + height - 1) + " is not inside the raster of "
                    + grid.width() + " × " + grid.height() + " cells");
        }
        GridExtent extent = new GridExtent(null, new long[] {col0, row0},
                new long[] {col0 + width - 1L, row0 + height - 1L}, true);
        try {
            GridGeometry sub = geometry.derive().subgrid(extent).build();
            GridCoverage coverage = resource.read(sub, band).forConvertedValues(false);
            RenderedImage image = coverage.render(extent);     // image (0, 0) = the extent's low corner
            return image.getData(new Rectangle(0, 0, width, height));
        } catch (DataStoreException | RuntimeException e) {
            throw new RasterFileException(file, "reading columns " + col0 + "…" + (col0 + width - 1) + ", rows "
                    + row0 + "…" + (row0 + height - 1) + " failed: " + RasterFileException.describe(e) + warningText(),
                    "the file is probably damaged or cut short; copy or create it again", e);
        }
    }

    /** Closes the file. */
    @Override
    public void close() {
        try {
            store.close();
        } catch (DataStoreException e) {
            throw new RasterFileException(file, "cannot be closed: " + RasterFileException.describe(e), "", e);
        }
    }

    private void closeQuietly() {
        try {
            store.close();
        } catch (DataStoreException | RuntimeException ignored) {
            // the error being reported matters more
        }
    }

    private String warningText() {
        return warnings.isEmpty() ? "" : " (warnings: " + String.join("; ", warnings) + ")";
    }

    private RasterGrid gridOf(Path file, GridGeometry g, int width, int height, int declaredEpsg) {
        if (!g.isDefined(GridGeometry.CRS) && declaredEpsg > 0) {
            throw new RasterFileException(file, "declares EPSG:" + declaredEpsg + ", which Apache SIS cannot build "
                    + "without the EPSG geodetic dataset (it knows WGS 84 and its UTM zones built in)" + warningText(),
                    "reproject it to a WGS 84 / UTM zone, e.g. gdalwarp -t_srs EPSG:326xx in.tif out.tif");
        }
        if (!g.isDefined(GridGeometry.CRS)) {
            throw new RasterFileException(file, "has no coordinate reference system" + warningText(),
                    "assign one, e.g. gdal_edit.py -a_srs EPSG:<code> " + file.getFileName());
        }
        if (!g.isDefined(GridGeometry.GRID_TO_CRS)) {
            throw new RasterFileException(file, "has no geotransform (no position on the ground)",
                    "georeference it, e.g. gdal_edit.py -a_ullr <ulx> <uly> <lrx> <lry> " + file.getFileName());
        }
        CoordinateReferenceSystem crs = g.getCoordinateReferenceSystem();
        String unsuitable = SisCrs.unsuitable(crs);
        if (unsuitable != null && requireProjected) {
            throw new RasterFileException(file, unsuitable,
                    "reproject to a metric CRS, e.g. gdalwarp -t_srs EPSG:326xx (WGS 84 / UTM zone xx)");
        }
        Matrix m = MathTransforms.getMatrix(g.getGridToCRS(PixelInCell.CELL_CORNER));
        if (m == null || m.getNumRow() != 3 || m.getNumCol() != 3) {
            throw new RasterFileException(file, "its geotransform is not a 2-D affine transform", FIX_ROTATED);
        }
        double a = m.getElement(0, 0), b = m.getElement(0, 1), c = m.getElement(0, 2);
        double d = m.getElement(1, 0), e = m.getElement(1, 1), f = m.getElement(1, 2);
        double scale = Math.max(Math.abs(a), Math.abs(e));
        if (Math.abs(b) > SHEAR_TOLERANCE * scale || Math.abs(d) > SHEAR_TOLERANCE * scale) {
            throw new RasterFileException(file, String.format(Locale.ROOT,
                    "its geotransform is rotated or sheared (x = %s + %s·col + %s·row, y = %s + %s·col + %s·row); "
                    + "only north-up grids are supported", c, a, b, f, d, e), FIX_ROTATED);
        }
        if (!(a > 0) || !(e < 0)) {
            throw new RasterFileException(file, "its grid is not north-up (pixel size " + a + " × " + e
                    + "; north-up has width > 0 and height < 0)", FIX_ROTATED);
        }
        return new RasterGrid(width, height, c, f, a, e, SisCrs.epsgOf(crs), SisCrs.wkt(crs));
    }

    /**
     * Refuses what Apache SIS 1.6 cannot decode, or decodes wrongly: compressions other than none,
     * LZW, DEFLATE and PackBits (TIFF 6.0 §3 and §9, codes 1, 5, 8/32946, 32773), the
     * floating-point predictor (Predictor 3, Adobe TIFF Technical Note 3), and horizontal
     * differencing (Predictor 2) on floating-point samples, which SIS 1.6 read back wrong without
     * any error in a trial on a GDAL-written file.
     */
    private static void checkCompression(Path file, TiffDirectory dir, SampleType type) throws IOException {
        long c = dir.integer(TiffDirectory.COMPRESSION, 1);
        if (c != 1 && c != 5 && c != 8 && c != 32946 && c != 32773) {
            String name = switch ((int) c) {
                case 7 -> "JPEG";
                case 34712 -> "JPEG 2000";
                case 34887 -> "LERC";
                case 34925 -> "LZMA";
                case 50000 -> "ZSTD";
                case 50001 -> "WEBP";
                default -> "code " + c;
            };
            throw new RasterFileException(file, "is compressed with " + name + " (TIFF compression " + c
                    + "), which Apache SIS 1.6 cannot read (it reads none, LZW, DEFLATE and PackBits)",
                    "recompress it, e.g. gdal_translate -co COMPRESS=DEFLATE in.tif out.tif");
        }
        long p = dir.integer(TiffDirectory.PREDICTOR, 1);
        if (p == 3 || (p == 2 && !type.isInteger()) || p > 3) {
            throw new RasterFileException(file, "uses TIFF predictor " + p + " on " + type.label()
                    + " samples, which Apache SIS 1.6 cannot read correctly",
                    "rewrite it without predictor, e.g. gdal_translate -co COMPRESS=DEFLATE -co PREDICTOR=1 in.tif out.tif");
        }
    }

    private static SampleType sampleType(Path file, TiffDirectory dir) throws IOException {
        long[] bits = dir.integers(TiffDirectory.BITS_PER_SAMPLE);
        long[] formats = dir.integers(TiffDirectory.SAMPLE_FORMAT);
        int b = bits == null ? 1 : (int) bits[0];
        int f = formats == null ? 1 : (int) formats[0];
        for (long x : bits == null ? new long[0] : bits) {
            if (x != b) {
                throw new RasterFileException(file, "its bands have different bit depths", "write one type for all bands");
            }
        }
        SampleType t = switch (f * 100 + b) {       // SampleFormat 1 unsigned, 2 signed, 3 float (TIFF 6.0 §19)
            case 108 -> SampleType.UINT8;
            case 208 -> throw new RasterFileException(file, "holds signed 8-bit samples (int8), which Apache SIS 1.6 "
                    + "cannot read", "convert it, e.g. gdal_translate -ot Int16 in.tif out.tif");
            case 116 -> SampleType.UINT16;
            case 216 -> SampleType.INT16;
            case 132 -> SampleType.UINT32;
            case 232 -> SampleType.INT32;
            case 332 -> SampleType.FLOAT32;
            case 364 -> SampleType.FLOAT64;
            default -> null;
        };
        if (t == null) {
            throw new RasterFileException(file, "holds " + b + "-bit samples of TIFF sample format " + f
                    + ", which is not supported (8, 16, 32-bit integers, 32 or 64-bit floats are)",
                    "convert it, e.g. gdal_translate -ot Float32 in.tif out.tif");
        }
        return t;
    }

    /** Parses GDAL_NODATA text ("-9999", "nan", "1e+20", "-inf"), or empty when absent. */
    static OptionalDouble parseNoData(Path file, String text) {
        if (text == null || text.isBlank()) {
            return OptionalDouble.empty();
        }
        String t = text.trim().toLowerCase(Locale.ROOT);
        switch (t) {
            case "nan", "-nan", "+nan" -> { return OptionalDouble.of(Double.NaN); }
            case "inf", "+inf", "infinity", "+infinity" -> { return OptionalDouble.of(Double.POSITIVE_INFINITY); }
            case "-inf", "-infinity" -> { return OptionalDouble.of(Double.NEGATIVE_INFINITY); }
            default -> { }
        }
        try {
            return OptionalDouble.of(Double.parseDouble(t));
        } catch (NumberFormatException e) {
            throw new RasterFileException(file, "its no-data tag (GDAL_NODATA, TIFF tag 42113) holds \"" + text
                    + "\", which is not a number", "set it again, e.g. gdal_edit.py -a_nodata -9999 " + file.getFileName());
        }
    }
}
