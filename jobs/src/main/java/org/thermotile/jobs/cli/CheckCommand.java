package org.thermotile.jobs.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.thermotile.jobs.city.PreparedRun;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.RunFileReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code thermotile check}: validates a run file and every input it names; writes nothing. */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = "Checks a run file and every input it names (rasters, class table, materials, "
                + "weather coverage) and prints what a run would do. Writes nothing.")
final class CheckCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "RUNFILE")
    Path runFile;

    @Override
    public Integer call() {
        RunFile run = RunFileReader.read(runFile);
        java.util.List<PreparedRun> periods = RunPreparer.prepareAll(run, false);
        PreparedRun p = periods.get(0);
        if (!run.observations().isEmpty()) {
            org.thermotile.jobs.observe.Observe.check(org.thermotile.jobs.observe.ObservationSet.of(run), p.grid());
        }
        PrintWriter out = spec.commandLine().getOut();
        out.printf(Locale.ROOT, "%s: ok%n", runFile);
        out.printf(Locale.ROOT, "  grid %d × %d cells of %.2f m, EPSG:%d, %d tiles of %d%n", p.grid().width(),
                p.grid().height(), p.grid().pixelWidth(), p.grid().epsg(), p.tiles().size(),
                run.tiling().tileSize());
        if (p.ingest() != null) {
            p.ingest().lines().forEach(l -> out.println("  " + l));
        }
        out.printf(Locale.ROOT, "  %d cells with a material; land-cover codes and cells: %s%n", p.activeCells(),
                p.codeCounts());
        out.printf(Locale.ROOT, "  materials: %s%n", String.join(", ", p.paletteLabels()));
        for (PreparedRun x : periods) {
            out.printf(Locale.ROOT, "  %s%d simulated hours (%d counted), %.3g cell-hours per variant%n",
                    x.period() == null ? "" : "period " + x.period() + ": ", x.spec().forcing().hours() - 1,
                    x.sampleEpochSeconds().length, (double) x.cellHours());
        }
        for (var t : p.plan().treated()) {
            long cells = 0;
            for (int d = 0; d <= p.districtNames().size(); d++) {
                cells += t.cells(d);
            }
            out.printf(Locale.ROOT, "  scenario %s: %d cells treated%s%n", t.scenario(), cells,
                    t.hasCost() ? String.format(Locale.ROOT, ", cost %.0f", java.util.stream.IntStream
                            .rangeClosed(0, p.districtNames().size())
                            .mapToDouble(d -> t.cost(d, p.grid().pixelAreaM2())).sum()) : "");
        }
        if (!run.observations().isEmpty()) {
            out.printf(Locale.ROOT, "  observations: %d images on the grid; hours kept for them and hourly_days: %d%n",
                    run.observations().size(), p.hourlyEpochSeconds().length);
        }
        periods.forEach(x -> x.notes().forEach(n -> out.println("  note: " + (x.period() == null ? "" : x.period() + ": ")
                + n)));
        out.flush();
        return 0;
    }
}
