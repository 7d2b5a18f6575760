package eigencheck.adapters;

import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Robustness: for every sample file, at least 10,000 mutations (truncation at every position class,
 * flipped bytes, deleted and duplicated lines, swapped columns, NaN inserted, random insertions), each
 * of which must end as a correct read or an {@link InputException}: no other exception, no hang.
 */
class MutationTest {
    private static final int MUTATIONS = 10_000;

    static Stream<Arguments> samples() throws IOException {
        RoundTripTest writers = new RoundTripTest();
        List<Arguments> list = new ArrayList<>();
        for (String name : new String[] {"slab-two-times.csv", "plate.json", "unstructured-ascii.vtk",
            "structured-points.vtk", "rectilinear.vtk", "structured-grid.vtk", "polydata.vtk", "line.vtu", "series.pvd"}) {
            Path p = SampleFilesTest.sample(name);
            list.add(Arguments.of(name, p, Files.readAllBytes(p), ReadOptions.defaults()));
        }
        Path other = SampleFilesTest.sample("other-layout.json");
        list.add(Arguments.of("other-layout.json (pointers)", other, Files.readAllBytes(other),
            ReadOptions.defaults().withPointers(Map.of("x", "/mesh/nodes/x", "values", "/solution/fields/0/data",
                "time", "/meta/t"))));
        list.add(Arguments.of("binary.vtk", Path.of("binary.vtk"), writers.legacyBinary(), ReadOptions.defaults()));
        for (RoundTripTest.Encoding e : new RoundTripTest.Encoding[] {RoundTripTest.Encoding.BASE64_UINT64,
            RoundTripTest.Encoding.ZLIB_UINT32, RoundTripTest.Encoding.APPENDED_RAW, RoundTripTest.Encoding.APPENDED_ZLIB}) {
            list.add(Arguments.of(e + ".vtu", Path.of(e + ".vtu"), writers.vtu(e), ReadOptions.defaults()));
        }
        return list.stream();
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("samples")
    void everyMutationEndsAsAReadOrAnInputException(String name, Path path, byte[] original, ReadOptions options) {
        List<Mutation> mutations = mutations(original, name.hashCode());
        assertTrue(mutations.size() >= MUTATIONS, name + ": only " + mutations.size() + " mutations");
        int[] outcomes = new int[2];
        assertTimeoutPreemptively(Duration.ofSeconds(240), () -> {
            for (Mutation m : mutations) {
                try {
                    Readers.read(path, m.bytes, options);
                    outcomes[0]++;
                } catch (InputException e) {
                    outcomes[1]++;
                    if (e.getMessage() == null || e.getMessage().isBlank()) {
                        fail(name + ", " + m.description + ": an empty message");
                    }
                } catch (Throwable t) {
                    fail(name + ", " + m.description + ": " + t, t);
                }
            }
        }, name + ": a mutation hung");
        assertTrue(outcomes[1] > 0, name + ": no mutation was rejected; the check cannot fail");
    }

    record Mutation(String description, byte[] bytes) {
    }

    static List<Mutation> mutations(byte[] b, long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        List<Mutation> out = new ArrayList<>();
        // truncation at every position (classes: inside tokens, at separators, at line ends)
        int step = Math.max(1, b.length / 3000);
        for (int i = 0; i < b.length; i += step) {
            out.add(new Mutation("truncated at " + i, Arrays.copyOf(b, i)));
        }
        List<int[]> lines = lines(b);
        while (out.size() < MUTATIONS + 200) {
            int kind = r.nextInt(8);
            byte[] m;
            String d;
            switch (kind) {
                case 0 -> {
                    int at = r.nextInt(b.length);
                    m = b.clone();
                    m[at] = (byte) r.nextInt(256);
                    d = "byte " + at + " set to " + (m[at] & 0xff);
                }
                case 1 -> {
                    int at = r.nextInt(b.length);
                    m = b.clone();
                    m[at] ^= (byte) (1 << r.nextInt(8));
                    d = "bit flipped in byte " + at;
                }
                case 2 -> {
                    int[] l = lines.get(r.nextInt(lines.size()));
                    m = concat(Arrays.copyOf(b, l[0]), Arrays.copyOfRange(b, l[1], b.length));
                    d = "line at " + l[0] + " deleted";
                }
                case 3 -> {
                    int[] l = lines.get(r.nextInt(lines.size()));
                    m = concat(Arrays.copyOf(b, l[1]), Arrays.copyOfRange(b, l[0], b.length));
                    d = "line at " + l[0] + " duplicated";
                }
                case 4 -> {
                    int[] l = lines.get(r.nextInt(lines.size()));
                    m = swapTokens(b, l, r);
                    d = "two columns swapped in the line at " + l[0];
                }
                case 5 -> {
                    m = replaceNumber(b, r, r.nextBoolean() ? "NaN" : "nan");
                    d = "a number replaced by NaN";
                }
                case 6 -> {
                    m = replaceNumber(b, r, r.nextBoolean() ? "1e308" : "-99999999999");
                    d = "a number replaced by a huge one";
                }
                default -> {
                    int at = r.nextInt(b.length + 1);
                    byte[] junk = new byte[1 + r.nextInt(8)];
                    for (int k = 0; k < junk.length; k++) {
                        junk[k] = (byte) r.nextInt(256);
                    }
                    m = concat(concat(Arrays.copyOf(b, at), junk), Arrays.copyOfRange(b, at, b.length));
                    d = junk.length + " random bytes inserted at " + at;
                }
            }
            out.add(new Mutation(d, m));
        }
        return out;
    }

    private static List<int[]> lines(byte[] b) {
        List<int[]> l = new ArrayList<>();
        int start = 0;
        for (int i = 0; i < b.length; i++) {
            if (b[i] == '\n') {
                l.add(new int[] {start, i + 1});
                start = i + 1;
            }
        }
        if (start < b.length) {
            l.add(new int[] {start, b.length});
        }
        return l;
    }

    private static byte[] concat(byte[] a, byte[] c) {
        byte[] r = Arrays.copyOf(a, a.length + c.length);
        System.arraycopy(c, 0, r, a.length, c.length);
        return r;
    }

    private static byte[] swapTokens(byte[] b, int[] line, SplittableRandom r) {
        String text = new String(b, line[0], line[1] - line[0], StandardCharsets.ISO_8859_1);
        String[] parts = text.split("(?<=[,\\s])|(?=[,\\s])");
        List<Integer> tokens = new ArrayList<>();
        for (int i = 0; i < parts.length; i++) {
            if (!parts[i].isBlank() && !parts[i].equals(",")) {
                tokens.add(i);
            }
        }
        if (tokens.size() < 2) {
            return b.clone();
        }
        int i = tokens.get(r.nextInt(tokens.size()));
        int j = tokens.get(r.nextInt(tokens.size()));
        String t = parts[i];
        parts[i] = parts[j];
        parts[j] = t;
        byte[] swapped = String.join("", parts).getBytes(StandardCharsets.ISO_8859_1);
        return concat(concat(Arrays.copyOf(b, line[0]), swapped), Arrays.copyOfRange(b, line[1], b.length));
    }

    private static byte[] replaceNumber(byte[] b, SplittableRandom r, String with) {
        List<int[]> numbers = new ArrayList<>();
        int i = 0;
        while (i < b.length) {
            if (Character.isDigit(b[i]) && (i == 0 || !Character.isLetterOrDigit(b[i - 1]))) {
                int s = i;
                while (i < b.length && (Character.isDigit(b[i]) || b[i] == '.' || b[i] == 'e' || b[i] == '-')) {
                    i++;
                }
                numbers.add(new int[] {s, i});
            } else {
                i++;
            }
        }
        if (numbers.isEmpty()) {
            return b.clone();
        }
        int[] n = numbers.get(r.nextInt(numbers.size()));
        return concat(concat(Arrays.copyOf(b, n[0]), with.getBytes(StandardCharsets.ISO_8859_1)),
            Arrays.copyOfRange(b, n[1], b.length));
    }
}
