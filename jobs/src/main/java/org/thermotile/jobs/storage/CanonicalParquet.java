package org.thermotile.jobs.storage;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;

/**
 * Parquet tables as every thermotile job leaves them: part files with stable names and canonical
 * footers, whatever Spark's task numbering and whichever JVM wrote them.
 */
public final class CanonicalParquet {
    private CanonicalParquet() {}

    private static final Pattern PART = Pattern.compile("part-(\\d+)-.*?(\\.[a-z0-9]+)?\\.parquet");

    /**
     * part-00003-&lt;uuid&gt;-c000.snappy.parquet → part-00000.snappy.parquet, numbered in task
     * order within each folder (so a partition's names do not depend on which other partitions
     * the same job wrote), footer in canonical form ({@link ParquetFooter}); checksum files removed.
     * For a run on a Hadoop file system, the table Spark wrote there is first copied into the
     * staging folder ({@link OutputStore#pull}).
     */
    public static void renameParts(Path dir) {
        OutputStore.pull(dir);
        renameLocalParts(dir);
    }

    private static void renameLocalParts(Path dir) {
        try (Stream<Path> s = Files.list(dir)) {
            List<Path> parts = new ArrayList<>();
            for (Path f : s.sorted().toList()) {
                String n = f.getFileName().toString();
                if (Files.isDirectory(f)) {
                    renameLocalParts(f);
                } else if (n.endsWith(".crc")) {
                    Files.delete(f);
                } else if (PART.matcher(n).matches()) {
                    parts.add(f);
                }
            }
            parts.sort(java.util.Comparator.comparingInt(f -> {
                Matcher m = PART.matcher(f.getFileName().toString());
                m.matches();
                return Integer.parseInt(m.group(1));
            }));
            for (int i = 0; i < parts.size(); i++) {
                Matcher m = PART.matcher(parts.get(i).getFileName().toString());
                m.matches();
                String ext = m.group(2) == null ? "" : m.group(2);
                Path named = Files.move(parts.get(i), dir.resolve(String.format("part-%05d%s.parquet", i, ext)));
                ParquetFooter.canonicalise(named);
            }
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }
}
