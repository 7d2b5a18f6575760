package eigencheck.suites.norms;

import eigencheck.adapters.CellType;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;

/**
 * Reference elements of the cell types the norms integrate over: shape functions and their
 * reference gradients, node orders as in the VTK file formats (VTK User's Guide, 11th ed., 2010,
 * figures 19-2 and 19-3), and quadrature rules: Gauss-Legendre products on lines, squares and cubes,
 * and collapsed (Duffy) products on triangles and tetrahedra (Karniadakis and Sherwin, <i>Spectral/hp
 * Element Methods</i>, 2nd ed., Oxford, 2005, section 4.1).
 */
final class Elements {
    /** Points per direction: exact for polynomials of degree 15, ample for smooth error integrands. */
    static final int ORDER = 8;
    private static final GaussIntegrator GL = new GaussIntegratorFactory().legendre(ORDER);

    private Elements() {
    }

    /** Quadrature on a reference element: points (dim per point) and weights. */
    record Rule(int dimension, double[] points, double[] weights) {
        int size() {
            return weights.length;
        }
    }

    /** Reference dimension of a cell type the norms handle, or -1 for the others. */
    static int dimension(int vtkType) {
        CellType t = CellType.of(vtkType);
        if (t == null) {
            return -1;
        }
        return switch (t) {
            case LINE, QUADRATIC_EDGE -> 1;
            case TRIANGLE, QUADRATIC_TRIANGLE, QUAD, PIXEL -> 2;
            case TETRA, HEXAHEDRON, VOXEL -> 3;
            default -> -1;
        };
    }

    static Rule rule(int vtkType) {
        CellType t = CellType.of(vtkType);
        int m = GL.getNumberOfPoints();
        switch (t) {
            case LINE, QUADRATIC_EDGE -> {
                double[] p = new double[m];
                double[] w = new double[m];
                for (int i = 0; i < m; i++) {
                    p[i] = GL.getPoint(i);
                    w[i] = GL.getWeight(i);
                }
                return new Rule(1, p, w);
            }
            case QUAD, PIXEL -> {
                double[] p = new double[2 * m * m];
                double[] w = new double[m * m];
                int k = 0;
                for (int i = 0; i < m; i++) {
                    for (int j = 0; j < m; j++) {
                        p[2 * k] = GL.getPoint(i);
                        p[2 * k + 1] = GL.getPoint(j);
                        w[k++] = GL.getWeight(i) * GL.getWeight(j);
                    }
                }
                return new Rule(2, p, w);
            }
            case TRIANGLE, QUADRATIC_TRIANGLE -> {
                // (a, b) in [0,1]^2 -> r = a, s = b (1 - a), Jacobian (1 - a)
                double[] p = new double[2 * m * m];
                double[] w = new double[m * m];
                int k = 0;
                for (int i = 0; i < m; i++) {
                    double a = 0.5 * (GL.getPoint(i) + 1);
                    for (int j = 0; j < m; j++) {
                        double b = 0.5 * (GL.getPoint(j) + 1);
                        p[2 * k] = a;
                        p[2 * k + 1] = b * (1 - a);
                        w[k++] = 0.25 * GL.getWeight(i) * GL.getWeight(j) * (1 - a);
                    }
                }
                return new Rule(2, p, w);
            }
            case HEXAHEDRON, VOXEL -> {
                double[] p = new double[3 * m * m * m];
                double[] w = new double[m * m * m];
                int k = 0;
                for (int i = 0; i < m; i++) {
                    for (int j = 0; j < m; j++) {
                        for (int l = 0; l < m; l++) {
                            p[3 * k] = GL.getPoint(i);
                            p[3 * k + 1] = GL.getPoint(j);
                            p[3 * k + 2] = GL.getPoint(l);
                            w[k++] = GL.getWeight(i) * GL.getWeight(j) * GL.getWeight(l);
                        }
                    }
                }
                return new Rule(3, p, w);
            }
            case TETRA -> {
                // r = a, s = b (1 - a), u = c (1 - a)(1 - b); Jacobian (1 - a)^2 (1 - b)
                double[] p = new double[3 * m * m * m];
                double[] w = new double[m * m * m];
                int k = 0;
                for (int i = 0; i < m; i++) {
                    double a = 0.5 * (GL.getPoint(i) + 1);
                    for (int j = 0; j < m; j++) {
                        double b = 0.5 * (GL.getPoint(j) + 1);
                        for (int l = 0; l < m; l++) {
                            double c = 0.5 * (GL.getPoint(l) + 1);
                            p[3 * k] = a;
                            p[3 * k + 1] = b * (1 - a);
                            p[3 * k + 2] = c * (1 - a) * (1 - b);
                            w[k++] = 0.125 * GL.getWeight(i) * GL.getWeight(j) * GL.getWeight(l) * (1 - a) * (1 - a)
                                * (1 - b);
                        }
                    }
                }
                return new Rule(3, p, w);
            }
            default -> throw new IllegalArgumentException("no quadrature for cell type " + vtkType);
        }
    }

