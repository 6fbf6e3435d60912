package org.thermotile.model.forcing;

/**
 * Where a simulation stands on the Earth.
 *
 * @param latitudeDeg  geodetic latitude [°], north positive, in [−90, 90]
 * @param longitudeDeg longitude [°], east positive, in [−180, 180]
 * @param elevationM   height above mean sea level [m]
 */
public record Site(double latitudeDeg, double longitudeDeg, double elevationM) implements java.io.Serializable {
    public Site {
        if (!(latitudeDeg >= -90 && latitudeDeg <= 90)) {
            throw new IllegalArgumentException("latitude " + latitudeDeg + "° is outside −90…90°");
        }
        if (!(longitudeDeg >= -180 && longitudeDeg <= 180)) {
            throw new IllegalArgumentException("longitude " + longitudeDeg + "° is outside −180…180°");
        }
        if (!(elevationM > -500 && elevationM < 9000)) {
            throw new IllegalArgumentException("elevation " + elevationM + " m is outside −500…9000 m");
        }
    }
}
