package org.thermotile.jobs.cli;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.materials.Material;
import org.thermotile.model.rating.SolarReflectanceIndex;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code thermotile rate}: Solar Reflectance Index of a surface under ASTM E1980 conditions. */
@Command(name = "rate", mixinStandardHelpOptions = true,
        description = {"Solar Reflectance Index (ASTM E1980) at low, medium and high wind, from "
                + "thermotile's own steady-state balance, with the steady-state surface temperatures.",
                "Give a library material, or a solar reflectance and a thermal emittance."})
final class RateCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = {"-m", "--material"}, paramLabel = "ID", description = "a library material id")
    String materialId;

    @Option(names = "--reflectance", paramLabel = "R", description = "solar reflectance, 0…1")
    Double reflectance;

    @Option(names = "--emittance", paramLabel = "E", description = "thermal emittance, 0…1")
    Double emittance;

    @picocli.CommandLine.Mixin
    SharedOptions.MaterialsFile materials = new SharedOptions.MaterialsFile();

    @Override
    public Integer call() {
        double r;
        double e;
        String label;
        if (materialId != null) {
            if (reflectance != null || emittance != null) {
                throw new UserInputException("give either --material or --reflectance with --emittance, not both");
            }
            Material m = Materials.lookup(materialId, materials.file);
            r = m.albedo();
            e = m.emissivity();
            label = m.id() + " (" + m.name() + ")";
        } else {
            if (reflectance == null || emittance == null) {
                throw new UserInputException("give --material ID, or both --reflectance and --emittance "
                        + "(e.g. --reflectance 0.65 --emittance 0.90)");
            }
            r = reflectance;
            e = emittance;
            if (!(r >= 0 && r <= 1) || !(e >= 0 && e <= 1)) {
                throw new UserInputException("--reflectance and --emittance must be between 0 and 1");
            }
            label = "reflectance " + r + ", emittance " + e;
        }
        PrintWriter out = spec.commandLine().getOut();
        out.printf("Solar Reflectance Index, ASTM E1980 conditions (1000 W/m² sun, air 310 K, sky 300 K)%n");
        out.printf("surface: %s, solar reflectance %.3f, thermal emittance %.3f%n", label, r, e);
        out.printf("%-8s %10s %8s %14s %14s%n", "wind", "h_c W/m²K", "SRI", "surface °C", "black/white °C");
        for (SolarReflectanceIndex.Wind w : SolarReflectanceIndex.Wind.values()) {
            SolarReflectanceIndex.Result res = SolarReflectanceIndex.of(r, e, w);
            out.printf("%-8s %10.0f %8.1f %14.1f %7.1f/%-6.1f%n", w.name().toLowerCase(java.util.Locale.ROOT),
                    w.convectionWm2K, res.sri(), res.surfaceTempK() - Physical.ZERO_CELSIUS_K,
                    res.blackTempK() - Physical.ZERO_CELSIUS_K, res.whiteTempK() - Physical.ZERO_CELSIUS_K);
        }
        out.println("SRI compares surfaces under fixed test conditions; it is not a surface or air "
                + "temperature forecast. Follow local building codes for roofing decisions.");
        out.flush();
        return 0;
    }
}
