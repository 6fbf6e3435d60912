package org.thermotile.model.forcing;

/** Fills the series a weather source leaves out; see {@link #prepare}. */
public final class ForcingPreparer {
    private ForcingPreparer() {}

    /**
     * Builds complete forcing from hourly weather: sun position per hour, beam/diffuse split of
     * GHI when not given, sky longwave when not given, pressure from elevation when not given.
     */
    public static Forcing prepare(HourlyWeather weather, Site site) {
        throw new UnsupportedOperationException("not yet written");
    }
}
