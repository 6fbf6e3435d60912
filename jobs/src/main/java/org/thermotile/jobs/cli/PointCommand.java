package org.thermotile.jobs.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.LocalDate;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.thermotile.jobs.config.Suggest;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.io.weather.GapFill;
import org.thermotile.jobs.io.weather.WeatherCsv;
import org.thermotile.jobs.io.weather.WeatherRead;
import org.thermotile.model.balance.ColumnSpacing;
import org.thermotile.model.balance.Convection;
import org.thermotile.model.balance.SingleSurface;
import org.thermotile.model.balance.SurfaceBlock.Flux;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.ForcingPreparer;
import org.thermotile.model.forcing.HourlyWeather;
import org.thermotile.model.forcing.Site;
import org.thermotile.model.forcing.SyntheticWeather;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialOverrides;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code thermotile point}: one surface, every flux, hour by hour. */
@Command(name = "point", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Runs one surface through an hourly weather file or a synthetic clear-sky "
                + "period and writes one CSV row per hour with every flux of its energy balance.",
                "Rows: time, surface temperature (°C), net shortwave, absorbed sky longwave, emitted "
                        + "longwave, sensible, latent, anthropogenic, conduction, storage, bottom (W/m²), "
                        + "closure residual (W/m²): residual = net shortwave + sky longwave - emitted + "
                        + "anthropogenic - sensible - latent - conduction, and conduction = storage + bottom. Fluxes are means over the hour ending at the row's time."})
