package org.thermotile.model.hotspot;

/**
 * Contiguous runs of equal, non-zero class codes on a raster: 4-connected components (cells that
 * share an edge; cells touching only at a corner are separate clusters, so each cluster is one
 * polygon, holes allowed).
 *
 * <p>Clusters are numbered 0, 1, 2, … in the row-major order of their first cell, so the
 * numbering is deterministic. {@link #cells(int)} lists a cluster's cells in row-major order.
 */
public final class Clusters {
    /** Label of a cell in no cluster (class 0 or no data). */
    public static final int NONE = -1;

    private final int width;
    private final int[] label;
    private final int count;
    private final int[] start;     // cluster k's cells are order[start[k] .. start[k+1])
    private final int[] order;

    private Clusters(int width, int[] label, int count, int[] start, int[] order) {
        this.width = width;
        this.label = label;
        this.count = count;
        this.start = start;
        this.order = order;
    }

    /**
     * Labels the clusters of {@code codes}.
     *
     * @param codes  row-major class codes; 0 and {@code noData} belong to no cluster
     * @param noData the no-data code
     */
    public static Clusters label(int[] codes, int width, int height, int noData) {
        if (codes.length != width * height) {
            throw new IllegalArgumentException(codes.length + " codes for a " + width + " × " + height + " raster");
        }
        int n = codes.length;
        int[] label = new int[n];
        java.util.Arrays.fill(label, NONE);
        int[] queue = new int[n];
        int count = 0;
        for (int seed = 0; seed < n; seed++) {
            int code = codes[seed];
            if (code == 0 || code == noData || label[seed] != NONE) {
                continue;
            }
            int head = 0, tail = 0;
            queue[tail++] = seed;
            label[seed] = count;
            while (head < tail) {
                int i = queue[head++];
                int r = i / width, c = i % width;
                if (c > 0) {
                    tail = visit(codes, label, queue, tail, i - 1, code, count);
                }
                if (c < width - 1) {
                    tail = visit(codes, label, queue, tail, i + 1, code, count);
                }
                if (r > 0) {
                    tail = visit(codes, label, queue, tail, i - width, code, count);
                }
                if (r < height - 1) {
                    tail = visit(codes, label, queue, tail, i + width, code, count);
                }
            }
            count++;
        }
        int[] start = new int[count + 1];
        for (int l : label) {
            if (l != NONE) {
                start[l + 1]++;
            }
        }
        for (int k = 0; k < count; k++) {
            start[k + 1] += start[k];
        }
        int[] fill = java.util.Arrays.copyOf(start, count);
        int[] order = new int[start[count]];
        for (int i = 0; i < n; i++) {
            if (label[i] != NONE) {
                order[fill[label[i]]++] = i;
            }
        }
        return new Clusters(width, label, count, start, order);
    }

    private static int visit(int[] codes, int[] label, int[] queue, int tail, int j, int code, int id) {
        if (label[j] == NONE && codes[j] == code) {
            label[j] = id;
            queue[tail++] = j;
        }
        return tail;
    }

    /** Number of clusters. */
    public int count() {
        return count;
    }

    /** The cluster of cell {@code i} (row-major), or {@link #NONE}. */
    public int labelOf(int i) {
        return label[i];
    }

    /** Number of cells of cluster {@code k}. */
    public int size(int k) {
        return start[k + 1] - start[k];
    }

    /** The row-major cell indices of cluster {@code k}, ascending (a new array). */
    public int[] cells(int k) {
        return java.util.Arrays.copyOfRange(order, start[k], start[k + 1]);
    }

    /** Raster width the labels refer to. */
    public int width() {
        return width;
    }
}
