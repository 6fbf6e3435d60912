package org.thermotile.jobs.observe;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SaveMode;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;
import org.thermotile.jobs.storage.CanonicalParquet;
import org.thermotile.jobs.storage.Folders;
import org.thermotile.jobs.storage.OutputStore;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.observe.Calibration;

/**
 * Writes a {@link Calibration.Fit}: a calibrated materials file in the YAML format that
 * {@link org.thermotile.jobs.io.MaterialsFile} reads (one entry per calibrated material, with the
 * material's own id and {@code base}, so that it replaces the library entry when merged), and a CSV of
 * the parameters (start, fitted value, standard error from the curvature, identifiable or not) and
 * the sample's RMSE and bias before and after (also as {@code calibration.parquet}).
 *
 * <p>A parameter reported as not identifiable keeps its starting value in the materials file (a
 * comment says so): the data do not support moving it. Only materials of the built-in library can
 * be written as bases in this version. Each file is written to a temporary sibling and moved into
 * place, so a failure leaves no partial file. Numbers are printed with {@link Locale#ROOT}: the same
 * fit gives byte-identical files.
 */
public final class CalibrationFiles {
    private CalibrationFiles() {}

    /** Columns of the statistics CSV. */
    public static final List<String> CSV_COLUMNS = List.of("quantity", "material", "before", "after",
            "standard_error", "identifiable", "note");

    /**
     * Writes the calibrated materials YAML.
     *
     * @param fit    the fit
     * @param origin what the observations were, for the {@code source} of each property
     * @throws IllegalArgumentException when a calibrated material is not a library material
     */
    public static void writeMaterials(Path file, Calibration.Fit fit, String origin) {
        Map<Integer, StringBuilder> entries = new LinkedHashMap<>();
        for (Calibration.Estimate e : fit.estimates()) {
            int m = e.parameter().material();
            Material mat = fit.palette()[m];
            if (MaterialLibrary.find(mat.id()).isEmpty()) {
                throw new IllegalArgumentException("calibrated material '" + mat.id() + "' is not in the built-in "
                        + "library; this version writes calibrated values only for library materials");
            }
            StringBuilder b = entries.computeIfAbsent(m, k -> new StringBuilder()
                    .append("- id: ").append(mat.id()).append('\n')
                    .append("  base: ").append(mat.id()).append('\n'));
            String key = e.parameter().key();
            if (e.identifiable()) {
                b.append("  ").append(key).append(": ").append(num(e.value())).append('\n');
            } else {
                b.append("  # ").append(key).append(" kept at ").append(num(e.start())).append(": not identifiable, ")
                        .append(e.why()).append('\n');
            }
        }
        StringBuilder out = new StringBuilder("# Calibrated materials (thermotile observe --calibrate).\n"
                + "# Fitted against " + origin + "; standard errors in calibration.csv.\n");
        entries.forEach((m, b) -> {
            StringBuilder src = new StringBuilder();
            for (Calibration.Estimate e : fit.estimates()) {
                if (e.parameter().material() == m && e.identifiable()) {
                    src.append(src.length() == 0 ? "" : "; ").append(e.parameter().key()).append(' ')
                            .append(num(e.value())).append(" ± ").append(num(e.standardError()));
                }
            }
            out.append(b);
            if (src.length() > 0) {
                out.append("  source: \"calibrated against ").append(origin.replace("\"", "'")).append(": ")
                        .append(src).append(" (standard error from the Gauss-Newton curvature)\"\n");
            }
        });
        publish(file, out.toString());
    }

