package eigencheck.suites.cli;

import java.io.PrintWriter;
import java.io.StringWriter;

/** Runs the command line in-process and keeps its exit code and both streams. */
record CliRun(int code, String out, String err) {
    static CliRun of(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new CliRun(code, out.toString(), err.toString());
    }
}
