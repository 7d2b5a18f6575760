package eigencheck.oracle.expr;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.apache.commons.math3.analysis.differentiation.DerivativeStructure;
import org.apache.commons.math3.special.Erf;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class ExpressionTest {
    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = ';', value = {
        "1 + 2*3; 7",
        "2^3^2; 512",
        "-2^2; -4",
        "(1 + 2)*3; 9",
        "2^-1; 0.5",
        "1e-3*1000; 1",
        "sin(pi/2) + cos(0); 2",
        "exp(log(5)); 5",
        "sqrt(16) + abs(-3); 7",
        "min(2, 3) + max(2, 3); 5",
        "step(-1) + step(0) + step(2); 1.5",
        "tanh(0) + sinh(0) + cosh(0); 1",
        "e; 2.718281828459045",
    })
    void evaluatesArithmeticAndFunctions(String text, double expected) {
        assertEquals(expected, Expression.parse(text).value(new double[0]), 1e-15 * Math.max(1, Math.abs(expected)), text);
    }

    @Test
    void nonSmoothnessIsTracedToTheVariablesOfTheKinkedArguments() {
        // step(r - a) switches between two formulas in r only: smooth in t; abs(t - 1) has a kink in t
        Expression inR = Expression.parse("step(r - 0.5)*sin(t) + max(r, 0.1)*t^2", "r", "t");
        assertTrue(inR.mayBeNonSmooth());
        assertTrue(inR.mayBeNonSmoothIn("r"));
        assertTrue(!inR.mayBeNonSmoothIn("t"));
        Expression inT = Expression.parse("r^2*exp(-abs(t - 1))", "r", "t");
        assertTrue(inT.mayBeNonSmoothIn("t"));
        assertTrue(!inT.mayBeNonSmoothIn("r"));
        Expression nested = Expression.parse("sin(min(r*t, 2))", "r", "t");
        assertTrue(nested.mayBeNonSmoothIn("r") && nested.mayBeNonSmoothIn("t"));
        assertTrue(!Expression.parse("sin(r*t)", "r", "t").mayBeNonSmoothIn("t"));
    }

    @Test
    void erfMatchesCommonsMath() {
        Expression e = Expression.parse("erf(x) + erfc(x)", "x");
        assertEquals(1.0, e.value(0.7), 1e-15);
        assertEquals(Erf.erf(0.3), Expression.parse("erf(x)", "x").value(0.3), 0.0);
    }

    @ParameterizedTest(name = "\"{0}\"")
    @CsvSource(delimiter = ';', value = {
        "sin(x*; 7; expression ends",
        "sin(x; 4; not closed",
        "2*y; 3; unknown name \"y\"",
        "sinn(x); 1; unknown function \"sinn\"",
        "2 3; 3; unexpected '3'",
        "; 1; empty expression",
        "x +; 4; expression ends",
        "2x; 2; write the multiplication explicitly",
        "min(x); 1; min takes 2 arguments",
        "x); 2; unmatched ')'",
        "sin; 1; needs its argument in parentheses",
        "1 # 2; 3; unexpected '#'",
    })
    void errorsNameTheColumnAndTheFix(String text, int column, String fragment) {
        String source = text == null ? "" : text;
        ExpressionException e = assertThrows(ExpressionException.class, () -> Expression.parse(source, "x", "t"));
        assertEquals(column, e.column(), e.getMessage());
        assertTrue(e.getMessage().contains(fragment), e.getMessage());
    }

    @Test
    void symbolicDerivativesAgreeWithCommonsMathDerivativeStructure() {
        // Reference: forward automatic differentiation on the same tree (Commons Math DerivativeStructure),
        // second order in two variables. Tolerance: 1e-12 relative, the rounding of both evaluations.
        String[] formulas = {
            "sin(3*x + 1) * cos(2*t) + 0.2*t", "exp(-x/0.05) * (1 + t) + x^2", "cosh(x - 0.3) * (1 + t^2)",
            "x^3 - 2*x*t + t^2", "erf(x*t) + erfc(x - t)", "log(2 + x*x) * sqrt(1 + t) / (1 + x)", "tanh(x)*sinh(t)",
            "tan(0.3*x) + x^t", "abs(x - 0.5)*t + min(x, t) + max(x*x, t)"};
        SplittableRandom random = new SplittableRandom(42);
        for (String f : formulas) {
            Expression u = Expression.parse(f, "x", "t");
            Expression ux = u.derivative("x");
            Expression uxx = ux.derivative("x");
            Expression ut = u.derivative("t");
            Expression uxt = ux.derivative("t");
            for (int i = 0; i < 50; i++) {
                double x = 0.05 + 0.9 * random.nextDouble();
                double t = 0.05 + 0.9 * random.nextDouble();
                DerivativeStructure dx = new DerivativeStructure(2, 2, 0, x);
                DerivativeStructure dt = new DerivativeStructure(2, 2, 1, t);
                DerivativeStructure d = u.value(dx, dt);
                check(d.getPartialDerivative(1, 0), ux.value(x, t), f + " d/dx");
                check(d.getPartialDerivative(2, 0), uxx.value(x, t), f + " d2/dx2");
                check(d.getPartialDerivative(0, 1), ut.value(x, t), f + " d/dt");
                check(d.getPartialDerivative(1, 1), uxt.value(x, t), f + " d2/dxdt");
            }
        }
    }

    private static void check(double expected, double actual, String what) {
        assertEquals(expected, actual, 1e-12 * Math.max(1, Math.abs(expected)), what);
    }

    @Test
    void substitutionAndReorderingKeepValues() {
        Expression u = Expression.parse("x*x + 3*t", "x", "t");
        Expression atOne = u.substitute("x", 1.0);
        assertEquals(java.util.List.of("t"), atOne.variables());
        assertEquals(1 + 3 * 2.0, atOne.value(2.0), 0.0);
        Expression swapped = u.over("t", "x");
        assertEquals(u.value(2, 5), swapped.value(5, 2), 0.0);
        assertTrue(Expression.parse("3*t", "x", "t").isIndependentOf("x"));
        Expression reparsed = Expression.parse(u.derivative("x").formula(), "x", "t");
        assertEquals(2 * 0.7, reparsed.value(0.7, 0.1), 1e-15);
    }

    @Test
    void substitutionFoldsTheFixedPartIntoConstants() {
        // a spot's factor along x read off at fixed y and z: the terms of y and z fold to one constant, so the
        // factor prints without them and keeps the value of the whole (common practice: constant folding)
        Expression spot = Expression.parse("1000*exp(-((x-0.5)^2+(y-0.4)^2+(z-0.6)^2)/0.02)", "x", "y", "z");
        Expression f = spot.substitute("y", 0.3).substitute("z", 0.55);
        assertEquals(1000 * Math.exp(-(0.04 + 0.01 + 0.0025) / 0.02), f.value(0.3), 1e-12);
        String printed = f.formula();
        assertTrue(!printed.contains("0.4") && !printed.contains("0.6"), printed);
        // a call of a constant folds too; a parsed formula is left as written
        assertEquals(Math.sin(2.0) * 3, Expression.parse("sin(y)*x", "x", "y").substitute("y", 2).value(3), 1e-15);
        assertTrue(Expression.parse("2*3*x", "x").formula().contains("3"));
    }

    @Test
    void aSumSplitsIntoItsSignedTerms() {
        // a - (b - c) + (-d) reads as the terms a, -b, c, -d (the signs of a sum, common practice); a product or
        // a call is one term; the terms add up to the whole at every point
        Expression e = Expression.parse("x^2 - (3*y - exp(x*y)) + (-sin(y)) + 2", "x", "y");
        java.util.List<Expression> terms = e.terms();
        assertEquals(5, terms.size());
        double[][] points = {{0.3, 0.7}, {1.5, -0.4}};
        double[][] expected = {{0.09, -2.1, Math.exp(0.21), -Math.sin(0.7), 2},
            {2.25, 1.2, Math.exp(-0.6), Math.sin(0.4), 2}};
        for (int p = 0; p < points.length; p++) {
            double sum = 0;
            for (int t = 0; t < terms.size(); t++) {
                double v = terms.get(t).value(points[p]);
                assertEquals(expected[p][t], v, 1e-15, "term " + t);
                sum += v;
            }
            assertEquals(e.value(points[p]), sum, 1e-14);
        }
        assertEquals(1, Expression.parse("x*(y + 1)", "x", "y").terms().size());
    }
}
