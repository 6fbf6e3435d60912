package org.thermotile.jobs.cli;

import java.io.PrintWriter;
import org.thermotile.jobs.errors.UserInputException;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/** The {@code thermotile} command line. */
@Command(name = "thermotile", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = {"Urban surface temperatures, cell by cell and hour by hour.", "",
                "Surface temperature is not air temperature nor a heat-health index; results are "
                        + "estimates for comparing options. Defer to local building codes and "
                        + "licensed professionals for roofing, structural and health decisions."},
        subcommands = {RunCommand.class, CheckCommand.class, DemoCommand.class, PointCommand.class,
                CompareCommand.class, ObserveCommand.class, HotspotsCommand.class, ReportCommand.class, RateCommand.class, MaterialsCommand.class,
                CommandLine.HelpCommand.class},
        exitCodeListHeading = "%nExit codes:%n",
        exitCodeList = {"0:done", "1:the run failed (see the message)",
                "2:bad input or usage, the output folder in use by another command, a full, read-only or "
                        + "vanished output disk, an unreadable input, out of memory (the message names the "
                        + "file, place and fix)",
                "130:stopped by SIGINT (Ctrl-C); nothing published, see the message for what was kept",
                "143:stopped by SIGTERM; as 130"})
public final class Main {
    /** Exit status for bad input or usage. */
    public static final int BAD_INPUT = 2;

    /** Kept strongly reachable so the level set on it holds (JUL keeps loggers weakly). */
    private static final java.util.logging.Logger SIS_LOG = java.util.logging.Logger.getLogger("org.apache.sis");

    public static void main(String[] args) {
        // Apache SIS warns once per JVM that its optional EPSG data folder is not configured;
        // thermotile does not use it (UTM zones are built in), so the warning is noise here.
        SIS_LOG.setLevel(java.util.logging.Level.SEVERE);
        onStopSignals();
        System.exit(execute(args));
    }

    /** Exit status of a run stopped by SIGINT (128 + 2, the shells' convention). */
    public static final int STOPPED_INT = 130;

    /** Exit status of a run stopped by SIGTERM (128 + 15). */
    public static final int STOPPED_TERM = 143;

    /**
     * SIGINT and SIGTERM exit through {@link System#exit} with 128 + the signal's number, as the
     * JVM itself would, after noting which signal it was: the shutdown hook of a running job
     * ({@code CityJob}) then cancels it, cleans up and names the signal.
     */
    @SuppressWarnings("removal")
    private static void onStopSignals() {
        for (String name : new String[] {"INT", "TERM"}) {
            try {
                sun.misc.Signal.handle(new sun.misc.Signal(name), sig -> {
                    org.thermotile.jobs.city.CityJob.stoppedBy("SIG" + sig.getName());
                    new Thread(() -> System.exit(128 + sig.getNumber()), "thermotile-exit").start();
                });
            } catch (IllegalArgumentException | UnsupportedOperationException | LinkageError e) {
                // the platform does not offer this signal (or the JVM was started with -Xrs): default handling
            }
        }
    }

    /** Runs the command line and returns the exit status (for tests). */
    public static int execute(String... args) {
        return newCommandLine().execute(args);
    }

    /** Runs {@code args} on a command line whose streams a test has set; returns the exit status. */
    public static int executeWith(CommandLine cl, String... args) {
        installHandler(cl);
        return cl.execute(args);
    }

    static CommandLine newCommandLine() {
        CommandLine cl = new CommandLine(new Main());
        installHandler(cl);
        return cl;
    }

    private static void installHandler(CommandLine cl) {
        cl.setExecutionExceptionHandler((ex, cmd, parsed) -> {
            PrintWriter err = cmd.getErr();
            if (org.thermotile.jobs.city.CityJob.isStopping()) {
                return 1;              // a stop: the stop handler reports it and the JVM exits with 130 or 143
            }
            if (isUserError(ex)) {
                err.println("thermotile " + cmd.getCommandName() + ": " + ex.getMessage());
                err.flush();
                return BAD_INPUT;
            }
            err.println("thermotile " + cmd.getCommandName() + " failed: " + ex);
            if (System.getenv("THERMOTILE_DEBUG") != null) {
                ex.printStackTrace(err);
            } else {
                err.println("(set THERMOTILE_DEBUG=1 for the stack trace)");
            }
            err.flush();
            return 1;
        });
    }

    static boolean isUserError(Throwable ex) {
        return ex instanceof UserInputException || ex instanceof IllegalArgumentException
                || ex instanceof org.thermotile.jobs.config.ConfigException
                || ex instanceof org.thermotile.jobs.io.raster.RasterFileException
                || ex instanceof java.io.FileNotFoundException
                || ex instanceof java.nio.file.NoSuchFileException;
    }

    /** Version from the jar manifest, or "development". */
    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            String v = Main.class.getPackage().getImplementationVersion();
            return new String[] {"thermotile " + (v == null ? "0.1.0-SNAPSHOT" : v)};
        }
    }
}
