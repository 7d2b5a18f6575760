package eigencheck.oracle.problem;

import eigencheck.oracle.expr.Expression;
import java.util.ArrayList;
import java.util.Collections;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * rho c du/dt = k lap(u) + source(x, t) on the domain, u(x, 0) = initial(x), one boundary condition
 * per side. Expressions use the domain's coordinates; the source and the boundary data also t.
 *
 * @param initial initial temperature, an expression of the coordinates (ignored when steady)
 * @param source volumetric heat source Q (W/m^3), an expression of the coordinates and t
 * @param steady the steady problem k lap(u) + Q = 0: source and face data must not depend on t
 * @since 0.1
 */
public record Problem(Domain domain, Material material, Expression initial, Expression source,
                      Map<Side, BoundaryCondition> boundary, boolean steady) {
    public Problem {
        Objects.requireNonNull(domain, "domain");
        Objects.requireNonNull(material, "material");
        Objects.requireNonNull(initial, "initial");
        Objects.requireNonNull(source, "source");
        Objects.requireNonNull(boundary, "boundary");
        List<String> problems = new ArrayList<>();
        for (Side s : domain.sides()) {
            if (!boundary.containsKey(s)) {
                problems.add("boundary." + s.key() + ": missing");
            }
        }
        for (Side s : boundary.keySet()) {
            if (!domain.sides().contains(s)) {
                problems.add("boundary." + s.key() + ": not a side of this domain");
            }
        }
        for (String v : initial.usedVariables()) {
            if (!domain.coordinates().contains(v)) {
                problems.add("initial: uses " + v + ", not a coordinate of this domain");
            }
        }
        if (steady) {
            if (!source.isIndependentOf("t")) {
                problems.add("source: depends on t, but the problem is steady; drop t or remove steady");
            }
            for (Map.Entry<Side, BoundaryCondition> e : boundary.entrySet()) {
                if (!e.getValue().data().isIndependentOf("t")) {
                    problems.add("boundary." + e.getKey().key() + ": depends on t, but the problem is steady");
                }
            }
        }
        if (!problems.isEmpty()) {
            throw new IllegalArgumentException(String.join("; ", problems));
        }
        EnumMap<Side, BoundaryCondition> copy = new EnumMap<>(Side.class);
        copy.putAll(boundary);
        boundary = Collections.unmodifiableMap(copy);
    }

    /** A transient problem. */
    public Problem(Domain domain, Material material, Expression initial, Expression source,
                   Map<Side, BoundaryCondition> boundary) {
        this(domain, material, initial, source, boundary, false);
    }

    /** The condition on one side. */
    public BoundaryCondition condition(Side side) {
        return boundary.get(side);
    }
}
