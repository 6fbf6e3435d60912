package org.thermotile.jobs.cluster;

import java.io.File;
import java.io.IOException;
import java.lang.management.ManagementFactory;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import java.util.jar.Attributes;
import java.util.jar.JarEntry;
import java.util.jar.JarInputStream;
import java.util.jar.JarOutputStream;
import java.util.jar.Manifest;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.thermotile.jobs.city.CityJob;
import org.thermotile.model.tile.TileSimulation;

/**
 * A real Spark standalone cluster on 127.0.0.1, started from the project's own class path: one
 * Master and {@code n} Workers, each a separate JVM ({@code java -cp … org.apache.spark.deploy.…}),
 * with free ports, logs under {@code dir/logs}. Executors are launched by the Workers from
 * {@code SPARK_HOME/jars}, a folder of links to the third-party runtime jars (Spark, Hadoop,
 * Apache SIS, …); thermotile's own classes reach them only through the application jar, as they
 * would on a cluster where Spark is installed and thermotile is submitted. {@link #close} stops
 * every process it started, by PID, executors first.
 */
final class StandaloneCluster implements AutoCloseable {
    static final String LOCALHOST = "127.0.0.1";

    /** Test-only jars kept off the cluster's class path. */
    private static final Pattern TEST_ONLY = Pattern.compile(
            "(junit-|opentest4j|apiguardian|duckdb_jdbc|hadoop-client-minicluster|surefire|thermotile-).*");

    final Path dir;
    final Path sparkHome;
    final Path logs;
    final int masterPort;
    final int masterUiPort;
    final String masterUrl;
    final List<Path> jars;
    private final List<Process> started = new ArrayList<>();
    private final List<Process> workers = new ArrayList<>();
    private final List<Path> workDirs = new ArrayList<>();

    private StandaloneCluster(Path dir) throws IOException {
        this.dir = dir;
        this.logs = Files.createDirectories(dir.resolve("logs"));
        this.jars = runtimeJars();
        this.sparkHome = sparkHome(dir.resolve("spark-home"), jars);
        this.masterPort = freePort();
        this.masterUiPort = freePort();
        this.masterUrl = "spark://" + LOCALHOST + ":" + masterPort;
    }

    /** Starts a Master and {@code workers} Workers of {@code coresEach} cores and {@code memoryEach} ("2g"). */
    static StandaloneCluster start(Path dir, int workers, int coresEach, String memoryEach) throws Exception {
        StandaloneCluster c = new StandaloneCluster(dir);
        try {
            c.launch("master", List.of("org.apache.spark.deploy.master.Master", "--host", LOCALHOST,
                    "--port", Integer.toString(c.masterPort), "--webui-port", Integer.toString(c.masterUiPort)));
            c.awaitMaster(Duration.ofSeconds(60));
            for (int i = 1; i <= workers; i++) {
                Path work = Files.createDirectories(dir.resolve("work" + i));
                c.workDirs.add(work);
                c.workers.add(c.launch("worker" + i, List.of("org.apache.spark.deploy.worker.Worker",
                        "--host", LOCALHOST, "--webui-port", Integer.toString(freePort()),
                        "--cores", Integer.toString(coresEach), "--memory", memoryEach,
                        "--work-dir", work.toString(), c.masterUrl)));
            }
            c.awaitWorkers(workers, Duration.ofSeconds(60));
            return c;
        } catch (Exception | Error e) {
            c.close();
            throw e;
        }
    }

    /** The test JVM's module openings (Surefire's argLine, i.e. the pom's spark.jvm.opens). */
    static List<String> jvmOpens() {
        return ManagementFactory.getRuntimeMXBean().getInputArguments().stream()
                .filter(a -> a.startsWith("--add-opens") || a.startsWith("-XX:+IgnoreUnrecognizedVMOptions")
                        || a.startsWith("-Djdk.reflect.useDirectMethodHandle") || a.startsWith("-Dio.netty."))
                .toList();
    }

    /** Jars of the test class path without thermotile's own classes and the test-only libraries. */
    static List<Path> runtimeJars() {
        String cp = System.getProperty("surefire.test.class.path", System.getProperty("java.class.path"));
        List<Path> out = new ArrayList<>();
        for (String e : cp.split(File.pathSeparator)) {
            Path p = Path.of(e);
            String n = p.getFileName() == null ? "" : p.getFileName().toString();
            if (n.endsWith(".jar") && Files.isRegularFile(p) && !TEST_ONLY.matcher(n).matches()) {
                out.add(p.toAbsolutePath());
            }
        }
        return out;
    }

    static String classPath(List<Path> jars) {
        return String.join(File.pathSeparator, jars.stream().map(Path::toString).toList());
    }

