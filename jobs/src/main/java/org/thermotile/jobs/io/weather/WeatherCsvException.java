package org.thermotile.jobs.io.weather;

/**
 * Bad content in a weather file, or weather that does not fit a request. The message names the
 * file, the line and column where there is one, the offending value and the fix.
 *
 * <p>Message layout: {@code <file>, line <n>, column <name>: <problem>. Fix: <fix>}; the line
 * and column parts are left out when the problem has no single place (for example a coverage
 * error).
 */
public final class WeatherCsvException extends IllegalArgumentException {
    private static final long serialVersionUID = 1L;

    private final String source;
    private final int line;
    private final String column;

    /**
     * @param source  the file (or other source) the problem is in
     * @param line    1-based line number, or 0 when no single line is at fault
     * @param column  column name, or {@code null} when no single column is at fault
     * @param problem what is wrong, including the offending value
     * @param fix     what to do about it
     */
    public WeatherCsvException(String source, int line, String column, String problem, String fix) {
        super(place(source, line, column) + ": " + problem + ". Fix: " + fix);
        this.source = source;
        this.line = line;
        this.column = column;
    }

    private static String place(String source, int line, String column) {
        StringBuilder s = new StringBuilder(source);
        if (line > 0) {
            s.append(", line ").append(line);
        }
        if (column != null) {
            s.append(", column ").append(column);
        }
        return s.toString();
    }

    /** The file (or other source) the problem is in. */
    public String source() {
        return source;
    }

    /** 1-based line number of the problem, or 0 when no single line is at fault. */
    public int line() {
        return line;
    }

    /** Column name of the problem, or {@code null} when no single column is at fault. */
    public String column() {
        return column;
    }
}
