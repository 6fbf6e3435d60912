package org.thermotile.jobs.testing;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.File;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Assumptions;

/**
 * The one way tests use an installed program as an independent check (GDAL's clients, GDAL's Python
 * scripts, headless Chromium): find it on PATH, skip the test with a clear assumption message when it
 * is missing (fail it instead when the environment variable CI is set, where the CI script installs
 * it), run it with a timeout, and capture its standard output and standard error separately.
 */
public final class ExternalTool {
    private ExternalTool() {}

    /** Default time a run may take. */
    public static final Duration TIMEOUT = Duration.ofSeconds(90);

    /** What one run gave. */
    public record Result(List<String> command, int exitCode, String stdout, String stderr) {
        /** Standard output then standard error, as a terminal would show them. */
        public String all() {
            return stdout + stderr;
        }
    }

    /** The first of {@code names} found as an executable on PATH (or as an absolute path), if any. */
    public static Optional<Path> locate(String... names) {
        String path = System.getenv().getOrDefault("PATH", "");
        for (String name : names) {
            Path direct = Path.of(name);
            if (direct.isAbsolute()) {
                if (Files.isExecutable(direct)) {
                    return Optional.of(direct);
                }
                continue;
            }
            for (String d : path.split(File.pathSeparator)) {
                if (!d.isEmpty() && Files.isExecutable(Path.of(d, name))) {
                    return Optional.of(Path.of(d, name));
                }
            }
        }
        return Optional.empty();
    }

    /**
     * The program, or the calling test skipped (failed under CI) with a message naming it and how to
     * install it.
     *
     * @param install how to install it, e.g. "apt-get install gdal-bin"
     * @param names   the program's names, tried in order (e.g. "chromium", "chromium-browser")
     */
    public static Path require(String install, String... names) {
        Optional<Path> found = locate(names);
        present(found.isPresent(), String.join(" or ", names), install);
        return found.get();
    }

    /**
     * A script or data file a program runs (e.g. GDAL's COG validator, run with python3), or the
     * calling test skipped (failed under CI) like {@link #require}.
     */
    public static Path requireFile(String install, Path file) {
        present(Files.isRegularFile(file), file.toString(), install);
        return file;
    }

    private static void present(boolean present, String what, String install) {
        if (!present && System.getenv("CI") != null) {
            fail(what + " not found but CI is set: the CI script must install it (" + install + ")");
        }
        Assumptions.assumeTrue(present, what + " not installed (" + install + "); this check is skipped");
    }

    /**
     * Runs {@code command} in {@code workDir} (null: the current folder) with extra environment
     * variables, waiting at most {@code timeout}; the process is killed when it takes longer.
     *
     * @throws IOException when it cannot be started, or times out
     */
    public static Result run(List<String> command, Path workDir, Map<String, String> env, Duration timeout,
            String stdin) throws IOException {
        Path out = Files.createTempFile("tool-", ".out");
        Path err = Files.createTempFile("tool-", ".err");
        try {
            ProcessBuilder pb = new ProcessBuilder(new ArrayList<>(command)).redirectOutput(out.toFile())
                    .redirectError(err.toFile());
            if (workDir != null) {
                pb.directory(workDir.toFile());
            }
            pb.environment().putAll(env);
            if (stdin == null) {
                pb.redirectInput(ProcessBuilder.Redirect.from(new File("/dev/null")));
            }
            Process p = pb.start();
            if (stdin != null) {
                try (var in = p.getOutputStream()) {
                    in.write(stdin.getBytes(StandardCharsets.UTF_8));
                }
            }
            try {
                if (!p.waitFor(timeout.toMillis(), TimeUnit.MILLISECONDS)) {
                    p.destroyForcibly();
                    throw new IOException(String.join(" ", command) + " did not finish within " + timeout.toSeconds()
                            + " s");
                }
            } catch (InterruptedException e) {
                p.destroyForcibly();
                Thread.currentThread().interrupt();
                throw new IOException(e);
            }
            return new Result(List.copyOf(command), p.exitValue(), Files.readString(out, StandardCharsets.UTF_8),
                    Files.readString(err, StandardCharsets.UTF_8));
        } finally {
            Files.deleteIfExists(out);
            Files.deleteIfExists(err);
        }
    }

    /** {@link #run} in the current folder, no extra environment, {@link #TIMEOUT}, no input. */
    public static Result run(List<String> command) throws IOException {
        return run(command, null, Map.of(), TIMEOUT, null);
    }

    /**
     * Runs {@code command} and returns its standard output followed by its standard error.
     *
     * @throws IOException on a non-zero exit (with the output), a timeout, or when it cannot start
     */
    public static String output(List<String> command) throws IOException {
        return succeeded(run(command)).all();
    }

    /** {@code r} itself when it exited 0; otherwise an IOException with the command and its output. */
    public static Result succeeded(Result r) throws IOException {
        if (r.exitCode() != 0) {
            throw new IOException(String.join(" ", r.command()) + " exited " + r.exitCode() + ":\n" + r.all());
        }
        return r;
    }
}
