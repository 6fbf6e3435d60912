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

    /** "java.util.zip.DataFormatException: " as wrappers put it before a cause's message. */
    private static final java.util.regex.Pattern CLASS_PREFIX =
            java.util.regex.Pattern.compile("(?:[a-z_][\\w]*\\.)+[A-Z]\\w*(?:Exception|Error): ");

    /**
     * @param file    the file concerned
     * @param problem what is wrong, in plain words
     * @param fix     what the user can do about it
     * @param cause   the underlying exception, or {@code null}
     */
    public RasterFileException(Path file, String problem, String fix, Throwable cause) {
        super(file + ": " + stripPeriod(problem) + (fix == null || fix.isEmpty() ? "" : ". Fix: " + fix), cause);
        this.file = file.toString();
    }

    /**
     * The messages along a cause chain, without repeats or class names: what a user can read of a
     * library exception ("Cannot render an image: invalid block type").
     */
    static String describe(Throwable e) {
        StringBuilder b = new StringBuilder();
        for (Throwable t = e; t != null; t = t.getCause()) {
            String m = t.getMessage();
            if (m == null || m.isBlank()) {
                m = t.getClass().getSimpleName();
            }
            m = stripPeriod(CLASS_PREFIX.matcher(m.strip()).replaceAll(""));
            if (b.indexOf(m) < 0) {
                if (b.length() > 0) {
                    b.append(": ");
                }
                b.append(m);
            }
            if (t.getCause() == t) {
                break;
            }
        }
        return b.toString();
    }

    private static String stripPeriod(String s) {
        return s.endsWith(".") ? s.substring(0, s.length() - 1) : s;
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
