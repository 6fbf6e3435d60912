import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.OptionalInt;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * Writes a synthetic city of WIDTH × HEIGHT cells for sizing runs: the demo's land cover
 * (data-samples/riverside, invented) repeated side by side on a grid with the demo's origin, cell
 * size and CRS, the demo's class table and weather, and a run file of one counted day without
 * spin-up and no hourly outputs.
 *
 *   java -cp jobs/target/classes:model/target/classes:$(cat jobs/target/runtime-classpath.txt) \
 *       deploy/sizing/SyntheticGrid.java OUT_DIR WIDTH HEIGHT
 */
public class SyntheticGrid {
    public static void main(String[] args) throws Exception {
        Path out = Path.of(args[0]);
        int width = Integer.parseInt(args[1]);
        int height = Integer.parseInt(args[2]);
        Path demo = Path.of("data-samples", "riverside");
        Files.createDirectories(out);
        int[] tile;
        RasterGrid g;
        OptionalInt noData;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(demo.resolve("landcover.tif"))) {
            g = r.grid();
            tile = r.readIntWindow(0, 0, g.width(), g.height());
            noData = r.noDataValue().isPresent() ? OptionalInt.of((int) r.noDataValue().getAsDouble()) : OptionalInt.empty();
        }
        int[] codes = new int[width * height];
        for (int row = 0; row < height; row++) {
            for (int col = 0; col < width; col++) {
                codes[row * width + col] = tile[(row % g.height()) * g.width() + col % g.width()];
            }
        }
        RasterGrid big = new RasterGrid(width, height, g.originX(), g.originY(), g.pixelWidth(), g.pixelHeight(),
                g.epsg(), g.crsWkt());
        GeoTiffWriter.writeInt(out.resolve("landcover.tif"), big, GeoTiffWriter.IntType.UINT8, codes, noData);
        Files.copy(demo.resolve("classes.yaml"), out.resolve("classes.yaml"), StandardCopyOption.REPLACE_EXISTING);
        Files.copy(demo.resolve("weather.csv"), out.resolve("weather.csv"), StandardCopyOption.REPLACE_EXISTING);
        Files.writeString(out.resolve("run.yaml"), """
                # Synthetic sizing city (invented): the demo's land cover repeated to %d × %d cells.
                name: sizing-%dx%d
                site: {latitude: 45.1436, longitude: 9.0229, elevation_m: 70}
                inputs: {land_cover: landcover.tif, classes: classes.yaml}
                weather: {file: weather.csv}
                period: {start: 2026-07-16, end: 2026-07-16, spin_up_days: 0}
                outputs:
                  maps: [peak, mean, night_min, peak_hour, degree_hours]
                  threshold_c: 45
                  hourly_days: []
                """.formatted(width, height, width, height));
        System.out.println(out.resolve("run.yaml"));
    }
}
