package eigencheck.oracle.problem;

/**
 * Constant, isotropic material: conductivity k (W/(m K)) and volumetric heat capacity rho*c
 * (J/(m^3 K)); diffusivity alpha = k/(rho c) (m^2/s). A pure-diffusion problem gives alpha alone,
 * which is stored as k = alpha, rho*c = 1: the source is then in K/s and a Neumann flux in K m/s.
 *
 * @since 0.1
 */
public record Material(double conductivity, double volumetricHeatCapacity) {
    public Material {
        if (!(conductivity > 0 && conductivity < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("material: conductivity = " + conductivity
                + " W/(m K) must be finite and > 0");
        }
        if (!(volumetricHeatCapacity > 0 && volumetricHeatCapacity < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("material: volumetricHeatCapacity = " + volumetricHeatCapacity
                + " J/(m^3 K) must be finite and > 0; for pure diffusion give diffusivity alone");
        }
    }

    /** Pure diffusion with diffusivity alpha (m^2/s). */
    public static Material ofDiffusivity(double diffusivity) {
        if (!(diffusivity > 0 && diffusivity < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("material: diffusivity = " + diffusivity
                + " m^2/s must be finite and > 0");
        }
        return new Material(diffusivity, 1.0);
    }

    /** alpha = k/(rho c), m^2/s. */
    public double diffusivity() {
        return conductivity / volumetricHeatCapacity;
    }
}