final class PointCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = {"-m", "--material"}, required = true, paramLabel = "ID",
            description = "library material id (see 'thermotile materials')")
    String materialId;

    @Option(names = "--set", paramLabel = "KEY=VALUE",
            description = "override a property, e.g. --set albedo=0.65 --set layers[0].thickness=0.004")
    List<String> overrides = new ArrayList<>();

    @picocli.CommandLine.Mixin
    SharedOptions.MaterialsFile materials = new SharedOptions.MaterialsFile();

    @Option(names = "--lat", required = true, paramLabel = "DEG", description = "latitude, north positive")
    double latitude;

    @Option(names = "--lon", required = true, paramLabel = "DEG", description = "longitude, east positive")
    double longitude;

    @Option(names = {"--elevation-m", "--elevation"}, paramLabel = "M", defaultValue = "0", description = "elevation (default ${DEFAULT-VALUE} m)")
    double elevationM;

    @Option(names = "--weather", paramLabel = "CSV", description = "hourly weather file (see README); without it a synthetic clear-sky period is used")
    Path weatherFile;

    @Option(names = {"--fill-gaps-max-hours", "--fill-gaps"}, paramLabel = "HOURS", defaultValue = "0",
            description = "fill weather gaps of up to this many hours by linear interpolation (default: gaps are errors)")
    int fillGapsHours;

    @Option(names = "--start", paramLabel = "DATE", description = "first reported day (default: the weather's first day after spin-up; synthetic: 2026-07-15)")
    LocalDate start;

    @Option(names = "--days", paramLabel = "N", defaultValue = "3", description = "reported days for synthetic weather (default ${DEFAULT-VALUE})")
    int days;

    @Option(names = {"--t-min-c", "--t-min"}, paramLabel = "°C", defaultValue = "20", description = "synthetic daily minimum air temperature (default ${DEFAULT-VALUE})")
    double tMinC;

    @Option(names = {"--t-max-c", "--t-max"}, paramLabel = "°C", defaultValue = "33", description = "synthetic daily maximum air temperature (default ${DEFAULT-VALUE})")
    double tMaxC;

    @Option(names = {"--rel-humidity-pct", "--rh"}, paramLabel = "%", defaultValue = "45", description = "synthetic relative humidity (default ${DEFAULT-VALUE})")
    double rhPct;

    @Option(names = {"--wind-ms", "--wind"}, paramLabel = "M/S", defaultValue = "2", description = "synthetic wind speed (default ${DEFAULT-VALUE})")
    double windMs;

    @Option(names = "--utc-offset", paramLabel = "±HH:MM", defaultValue = "+00:00", description = "synthetic local clock offset from UTC (default ${DEFAULT-VALUE})")
    String utcOffset;

    @Option(names = "--spin-up-days", paramLabel = "N", defaultValue = "2", description = "days simulated before reporting starts (default ${DEFAULT-VALUE})")
    int spinUpDays;

    @Option(names = {"--timestep-minutes", "--step-minutes"}, paramLabel = "MIN", defaultValue = "10", description = "sub-step, dividing 60 (default ${DEFAULT-VALUE})")
    int stepMinutes;

    @Option(names = "--convection", paramLabel = "MODEL", defaultValue = "mcadams",
            description = "'mcadams' (wind correlation) or a fixed coefficient in W/(m² K) (default ${DEFAULT-VALUE})")
    String convection;

    @Option(names = "--column-spacing", paramLabel = "NAME", defaultValue = "standard",
            description = "spacing of the conduction nodes, as the run file's physics.column_spacing: standard or "
                    + "coarse (fewer nodes below 25 cm; default ${DEFAULT-VALUE})")
    String columnSpacing;

    @Option(names = {"--deep-ground-temp-c", "--deep-ground"}, paramLabel = "°C", description = "deep-ground temperature (default: mean air temperature)")
    Double deepGroundC;

    @Option(names = {"--threshold-c", "--threshold"}, paramLabel = "°C", defaultValue = "45", description = "threshold for hours and degree-hours above (default ${DEFAULT-VALUE})")
    double thresholdC;

    @Option(names = {"-o", "--out"}, paramLabel = "CSV", description = "write the hourly CSV here (default: standard output)")
    Path out;

    @Override
    public Integer call() throws IOException {
        Material material = Materials.lookup(materialId, materials.file);
        if (!overrides.isEmpty()) {
            material = MaterialOverrides.applyAll(material, overrides, "--set");
        }
        Site site = new Site(latitude, longitude, elevationM);
        HourlyWeather weather = weather(site);
        if (weather.hours() <= 24 * spinUpDays + 1) {
            throw new UserInputException("the weather has " + weather.hours() + " hours, not more than the "
                    + spinUpDays + " spin-up days. Fix: give a longer weather file or --spin-up-days 0");
        }
        Forcing forcing = ForcingPreparer.prepare(weather, site);
        Convection conv = parseConvection(convection);
        double deepK = deepGroundC != null ? deepGroundC + Physical.ZERO_CELSIUS_K
                : java.util.Arrays.stream(forcing.airTempK).average().orElseThrow();
        int firstHour = Math.max(1, 24 * spinUpDays);
        SingleSurface.Result r = SingleSurface.run(material, forcing, stepMinutes, conv, deepK, firstHour,
                thresholdC + Physical.ZERO_CELSIUS_K, parseColumnSpacing(columnSpacing));

        ZoneOffset zo = ZoneOffset.ofTotalSeconds(forcing.utcOffsetSeconds);
        if (out != null) {
            try (Writer w = Files.newBufferedWriter(out)) {
                writeCsv(r, zo, w);
            }
        } else {
            PrintWriter w = spec.commandLine().getOut();
            writeCsv(r, zo, w);
            w.flush();
        }
        var st = r.statistics;
        int peakAt = 0;
        for (int i = 1; i < r.hours(); i++) {
            if (r.surfaceTempK[i] > r.surfaceTempK[peakAt]) {
                peakAt = i;
            }
        }
        PrintWriter err = spec.commandLine().getErr();
        err.printf(Locale.ROOT, "%s: peak %.1f °C at %s, mean %.1f °C, minimum %.1f °C over %d h; "
                        + "%d h above %.0f °C; closure residual %.1e%s%n",
                material.id(), st.peakK(0) - Physical.ZERO_CELSIUS_K,
                OffsetDateTime.ofInstant(Instant.ofEpochSecond(r.epochSecond[peakAt]), zo),
                st.meanK(0) - Physical.ZERO_CELSIUS_K, min(r.surfaceTempK) - Physical.ZERO_CELSIUS_K,
                r.hours(), st.hoursAbove(0), thresholdC, r.closureResidualFraction,
                out != null ? "; hourly rows in " + out : "");
        err.println("(surface temperature, not air temperature nor a heat-health index)");
        err.flush();
        return 0;
    }

    private HourlyWeather weather(Site site) throws IOException {
        if (weatherFile != null) {
            WeatherRead read = WeatherCsv.read(weatherFile, fillGapsHours > 0 ? GapFill.linear(fillGapsHours) : GapFill.none());
            HourlyWeather w = read.weather();
            if (start != null) {
                ZoneOffset zo = ZoneOffset.ofTotalSeconds(w.utcOffsetSeconds);
                Instant from = start.minusDays(spinUpDays).atStartOfDay().toInstant(zo);
                Instant to = Instant.ofEpochSecond(w.epochSecond[w.hours() - 1]);
                w = read.slice(from, to);
            }
            return w;
        }
        ZoneOffset zo;
        try {
            zo = ZoneOffset.of(utcOffset);
        } catch (java.time.DateTimeException e) {
            throw new UserInputException("--utc-offset '" + utcOffset + "' is not an offset. Fix: e.g. +02:00");
        }
        LocalDate first = (start != null ? start : LocalDate.of(2026, 7, 15)).minusDays(spinUpDays);
        HourlyWeather w = SyntheticWeather.clearSky(site, SyntheticWeather.Spec.withRelativeHumidity(first,
                days + spinUpDays, zo.getTotalSeconds(), tMinC, tMaxC, rhPct / 100.0, windMs));
        return w;
    }

    static ColumnSpacing parseColumnSpacing(String s) {
        ColumnSpacing spacing = ColumnSpacing.named(s);
        if (spacing == null) {
            throw new UserInputException("--column-spacing '" + s + "' is not a column spacing"
                    + Suggest.closest(s, ColumnSpacing.names()).map(c -> " (did you mean '" + c + "'?)").orElse("")
                    + ". Fix: give one of "
                    + String.join(" | ", ColumnSpacing.names()));
        }
        return spacing;
    }

    static Convection parseConvection(String s) {
        if ("mcadams".equalsIgnoreCase(s)) {
            return Convection.mcAdams();
        }
        try {
            return Convection.fixed(Double.parseDouble(s));
        } catch (NumberFormatException e) {
            throw new UserInputException("--convection '" + s + "': give 'mcadams' or a coefficient in W/(m² K), e.g. 12");
        }
    }

    static final String HEADER = "time,surface_c,net_shortwave_wm2,absorbed_sky_longwave_wm2,"
            + "emitted_longwave_wm2,sensible_wm2,latent_wm2,anthropogenic_wm2,conduction_wm2,storage_wm2,"
            + "bottom_wm2,residual_wm2";

    static void writeCsv(SingleSurface.Result r, ZoneOffset zo, Writer w) throws IOException {
        Flux[] cols = {Flux.NET_SHORTWAVE, Flux.ABSORBED_SKY_LONGWAVE, Flux.EMITTED_LONGWAVE, Flux.SENSIBLE,
            Flux.LATENT, Flux.ANTHROPOGENIC, Flux.CONDUCTION, Flux.STORAGE, Flux.BOTTOM, Flux.RESIDUAL};
        w.write(HEADER);
        w.write('\n');
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < r.hours(); i++) {
            sb.setLength(0);
            sb.append(OffsetDateTime.ofInstant(Instant.ofEpochSecond(r.epochSecond[i]), zo));
            sb.append(',').append(String.format(Locale.ROOT, "%.3f", r.surfaceTempK[i] - Physical.ZERO_CELSIUS_K));
            for (Flux f : cols) {
                double v = r.fluxWm2[f.ordinal()][i];
                // 8 decimals: the eight rounded terms of a row then close to better than 1e-7 W/m².
                sb.append(',').append(f == Flux.RESIDUAL ? String.format(Locale.ROOT, "%.2e", v)
                        : String.format(Locale.ROOT, "%.8f", v));
            }
            sb.append('\n');
            w.write(sb.toString());
        }
    }

    static double min(double[] a) {
        double m = Double.POSITIVE_INFINITY;
        for (double v : a) {
            m = Math.min(m, v);
        }
        return m;
    }
}
