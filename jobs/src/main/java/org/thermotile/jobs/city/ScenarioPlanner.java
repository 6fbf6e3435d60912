package org.thermotile.jobs.city;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.BitSet;
import java.util.List;
import java.util.Map;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.Scenario;
import org.thermotile.jobs.io.districts.Districts;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.materials.MaterialOverrides;
import org.thermotile.model.scenario.Adoption;
import org.thermotile.model.tile.TileSimulation;

/**
 * Resolves a run's scenarios on the driver: the changed materials, and for each change the
 * adoption cut that treats exactly the requested fraction of the candidate area (whole buildings
 * where a heights raster tells them apart), found by one streamed pass over the grid.
 */
public final class ScenarioPlanner {
    private ScenarioPlanner() {}

    /** Material whose cells are never roofs even when tall. */
    static final String TREES = "tree_canopy";

    /** What a scenario treats, for the comparison: cells per district (last entry: outside districts). */
    public record Treated(String scenario, long[][] cellsPerChangeAndDistrict, double[] costPerM2)
            implements java.io.Serializable {
        /** Treated cells of all changes in district {@code d} (the last index is "no district"). */
        public long cells(int d) {
            long n = 0;
            for (long[] c : cellsPerChangeAndDistrict) {
                n += c[d];
            }
            return n;
        }

        /** Cost in district {@code d} for cells of {@code cellAreaM2} (changes without a cost count 0). */
        public double cost(int d, double cellAreaM2) {
            double s = 0;
            for (int k = 0; k < costPerM2.length; k++) {
                if (!Double.isNaN(costPerM2[k])) {
                    s += cellsPerChangeAndDistrict[k][d] * cellAreaM2 * costPerM2[k];
                }
            }
            return s;
        }

        public boolean hasCost() {
            return Arrays.stream(costPerM2).anyMatch(c -> !Double.isNaN(c));
        }
    }

    /**
     * The variants (baseline first), what each scenario treats, and the per-cell adoption units
     * and roof flags the tile tasks need (null without scenarios).
     */
    public record Plan(List<ScenarioVariant> variants, List<Treated> treated, int[] units, BitSet roofs)
            implements java.io.Serializable {
    }

