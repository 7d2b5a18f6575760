package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertClose;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;
import org.junit.jupiter.api.Test;

/** The Gauss-Legendre rules behind every projection. */
class GaussLegendreTest {
    @Test
    void fivePointRuleMatchesTheHandbook() {
        // Abramowitz and Stegun, Handbook of Mathematical Functions, table 25.4, n = 5 (values recalled from
        // memory, checked here to 1e-15)
        GaussLegendre g = GaussLegendre.of(5);
        double[] x = {0.9061798459386640, 0.5384693101056831, 0};
        double[] w = {0.2369268850561891, 0.4786286704993665, 0.5688888888888889};
        for (int i = 0; i < 3; i++) {
            assertClose(x[i], g.nodes[i], 1e-15, "node " + i);
            assertClose(-x[i], g.nodes[4 - i], 1e-15, "mirrored node " + i);
            assertClose(w[i], g.weights[i], 1e-15, "weight " + i);
        }
    }

    @Test
    void agreesWithCommonsMathsHighPrecisionRule() {
        // Commons Math computes its rule in BigDecimal arithmetic and rounds it once (a reference library)
        for (int n : new int[] {17, 64, 200}) {
            GaussIntegrator reference = new GaussIntegratorFactory().legendreHighPrecision(n, -1, 1);
            GaussLegendre g = GaussLegendre.of(n);
            for (int i = 0; i < n; i++) {
                // our nodes run from +1 down to -1
                assertClose(reference.getPoint(n - 1 - i), g.nodes[i], 4e-16, "n = " + n + ", node " + i);
                assertClose(reference.getWeight(n - 1 - i), g.weights[i], 1e-15, "n = " + n + ", weight " + i);
            }
        }
    }

    @Test
    void largeRulesShareTheirNodesAmongTheCoresAndStayExact() {
        // 3001 and 4000 nodes take the parallel path; x^k integrates to 2/(k + 1) for even k (common practice)
        for (int n : new int[] {1000, 3001, 4000}) {
            GaussLegendre g = GaussLegendre.of(n);
            for (int k = 0; k <= 40; k += 4) {
                double sum = 0;
                for (int i = 0; i < n; i++) {
                    sum += g.weights[i] * Math.pow(g.nodes[i], k);
                }
                assertClose(2.0 / (k + 1), sum, 2e-14, "n = " + n + ", x^" + k);
            }
            for (int i = 1; i < n; i++) {
                assertTrue(g.nodes[i] < g.nodes[i - 1], "n = " + n + ": nodes decrease at " + i);
                assertTrue(g.weights[i] > 0, "n = " + n + ": weight " + i + " positive");
            }
            if (n % 2 == 1) {
                assertClose(0, g.nodes[n / 2], 0, "middle node of an odd rule");
            }
        }
    }
}
