package org.thermotile.jobs.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;

/** The launcher script and the build must give Spark the same JVM module openings. */
class LauncherTest {
    @Test
    void launcherOpensMatchThePomProperty() throws Exception {
        Path root = Path.of("..").toAbsolutePath().normalize();
        String pom = Files.readString(root.resolve("pom.xml"));
        Matcher m = Pattern.compile("<spark.jvm.opens>(.*?)</spark.jvm.opens>", Pattern.DOTALL).matcher(pom);
        m.find();
        String launcher = Files.readString(root.resolve("thermotile"));
        Matcher l = Pattern.compile("opens=\"(.*?)\"").matcher(launcher);
        l.find();
        assertEquals(m.group(1).trim(), l.group(1).trim());
    }
}