    /** SPARK_HOME whose jars/ links every runtime jar: what a Worker needs to launch executors. */
    static Path sparkHome(Path home, List<Path> jars) throws IOException {
        Path j = Files.createDirectories(home.resolve("jars"));
        for (Path jar : jars) {
            Path link = j.resolve(jar.getFileName());
            if (!Files.exists(link)) {
                Files.createSymbolicLink(link, jar);
            }
        }
        Files.createDirectories(home.resolve("conf"));
        return home;
    }

    /**
     * The application jar for spark-submit: thermotile's model and jobs classes (and resources)
     * from wherever the test class path has them (folders or jars), Main-Class set.
     */
    static Path applicationJar(Path file) throws IOException {
        Manifest mf = new Manifest();
        mf.getMainAttributes().put(Attributes.Name.MANIFEST_VERSION, "1.0");
        mf.getMainAttributes().put(Attributes.Name.MAIN_CLASS, "org.thermotile.jobs.cli.Main");
        java.util.Set<String> seen = new java.util.HashSet<>();
        try (JarOutputStream out = new JarOutputStream(Files.newOutputStream(file), mf)) {
            for (Class<?> c : List.of(CityJob.class, TileSimulation.class)) {
                Path src;
                try {
                    src = Path.of(c.getProtectionDomain().getCodeSource().getLocation().toURI());
                } catch (java.net.URISyntaxException e) {
                    throw new IOException(e);
                }
                if (Files.isDirectory(src)) {
                    try (Stream<Path> s = Files.walk(src)) {
                        for (Path f : s.filter(Files::isRegularFile).sorted().toList()) {
                            String name = src.relativize(f).toString().replace(File.separatorChar, '/');
                            if (seen.add(name)) {
                                out.putNextEntry(new JarEntry(name));
                                Files.copy(f, out);
                                out.closeEntry();
                            }
                        }
                    }
                } else {
                    try (JarInputStream in = new JarInputStream(Files.newInputStream(src))) {
                        for (JarEntry e; (e = in.getNextJarEntry()) != null; ) {
                            if (!e.isDirectory() && !e.getName().startsWith("META-INF/") && seen.add(e.getName())) {
                                out.putNextEntry(new JarEntry(e.getName()));
                                in.transferTo(out);
                                out.closeEntry();
                            }
                        }
                    }
                }
            }
        }
        return file;
    }

    /** A {@code java} command with the runtime class path and Spark's environment. */
    ProcessBuilder javaCommand(String heap, List<String> mainAndArgs) {
        List<String> cmd = new ArrayList<>();
        cmd.add(Path.of(System.getProperty("java.home"), "bin", "java").toString());
        cmd.add("-Xmx" + heap);
        cmd.addAll(jvmOpens());
        cmd.add("-cp");
        cmd.add(classPath(jars));
        cmd.addAll(mainAndArgs);
        ProcessBuilder pb = new ProcessBuilder(cmd);
        pb.environment().put("SPARK_HOME", sparkHome.toString());
        pb.environment().put("SPARK_SCALA_VERSION", "2.13");
        pb.environment().put("SPARK_LOCAL_IP", LOCALHOST);
        pb.environment().put("SPARK_CONF_DIR", sparkHome.resolve("conf").toString());
        pb.redirectErrorStream(true);
        return pb;
    }

    private Process launch(String name, List<String> mainAndArgs) throws IOException {
        ProcessBuilder pb = javaCommand("512m", mainAndArgs);
        pb.redirectOutput(logs.resolve(name + ".log").toFile());
        Process p = pb.start();
        started.add(p);
        return p;
    }

    /**
     * Runs {@code spark-submit} (org.apache.spark.deploy.SparkSubmit, client mode: the driver is
     * this child JVM with heap {@code driverHeap}) and waits for it; the log goes to {@code log}.
     */
    Process submit(Path appJar, String driverHeap, List<String> conf, List<String> appArgs, Path log)
            throws IOException {
        List<String> args = new ArrayList<>(List.of("org.apache.spark.deploy.SparkSubmit",
                "--master", masterUrl, "--deploy-mode", "client", "--class", "org.thermotile.jobs.cli.Main"));
        for (String c : conf) {
            args.add("--conf");
            args.add(c);
        }
        args.add(appJar.toString());
        args.addAll(appArgs);
        ProcessBuilder pb = javaCommand(driverHeap, args);
        pb.directory(Path.of("").toAbsolutePath().toFile());
        pb.redirectOutput(log.toFile());
        Process p = pb.start();
        started.add(p);
        return p;
    }

    /** Waits for {@code p} at most {@code timeout}; kills it (by PID) if it is still running. */
    static int await(Process p, Duration timeout, Path log) throws Exception {
        if (!p.waitFor(timeout.toMillis(), TimeUnit.MILLISECONDS)) {
            stop(p.toHandle());
            throw new AssertionError("no exit within " + timeout + "; log:\n" + tail(log, 60));
        }
        return p.exitValue();
    }

