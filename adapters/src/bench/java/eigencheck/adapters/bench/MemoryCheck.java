package eigencheck.adapters.bench;

import eigencheck.adapters.FieldSeries;
import eigencheck.adapters.ReadOptions;
import eigencheck.adapters.Readers;
import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Peak heap while reading the 10^6-point files, against the raw array size (4 arrays of 10^6
 * doubles = 32 MB). Run with a small young generation so that the peak shows live data rather than
 * uncollected garbage:
 * <pre>mvn -q -pl adapters -Pbenchmark test-compile exec:exec -Dbench.main=eigencheck.adapters.bench.MemoryCheck \
 *   -Dbench.jvm="-XX:+UseSerialGC -Xmn16m -Xmx1g"</pre>
 */
public final class MemoryCheck {
    private MemoryCheck() {
    }

    public static void main(String[] args) throws Exception {
        Path dir = Files.createTempDirectory("eigencheck-mem");
        Path csv = BenchFiles.csv(dir);
        Path vtu = BenchFiles.vtu(dir);
        for (Path p : new Path[] {csv, vtu, csv, vtu}) {
            System.gc();
            long base = heapUsed();
            for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
                pool.resetPeakUsage();
            }
            long start = System.nanoTime();
            FieldSeries s = Readers.read(p, ReadOptions.defaults());
            long ms = (System.nanoTime() - start) / 1_000_000;
            long peak = 0;
            for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
                if (pool.getType() == MemoryType.HEAP) {
                    peak += pool.getPeakUsage().getUsed();
                }
            }
            System.out.printf("%s: %d points in %d ms, peak heap above baseline %.1f MB = %.2f x the raw %d MB%n",
                p.getFileName(), s.fields().get(0).size(), ms, (peak - base) / 1e6,
                (peak - base) / (double) BenchFiles.RAW_BYTES, BenchFiles.RAW_BYTES / 1_000_000);
        }
        Files.delete(csv);
        Files.delete(vtu);
        Files.delete(dir);
    }

    private static long heapUsed() {
        long used = 0;
        for (MemoryPoolMXBean pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == MemoryType.HEAP) {
                used += pool.getUsage().getUsed();
            }
        }
        return used;
    }
}
