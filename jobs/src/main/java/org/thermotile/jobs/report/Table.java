package org.thermotile.jobs.report;

import java.io.BufferedReader;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.apache.parquet.column.page.PageReadStore;
import org.apache.parquet.example.data.Group;
import org.apache.parquet.example.data.simple.convert.GroupRecordConverter;
import org.apache.parquet.hadoop.ParquetFileReader;
import org.apache.parquet.io.ColumnIOFactory;
import org.apache.parquet.io.LocalInputFile;
import org.apache.parquet.io.MessageColumnIO;
import org.apache.parquet.io.RecordReader;
import org.apache.parquet.schema.MessageType;
import org.apache.parquet.schema.PrimitiveType;
import org.apache.parquet.schema.Type;
import org.thermotile.jobs.storage.TableColumns;

/**
 * A small table read whole into memory: column names and rows of boxed values (String, Integer,
 * Long, Double, Float, Boolean or null). For the report's summary tables (tens of thousands of
 * rows at most), read straight from Parquet part files with parquet-hadoop (no Spark session) or
 * from CSV.
 */
public final class Table {
    private final List<String> columns;
    private final List<Object[]> rows;

    Table(List<String> columns, List<Object[]> rows) {
        this.columns = List.copyOf(columns);
        this.rows = rows;
    }

    /** Column names in file order. */
    public List<String> columns() {
        return columns;
    }

    /** Rows in file order (part files in name order). */
    public List<Object[]> rows() {
        return rows;
    }

    /** Index of a column, or −1. */
    public int indexOf(String column) {
        return columns.indexOf(column);
    }

    /**
     * Index of a required column.
     *
     * @throws ReportException naming {@code source} and the columns that exist, or, when the table
     *         has the column's name from before column names carried units, saying so and to run again
     */
    public int require(String column, Path source) {
        int i = columns.indexOf(column);
        String older = i < 0 ? TableColumns.olderLayout(source, column, columns) : null;
        if (older != null) {
            throw new ReportException(older);
        }
        if (i < 0) {
            throw new ReportException(source + ": column '" + column + "' is missing (columns: "
                    + String.join(", ", columns) + "). Fix: write the table again with thermotile run");
        }
        return i;
    }

    /** A numeric cell as double (NaN when null). */
    public static double number(Object v) {
        return v instanceof Number n ? n.doubleValue() : Double.NaN;
    }

    /**
     * Reads a Parquet table: a folder of part files (Spark's layout; files starting with '_' or
     * '.' are skipped) or a single {@code .parquet} file. All parts must share one schema.
     *
     * @throws ReportException naming the file when it cannot be read
     */
    public static Table readParquet(Path location) {
        List<Path> parts;
        if (Files.isDirectory(location)) {
            try (Stream<Path> s = Files.list(location)) {
                parts = s.filter(p -> {
                    String n = p.getFileName().toString();
                    return n.endsWith(".parquet") && !n.startsWith("_") && !n.startsWith(".");
                }).sorted().toList();
            } catch (IOException e) {
                throw new ReportException(location + ": cannot list the folder (" + e.getMessage() + ")", e);
            }
            if (parts.isEmpty()) {
                throw new ReportException(location + ": holds no .parquet part files. Fix: run the job again "
                        + "(thermotile run) to write the table");
            }
        } else {
            parts = List.of(location);
        }
        List<String> columns = null;
        List<Object[]> rows = new ArrayList<>();
        for (Path part : parts) {
            try (ParquetFileReader reader = ParquetFileReader.open(new LocalInputFile(part))) {
                MessageType schema = reader.getFooter().getFileMetaData().getSchema();
                List<String> names = schema.getFields().stream().map(Type::getName).toList();
                if (columns == null) {
                    columns = names;
                } else if (!columns.equals(names)) {
                    throw new ReportException(part + ": its columns " + names + " differ from the other parts' "
                            + columns + ". Fix: write the table again");
                }
                MessageColumnIO io = new ColumnIOFactory().getColumnIO(schema);
                PageReadStore pages;
                while ((pages = reader.readNextRowGroup()) != null) {
                    RecordReader<Group> rr = io.getRecordReader(pages, new GroupRecordConverter(schema));
                    for (long r = 0, n = pages.getRowCount(); r < n; r++) {
                        rows.add(values(rr.read(), schema));
                    }
                }
            } catch (IOException | RuntimeException e) {
                if (e instanceof ReportException re) {
                    throw re;
                }
                throw new ReportException(part + ": cannot be read as Parquet (" + e + "). Fix: run the job "
                        + "again; the file may be damaged or cut short", e);
            }
        }
        return new Table(columns, rows);
    }

    private static Object[] values(Group g, MessageType schema) {
        int n = schema.getFieldCount();
        Object[] row = new Object[n];
        for (int i = 0; i < n; i++) {
            Type t = schema.getType(i);
            if (!t.isPrimitive() || g.getFieldRepetitionCount(i) == 0) {
                continue;
            }
            PrimitiveType.PrimitiveTypeName p = t.asPrimitiveType().getPrimitiveTypeName();
            row[i] = switch (p) {
                case INT32 -> g.getInteger(i, 0);
                case INT64 -> g.getLong(i, 0);
                case DOUBLE -> g.getDouble(i, 0);
                case FLOAT -> g.getFloat(i, 0);
                case BOOLEAN -> g.getBoolean(i, 0);
                case BINARY, FIXED_LEN_BYTE_ARRAY -> g.getString(i, 0);
                default -> g.getValueToString(i, 0);
            };
        }
        return row;
    }

    /**
     * Reads a CSV table with a header line: plain comma-separated values without quoting; cells
     * that parse as numbers become Double, empty cells null, others String.
     */
    public static Table readCsv(Path file) {
        List<String> columns = null;
        List<Object[]> rows = new ArrayList<>();
        try (BufferedReader in = Files.newBufferedReader(file)) {
            String line;
            int lineNo = 0;
            while ((line = in.readLine()) != null) {
                lineNo++;
                if (line.isBlank() || line.startsWith("#")) {
                    continue;
                }
                String[] cells = line.split(",", -1);
                if (columns == null) {
                    columns = new ArrayList<>();
                    for (String c : cells) {
                        columns.add(c.trim());
                    }
                    continue;
                }
                if (cells.length != columns.size()) {
                    throw new ReportException(file + ", line " + lineNo + ": " + cells.length + " cells where the "
                            + "header has " + columns.size() + ". Fix: give one value per column");
                }
                Object[] row = new Object[cells.length];
                for (int i = 0; i < cells.length; i++) {
                    String c = cells[i].trim();
                    if (c.isEmpty()) {
                        continue;
                    }
                    try {
                        row[i] = Double.parseDouble(c);
                    } catch (NumberFormatException e) {
                        row[i] = c;
                    }
                }
                rows.add(row);
            }
        } catch (IOException e) {
            throw new ReportException(file + ": cannot be read (" + e.getMessage() + ")", e);
        }
        if (columns == null) {
            throw new ReportException(file + ": is empty. Fix: write a header line and the rows");
        }
        return new Table(columns, rows);
    }
}
