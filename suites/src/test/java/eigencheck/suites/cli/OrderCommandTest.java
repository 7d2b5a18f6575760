package eigencheck.suites.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class OrderCommandTest {
    @Test
    void printsCelik2008Table1Column3AsJson(@TempDir Path dir) throws Exception {
        // Celik et al. (2008), Table 1, column 3 (oscillatory): p = 1.51, phi_ext = 6.0269, e_a = 0.7 %,
        // e_ext = 0.4 %, GCI_fine = 0.5 %; h chosen so that r21 = 2.0 and r32 = 2.143
        Path table = dir.resolve("t.csv");
        Files.writeString(table, "# three grids, finest first\nh,value\n1,6.0042\n2,5.9624\n4.286,6.0909\n");
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(new String[] {"order", "--table", table.toString(), "--json"}, new PrintWriter(out, true),
            new PrintWriter(err, true));
        assertEquals(0, code, err.toString());
        JsonNode j = new ObjectMapper().readTree(out.toString());
        assertEquals(1.51, j.get("order").asDouble(), 0.005);
        assertEquals(6.0269, j.get("extrapolated").asDouble(), 0.00005);
        assertEquals(0.007, j.get("approxRelError").asDouble(), 0.0005);
        assertEquals(0.004, j.get("extrapRelError").asDouble(), 0.0005);
        assertEquals(0.005, j.get("gciFine").asDouble(), 0.0005);
        assertEquals("oscillatory", j.get("convergence").asText());
        assertTrue(j.has("asymptoticRatio"));
        Files.writeString(table, "h,value\n1,6.0\n2,x\n");
        int bad = Main.run(new String[] {"order", "--table", table.toString()}, new PrintWriter(out, true),
            new PrintWriter(err, true));
        assertEquals(2, bad);
        assertTrue(err.toString().contains("t.csv:3:2: column \"value\": \"x\" is not a number"), err.toString());
    }
}
