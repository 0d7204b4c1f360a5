package dev.cairn.tables;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.gravity.PolyhedronField;
import dev.cairn.io.InputException;
import dev.cairn.mesh.Shapes;
import dev.cairn.util.ProgressListener;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Checkpointed runs: an interrupted and resumed run, and shards merged, give byte-identical data files. */
class TableJobTest {
    @TempDir
    Path dir;

    private final PolyhedronField body = new PolyhedronField(Shapes.icosphere(2, 1000), 2000);
    private final TableLayout layout = new TableLayout(
        BoxGrid.ofSpacing(new double[] {-1500, 1500, -1200, 1200, -900, 900}, new double[] {300, 300, 300}),
        true, false, false, 0, new double[] {0, 0, 1}, new double[3]);
    private static final int CHUNK = 97; // not a divisor of the node count: the last chunk is short

    private TableBuilder.Outcome run(Path out, String fmt, boolean resume, int shard, int shards, int threads,
                                     int stopAfter) {
        AtomicInteger chunks = new AtomicInteger();
        return TableBuilder.build(new TableBuilder.Request(body, layout, out, fmt, CHUNK, resume, shard, shards,
            threads, Map.of("file", "icosphere"), "test"), ProgressListener.NONE,
            () -> stopAfter > 0 && chunks.incrementAndGet() >= stopAfter, "2026-01-01T00:00:0" + (resume ? 1 : 0) + "Z");
    }

    @Test
    void resumedRunIsByteIdenticalToSingleRun() throws IOException {
        for (String fmt : new String[] {TableFiles.NPY, TableFiles.CSV}) {
            Path single = dir.resolve("single." + fmt);
            assertTrue(run(single, fmt, false, 0, 0, 2, 0).complete());
            Path resumed = dir.resolve("resumed." + fmt);
            TableBuilder.Outcome first = run(resumed, fmt, false, 0, 0, 1, 3);
            assertFalse(first.complete(), "the run must stop after 3 chunks");
            assertFalse(Files.exists(resumed), "no output before the table is complete");
            TableBuilder.Outcome second = run(resumed, fmt, true, 0, 0, 2, 0);
            assertTrue(second.complete());
            assertEquals(3, second.job().chunksReused());
            assertArrayEquals(Files.readAllBytes(single), Files.readAllBytes(resumed), fmt);
            assertFalse(Files.exists(TableJob.workDir(resumed)), "checkpoints are removed once the table is written");
            assertEquals("2026-01-01T00:00:00Z", second.metadata().get("created_utc"),
                "creation time is the first start's");
        }
    }

    @Test
    void resumeOfAnotherTableIsRefused() {
        Path out = dir.resolve("x.npy");
        run(out, TableFiles.NPY, false, 0, 0, 1, 2);
        TableLayout other = new TableLayout(layout.grid(), false, false, false, 0, new double[] {0, 0, 1}, new double[3]);
        InputException e = assertThrows(InputException.class, () -> TableBuilder.build(new TableBuilder.Request(body,
            other, out, TableFiles.NPY, CHUNK, true, 0, 0, 1, Map.of("file", "icosphere"), "test"),
            ProgressListener.NONE, () -> false, "t"));
        assertTrue(e.getMessage().contains("different table"), e.getMessage());
        InputException none = assertThrows(InputException.class, () -> run(dir.resolve("never.npy"), TableFiles.NPY,
            true, 0, 0, 1, 0));
        assertTrue(none.getMessage().contains("no interrupted run"), none.getMessage());
    }

    @Test
    void shardsMergeIntoByteIdenticalFile() throws IOException {
        Path single = dir.resolve("single.npy");
        run(single, TableFiles.NPY, false, 0, 0, 1, 0);
        Path singleCsv = dir.resolve("single.csv");
        run(singleCsv, TableFiles.CSV, false, 0, 0, 1, 0);
        int n = 3;
        List<Path> shards = new ArrayList<>();
        for (int i = n; i >= 1; i--) { // any order
            Path s = dir.resolve("part" + i + ".npy");
            assertTrue(run(s, TableFiles.NPY, false, i, n, 2, 0).complete());
            shards.add(s);
        }
        Path merged = dir.resolve("merged.npy");
        TableBuilder.merge(shards, merged, null, "now");
        assertArrayEquals(Files.readAllBytes(single), Files.readAllBytes(merged));
        Path mergedCsv = dir.resolve("merged.csv");
        TableBuilder.merge(shards, mergedCsv, TableFiles.CSV, "now");
        assertArrayEquals(Files.readAllBytes(singleCsv), Files.readAllBytes(mergedCsv));
        InputException missing = assertThrows(InputException.class,
            () -> TableBuilder.merge(shards.subList(0, 2), dir.resolve("m2.npy"), null, "now"));
        assertTrue(missing.getMessage().contains("3 shards"), missing.getMessage());
    }

    @Test
    void shardRangesCoverAllNodesOnce() {
        int nodes = 1001;
        int next = 0;
        for (int i = 1; i <= 7; i++) {
            int[] r = TableJob.shardRange(nodes, i, 7);
            assertEquals(next, r[0]);
            next = r[1];
        }
        assertEquals(nodes, next);
        assertThrows(InputException.class, () -> TableJob.shardRange(nodes, 0, 3));
        assertThrows(InputException.class, () -> TableJob.shardRange(nodes, 4, 3));
    }
}
