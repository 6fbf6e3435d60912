package org.thermotile.jobs.city;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.List;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.model.geometry.GeometryFactors;
import org.thermotile.model.geometry.Shadows;
import org.thermotile.model.geometry.SkyViewFactor;

/**
 * Urban geometry settings: on whenever the run has a heights raster; the optional
 * {@code geometry:} block tunes it:
 * <pre>
 * geometry:
 *   sky_view_directions: 32        # azimuth directions of the horizon search (≥ 16)
 *   search_radius_m: 100           # obstacles farther than this are ignored
 *   min_sun_elevation_deg: 10      # lower suns: beam counted as diffuse (no cast shadow)
 *   canopy_transmissivity: 0.3     # share of beam sunlight through tree crowns
 *   wall_emissivity: 0.90
 * </pre>
 * Tree heights are the heights of cells whose land cover is tree canopy; trees shade with the
 * canopy transmissivity; they are not sky view obstacles, and a tree cell's own sky view factor
 * is that of the ground below it (see the README, "Trees in the sky view factor").
 *
 * @param haloCells cells of context around each tile: enough for the search radius and for the
 *                  tallest height's shadow at the lowest sun that casts one
 */
record GeometryBlock(int directions, double searchRadiusM, double minSunElevationDeg, double canopyTransmissivity,
        double wallEmissivity, int haloCells) implements java.io.Serializable {

    static final List<String> KEYS = List.of("sky_view_directions", "search_radius_m", "min_sun_elevation_deg",
            "canopy_transmissivity", "wall_emissivity");

    /** The geometry settings of {@code run} (null without heights), with the halo for {@code tallestM}. */
    static GeometryBlock of(RunFile run, double cellM, double tallestM) {
        JsonNode n = run.reserved("geometry");
        if (run.inputs().heights() == null && run.inputs().buildings() == null) {
            if (n != null && !n.isNull()) {
                throw new UserInputException(run.source() + ": geometry settings need a heights raster or building "
                        + "footprints. Fix: give inputs.heights or inputs.buildings, or drop the geometry block");
            }
            return null;
        }
        String where = run.source() + ": geometry";
        if (n != null && !n.isNull()) {
            if (!n.isObject()) {
                throw new UserInputException(where + " must be a mapping of " + String.join(", ", KEYS));
            }
            n.fieldNames().forEachRemaining(k -> {
                if (!KEYS.contains(k)) {
                    throw new UserInputException(where + "." + k + ": unknown key; known keys: " + String.join(", ", KEYS));
                }
            });
        } else {
            n = com.fasterxml.jackson.databind.node.NullNode.getInstance();
        }
        int dirs = n.path("sky_view_directions").asInt(32);
        double radius = n.path("search_radius_m").asDouble(100);
        double minSun = n.path("min_sun_elevation_deg").asDouble(10);
        double tau = n.path("canopy_transmissivity").asDouble(0.3);
        double wallEps = n.path("wall_emissivity").asDouble(GeometryFactors.DEFAULT_WALL_EMISSIVITY);
        if (dirs < 16 || dirs > 360) {
            throw new UserInputException(where + ".sky_view_directions: " + dirs + " must be 16…360");
        }
        if (!(radius >= cellM && radius <= 2000)) {
            throw new UserInputException(where + ".search_radius_m: " + radius + " must be between one cell ("
                    + cellM + " m) and 2000 m");
        }
        if (!(minSun >= 1 && minSun <= 45)) {
            throw new UserInputException(where + ".min_sun_elevation_deg: " + minSun + " must be 1…45°");
        }
        if (!(tau >= 0 && tau <= 1)) {
            throw new UserInputException(where + ".canopy_transmissivity: " + tau + " must be 0…1");
        }
        if (!(wallEps > 0 && wallEps <= 1)) {
            throw new UserInputException(where + ".wall_emissivity: " + wallEps + " must be above 0, at most 1");
        }
        int halo = Math.max(new SkyViewFactor(cellM, radius, dirs).haloCells(),
                Shadows.haloCells(tallestM, minSun, cellM));
        return new GeometryBlock(dirs, radius, minSun, tau, wallEps, halo);
    }
}
