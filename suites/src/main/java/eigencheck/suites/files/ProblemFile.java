package eigencheck.suites.files;

import eigencheck.adapters.InputException;
import eigencheck.adapters.InputLocation;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Domain;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
import java.nio.file.Path;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;

/**
 * Reads a problem file (YAML or JSON, keys in lowerCamelCase; see README "Problem files") into the
 * oracle's {@link Problem} record. Every problem of the file is reported at once, each with its
 * line, column and field path.
 *
 * @since 0.1
 */
public final class ProblemFile {
    private static final List<String> TOP = List.of("name", "description", "domain", "material", "initial", "source",
        "boundary", "steady");
    private static final List<String> SHAPES = List.of("slab", "rectangle", "box", "cylinder", "sphere");
    private static final List<String> CONDITIONS = List.of("dirichlet", "neumann", "robin");

    private ProblemFile() {
    }

    /**
     * Writes a problem in the problem-file format (JSON), expressions as formulas: what a solver of a
     * manufactured case reads through the {@code {problem}} placeholder.
     */
    public static String toJson(Problem p) {
        com.fasterxml.jackson.databind.ObjectMapper m = new com.fasterxml.jackson.databind.ObjectMapper();
        var root = m.createObjectNode();
        var domain = root.putObject("domain");
        if (p.domain() instanceof eigencheck.oracle.problem.Sphere sphere) {
            domain.put("shape", "sphere");
            domain.put("radius", sphere.radius());
        } else if (p.domain() instanceof eigencheck.oracle.problem.Cylinder cylinder) {
            domain.put("shape", "cylinder");
            domain.put("radius", cylinder.radius());
        } else if (p.domain() instanceof eigencheck.oracle.problem.Rectangle rect) {
            domain.put("shape", "rectangle");
            domain.put("lengthX", rect.lengthX());
            domain.put("lengthY", rect.lengthY());
        } else if (p.domain() instanceof eigencheck.oracle.problem.Box box) {
            domain.put("shape", "box");
            domain.put("lengthX", box.lengthX());
            domain.put("lengthY", box.lengthY());
            domain.put("lengthZ", box.lengthZ());
        } else {
            domain.put("shape", "slab");
            domain.put("length", ((Slab) p.domain()).length());
        }
        var material = root.putObject("material");
        material.put("conductivity", p.material().conductivity());
        material.put("volumetricHeatCapacity", p.material().volumetricHeatCapacity());
        root.put("initial", p.initial().formula());
        root.put("source", p.source().formula());
        var boundary = root.putObject("boundary");
        for (Map.Entry<Side, BoundaryCondition> e : p.boundary().entrySet()) {
            var face = boundary.putObject(e.getKey().key());
            BoundaryCondition bc = e.getValue();
            if (bc instanceof BoundaryCondition.Dirichlet d) {
                face.put("dirichlet", d.temperature().formula());
            } else if (bc instanceof BoundaryCondition.Neumann n) {
                face.put("neumann", n.heatFlux().formula());
            } else if (bc instanceof BoundaryCondition.Robin r) {
                var robin = face.putObject("robin");
                robin.put("h", r.heatTransferCoefficient());
                robin.put("ambient", r.ambient().formula());
            }
        }
        try {
            return m.writerWithDefaultPrettyPrinter().writeValueAsString(root);
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    /** Reads and checks the file. @throws InputException listing every problem found */
    public static Problem read(Path file) throws InputException {
        return fromTree(TreeReader.read(file));
    }

    /** Checks a tree already read (for problems embedded in suite files). */
    public static Problem fromTree(Node root) throws InputException {
        Checker c = new Checker();
        Node.Obj top = c.object(root, "a problem file is a mapping with domain, material, initial, source, boundary");
        c.throwIfAny();
        c.allowOnly(top, TOP);

        Domain domain = null;
        Node domainNode = c.required(top, "domain", "give the body, for example {shape: slab, length: 0.1}");
        if (domainNode != null) {
            domain = domain(c, domainNode);
        }

        Material material = null;
        Node materialNode = c.required(top, "material",
            "give {conductivity: W/(m K), volumetricHeatCapacity: J/(m^3 K)} or {diffusivity: m^2/s}");
        if (materialNode != null) {
            material = material(c, materialNode);
        }

        String[] space = domain == null ? (sidesOfShape(domainNode) != null && sidesOfShape(domainNode).size() == 1
            ? new String[] {"r"} : new String[] {"x"}) : domain.coordinates().toArray(String[]::new);
        String[] spaceTime = new String[space.length + 1];
        System.arraycopy(space, 0, spaceTime, 0, space.length);
        spaceTime[space.length] = "t";

        boolean steady = false;
        Node steadyNode = top.fields().get("steady");
        if (steadyNode != null) {
            if (steadyNode instanceof Node.Scalar s && s.value() instanceof Boolean b) {
                steady = b;
            } else {
                c.problem(InputException.Cause.INVALID_VALUE, steadyNode.location(), "steady is true or false");
            }
        }
        Expression initial = Expression.parse("0", space);
        Node initialNode = steady ? top.fields().get("initial") : c.required(top, "initial",
            "give the initial temperature, an expression of " + String.join(", ", space) + " (for example \"20\")");
        if (initialNode != null) {
            initial = c.expression(initialNode, space, "the initial temperature is an expression of "
                + String.join(", ", space));
        }
        Expression source = Expression.parse("0", spaceTime);
        Node sourceNode = top.fields().get("source");
        if (sourceNode != null) {
            source = c.expression(sourceNode, spaceTime, "the source (W/m^3) is an expression of "
                + String.join(", ", spaceTime));
        }

        Map<Side, BoundaryCondition> boundary = new EnumMap<>(Side.class);
        Node boundaryNode = c.required(top, "boundary", "give one condition per side, for example"
            + " {xmin: {dirichlet: \"0\"}, xmax: {robin: {h: 25, ambient: \"20\"}}}");
        List<Side> domainSides = domain != null ? domain.sides() : sidesOfShape(domainNode);
        if (boundaryNode != null) {
            Node.Obj b = c.object(boundaryNode, "one condition per side");
            if (b != null && domainSides == null) {
                // the domain is unusable: still check each condition that is there
                for (Node n : b.fields().values()) {
                    condition(c, n, new String[] {"t"});
                }
            } else if (b != null) {
                List<String> sides = domainSides.stream().map(Side::key).toList();
                c.allowOnly(b, sides);
                for (Side side : domainSides) {
                    Node n = c.required(b, side.key(), "give {dirichlet: ...}, {neumann: ...} or {robin: {h, ambient}}");
                    if (n != null) {
                        BoundaryCondition bc = condition(c, n, faceVariables(space, side));
                        if (bc != null) {
                            boundary.put(side, bc);
                        }
                    }
                }
            }
        }
        c.throwIfAny();
        try {
            return new Problem(domain, material, initial, source, boundary, steady);
        } catch (IllegalArgumentException e) {
            throw new InputException(InputException.Cause.INVALID_VALUE, top.location(), e.getMessage());
        }
    }

    /** The variables of a side's data: the coordinates along the side, then t. */
    private static String[] faceVariables(String[] space, Side side) {
        if (space.length == 1) {
            return new String[] {"t"};
        }
        String normal = side.key().substring(0, 1);
        List<String> vars = new java.util.ArrayList<>();
        for (String s : space) {
            if (!s.equals(normal)) {
                vars.add(s);
            }
        }
        vars.add("t");
        return vars.toArray(String[]::new);
    }

    /** The sides of the shape the domain names, even when its sizes are wrong; null if unknown. */
    private static List<Side> sidesOfShape(Node domainNode) {
        if (domainNode instanceof Node.Obj o && o.fields().get("shape") instanceof Node.Scalar s) {
            if ("rectangle".equals(s.value())) {
                return List.of(Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX);
            }
            if ("box".equals(s.value())) {
                return List.of(Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX, Side.ZMIN, Side.ZMAX);
            }
            if ("cylinder".equals(s.value())) {
                return List.of(Side.SURFACE);
            }
        }
        if (domainNode instanceof Node.Obj o && o.fields().get("shape") instanceof Node.Scalar s
            && "slab".equals(s.value())) {
            return List.of(Side.XMIN, Side.XMAX);
        }
        if (domainNode instanceof Node.Obj o && o.fields().get("shape") instanceof Node.Scalar s
            && "sphere".equals(s.value())) {
            return List.of(Side.SURFACE);
        }
        return null;
    }

    private static Domain domain(Checker c, Node n) {
        Node.Obj o = c.object(n, "for example {shape: slab, length: 0.1}");
        if (o == null) {
            return null;
        }
        Node shapeNode = c.required(o, "shape", "one of " + String.join(", ", SHAPES));
        if (shapeNode == null) {
            return null;
        }
        String shape = c.text(shapeNode, "one of " + String.join(", ", SHAPES));
        if (shape == null) {
            return null;
        }
        if (!SHAPES.contains(shape)) {
            String near = Checker.nearest(shape, SHAPES);
            c.problem(InputException.Cause.INVALID_VALUE, shapeNode.location(), "unknown shape \"" + shape + "\""
                + (near != null ? " (did you mean \"" + near + "\"?)" : "") + "; allowed: " + String.join(", ", SHAPES));
            return null;
        }
        if (shape.equals("sphere")) {
            c.allowOnly(o, List.of("shape", "radius"));
            Node radius = c.required(o, "radius", "the sphere's radius in m, for example 0.05");
            if (radius == null) {
                return null;
            }
            double r = c.positive(radius, "the sphere's radius in m");
            return Double.isNaN(r) ? null : new eigencheck.oracle.problem.Sphere(r);
        }
        if (shape.equals("cylinder")) {
            c.allowOnly(o, List.of("shape", "radius"));
            Node radius = c.required(o, "radius", "the cylinder's radius in m, for example 0.05");
            if (radius == null) {
                return null;
            }
            double r = c.positive(radius, "the cylinder's radius in m");
            return Double.isNaN(r) ? null : new eigencheck.oracle.problem.Cylinder(r);
        }
        if (shape.equals("rectangle") || shape.equals("box")) {
            List<String> keys = shape.equals("box") ? List.of("lengthX", "lengthY", "lengthZ")
                : List.of("lengthX", "lengthY");
            List<String> allowed = new java.util.ArrayList<>(keys);
            allowed.add(0, "shape");
            c.allowOnly(o, allowed);
            double[] l = new double[keys.size()];
            boolean ok = true;
            for (int i = 0; i < keys.size(); i++) {
                Node ln = c.required(o, keys.get(i), "the " + shape + "'s edge along " + "xyz".charAt(i)
                    + " in m, for example 0.1");
                l[i] = ln == null ? Double.NaN : c.positive(ln, "the edge length in m");
                ok &= !Double.isNaN(l[i]);
            }
            if (!ok) {
                return null;
            }
            return shape.equals("box") ? new eigencheck.oracle.problem.Box(l[0], l[1], l[2])
                : new eigencheck.oracle.problem.Rectangle(l[0], l[1]);
        }
        c.allowOnly(o, List.of("shape", "length"));
        Node length = c.required(o, "length", "the slab's thickness in m, for example 0.1");
        if (length == null) {
            return null;
        }
        double l = c.positive(length, "the slab's thickness in m");
        return Double.isNaN(l) ? null : new Slab(l);
    }

    private static Material material(Checker c, Node n) {
        Node.Obj o = c.object(n, "give {conductivity, volumetricHeatCapacity} or {diffusivity}");
        if (o == null) {
            return null;
        }
        c.allowOnly(o, List.of("conductivity", "volumetricHeatCapacity", "density", "specificHeat", "diffusivity"));
        Map<String, Node> f = o.fields();
        if (f.containsKey("diffusivity")) {
            for (String other : List.of("conductivity", "volumetricHeatCapacity", "density", "specificHeat")) {
                if (f.containsKey(other)) {
                    c.problem(InputException.Cause.INVALID_VALUE, o.keys().get(other), "give either diffusivity alone"
                        + " or conductivity with a heat capacity, not both");
                    return null;
                }
            }
            double alpha = c.positive(f.get("diffusivity"), "diffusivity alpha in m^2/s");
            return Double.isNaN(alpha) ? null : Material.ofDiffusivity(alpha);
        }
        Node kNode = c.required(o, "conductivity", "conductivity k in W/(m K), or give diffusivity alone");
        double k = kNode == null ? Double.NaN : c.positive(kNode, "conductivity k in W/(m K)");
        double rhoC;
        if (f.containsKey("volumetricHeatCapacity")) {
            if (f.containsKey("density") || f.containsKey("specificHeat")) {
                c.problem(InputException.Cause.INVALID_VALUE, o.keys().get(f.containsKey("density") ? "density"
                    : "specificHeat"), "give volumetricHeatCapacity or density with specificHeat, not both");
                return null;
            }
            rhoC = c.positive(f.get("volumetricHeatCapacity"), "rho*c in J/(m^3 K)");
        } else if (f.containsKey("density") || f.containsKey("specificHeat")) {
            Node rho = c.required(o, "density", "density in kg/m^3, with specificHeat in J/(kg K)");
            Node cp = c.required(o, "specificHeat", "specific heat in J/(kg K), with density in kg/m^3");
            if (rho == null || cp == null) {
                return null;
            }
            rhoC = c.positive(rho, "density in kg/m^3") * c.positive(cp, "specific heat in J/(kg K)");
        } else {
            c.problem(InputException.Cause.MISSING, new InputLocation(o.location().file(), o.location().line(),
                o.location().column(), -1, o.location().path() + ".volumetricHeatCapacity"),
                "missing; give volumetricHeatCapacity (J/(m^3 K)) or density and specificHeat");
            return null;
        }
        if (Double.isNaN(k) || Double.isNaN(rhoC)) {
            return null;
        }
        return new Material(k, rhoC);
    }

    private static BoundaryCondition condition(Checker c, Node n, String[] time) {
        Node.Obj o = c.object(n, "give {dirichlet: \"u(t)\"}, {neumann: \"q(t)\"} or {robin: {h: 25, ambient: \"20\"}}");
        if (o == null) {
            return null;
        }
        if (o.fields().size() != 1) {
            c.problem(InputException.Cause.INVALID_VALUE, o.location(), "give exactly one of "
                + String.join(", ", CONDITIONS) + ", found " + (o.fields().isEmpty() ? "none" : o.fields().keySet()));
            return null;
        }
        String type = o.fields().keySet().iterator().next();
        Node value = o.fields().get(type);
        String of = String.join(", ", time);
        switch (type) {
            case "dirichlet": {
                Expression e = c.expression(value, time, "the face temperature is an expression of " + of);
                return e == null ? null : new BoundaryCondition.Dirichlet(e);
            }
            case "neumann": {
                Expression e = c.expression(value, time, "the heat flux into the body (W/m^2) is an expression of " + of);
                return e == null ? null : new BoundaryCondition.Neumann(e);
            }
            case "robin": {
                Node.Obj r = c.object(value, "give {h: W/(m^2 K), ambient: \"u_amb(t)\"}");
                if (r == null) {
                    return null;
                }
                c.allowOnly(r, List.of("h", "ambient"));
                Node h = c.required(r, "h", "the heat transfer coefficient in W/(m^2 K)");
                Node ambient = c.required(r, "ambient", "the ambient temperature, an expression of t");
                double hv = h == null ? Double.NaN : c.positive(h, "the heat transfer coefficient in W/(m^2 K); for an"
                    + " insulated side use neumann: 0");
                Expression a = ambient == null ? null : c.expression(ambient, time, "the ambient temperature is an"
                    + " expression of " + of);
                return Double.isNaN(hv) || a == null ? null : new BoundaryCondition.Robin(hv, a);
            }
            default: {
                String near = Checker.nearest(type, CONDITIONS);
                c.problem(InputException.Cause.UNKNOWN_FIELD, o.keys().get(type), "unknown boundary type \"" + type + "\""
                    + (near != null ? " (did you mean \"" + near + "\"?)" : "") + "; allowed: "
                    + String.join(", ", CONDITIONS));
                return null;
            }
        }
    }
}
