package eigencheck.oracle.problem;

import eigencheck.oracle.expr.Expression;

/**
 * Condition on one side, n the outward normal. Data are expressions of t (and, in 2D and 3D, of the
 * coordinates along the side).
 *
 * @since 0.1
 */
public sealed interface BoundaryCondition permits BoundaryCondition.Dirichlet, BoundaryCondition.Neumann,
    BoundaryCondition.Robin {

    /** The data expression of this condition (temperature, flux or ambient temperature). */
    Expression data();

    /** Fixed temperature: u = temperature(t), degC or K. */
    record Dirichlet(Expression temperature) implements BoundaryCondition {
        public Dirichlet {
            java.util.Objects.requireNonNull(temperature, "dirichlet: temperature");
        }

        @Override
        public Expression data() {
            return temperature;
        }
    }

    /** Prescribed heat flux INTO the body: k du/dn = heatFlux(t), W/m^2; 0 is insulated. */
    record Neumann(Expression heatFlux) implements BoundaryCondition {
        public Neumann {
            java.util.Objects.requireNonNull(heatFlux, "neumann: heatFlux");
        }

        @Override
        public Expression data() {
            return heatFlux;
        }
    }

    /** Convection: -k du/dn = h (u - ambient(t)), h in W/(m^2 K). */
    record Robin(double heatTransferCoefficient, Expression ambient) implements BoundaryCondition {
        public Robin {
            if (!(heatTransferCoefficient > 0 && heatTransferCoefficient < Double.POSITIVE_INFINITY)) {
                throw new IllegalArgumentException("robin: h = " + heatTransferCoefficient
                    + " W/(m^2 K) must be finite and > 0; for an insulated side use neumann with 0");
            }
            java.util.Objects.requireNonNull(ambient, "robin: ambient");
        }

        @Override
        public Expression data() {
            return ambient;
        }
    }
}
