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
        String owner = "layer '" + name + "'";
        MaterialProperty.LAYER_THICKNESS.check(owner, thicknessM);
        MaterialProperty.LAYER_CONDUCTIVITY.check(owner, conductivityWmK);
        MaterialProperty.LAYER_HEAT_CAPACITY.check(owner, volumetricHeatCapacityJm3K);
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
