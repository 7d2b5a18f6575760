package eigencheck.suites.norms;

import eigencheck.adapters.Cells;
import eigencheck.adapters.DataArray;
import eigencheck.adapters.Field;

/**
 * Error norms of one solver output against a reference:
 * <ul>
 * <li>nodal: max_i |u_h(x_i) - u(x_i)| and rms = sqrt(mean of the squares) over the points;</li>
 * <li>finite-element: the L2 norm sqrt(int (u_h - u)^2) and H1 seminorm sqrt(int |grad u_h - grad u|^2)
 * of the error of the finite-element function that the nodal values define on the solver's own cells
 * (linear, bilinear, trilinear or quadratic interpolation by cell type, isoparametric geometry), by
 * Gauss quadrature with the reference at the quadrature points. On a cell of lower dimension than
 * the space (a line in 3D, a triangle in 3D) the gradient is the tangential one;</li>
 * <li>cell data: errors of the cell values against the exact cell averages (the reference's own exact
 * segment average on lines, quadrature elsewhere): max, rms, and the L2 norm of the piecewise-constant
 * error sqrt(sum |K| e_K^2).</li>
 * </ul>
 * Only cells of the highest dimension present are integrated (boundary lines of a 2D mesh are
 * skipped).
 *
 * @since 0.1
 */
public final class ErrorNorms {
    private ErrorNorms() {
    }

    /**
     * @param location "points" or "cells"
     * @param count points or cells compared
     * @param l2 null when the output has no cells (or for nodal-only comparisons)
     * @param h1semi null when not applicable (no cells, or cell data)
     */
    public record Result(String location, int count, double max, double rms, Double l2, Double h1semi) {
    }

    /** Norms of the point-data array {@code values} (first component). */
    public static Result ofPointData(Field field, DataArray values, Reference reference) {
        return ofPointData(field, values, reference, true);
    }

    /**
     * As {@link #ofPointData(Field, DataArray, Reference)}; with {@code elementNorms} false the L2 and H1
     * norms are not computed (null), so the reference is asked for the nodes alone: a case that rules on
     * nodal norms needs no reference at quadrature points (which may lie closer to a face than the
     * reference certifies).
     */
    public static Result ofPointData(Field field, DataArray values, Reference reference, boolean elementNorms) {
        int n = field.size();
        double[] xyz = xyz(field);
        double[] exact = new double[n];
        reference.evaluate(xyz, exact, null);
        double max = 0;
        double sum = 0;
        for (int i = 0; i < n; i++) {
            double e = values.value(i) - exact[i];
            max = Math.max(max, Math.abs(e));
            sum += e * e;
        }
        double rms = Math.sqrt(sum / n);
        Cells cells = field.cells();
        if (cells == null || topDimension(cells) < 1 || !elementNorms) {
            return new Result("points", n, max, rms, null, null);
        }
        double[] norms = finiteElement(field, values, reference, xyz);
        return new Result("points", n, max, rms, Math.sqrt(norms[0]),
            reference.hasGradient() ? Math.sqrt(norms[1]) : null);
    }

    /** Norms of the cell-data array {@code values} against exact cell averages. */
    public static Result ofCellData(Field field, DataArray values, Reference reference) {
        Cells cells = field.cells();
        int top = topDimension(cells);
        double[] xyz = xyz(field);
        double max = 0;
        double sum = 0;
        double l2 = 0;
        int count = 0;
        for (int c = 0; c < cells.size(); c++) {
            int type = cells.type(c);
            if (Elements.dimension(type) != top) {
                continue;
            }
            double[] average = new double[1];
            double measure = cellAverage(cells, c, xyz, reference, average);
            double e = values.value(c) - average[0];
            max = Math.max(max, Math.abs(e));
            sum += e * e;
            l2 += measure * e * e;
            count++;
        }
        return new Result("cells", count, max, Math.sqrt(sum / Math.max(1, count)), Math.sqrt(l2), null);
    }

    private static double[] xyz(Field f) {
        int n = f.size();
        double[] xyz = new double[3 * n];
        for (int i = 0; i < n; i++) {
            for (int a = 0; a < f.dimension(); a++) {
                xyz[3 * i + a] = f.coordinate(i, a);
            }
        }
        return xyz;
    }

    static int topDimension(Cells cells) {
        int top = -1;
        for (int c = 0; c < cells.size(); c++) {
            top = Math.max(top, Elements.dimension(cells.type(c)));
        }
        return top;
    }

