package org.thermotile.model.observe;

/**
 * Decoding of stored raster values into physical ones: {@code v = stored · scale + offset}, with a
 * no-data value and an optional °C → K conversion.
 *
 * <p>The Landsat Collection 2 Level-2 surface-temperature band, for instance, stores unsigned
 * 16-bit integers with scale 0.00341802 K and offset 149.0 K (USGS, Landsat 8–9 Collection 2
 * Level-2 Science Product Guide, 2022, Table 6-1).
 *
 * @param scale   multiplier [physical unit per stored unit]
 * @param offset  added after scaling [physical unit]
 * @param nodata  stored value meaning "no observation" (compared before scaling); NaN for none
 * @param celsius true when the decoded unit is °C (then 273.15 is added to give K)
 */
public record StoredScaling(double scale, double offset, double nodata, boolean celsius) {

    /** Identity decoding in kelvin with no no-data value. */
    public static final StoredScaling KELVIN = new StoredScaling(1.0, 0.0, Double.NaN, false);

    /** The decoded value in kelvin (or the decoded radiance when the image is a radiance); NaN for no data. */
    public double decode(double stored) {
        if (Double.isNaN(stored) || (!Double.isNaN(nodata) && stored == nodata)) {
            return Double.NaN;
        }
        double v = stored * scale + offset;
        return celsius ? v + 273.15 : v;
    }
}
