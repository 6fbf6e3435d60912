package org.thermotile.jobs.city;

import java.util.List;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunBlocks;
import org.thermotile.jobs.config.RunFile;
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

    static final List<String> KEYS = RunBlocks.GEOMETRY;

    /**
     * The geometry settings of {@code run} (null without heights), with the halo for {@code tallestM}.
     * The block itself is checked when the run file is read ({@link RunBlocks}); what needs the grid
     * is checked here.
     */
    static GeometryBlock of(RunFile run, double cellM, double tallestM) {
        if (run.inputs().heights() == null && run.inputs().buildings() == null) {
            return null;
        }
        RunBlocks.Geometry g = RunBlocks.geometryOf(run);
        int dirs = g.skyViewDirections();
        double radius = g.searchRadiusM();
        double minSun = g.minSunElevationDeg();
        double tau = g.canopyTransmissivity();
        double wallEps = g.wallEmissivity();
        if (!(radius >= cellM)) {
            throw new UserInputException(run.source() + ": geometry.search_radius_m: " + radius + " must be between "
                    + "one cell (" + cellM + " m) and " + RunBlocks.MAX_SEARCH_RADIUS_M + " m");
        }
        int halo = Math.max(new SkyViewFactor(cellM, radius, dirs).haloCells(),
                Shadows.haloCells(tallestM, minSun, cellM));
        return new GeometryBlock(dirs, radius, minSun, tau, wallEps, halo);
    }
}