    /** The executor JVMs (CoarseGrainedExecutorBackend) the Workers have running now. */
    List<ProcessHandle> executors() {
        List<ProcessHandle> out = new ArrayList<>();
        for (Process w : workers) {
            w.toHandle().descendants().filter(h -> commandLine(h).contains("CoarseGrainedExecutorBackend"))
                    .forEach(out::add);
        }
        return out;
    }

    /** Executor stderr files of all Workers ({@code work-dir/app-…/ID/stderr}). */
    List<Path> executorLogs() throws IOException {
        List<Path> out = new ArrayList<>();
        for (Path w : workDirs) {
            try (Stream<Path> s = Files.walk(w, 3)) {
                s.filter(p -> p.getFileName().toString().equals("stderr")).forEach(out::add);
            }
        }
        return out;
    }

    /** The executor id written in a process's command line (--executor-id N). */
    static Optional<String> executorId(ProcessHandle h) {
        Matcher m = Pattern.compile("--executor-id (\\S+)").matcher(commandLine(h));
        return m.find() ? Optional.of(m.group(1)) : Optional.empty();
    }

    /** The full command line of a process, from /proc on Linux ({@code info()} may truncate). */
    static String commandLine(ProcessHandle h) {
        Path proc = Path.of("/proc", Long.toString(h.pid()), "cmdline");
        try {
            return new String(Files.readAllBytes(proc), StandardCharsets.UTF_8).replace('\0', ' ');
        } catch (IOException e) {
            return h.info().commandLine().orElse("");
        }
    }

    private void awaitMaster(Duration timeout) throws Exception {
        long end = System.nanoTime() + timeout.toNanos();
        while (System.nanoTime() < end) {
            if (masterState().isPresent()) {
                return;
            }
            checkAlive();
            Thread.sleep(250);
        }
        throw new AssertionError("the Spark master did not answer within " + timeout + ":\n"
                + tail(logs.resolve("master.log"), 40));
    }

    private void awaitWorkers(int n, Duration timeout) throws Exception {
        long end = System.nanoTime() + timeout.toNanos();
        while (System.nanoTime() < end) {
            Optional<JsonNode> s = masterState();
            if (s.isPresent() && s.get().path("aliveworkers").asInt() >= n) {
                return;
            }
            checkAlive();
            Thread.sleep(250);
        }
        throw new AssertionError(n + " workers did not register within " + timeout + ":\n"
                + tail(logs.resolve("worker1.log"), 40));
    }

    /** The master's state as its web UI's /json/ page reports it, if it answers. */
    Optional<JsonNode> masterState() {
        try {
            HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(2)).build();
            HttpResponse<String> r = http.send(HttpRequest.newBuilder(
                    URI.create("http://" + LOCALHOST + ":" + masterUiPort + "/json/"))
                    .timeout(Duration.ofSeconds(5)).build(), HttpResponse.BodyHandlers.ofString());
            return r.statusCode() == 200 ? Optional.of(new ObjectMapper().readTree(r.body())) : Optional.empty();
        } catch (IOException e) {
            return Optional.empty();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return Optional.empty();
        }
    }

    private void checkAlive() throws IOException {
        for (Process p : started) {
            if (!p.isAlive()) {
                throw new AssertionError("a cluster process exited with status " + p.exitValue()
                        + "; logs in " + logs);
            }
        }
    }

    /** Stops every process started here, by PID: descendants (executors) first, then the process. */
    @Override
    public void close() {
        List<Process> all = new ArrayList<>(started);
        java.util.Collections.reverse(all);            // submitter, workers, then the master
        for (Process p : all) {
            stop(p.toHandle());
        }
    }

    static void stop(ProcessHandle h) {
        List<ProcessHandle> children = h.descendants().toList();
        h.destroy();
        children.forEach(ProcessHandle::destroy);
        for (ProcessHandle x : concat(children, h)) {
            try {
                x.onExit().get(10, TimeUnit.SECONDS);
            } catch (Exception e) {
                x.destroyForcibly();
            }
        }
    }

    private static List<ProcessHandle> concat(List<ProcessHandle> a, ProcessHandle b) {
        List<ProcessHandle> l = new ArrayList<>(a);
        l.add(b);
        return l;
    }

    static int freePort() throws IOException {
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getByName(LOCALHOST))) {
            return s.getLocalPort();
        }
    }

    static String tail(Path file, int lines) {
        try {
            List<String> all = Files.readAllLines(file, StandardCharsets.UTF_8);
            return String.join("\n", all.subList(Math.max(0, all.size() - lines), all.size()));
        } catch (IOException e) {
            return "(no log at " + file + ")";
        }
    }
}