    public static Plan plan(PreparedRun p, List<Scenario> scenarios) {
        TileJobSpec spec = p.spec();
        List<ScenarioVariant> variants = new ArrayList<>();
        variants.add(new ScenarioVariant(Scenario.BASELINE, spec.palette(), new ScenarioVariant.Change[0]));
        List<Treated> treated = new ArrayList<>();
        if (scenarios.isEmpty()) {
            return new Plan(variants, treated, null, null);
        }
        boolean roofs = scenarios.stream().flatMap(s -> s.changes().stream()).anyMatch(c -> c.targets().roofsOnly());
        if (roofs && !spec.hasHeights()) {
            throw new UserInputException(p.run().source() + ": a scenario targets roofs only (roofs_only: true), "
                    + "which needs a heights raster or building footprints. Fix: give inputs.heights or "
                    + "inputs.buildings, or drop roofs_only");
        }
        GridScan scan = GridScan.of(p);
        for (Scenario sc : scenarios) {
            List<Material> palette = new ArrayList<>(Arrays.asList(spec.palette()));
            List<ScenarioVariant.Change> changes = new ArrayList<>();
            long[][] treatedCells = new long[sc.changes().size()][];
            double[] cost = new double[sc.changes().size()];
            for (int k = 0; k < sc.changes().size(); k++) {
                Scenario.Change ch = sc.changes().get(k);
                String where = p.run().source() + ", scenario '" + sc.name() + "' (" + sc.origin() + "), change " + (k + 1);
                boolean[] matTarget = new boolean[spec.palette().length];
                for (String id : ch.targets().materials()) {
                    MaterialLibrary.get(id, p.knownMaterials()); // an unknown id fails with suggestions
                    for (int i = 0; i < spec.palette().length; i++) {
                        if (spec.palette()[i].id().equals(id)) {
                            matTarget[i] = true;
                        }
                    }
                }
                BitSet codes = new BitSet();
                ch.targets().codes().forEach(codes::set);
                BitSet districts = null;
                if (!ch.targets().districts().isEmpty()) {
                    districts = new BitSet();
                    for (String d : ch.targets().districts()) {
                        int idx = p.districtNames().indexOf(d);
                        if (idx < 0) {
                            throw new UserInputException(where + ": district '" + d + "' does not exist. "
                                    + (p.districtNames().isEmpty() ? "The run has no districts (inputs.districts)."
                                    : "Available: " + String.join(", ", p.districtNames())));
                        }
                        districts.set(idx);
                    }
                }
                // The material each current palette entry becomes.
                int[] repl = new int[palette.size()];
                int current = palette.size();
                for (int i = 0; i < current; i++) {
                    Material m = palette.get(i);
                    Material n = ch.material() == null ? m : MaterialLibrary.get(ch.material(), p.knownMaterials());
                    if (!ch.set().isEmpty()) {
                        n = MaterialOverrides.apply(n, ch.set(), where);
                    }
                    repl[i] = palette.size();
                    palette.add(n);
                }
                ScenarioVariant.Change proto = new ScenarioVariant.Change(matTarget, codes, districts,
                        ch.targets().roofsOnly(), ch.seed(), 0, ch.adoption() >= 1.0, repl);
                long threshold = scan.threshold(proto, ch.adoption());
                ScenarioVariant.Change resolved = new ScenarioVariant.Change(matTarget, codes, districts,
                        ch.targets().roofsOnly(), ch.seed(), threshold, ch.adoption() >= 1.0, repl);
                treatedCells[k] = scan.treatedPerDistrict(resolved, p.districtNames().size());
                if (Arrays.stream(treatedCells[k]).sum() == 0 && ch.adoption() > 0) {
                    throw new UserInputException(where + ": no cell matches its targets " + describe(ch.targets())
                            + ". Fix: check the material ids, codes and districts (see 'thermotile check')");
                }
                cost[k] = ch.costPerM2();
                changes.add(resolved);
            }
            // Grow every replacement table to the final palette (later entries map to themselves).
            ScenarioVariant.Change[] fixed = new ScenarioVariant.Change[changes.size()];
            for (int k = 0; k < changes.size(); k++) {
                ScenarioVariant.Change c = changes.get(k);
                int[] r = Arrays.copyOf(c.replacement(), palette.size());
                for (int i = c.replacement().length; i < r.length; i++) {
                    r[i] = i;
                }
                fixed[k] = new ScenarioVariant.Change(c.materialTarget(), c.codeTarget(), c.districtTarget(),
                        c.roofsOnly(), c.seed(), c.threshold(), c.all(), r);
            }
            variants.add(new ScenarioVariant(sc.name(), palette.toArray(new Material[0]), fixed));
            treated.add(new Treated(sc.name(), treatedCells, cost));
        }
        int[] units = new int[scan.unit.length];
        BitSet roofFlags = new BitSet(scan.roof.length);
        for (int i = 0; i < units.length; i++) {
            units[i] = (int) scan.unit[i];
            if (scan.roof[i]) {
                roofFlags.set(i);
            }
        }
        return new Plan(variants, treated, units, roofFlags);
    }

    static String describe(Scenario.Targets t) {
        return "(materials " + t.materials() + ", codes " + t.codes() + ", districts " + t.districts()
                + (t.roofsOnly() ? ", roofs only" : "") + ")";
    }

    /**
     * The per-cell facts the candidate test needs, for the whole grid, gathered tile by tile:
     * baseline palette entry, code, district, roof flag and adoption unit (building or cell).
     * O(cells) memory on the driver.
     */
    static final class GridScan {
        final int[] base;
        final int[] code;
        final int[] district;
        final boolean[] roof;
        final long[] unit;

        private GridScan(int n) {
            base = new int[n];
            code = new int[n];
            district = new int[n];
            roof = new boolean[n];
            unit = new long[n];
        }

