package eigencheck.suites.run;

import eigencheck.suites.Suite;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;

/**
 * Runs one level's solver: the command template with the level's values put in, as an argument list
 * (ProcessBuilder, never a shell), in the suite's folder, with stdout and stderr kept in the level's
 * own folder and a timeout. A level whose command, input files and output are unchanged since the
 * last run (SHA-256 of each) is not run again.
 */
public final class LevelRunner {
    /** What happened. */
    public record Outcome(boolean ok, boolean cached, double seconds, Path output, String message) {
    }

    private LevelRunner() {
    }

    public static Outcome run(Suite suite, Suite.Case c, Suite.Level level, Path levelDir) {
        try {
            Files.createDirectories(levelDir);
        } catch (IOException e) {
            return new Outcome(false, false, 0, null, "cannot create " + levelDir + ": " + e.getMessage());
        }
        if (c.solver() == null) {
            Path out = level.output();
            if (out == null || !Files.isRegularFile(out)) {
                return new Outcome(false, false, 0, out, "the level's output " + out + " does not exist");
            }
            return new Outcome(true, true, 0, out, "");
        }
        Path output = levelDir.resolve(c.solver().output()).toAbsolutePath();
        Path problem = c.problemFile();
        if (c.manufactured() != null && c.problem() != null) {
            problem = levelDir.resolve("problem.json").toAbsolutePath();
            try {
                Files.writeString(problem, eigencheck.suites.files.ProblemFile.toJson(c.problem()));
            } catch (IOException e) {
                return new Outcome(false, false, 0, null, "cannot write " + problem + ": " + e.getMessage());
            }
        }
        List<String> args = substitute(c.solver().command(), level, output, levelDir);
        if (problem != null) {
            for (int i = 0; i < args.size(); i++) {
                args.set(i, args.get(i).replace("{problem}", problem.toString()));
            }
        }
        String inputs = inputsHash(suite.directory(), args, c, output);
        Path stamp = levelDir.resolve("inputs.sha256");
        Path outStamp = levelDir.resolve("output.sha256");
        try {
            if (Files.isRegularFile(output) && Files.isRegularFile(stamp) && Files.isRegularFile(outStamp)
                && Files.readString(stamp).equals(inputs) && Files.readString(outStamp).equals(fileHash(output))) {
                return new Outcome(true, true, 0, output, "");
            }
        } catch (IOException e) {
            // rerun
        }
        Path stdout = levelDir.resolve("stdout.txt");
        Path stderr = levelDir.resolve("stderr.txt");
        long start = System.nanoTime();
        try {
            Files.deleteIfExists(output);
            Files.writeString(levelDir.resolve("command.txt"), String.join("\n", args) + "\n");
            ProcessBuilder pb = new ProcessBuilder(args).directory(suite.directory().toFile())
                .redirectOutput(stdout.toFile()).redirectError(stderr.toFile());
            Process p = pb.start();
            boolean done = p.waitFor((long) (c.solver().timeoutSeconds() * 1000), TimeUnit.MILLISECONDS);
            double seconds = (System.nanoTime() - start) / 1e9;
            if (!done) {
                p.descendants().forEach(ProcessHandle::destroyForcibly);
                p.destroyForcibly();
                p.waitFor(10, TimeUnit.SECONDS);
                return new Outcome(false, false, seconds, output, "the solver did not finish within "
                    + c.solver().timeoutSeconds() + " s (timeout); log tail:\n" + tail(stdout, stderr));
            }
            if (p.exitValue() != 0) {
                return new Outcome(false, false, seconds, output, "the solver exited with code " + p.exitValue()
                    + "; log tail:\n" + tail(stdout, stderr));
            }
            if (!Files.isRegularFile(output) || Files.size(output) == 0) {
                return new Outcome(false, false, seconds, output, "the solver wrote nothing to " + output
                    + "; log tail:\n" + tail(stdout, stderr));
            }
            Files.writeString(stamp, inputs);
            Files.writeString(outStamp, fileHash(output));
            return new Outcome(true, false, seconds, output, "");
        } catch (IOException e) {
            return new Outcome(false, false, (System.nanoTime() - start) / 1e9, output, "cannot start the solver "
                + args.get(0) + " (" + e.getMessage() + "); check the command");
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return new Outcome(false, false, 0, output, "interrupted");
        }
    }

    /** The command with {name} placeholders replaced by the level's values. */
    public static List<String> substitute(List<String> command, Suite.Level level, Path output, Path levelDir) {
        Map<String, String> values = new java.util.LinkedHashMap<>(level.values());
        values.put("output", output.toString());
        values.put("level", Integer.toString(level.index()));
        values.put("dir", levelDir.toAbsolutePath().toString());
        values.putIfAbsent("cellSize", Double.toString(level.cellSize()));
        if (level.cells() != null) {
            values.put("cells", Integer.toString(level.cells()));
        }
        if (!Double.isNaN(level.timeStep())) {
            values.put("timeStep", Double.toString(level.timeStep()));
        }
        List<String> out = new ArrayList<>();
        for (String a : command) {
            String s = a;
            for (Map.Entry<String, String> e : values.entrySet()) {
                s = s.replace("{" + e.getKey() + "}", e.getValue());
            }
            out.add(s);
        }
        return out;
    }

    /** SHA-256 of the arguments, the files they name (not the output) and the problem file. */
    private static String inputsHash(Path dir, List<String> args, Suite.Case c, Path output) {
        try {
            MessageDigest d = MessageDigest.getInstance("SHA-256");
            for (String a : args) {
                d.update(a.getBytes(StandardCharsets.UTF_8));
                d.update((byte) 0);
                if (a.contains(output.toString())) {
                    continue;
                }
                if (a.endsWith("problem.json") && c.problem() != null && c.manufactured() != null) {
                    d.update(eigencheck.suites.files.ProblemFile.toJson(c.problem()).getBytes(StandardCharsets.UTF_8));
                    continue;
                }
                try {
                    Path p = dir.resolve(a);
                    if (Files.isRegularFile(p) && Files.size(p) < (64 << 20)) {
                        d.update(Files.readAllBytes(p));
                    }
                } catch (IOException | java.nio.file.InvalidPathException e) {
                    // not a file
                }
            }
            if (c.problemFile() != null && Files.isRegularFile(c.problemFile())) {
                d.update(Files.readAllBytes(c.problemFile()));
            }
            return HexFormat.of().formatHex(d.digest());
        } catch (NoSuchAlgorithmException | IOException e) {
            return "unhashable-" + System.nanoTime();
        }
    }

    private static String fileHash(Path p) throws IOException {
        try {
            MessageDigest d = MessageDigest.getInstance("SHA-256");
            return HexFormat.of().formatHex(d.digest(Files.readAllBytes(p)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }

    private static String tail(Path stdout, Path stderr) {
        StringBuilder b = new StringBuilder();
        for (Path p : new Path[] {stdout, stderr}) {
            try {
                List<String> lines = Files.readAllLines(p, StandardCharsets.UTF_8);
                for (int i = Math.max(0, lines.size() - 12); i < lines.size(); i++) {
                    b.append("  ").append(p.getFileName()).append(": ").append(lines.get(i)).append('\n');
                }
            } catch (IOException e) {
                // no log
            }
        }
        return b.length() == 0 ? "  (the solver printed nothing)" : b.toString();
    }
}