    /** {int e^2, int |grad e|^2} over the cells of top dimension. */
    private static double[] finiteElement(Field field, DataArray values, Reference reference, double[] xyz) {
        Cells cells = field.cells();
        int top = topDimension(cells);
        // gather all quadrature points first, then one bulk evaluation of the reference
        int total = 0;
        for (int c = 0; c < cells.size(); c++) {
            if (Elements.dimension(cells.type(c)) == top) {
                total += Elements.rule(cells.type(c)).size();
            }
        }
        double[] qp = new double[3 * total];
        double[] qw = new double[total]; // weight times measure
        double[] uh = new double[total];
        double[] duh = new double[3 * total]; // reference-coordinate gradient of u_h (top entries)
        double[] jac = new double[9 * total]; // J (3 x top), row-major
        int k = 0;
        double[] nodesXyz = new double[3 * 27];
        double[] nodeValues = new double[27];
        for (int c = 0; c < cells.size(); c++) {
            int type = cells.type(c);
            if (Elements.dimension(type) != top) {
                continue;
            }
            int count = cells.nodeCount(c);
            int[] order = Elements.order(type, count);
            for (int i = 0; i < count; i++) {
                int node = cells.node(c, order[i]);
                for (int a = 0; a < 3; a++) {
                    nodesXyz[3 * i + a] = xyz[3 * node + a];
                }
                nodeValues[i] = values.value(node);
            }
            Elements.Rule rule = Elements.rule(type);
            double[] n = new double[count];
            double[] g = new double[count * top];
            double[] j = new double[9];
            for (int q = 0; q < rule.size(); q++, k++) {
                Elements.shape(type, rule.points(), q * top, n, g);
                java.util.Arrays.fill(j, 0);
                for (int i = 0; i < count; i++) {
                    for (int a = 0; a < 3; a++) {
                        qp[3 * k + a] += n[i] * nodesXyz[3 * i + a];
                        for (int d = 0; d < top; d++) {
                            j[3 * a + d] += nodesXyz[3 * i + a] * g[top * i + d];
                        }
                    }
                    uh[k] += n[i] * nodeValues[i];
                    for (int d = 0; d < top; d++) {
                        duh[3 * k + d] += nodeValues[i] * g[top * i + d];
                    }
                }
                System.arraycopy(j, 0, jac, 9 * k, 9);
                qw[k] = rule.weights()[q] * Math.sqrt(Math.abs(det(gram(j, top), top)));
            }
        }
        double[] u = new double[total];
        double[] du = new double[3 * total];
        reference.evaluate(qp, u, reference.hasGradient() ? du : null);
        double l2 = 0;
        double h1 = 0;
        double[] j = new double[9];
        double[] a = new double[top];
        for (int q = 0; q < total; q++) {
            double e = uh[q] - u[q];
            l2 += qw[q] * e * e;
            System.arraycopy(jac, 9 * q, j, 0, 9);
            // a = grad_ref u_h - J^T grad u; |grad e|^2 = a^T G^{-1} a
            for (int d = 0; d < top; d++) {
                double jt = 0;
                for (int r = 0; r < 3; r++) {
                    jt += j[3 * r + d] * du[3 * q + r];
                }
                a[d] = duh[3 * q + d] - jt;
            }
            double[] gInv = inverse(gram(j, top), top);
            double s = 0;
            for (int d = 0; d < top; d++) {
                for (int f = 0; f < top; f++) {
                    s += a[d] * gInv[top * d + f] * a[f];
                }
            }
            h1 += qw[q] * s;
        }
        return new double[] {l2, h1};
    }

    /** Mean of the reference over cell c into out[0]; returns the cell's measure. */
    private static double cellAverage(Cells cells, int c, double[] xyz, Reference reference, double[] out) {
        int type = cells.type(c);
        int top = Elements.dimension(type);
        int count = cells.nodeCount(c);
        int[] order = Elements.order(type, count);
        if (top == 1) {
            int a = cells.node(c, 0);
            int b = cells.node(c, 1);
            double length = 0;
            for (int d = 0; d < 3; d++) {
                length += Math.pow(xyz[3 * b + d] - xyz[3 * a + d], 2);
            }
            double exact = segment(reference, xyz, a, b);
            if (!Double.isNaN(exact)) {
                out[0] = exact;
                return Math.sqrt(length);
            }
        }
        if (top >= 2) {
            double[] box = axisAlignedBox(cells, c, xyz, top);
            if (box != null) {
                double exact = reference.boxAverage(java.util.Arrays.copyOf(box, 3), java.util.Arrays.copyOfRange(box, 3, 6));
                if (!Double.isNaN(exact)) {
                    out[0] = exact;
                    return box[6];
                }
            }
        }
        Elements.Rule rule = Elements.rule(type);
        double[] n = new double[count];
        double[] g = new double[count * top];
        double[] qp = new double[3 * rule.size()];
        double[] w = new double[rule.size()];
        double[] j = new double[9];
        for (int q = 0; q < rule.size(); q++) {
            Elements.shape(type, rule.points(), q * top, n, g);
            java.util.Arrays.fill(j, 0);
            for (int i = 0; i < count; i++) {
                int node = cells.node(c, order[i]);
                for (int a = 0; a < 3; a++) {
                    qp[3 * q + a] += n[i] * xyz[3 * node + a];
                    for (int d = 0; d < top; d++) {
                        j[3 * a + d] += xyz[3 * node + a] * g[top * i + d];
                    }
                }
            }
            w[q] = rule.weights()[q] * Math.sqrt(Math.abs(det(gram(j, top), top)));
        }
        double[] u = new double[rule.size()];
        reference.evaluate(qp, u, null);
        double measure = 0;
        double integral = 0;
        for (int q = 0; q < u.length; q++) {
            measure += w[q];
            integral += w[q] * u[q];
        }
        out[0] = integral / measure;
        return measure;
    }