    /**
     * Shape functions N_i and reference gradients dN_i/dr_a at the reference point p (dimension
     * entries from {@code p[offset]}); n nodes; gradient flat, node-major.
     */
    static void shape(int vtkType, double[] p, int offset, double[] n, double[] grad) {
        CellType t = CellType.of(vtkType);
        switch (t) {
            case LINE -> {
                double x = p[offset];
                n[0] = 0.5 * (1 - x);
                n[1] = 0.5 * (1 + x);
                grad[0] = -0.5;
                grad[1] = 0.5;
            }
            case QUADRATIC_EDGE -> {
                double x = p[offset];
                n[0] = 0.5 * x * (x - 1);
                n[1] = 0.5 * x * (x + 1);
                n[2] = 1 - x * x;
                grad[0] = x - 0.5;
                grad[1] = x + 0.5;
                grad[2] = -2 * x;
            }
            case TRIANGLE -> {
                double r = p[offset];
                double s = p[offset + 1];
                n[0] = 1 - r - s;
                n[1] = r;
                n[2] = s;
                grad[0] = -1;
                grad[1] = -1;
                grad[2] = 1;
                grad[3] = 0;
                grad[4] = 0;
                grad[5] = 1;
            }
            case QUADRATIC_TRIANGLE -> {
                double r = p[offset];
                double s = p[offset + 1];
                double l0 = 1 - r - s;
                // vertices 0 1 2, then mid-edges 0-1, 1-2, 2-0
                n[0] = l0 * (2 * l0 - 1);
                n[1] = r * (2 * r - 1);
                n[2] = s * (2 * s - 1);
                n[3] = 4 * l0 * r;
                n[4] = 4 * r * s;
                n[5] = 4 * s * l0;
                double[] g = {1 - 4 * l0, 1 - 4 * l0, 4 * r - 1, 0, 0, 4 * s - 1, 4 * (l0 - r), -4 * r, 4 * s, 4 * r,
                    -4 * s, 4 * (l0 - s)};
                System.arraycopy(g, 0, grad, 0, 12);
            }
            case QUAD, PIXEL -> {
                double x = p[offset];
                double y = p[offset + 1];
                double[] sx = {-1, 1, 1, -1};
                double[] sy = {-1, -1, 1, 1};
                for (int i = 0; i < 4; i++) {
                    n[i] = 0.25 * (1 + sx[i] * x) * (1 + sy[i] * y);
                    grad[2 * i] = 0.25 * sx[i] * (1 + sy[i] * y);
                    grad[2 * i + 1] = 0.25 * sy[i] * (1 + sx[i] * x);
                }
            }
            case TETRA -> {
                double r = p[offset];
                double s = p[offset + 1];
                double u = p[offset + 2];
                n[0] = 1 - r - s - u;
                n[1] = r;
                n[2] = s;
                n[3] = u;
                double[] g = {-1, -1, -1, 1, 0, 0, 0, 1, 0, 0, 0, 1};
                System.arraycopy(g, 0, grad, 0, 12);
            }
            case HEXAHEDRON, VOXEL -> {
                double x = p[offset];
                double y = p[offset + 1];
                double z = p[offset + 2];
                double[] sx = {-1, 1, 1, -1, -1, 1, 1, -1};
                double[] sy = {-1, -1, 1, 1, -1, -1, 1, 1};
                double[] sz = {-1, -1, -1, -1, 1, 1, 1, 1};
                for (int i = 0; i < 8; i++) {
                    n[i] = 0.125 * (1 + sx[i] * x) * (1 + sy[i] * y) * (1 + sz[i] * z);
                    grad[3 * i] = 0.125 * sx[i] * (1 + sy[i] * y) * (1 + sz[i] * z);
                    grad[3 * i + 1] = 0.125 * sy[i] * (1 + sx[i] * x) * (1 + sz[i] * z);
                    grad[3 * i + 2] = 0.125 * sz[i] * (1 + sx[i] * x) * (1 + sy[i] * y);
                }
            }
            default -> throw new IllegalArgumentException("no shape functions for cell type " + vtkType);
        }
    }

    /** Node order of the cell's file nodes in the element's order (pixel and voxel differ from quad and hex). */
    static int[] order(int vtkType, int count) {
        CellType t = CellType.of(vtkType);
        if (t == CellType.PIXEL) {
            return new int[] {0, 1, 3, 2};
        }
        if (t == CellType.VOXEL) {
            return new int[] {0, 1, 3, 2, 4, 5, 7, 6};
        }
        int[] o = new int[count];
        for (int i = 0; i < count; i++) {
            o[i] = i;
        }
        return o;
    }
}
