package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.io.InputException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code render --markers}: which rows become markers, and one-line refusals naming file and line (project rule). */
class MarkerPointsTest {
    @TempDir
    Path dir;

    @Test
    void restRowsOfALandingsFileAreMarkers() throws Exception {
        Path f = dir.resolve("landings.csv");
        Files.writeString(f, "sample,outcome,x_m,y_m,z_m\n1,rest,1.5,2,3\n2,escaped,9,9,9\n# note\n3,rest,-4,5e2,6\n");
        assertArrayEquals(new double[] {1.5, 2, 3, -4, 500, 6}, MarkerPoints.read(f), 0.0);
        Path g = dir.resolve("plain.csv");
        Files.writeString(g, "z_m,y_m,x_m\n3,2,1\n");
        assertArrayEquals(new double[] {1, 2, 3}, MarkerPoints.read(g), 0.0);
    }

    @Test
    void badValuesAreRefusedWithFileAndLine() throws Exception {
        String[][] cases = {
            {"x_m,y_m,z_m\n1,2,NaN\n", ":2:"},
            {"x_m,y_m,z_m\n1,2,3\n1,2,abc\n", ":3:"},
            {"x_m,y_m,z_m\n1,2,1e300\n", ":2:"},
            {"x_m,y_m,z_m\n1,2\n", ":2:"},
            {"a,b,c\n1,2,3\n", ":1:"},
            {"", ":1:"}};
        for (String[] c : cases) {
            Path f = dir.resolve("bad.csv");
            Files.writeString(f, c[0]);
            InputException e = assertThrows(InputException.class, () -> MarkerPoints.read(f), c[0]);
            assertTrue(e.getMessage().contains("bad.csv" + c[1]) && !e.getMessage().contains("\n"), e.getMessage());
        }
    }
}
