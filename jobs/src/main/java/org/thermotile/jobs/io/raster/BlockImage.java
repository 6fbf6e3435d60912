package org.thermotile.jobs.io.raster;

import java.awt.Point;
import java.awt.image.BandedSampleModel;
import java.awt.image.ColorModel;
import java.awt.image.Raster;
import java.awt.image.SampleModel;
import java.awt.image.WritableRaster;
import org.apache.sis.image.PlanarImage;
import org.apache.sis.image.internal.shared.ColorModelFactory;

/**
 * A tiled image whose tiles are computed on request by a {@link Filler}, so a writer that pulls
 * tiles one at a time never needs the whole grid in memory. One bank per band
 * ({@link BandedSampleModel}), which SIS writes as TIFF planar configuration 2 (band-sequential).
 *
 * <p>The colour model is SIS's grey scale with band 0 visible: it is what makes the SIS 1.6
 * writer declare a multi-band image as grey plus extra samples instead of RGB. It comes from an
 * SIS-internal package (accessible on the class path); {@code GeoTiffWriterTest} checks the
 * photometric tag, so an SIS upgrade that moves it shows up as a test failure.
 */
final class BlockImage extends PlanarImage {

    /** Fills the part of a tile that lies inside the image. */
    @FunctionalInterface
    interface Filler {
        /**
         * @param tile the tile raster, whose own coordinates are image coordinates
         * @param col0 first column inside the image
         * @param row0 first row inside the image
         * @param w    columns inside the image
         * @param h    rows inside the image
         */
        void fill(WritableRaster tile, int col0, int row0, int w, int h);
    }

    private final int width, height, tileWidth, tileHeight;
    private final SampleModel sampleModel;
    private final ColorModel colorModel;
    private final Filler filler;

    BlockImage(int width, int height, int tileWidth, int tileHeight, int bands, int dataType,
            double displayMin, double displayMax, Filler filler) {
        this.width = width;
        this.height = height;
        this.tileWidth = tileWidth;
        this.tileHeight = tileHeight;
        this.sampleModel = new BandedSampleModel(dataType, tileWidth, tileHeight, bands);
        this.colorModel = ColorModelFactory.createGrayScale(dataType, bands, 0, displayMin, displayMax);
        this.filler = filler;
    }

    @Override public int getWidth() { return width; }
    @Override public int getHeight() { return height; }
    @Override public int getTileWidth() { return tileWidth; }
    @Override public int getTileHeight() { return tileHeight; }
    @Override public SampleModel getSampleModel() { return sampleModel; }
    @Override public ColorModel getColorModel() { return colorModel; }

    @Override
    public Raster getTile(int tileX, int tileY) {
        int x0 = tileX * tileWidth, y0 = tileY * tileHeight;
        WritableRaster tile = Raster.createWritableRaster(sampleModel, new Point(x0, y0));
        filler.fill(tile, x0, y0, Math.min(tileWidth, width - x0), Math.min(tileHeight, height - y0));
        return tile;
    }
}
