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
                "2:bad input or usage (the message names the file, place and fix)"})
public final class Main {
    /** Exit status for bad input or usage. */
    public static final int BAD_INPUT = 2;

    /** Kept strongly reachable so the level set on it holds (JUL keeps loggers weakly). */
    private static final java.util.logging.Logger SIS_LOG = java.util.logging.Logger.getLogger("org.apache.sis");

    public static void main(String[] args) {
        // Apache SIS warns once per JVM that its optional EPSG data folder is not configured;
        // thermotile does not use it (UTM zones are built in), so the warning is noise here.
        SIS_LOG.setLevel(java.util.logging.Level.SEVERE);
        System.exit(execute(args));
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