    /** Writes the statistics CSV (columns {@link #CSV_COLUMNS}). */
    public static void writeStatistics(Path file, Calibration.Fit fit) {
        StringBuilder b = new StringBuilder(String.join(",", CSV_COLUMNS)).append('\n');
        for (Calibration.Estimate e : fit.estimates()) {
            b.append(e.parameter().key()).append(',').append(fit.palette()[e.parameter().material()].id()).append(',')
                    .append(num(e.start())).append(',').append(num(e.value())).append(',')
                    .append(num(e.standardError())).append(',').append(e.identifiable()).append(',')
                    .append(quote(e.why())).append('\n');
        }
        String sample = Calibrate.samplingLabel() + ": " + fit.sample().length + " pixels, " + fit.residuals()
                + " residuals";
        b.append("rmse_k,,").append(num(fit.rmseBeforeK())).append(',').append(num(fit.rmseAfterK()))
                .append(",,,").append(quote(sample)).append('\n');
        b.append("bias_k,,").append(num(fit.biasBeforeK())).append(',').append(num(fit.biasAfterK()))
                .append(",,,").append(quote("simulated minus observed")).append('\n');
        publish(file, b.toString());
    }

    /** Schema of {@code calibration.parquet}: the CSV's columns, typed. */
    public static final StructType PARQUET_SCHEMA = new StructType()
            .add("quantity", DataTypes.StringType, false)
            .add("material", DataTypes.StringType, true)
            .add("before", DataTypes.DoubleType, false)
            .add("after", DataTypes.DoubleType, false)
            .add("standard_error", DataTypes.DoubleType, true)
            .add("identifiable", DataTypes.BooleanType, true)
            .add("note", DataTypes.StringType, true);

    /**
     * Writes the rows of the statistics CSV as a Parquet table (one part file, canonical name and
     * footer): staged beside {@code dir} and renamed into place, so a failure leaves none. A
     * standard error that is not finite (a parameter the data do not constrain) is stored as
     * +Infinity, as the CSV's {@code inf}.
     */
    public static void writeParquet(SparkSession spark, Path dir, Calibration.Fit fit) {
        List<Row> rows = new ArrayList<>();
        for (Calibration.Estimate e : fit.estimates()) {
            rows.add(RowFactory.create(e.parameter().key(), fit.palette()[e.parameter().material()].id(), e.start(),
                    e.value(), e.standardError(), e.identifiable(), e.why().isEmpty() ? null : e.why()));
        }
        rows.add(RowFactory.create("rmse_k", null, fit.rmseBeforeK(), fit.rmseAfterK(), null, null,
                Calibrate.samplingLabel() + ": " + fit.sample().length + " pixels, " + fit.residuals() + " residuals"));
        rows.add(RowFactory.create("bias_k", null, fit.biasBeforeK(), fit.biasAfterK(), null, null,
                "simulated minus observed"));
        Path tmp = dir.resolveSibling("." + dir.getFileName() + ".tmp");
        try {
            Folders.deleteQuietly(tmp);
            spark.createDataFrame(rows, PARQUET_SCHEMA).coalesce(1).write().mode(SaveMode.ErrorIfExists)
                    .parquet(OutputStore.sparkUri(tmp));
            CanonicalParquet.renameParts(tmp);
            if (Files.exists(dir)) {
                Folders.deleteTree(dir);
            }
            Files.move(tmp, dir);
        } catch (IOException e) {
            Folders.deleteQuietly(tmp);
            throw new java.io.UncheckedIOException("cannot write " + dir, e);
        } catch (RuntimeException e) {
            Folders.deleteQuietly(tmp);
            throw e;
        }
    }

    private static String num(double v) {
        return Double.isInfinite(v) ? "inf" : String.format(Locale.ROOT, "%.6g", v);
    }

    private static String quote(String s) {
        return s.isEmpty() ? "" : "\"" + s.replace("\"", "\"\"") + "\"";
    }

    private static void publish(Path file, String text) {
        Path tmp = file.resolveSibling(file.getFileName() + ".tmp");
        try {
            Files.writeString(tmp, text, StandardCharsets.UTF_8);
            Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            try {
                Files.deleteIfExists(tmp);
            } catch (IOException ignored) {
                // nothing more to clean
            }
            throw new java.io.UncheckedIOException("cannot write " + file, e);
        }
    }
}
