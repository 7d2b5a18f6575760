package eigencheck.suites.cli;

import eigencheck.adapters.InputException;
import eigencheck.oracle.OracleException;
import java.io.PrintWriter;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * The {@code eigencheck} command line. Exit codes: 0 all good, 1 a check failed or the oracle refused
 * a value it cannot certify, 2 bad input or usage (the message names the file, line or field, and
 * what to do). No stack trace reaches the user.
 */
@Command(name = "eigencheck", mixinStandardHelpOptions = true, version = "eigencheck 0.1.0",
    description = "Certified reference solutions of the linear diffusion equation and convergence evidence"
        + " for heat-conduction solvers.",
    subcommands = {RunCommand.class, EvalCommand.class, CompareCommand.class, OrderCommand.class,
        CommandLine.HelpCommand.class})
public final class Main implements Runnable {
    /** Exit code when every check passed. */
    public static final int OK = 0;
    /** Exit code when a check failed or a value could not be certified. */
    public static final int FAILED = 1;
    /** Exit code for bad input or usage. */
    public static final int BAD_INPUT = 2;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        throw new CommandLine.ParameterException(spec.commandLine(), "name a command: run, eval, compare or order (see eigencheck --help)");
    }

    public static void main(String[] args) {
        System.exit(run(args, new PrintWriter(System.out, true), new PrintWriter(System.err, true)));
    }

    /** Runs the command line with the given streams; returns the exit code. */
    public static int run(String[] args, PrintWriter out, PrintWriter err) {
        CommandLine cl = new CommandLine(new Main());
        cl.setOut(out);
        cl.setErr(err);
        cl.setParameterExceptionHandler((ex, a) -> {
            err.println("eigencheck: " + ex.getMessage());
            err.println("usage: " + ex.getCommandLine().getCommandSpec().qualifiedName()
                + " --help shows the options");
            return BAD_INPUT;
        });
        cl.setExecutionExceptionHandler((ex, commandLine, parseResult) -> {
            if (ex instanceof InputException ie) {
                err.println(ie.getMessage());
                return BAD_INPUT;
            }
            if (ex instanceof OracleException oe) {
                err.println(oe.getMessage());
                return switch (oe.reason()) {
                    case OUTSIDE_DOMAIN, OUTSIDE_TIME_RANGE, DATA_NOT_FINITE, DATA_NOT_RESOLVED, UNSUPPORTED -> BAD_INPUT;
                    default -> FAILED;
                };
            }
            if (ex instanceof IllegalArgumentException iae) {
                err.println("eigencheck: " + iae.getMessage());
                return BAD_INPUT;
            }
            err.println("eigencheck: internal error (" + ex.getClass().getSimpleName() + ": " + ex.getMessage()
                + "); please report it with the command and input files");
            return FAILED;
        });
        return cl.execute(args);
    }
}