    /**
     * {lo x, y, z, hi x, y, z, measure} of a quadrilateral (top 2, in a plane z = const) or hexahedral
     * cell (top 3) whose corners are exactly those of an axis-aligned box, else null.
     */
    private static double[] axisAlignedBox(Cells cells, int c, double[] xyz, int top) {
        int corners = top == 2 ? 4 : 8;
        if (cells.nodeCount(c) < corners) {
            return null;
        }
        double[] lo = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY};
        double[] hi = {Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY};
        for (int i = 0; i < corners; i++) {
            int node = cells.node(c, i);
            for (int d = 0; d < 3; d++) {
                lo[d] = Math.min(lo[d], xyz[3 * node + d]);
                hi[d] = Math.max(hi[d], xyz[3 * node + d]);
            }
        }
        for (int i = 0; i < corners; i++) {
            int node = cells.node(c, i);
            for (int d = 0; d < top; d++) {
                double v = xyz[3 * node + d];
                if (v != lo[d] && v != hi[d]) {
                    return null;
                }
            }
            if (top == 2 && xyz[3 * node + 2] != lo[2]) {
                return null;
            }
        }
        double measure = 1;
        for (int d = 0; d < top; d++) {
            if (!(hi[d] > lo[d])) {
                return null;
            }
            measure *= hi[d] - lo[d];
        }
        return new double[] {lo[0], lo[1], lo[2], hi[0], hi[1], hi[2], measure};
    }

    /** The exact segment average when the segment lies along the reference's axis. */
    private static double segment(Reference reference, double[] xyz, int a, int b) {
        for (int axis = 0; axis < 3; axis++) {
            boolean along = true;
            for (int d = 0; d < 3; d++) {
                if (d != axis && xyz[3 * a + d] != xyz[3 * b + d]) {
                    along = false;
                }
            }
            if (along && reference.axis() == axis) {
                return reference.segmentAverage(xyz[3 * a + axis], xyz[3 * b + axis]);
            }
        }
        return Double.NaN;
    }

    private static double[] gram(double[] j, int top) {
        double[] g = new double[top * top];
        for (int d = 0; d < top; d++) {
            for (int f = 0; f < top; f++) {
                double s = 0;
                for (int r = 0; r < 3; r++) {
                    s += j[3 * r + d] * j[3 * r + f];
                }
                g[top * d + f] = s;
            }
        }
        return g;
    }

    private static double det(double[] g, int n) {
        return switch (n) {
            case 1 -> g[0];
            case 2 -> g[0] * g[3] - g[1] * g[2];
            default -> g[0] * (g[4] * g[8] - g[5] * g[7]) - g[1] * (g[3] * g[8] - g[5] * g[6])
                + g[2] * (g[3] * g[7] - g[4] * g[6]);
        };
    }

    private static double[] inverse(double[] g, int n) {
        double d = det(g, n);
        return switch (n) {
            case 1 -> new double[] {1 / g[0]};
            case 2 -> new double[] {g[3] / d, -g[1] / d, -g[2] / d, g[0] / d};
            default -> new double[] {
                (g[4] * g[8] - g[5] * g[7]) / d, (g[2] * g[7] - g[1] * g[8]) / d, (g[1] * g[5] - g[2] * g[4]) / d,
                (g[5] * g[6] - g[3] * g[8]) / d, (g[0] * g[8] - g[2] * g[6]) / d, (g[2] * g[3] - g[0] * g[5]) / d,
                (g[3] * g[7] - g[4] * g[6]) / d, (g[1] * g[6] - g[0] * g[7]) / d, (g[0] * g[4] - g[1] * g[3]) / d};
        };
    }
}
