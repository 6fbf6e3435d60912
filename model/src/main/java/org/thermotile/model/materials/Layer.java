package org.thermotile.model.materials;

/**
 * One homogeneous layer of a surface's construction, listed from the surface down.
 *
 * @param name                       what the layer is ("asphalt wearing course")
 * @param thicknessM                 thickness [m], &gt; 0
 * @param conductivityWmK            thermal conductivity k [W m⁻¹ K⁻¹], &gt; 0
 * @param volumetricHeatCapacityJm3K volumetric heat capacity ρc [J m⁻³ K⁻¹], &gt; 0
 */
public record Layer(String name, double thicknessM, double conductivityWmK,
        double volumetricHeatCapacityJm3K) implements java.io.Serializable {
    public Layer {
        if (!(thicknessM > 0 && thicknessM < 20)) {
            throw new IllegalArgumentException("layer '" + name + "': thickness " + thicknessM
                    + " m must be in (0, 20) m");
        }
        if (!(conductivityWmK > 0 && conductivityWmK < 500)) {
            throw new IllegalArgumentException("layer '" + name + "': conductivity " + conductivityWmK
                    + " W/(m K) must be in (0, 500)");
        }
        if (!(volumetricHeatCapacityJm3K > 1e3 && volumetricHeatCapacityJm3K < 1e8)) {
            throw new IllegalArgumentException("layer '" + name + "': volumetric heat capacity "
                    + volumetricHeatCapacityJm3K + " J/(m³ K) must be in (1e3, 1e8)");
        }
    }

    /** Thermal diffusivity κ = k / ρc [m² s⁻¹]. */
    public double diffusivityM2s() {
        return conductivityWmK / volumetricHeatCapacityJm3K;
    }

    /** Areal heat capacity of the whole layer ρc·d [J m⁻² K⁻¹]. */
    public double arealHeatCapacityJm2K() {
        return volumetricHeatCapacityJm3K * thicknessM;
    }
}
