package org.thermotile.jobs.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.thermotile.jobs.report.RunReport;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code thermotile report}: (re)writes a finished run's report.html without simulating again. */
@Command(name = "report", mixinStandardHelpOptions = true,
        description = {"Writes report.html in a finished run folder: maps, curves, tables and the cautions, "
                + "one self-contained page that opens in any browser with no network.",
                "Reads only the run's files (manifest, maps, tables); nothing is simulated again. The map PNGs are "
                        + "written beside their GeoTIFFs (maps/peak.png, …)."})
final class ReportCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "RUN_DIR", description = "a folder written by 'thermotile run'")
    Path runDir;

    @Override
    public Integer call() {
        try (org.thermotile.jobs.storage.RunLock lock = FolderLock.hold(runDir, "report")) {
            return work();
        }
    }

    private Integer work() {
        RunReport.Result r = RunReport.build(runDir);
        org.thermotile.jobs.catalogue.StacItem.writeAll(runDir);   // the catalogue entry lists the report
        PrintWriter out = spec.commandLine().getOut();
        out.println("report: " + r.html());
        out.println("  sections: " + String.join(", ", r.sections()));
        out.println("  maps:     " + String.join(" ", r.maps().stream().map(m -> r.html().getParent()
                .relativize(m.png()).toString()).toList()));
        out.flush();
        return 0;
    }
}
