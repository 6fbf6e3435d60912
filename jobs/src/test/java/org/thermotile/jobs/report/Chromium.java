package org.thermotile.jobs.report;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Assumptions;
import org.thermotile.jobs.testing.ExternalTool;

/**
 * Headless Debian Chromium as an independent check of a page: loads it from file://, reports
 * console messages (from Chromium's own log on stderr), what an injected script saw after the
 * load event (images decoded, resource requests, load errors), and takes screenshots.
 */
final class Chromium {
    private Chromium() {}

    static final List<String> FLAGS = List.of("--headless", "--no-sandbox", "--disable-gpu",
            "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run",
            "--enable-logging=stderr", "--v=0");

    /**
     * Runs before the page's content-security policy (it is inserted right after {@code <head>}), so
     * the policy does not block it; writes its findings into {@code <html data-check="…">}.
     */
    static final String PROBE = """
            <script>
            (function () {
              var errors = 0;
              window.addEventListener('error', function () { errors++; }, true);
              window.addEventListener('load', function () {
                var imgs = document.images, undecoded = 0;
                for (var i = 0; i < imgs.length; i++) {
                  if (!(imgs[i].complete && imgs[i].naturalWidth > 0 && imgs[i].naturalHeight > 0)) undecoded++;
                }
                var requests = performance.getEntriesByType('resource')
                    .filter(function (r) { return r.name.indexOf('data:') !== 0; }).length;
                document.documentElement.setAttribute('data-check', 'images=' + imgs.length + ' undecoded=' + undecoded
                    + ' svgs=' + document.querySelectorAll('svg').length + ' requests=' + requests + ' errors=' + errors);
              });
            })();
            </script>
            """;

    /** What one page load showed. */
    record Load(int images, int undecoded, int svgs, int requests, int errors, List<String> console) {
    }

    /** The browser on PATH; skips the test when absent, fails it when absent and env CI is set. */
    static Path executable() {
        return ExternalTool.require("apt-get install -y chromium", "chromium", "chromium-browser");
    }

    static Optional<Path> find() {
        return ExternalTool.locate("chromium", "chromium-browser");
    }

    /** Loads a copy of {@code page} (the probe inserted) and returns what the probe and the console saw. */
    static Load load(Path page, Path work) throws IOException, InterruptedException {
        String html = Files.readString(page, StandardCharsets.UTF_8);
        int head = html.indexOf("<head>");
        if (head < 0) {
            fail(page + " has no <head>");
        }
        Path probed = page.resolveSibling(".probe-" + page.getFileName());
        Files.writeString(probed, html.substring(0, head + 6) + "\n" + PROBE + html.substring(head + 6));
        try {
            Run r = run(work, List.of("--dump-dom", probed.toUri().toString()));
            Matcher m = Pattern.compile("data-check=\"images=(\\d+) undecoded=(\\d+) svgs=(\\d+) requests=(\\d+) "
                    + "errors=(\\d+)\"").matcher(r.stdout());
            if (!m.find()) {
                fail("the probe did not report (page did not finish loading?); stderr:\n" + r.stderr());
            }
            return new Load(Integer.parseInt(m.group(1)), Integer.parseInt(m.group(2)), Integer.parseInt(m.group(3)),
                    Integer.parseInt(m.group(4)), Integer.parseInt(m.group(5)), consoleLines(r.stderr()));
        } finally {
            Files.deleteIfExists(probed);
        }
    }

    /** A screenshot of {@code page} in a {@code width × height} window, written to {@code png}. */
    static void screenshot(Path page, int width, int height, Path png, Path work) throws IOException, InterruptedException {
        run(work, List.of("--window-size=" + width + "," + height, "--hide-scrollbars", "--screenshot=" + png,
                page.toUri().toString()));
        if (!Files.isRegularFile(png)) {
            fail("chromium wrote no screenshot " + png);
        }
    }

    /** Console messages in Chromium's stderr log: lines "[…:INFO:CONSOLE:n] "text", source: …". */
    static List<String> consoleLines(String stderr) {
        List<String> out = new ArrayList<>();
        for (String line : stderr.split("\n")) {
            if (line.contains(":CONSOLE")) {
                out.add(line);
            }
        }
        return out;
    }

    record Run(String stdout, String stderr) {
    }

    private static Run run(Path work, List<String> args) throws IOException, InterruptedException {
        Path profile = Files.createTempDirectory(work, "chromium-profile-");
        List<String> cmd = new ArrayList<>();
        cmd.add(executable().toString());
        cmd.addAll(FLAGS);
        cmd.add("--user-data-dir=" + profile);
        cmd.addAll(args);
        ExternalTool.Result r;
        try {
            r = ExternalTool.run(cmd, work, java.util.Map.of(), java.time.Duration.ofSeconds(90), null);
        } catch (IOException e) {
            fail("chromium: " + e.getMessage());
            throw e;
        }
        return new Run(r.stdout(), r.stderr());
    }
}
