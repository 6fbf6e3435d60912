package org.thermotile.model.constants;

/**
 * Physical constants used throughout the model, each as published.
 *
 * <p>All values are SI. Sources: CODATA 2018 recommended values (Tiesinga et al. 2021, Rev. Mod.
 * Phys. 93, 025010); dry-air properties from the WMO Guide to Meteorological Instruments (WMO-No. 8,
 * 2018) and the ICAO standard atmosphere.
 */
public final class Physical {
    private Physical() {}

    /** Stefan–Boltzmann constant σ [W m⁻² K⁻⁴], CODATA 2018 (derived exactly from h, c, k). */
    public static final double STEFAN_BOLTZMANN = 5.670374419e-8;
    /** Planck constant h [J s], exact since the 2019 SI redefinition (CODATA 2018). */
    public static final double PLANCK = 6.62607015e-34;
    /** Speed of light in vacuum c [m s⁻¹], exact (CODATA 2018). */
    public static final double SPEED_OF_LIGHT = 299_792_458.0;
    /** Boltzmann constant k [J K⁻¹], exact since the 2019 SI redefinition (CODATA 2018). */
    public static final double BOLTZMANN = 1.380649e-23;
    /** Wien wavelength displacement constant b [m K], CODATA 2018. */
    public static final double WIEN_DISPLACEMENT = 2.897771955e-3;

    /** 0 °C in kelvin [K]. */
    public static final double ZERO_CELSIUS_K = 273.15;
    /** Standard sea-level pressure [Pa] (ICAO standard atmosphere). */
    public static final double STANDARD_PRESSURE_PA = 101_325.0;
    /** Specific heat of dry air at constant pressure c_p [J kg⁻¹ K⁻¹] (common practice: 1005). */
    public static final double CP_DRY_AIR = 1005.0;
    /** Ratio of the molar masses of water vapour and dry air ε = 0.622 (WMO-No. 8, 2018, Annex 4.B). */
    public static final double VAPOUR_MASS_RATIO = 0.62198;
    /** Specific gas constant of dry air R_d [J kg⁻¹ K⁻¹] (ICAO standard atmosphere). */
    public static final double GAS_CONSTANT_DRY_AIR = 287.05;
    /** Solar constant, mean total solar irradiance at 1 au [W m⁻²] (Kopp &amp; Lean 2011). */
    public static final double SOLAR_CONSTANT = 1361.0;

    /** Seconds in one hour. */
    public static final int SECONDS_PER_HOUR = 3600;
}
