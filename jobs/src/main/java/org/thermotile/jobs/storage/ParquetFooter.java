package org.thermotile.jobs.storage;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.Comparator;
import org.apache.parquet.format.ColumnChunk;
import org.apache.parquet.format.Encoding;
import org.apache.parquet.format.FileMetaData;
import org.apache.parquet.format.RowGroup;
import org.apache.parquet.format.Util;

/**
 * Puts a Parquet file's footer in a canonical form, so that the same rows give the same bytes in
 * every JVM. parquet-mr 1.17 gathers each column chunk's encodings in a {@code HashSet} of enum
 * constants, whose order follows identity hash codes: two JVMs (an embedded run and a cluster's
 * executors, or two runs) list the same encodings in different orders. Sorting the list by the
 * encoding's number changes no meaning (the Parquet format calls it a set: "Set of all encodings
 * used for this column", parquet.thrift, ColumnMetaData field 2) and no length, so the rewrite
 * happens in place.
 */
final class ParquetFooter {
    private ParquetFooter() {}

    private static final byte[] MAGIC = "PAR1".getBytes(StandardCharsets.US_ASCII);

    /** Sorts every column chunk's encoding list of {@code file}'s footer in place. */
    static void canonicalise(Path file) {
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ, StandardOpenOption.WRITE)) {
            long size = ch.size();
            ByteBuffer tail = ByteBuffer.allocate(8).order(ByteOrder.LITTLE_ENDIAN);
            readFully(ch, tail, size - 8);
            int footerLength = tail.getInt(0);
            for (int i = 0; i < 4; i++) {
                if (tail.get(4 + i) != MAGIC[i]) {
                    throw new IOException(file + " does not end with the Parquet magic PAR1");
                }
            }
            long start = size - 8 - footerLength;
            ByteBuffer footer = ByteBuffer.allocate(footerLength);
            readFully(ch, footer, start);
            FileMetaData meta = Util.readFileMetaData(new ByteArrayInputStream(footer.array()));
            for (RowGroup g : meta.getRow_groups()) {
                for (ColumnChunk c : g.getColumns()) {
                    c.getMeta_data().getEncodings().sort(Comparator.comparingInt(Encoding::getValue));
                }
            }
            ByteArrayOutputStream out = new ByteArrayOutputStream(footerLength);
            Util.writeFileMetaData(meta, out);
            byte[] bytes = out.toByteArray();
            if (bytes.length != footerLength) {
                throw new IOException(file + ": the canonical footer has " + bytes.length
                        + " bytes where the original had " + footerLength);
            }
            ch.write(ByteBuffer.wrap(bytes), start);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot canonicalise the Parquet footer of " + file, e);
        }
    }

    private static void readFully(FileChannel ch, ByteBuffer b, long pos) throws IOException {
        while (b.hasRemaining()) {
            if (ch.read(b, pos + b.position()) < 0) {
                throw new IOException("unexpected end of file");
            }
        }
    }
}