        static GridScan of(PreparedRun p) {
            TileJobSpec spec = p.spec();
            int w = p.grid().width();
            GridScan g = new GridScan(w * p.grid().height());
            Arrays.fill(g.district, -1);
            // On the driver: the local copies the run's checks read (URIs are staged once).
            Path localHeights = spec.heights() == null || spec.heightGrid() != null ? null
                    : RunPreparer.localPath(spec.heights(), "inputs.heights");
            try (GeoTiffReader lc = GeoTiffReader.openSingleBand(RunPreparer.localPath(spec.landCover(), "inputs.land_cover"))) {
                for (TileSpec t : p.tiles()) {
                    int[] codes = lc.readIntWindow(t.col0(), t.row0(), t.width(), t.height());
                    float[] h = !spec.hasHeights() ? null
                            : spec.heightsWindow(localHeights, t.col0(), t.row0(), t.width(), t.height());
                    int[] mapped = new int[codes.length];
                    for (int i = 0; i < codes.length; i++) {
                        int c = codes[i];
                        mapped[i] = c >= 0 && c < spec.codeToPalette().length ? spec.codeToPalette()[c] : -1;
                    }
                    spec.applyCellPalette(mapped, t.col0(), t.row0(), t.width());
                    int[] d = spec.districts().isEmpty() ? null
                            : Districts.assign(spec.districts(), p.grid(), t.col0(), t.row0(), t.width(), t.height());
                    for (int i = 0; i < codes.length; i++) {
                        int cell = (t.row0() + i / t.width()) * w + t.col0() + i % t.width();
                        int c = codes[i];
                        int b = mapped[i];
                        g.code[cell] = Math.max(0, c);
                        g.base[cell] = b;
                        g.district[cell] = d == null ? -1 : d[i];
                        g.roof[cell] = h != null && b >= 0 && h[i] >= Scenario.ROOF_MIN_HEIGHT_M
                                && !TREES.equals(spec.palette()[b].id());
                    }
                }
            }
            // Units: a cell is its own unit; roof cells join their building (4-connected roof cells),
            // named by the building's smallest cell index so that the name does not depend on tiles.
            int n = g.unit.length;
            int[] parent = new int[n];
            for (int i = 0; i < n; i++) {
                parent[i] = i;
            }
            int hgt = p.grid().height();
            for (int r = 0; r < hgt; r++) {
                for (int c = 0; c < w; c++) {
                    int i = r * w + c;
                    if (!g.roof[i]) {
                        continue;
                    }
                    if (c > 0 && g.roof[i - 1]) {
                        union(parent, i, i - 1);
                    }
                    if (r > 0 && g.roof[i - w]) {
                        union(parent, i, i - w);
                    }
                }
            }
            for (int i = 0; i < n; i++) {
                g.unit[i] = g.roof[i] ? find(parent, i) : i;
            }
            return g;
        }

        /** Union by smaller root, so every root is its component's smallest index. */
        static void union(int[] parent, int a, int b) {
            int ra = find(parent, a);
            int rb = find(parent, b);
            if (ra != rb) {
                parent[Math.max(ra, rb)] = Math.min(ra, rb);
            }
        }

        static int find(int[] parent, int i) {
            while (parent[i] != i) {
                parent[i] = parent[parent[i]];
                i = parent[i];
            }
            return i;
        }

        boolean candidate(ScenarioVariant.Change ch, int cell) {
            return base[cell] >= 0 && ch.candidate(base[cell], code[cell], district[cell], roof[cell]);
        }

        /**
         * The cut treating the units of smallest key until their area reaches {@code adoption} of
         * the candidate area (a unit is taken while that brings the total nearer the target).
         */
        long threshold(ScenarioVariant.Change ch, double adoption) {
            java.util.HashMap<Long, long[]> units = new java.util.HashMap<>();
            long total = 0;
            for (int cell = 0; cell < base.length; cell++) {
                if (candidate(ch, cell)) {
                    units.computeIfAbsent(unit[cell], u -> new long[] {Adoption.key(ch.seed(), u), 0})[1]++;
                    total++;
                }
            }
            if (adoption <= 0 || units.isEmpty()) {
                return 0;
            }
            long[][] sorted = units.values().toArray(new long[0][]);
            Arrays.sort(sorted, (a, b) -> Long.compareUnsigned(a[0], b[0]));
            double target = adoption * total;
            long sum = 0;
            for (long[] u : sorted) {
                if (Math.abs(sum + u[1] - target) > Math.abs(sum - target)) {
                    return u[0]; // this unit and all later ones stay untreated
                }
                sum += u[1];
            }
            return -1L; // all (unsigned maximum)
        }

        long[] treatedPerDistrict(ScenarioVariant.Change ch, int districts) {
            long[] out = new long[districts + 1];
            for (int cell = 0; cell < base.length; cell++) {
                if (candidate(ch, cell) && Adoption.treated(Adoption.key(ch.seed(), unit[cell]), ch.threshold(), ch.all())) {
                    out[district[cell] < 0 ? districts : district[cell]]++;
                }
            }
            return out;
        }
    }
}
