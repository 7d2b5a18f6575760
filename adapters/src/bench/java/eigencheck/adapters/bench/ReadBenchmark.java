package eigencheck.adapters.bench;

import eigencheck.adapters.FieldSeries;
import eigencheck.adapters.InputException;
import eigencheck.adapters.ReadOptions;
import eigencheck.adapters.Readers;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Reading a 10^6-point field (issue 3 targets: CSV under 1.5 s, binary VTU under 0.5 s on 2 cores).
 *
 * <pre>mvn -q -pl adapters -Pbenchmark test-compile exec:exec -Dbench.args="ReadBenchmark"</pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgs = {"-Xmx2g"})
@Warmup(iterations = 3)
@Measurement(iterations = 5)
public class ReadBenchmark {
    Path dir;
    Path csv;
    Path vtu;

    @Setup(Level.Trial)
    public void write() throws IOException {
        dir = Files.createTempDirectory("eigencheck-bench");
        csv = BenchFiles.csv(dir);
        vtu = BenchFiles.vtu(dir);
    }

    @TearDown(Level.Trial)
    public void delete() throws IOException {
        Files.deleteIfExists(csv);
        Files.deleteIfExists(vtu);
        Files.deleteIfExists(dir);
    }

    @Benchmark
    public FieldSeries csvMillionPoints() throws InputException {
        return Readers.read(csv, ReadOptions.defaults());
    }

    @Benchmark
    public FieldSeries vtuBinaryMillionPoints() throws InputException {
        return Readers.read(vtu, ReadOptions.defaults());
    }
}
