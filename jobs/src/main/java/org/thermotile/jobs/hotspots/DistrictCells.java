package org.thermotile.jobs.hotspots;

import java.nio.file.Path;
import java.util.List;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * The districts a hotspot analysis reports on: their ids and names, and each cell's district.
 * {@link #GEOJSON} reads them with {@code org.thermotile.jobs.io.districts.Districts}.
 */
public interface DistrictCells {

    /** One district. */
    record District(int index, String id, String name) {
    }

    /** The districts, index 0, 1, … in file order. */
    List<District> districts();

    /** Per cell (row-major), the district index, or −1 for none. */
    int[] cellDistrict();

    /** Reads a districts file onto a grid. */
    @FunctionalInterface
    interface Loader {
        DistrictCells load(Path file, RasterGrid grid);
    }

    /** The loader used when none is wired in: districts are left out, with a note. */
    Loader NOT_AVAILABLE = (file, grid) -> null;

    /** Districts from the run's GeoJSON, as the city job reads them. */
    Loader GEOJSON = (file, grid) -> {
        org.thermotile.jobs.io.districts.Districts d = org.thermotile.jobs.io.districts.Districts.read(file, grid);
        return of(d.districts().stream().map(x -> new District(x.index(), x.id(), x.name())).toList(),
                d.cellDistrict());
    };

    /** Districts from lists. */
    static DistrictCells of(List<District> districts, int[] cellDistrict) {
        List<District> copy = List.copyOf(districts);
        return new DistrictCells() {
            @Override
            public List<District> districts() {
                return copy;
            }

            @Override
            public int[] cellDistrict() {
                return cellDistrict;
            }
        };
    }
}
