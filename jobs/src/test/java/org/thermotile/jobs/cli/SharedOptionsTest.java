package org.thermotile.jobs.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import java.util.function.Function;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/**
 * Options shared through mixins are parsed the same in every command, and the run-file-style names
 * ({@code --timestep-minutes} like {@code physics.timestep_minutes}, {@code --distance-m} like
 * {@code hotspots.distance_m}) set the same field as the older names, which keep working.
 */
class SharedOptionsTest {
    private static final String[] POINT = {"-m", "asphalt_aged", "--lat", "45", "--lon", "9"};

    private static PointCommand point(String... more) {
        PointCommand c = new PointCommand();
        String[] args = java.util.stream.Stream.concat(java.util.Arrays.stream(POINT), java.util.Arrays.stream(more))
                .toArray(String[]::new);
        new CommandLine(c).parseArgs(args);
        return c;
    }

    private static HotspotsCommand hotspots(String... more) {
        HotspotsCommand c = new HotspotsCommand();
        String[] args = java.util.stream.Stream.concat(java.util.stream.Stream.of("runs/x"), java.util.Arrays.stream(more))
                .toArray(String[]::new);
        new CommandLine(c).parseArgs(args);
        return c;
    }

    private static <T> void sameField(Function<String[], T> parse, Function<T, Object> field, String newName,
            String oldName, String value) {
        Object viaNew = field.apply(parse.apply(new String[] {newName, value}));
        Object viaOld = field.apply(parse.apply(new String[] {oldName, value}));
        assertEquals(viaOld, viaNew, newName + " and " + oldName);
        Object unset = field.apply(parse.apply(new String[0]));
        assertFalse(viaNew.equals(unset), newName + " " + value + " changes the value from its default " + unset);
    }

    @Test
    void pointNamesLikeTheRunFileAreAliasesOfTheOldNames() {
        Function<String[], PointCommand> p = SharedOptionsTest::point;
        sameField(p, c -> c.stepMinutes, "--timestep-minutes", "--step-minutes", "15");
        sameField(p, c -> c.fillGapsHours, "--fill-gaps-max-hours", "--fill-gaps", "3");
        sameField(p, c -> c.elevationM, "--elevation-m", "--elevation", "120");
        sameField(p, c -> c.deepGroundC, "--deep-ground-temp-c", "--deep-ground", "14");
        sameField(p, c -> c.thresholdC, "--threshold-c", "--threshold", "50");
        sameField(p, c -> c.tMinC, "--t-min-c", "--t-min", "18");
        sameField(p, c -> c.tMaxC, "--t-max-c", "--t-max", "35");
        sameField(p, c -> c.rhPct, "--rel-humidity-pct", "--rh", "60");
        sameField(p, c -> c.windMs, "--wind-ms", "--wind", "4");
    }

    @Test
    void hotspotNamesLikeTheRunFileAreAliasesOfTheOldNames() {
        Function<String[], HotspotsCommand> h = SharedOptionsTest::hotspots;
        sameField(h, c -> c.distanceM, "--distance-m", "--distance", "60");
        sameField(h, c -> c.cellSizeM, "--cell-size-m", "--cell-size", "20");
        sameField(h, c -> c.minExcessK, "--min-excess-k", "--min-excess", "2");
        sameField(h, c -> c.minAreaM2, "--min-area-m2", "--min-area", "800");
    }

    @Test
    void mixedInOptionsParseAlikeInEveryCommand() {
        RunCommand r = new RunCommand();
        new CommandLine(r).parseArgs("run.yaml", "--master", "spark://h:7077", "--threads", "3", "--replace", "--quiet");
        assertEquals("spark://h:7077", r.spark.master);
        assertEquals(3, r.spark.threads);
        assertTrue(r.replace.replace && r.quiet.quiet);
        HotspotsCommand h = hotspots("--master", "spark://h:7077", "--threads", "3", "--replace");
        assertEquals("spark://h:7077", h.sparkOptions.master);
        assertEquals(3, h.sparkOptions.threads);
        assertTrue(h.replace.replace);
        HotspotsCommand d = hotspots();
        assertNull(d.sparkOptions.master);
        assertEquals(0, d.sparkOptions.threads);
        assertFalse(d.replace.replace);
        DemoCommand demo = new DemoCommand();
        new CommandLine(demo).parseArgs("--quiet");
        assertTrue(demo.quiet.quiet);
        for (Object cmd : List.of(new MaterialsCommand(), new RateCommand(), new PointCommand())) {
            CommandLine cl = new CommandLine(cmd);
            assertTrue(cl.getCommandSpec().findOption("--materials-file") != null, cmd.getClass().getSimpleName());
        }
        PointCommand p = point("--materials-file", "mine.yaml");
        assertEquals(Path.of("mine.yaml"), p.materials.file);
        // One description for a shared option, wherever it appears.
        String run = new CommandLine(new RunCommand()).getCommandSpec().findOption("--master").description()[0];
        String hot = new CommandLine(new HotspotsCommand()).getCommandSpec().findOption("--master").description()[0];
        assertEquals(run, hot);
    }
}
