package org.thermotile.jobs.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.errors.UserInputException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

/** {@code thermotile demo}: the city job on the bundled demo city, Riverside Flats. */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = "Runs the bundled demo city (Riverside Flats, an invented riverside district) "
                + "on embedded Spark and prints where the outputs are.")
final class DemoCommand implements Callable<Integer> {
    @Option(names = "--out", paramLabel = "DIR", description = "output folder (default: runs/riverside-demo, replaced)")
    Path out;

    @Mixin
    SharedOptions.Quiet quiet = new SharedOptions.Quiet();

    @Override
    public Integer call() {
        Path runFile = home().resolve("data-samples/riverside/run.yaml");
        if (!Files.isRegularFile(runFile)) {
            throw new UserInputException(runFile + " not found. Fix: run the demo from a checkout of "
                    + "thermotile (the launcher sets thermotile.home)");
        }
        RunFile run = RunFileReader.read(runFile);
        Path dir = out != null ? out : Path.of("runs", "riverside-demo");
        RunCommand.execute(run, dir, null, 0, out == null, quiet.quiet, false, false, System.out);
        return 0;
    }

    static Path home() {
        String h = System.getProperty("thermotile.home");
        return h != null ? Path.of(h) : Path.of("").toAbsolutePath();
    }
}
