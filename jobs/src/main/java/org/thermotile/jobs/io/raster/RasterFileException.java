package org.thermotile.jobs.io.raster;

import java.nio.file.Path;

/**
 * A raster file that cannot be read or written as asked: missing, not a TIFF, truncated, without
 * a coordinate reference system, rotated, of the wrong shape. The message names the file, the
 * problem and the fix; the underlying library exception, if any, is kept as the cause.
 */
public final class RasterFileException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    private final String file;

    /**
     * @param file    the file concerned
     * @param problem what is wrong, in plain words
     * @param fix     what the user can do about it
     * @param cause   the underlying exception, or {@code null}
     */
    public RasterFileException(Path file, String problem, String fix, Throwable cause) {
        super(file + ": " + problem + (fix == null || fix.isEmpty() ? "" : ". Fix: " + fix), cause);
        this.file = file.toString();
    }

    /** @param file the file concerned; @param problem what is wrong; @param fix what to do */
    public RasterFileException(Path file, String problem, String fix) {
        this(file, problem, fix, null);
    }

    /** The file the message is about, as given by the caller. */
    public String file() {
        return file;
    }
}
