package org.echotrellis.fit.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestFactory;

/**
 * Lawson–Hanson NNLS against a general-purpose reference library: scipy.optimize.nnls values
 * produced by {@code nnls_reference.py} (committed beside the JSON, which records the Python,
 * NumPy and SciPy versions — SciPy 1.17.1, NumPy 2.4.6, Python 3.11.7). Tolerance 1e-8 absolute
 * (all problems are O(1)). Where A is rank-deficient the minimiser x is not unique, but the fitted
 * vector A·x (the projection of y onto the cone spanned by the columns) and the residual norm are;
 * only those are compared for such problems.
 */
class NnlsReferenceTest {

    private static final double TOL = 1e-8;

    private static JsonNode reference() throws IOException {
        try (InputStream in = NnlsReferenceTest.class.getResourceAsStream("nnls_reference.json")) {
            return new ObjectMapper().readTree(in);
        }
    }

    @Test
    void referenceCoversTwentyProblemsIncludingRankDeficient() throws IOException {
        JsonNode problems = reference().get("problems");
        int deficient = 0;
        for (JsonNode p : problems) {
            if (p.get("rank").asInt() < p.get("n").asInt()) {
                deficient++;
            }
        }
        assertTrue(problems.size() >= 20, "problems: " + problems.size());
        assertTrue(deficient >= 5, "rank-deficient problems: " + deficient);
    }

    @TestFactory
    List<DynamicTest> matchesScipy() throws IOException {
        List<DynamicTest> tests = new ArrayList<>();
        Nnls solver = new Nnls();   // one solver reused across problems: workspaces must not leak state
        for (JsonNode p : reference().get("problems")) {
            tests.add(DynamicTest.dynamicTest(p.get("name").asText(), () -> check(solver, p)));
        }
        return tests;
    }

    private static void check(Nnls solver, JsonNode p) {
        int m = p.get("m").asInt();
        int n = p.get("n").asInt();
        double[] a = new double[m * n];
        for (int i = 0; i < m; i++) {
            for (int j = 0; j < n; j++) {
                a[j * m + i] = p.get("a").get(i).get(j).asDouble();
            }
        }
        double[] y = vector(p.get("y"));
        double[] x = new double[n];
        assertEquals(Nnls.CONVERGED, solver.solve(a, m, n, y, x));
        double[] fitted = new double[m];
        double rss = Gram.residual(a, m, n, x, y, 0, fitted);
        for (int j = 0; j < n; j++) {
            assertTrue(x[j] >= 0, "x[" + j + "] = " + x[j]);
        }
        // scipy.optimize.nnls residual norm and fitted vector (nnls_reference.json), 1e-8 absolute
        assertEquals(p.get("rnorm").asDouble(), Math.sqrt(rss), TOL, "residual norm");
        double[] fittedRef = vector(p.get("fitted"));
        for (int i = 0; i < m; i++) {
            assertEquals(fittedRef[i], fitted[i], TOL, "fitted[" + i + "]");
        }
        if (p.get("unique_x").asBoolean()) {
            // scipy.optimize.nnls solution x (nnls_reference.json), 1e-8 absolute
            double[] xRef = vector(p.get("x"));
            for (int j = 0; j < n; j++) {
                assertEquals(xRef[j], x[j], TOL, "x[" + j + "]");
            }
        }
    }

    private static double[] vector(JsonNode node) {
        double[] v = new double[node.size()];
        for (int i = 0; i < v.length; i++) {
            v[i] = node.get(i).asDouble();
        }
        return v;
    }
}
