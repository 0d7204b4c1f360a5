package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.io.InputException;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The survey-directory reader: values by column name, zones, and refusal of a survey of another model. */
class SurveyDataTest {
    @TempDir
    Path tmp;

    private final TriangleMesh mesh = Shapes.icosphere(2, 500.0);

    private Path fixture() throws IOException {
        Path obj = SyntheticSurvey.writeObj(mesh, tmp.resolve("body.obj"));
        SyntheticSurvey.write(tmp.resolve("s"), obj, mesh, f -> f * 0.1, f -> f < 5 ? 1 : f < 8 ? 2 : 0);
        return obj;
    }

    @Test
    void readsColumnsByNameInFacetOrder() throws IOException {
        Path obj = fixture();
        SurveyData s = SurveyData.read(tmp.resolve("s"), obj, mesh.facetCount());
        assertEquals(mesh.facetCount(), s.facets());
        double[] slope = s.column("slope_deg");
        for (int f = 0; f < mesh.facetCount(); f++) {
            assertEquals(f * 0.1, slope[f], 1e-6, "slope of facet " + f); // written with 6 decimals
        }
        assertTrue(s.hasColumn("hover_accel_m_s2"));
        assertTrue(Double.isNaN(s.value("no_such_column", 0)));
        assertThrows(InputException.class, () -> s.column("no_such_column"));
    }

    @Test
    void zonesCsvGivesEveryOverlappingFootprint() throws IOException {
        Path obj = fixture();
        // zones 1 and 2 share facets 4 and 5, which the zone column (best rank per facet) cannot show
        Files.writeString(tmp.resolve("s").resolve("zones.csv"), "zone,facet,aim\n1,0,1\n1,4,0\n1,5,0\n2,4,0\n"
            + "2,5,1\n2,6,1\n");
        SurveyData s = SurveyData.read(tmp.resolve("s"), obj, mesh.facetCount());
        assertEquals(2, s.zones().size());
        assertArrayEquals(new int[] {0, 4, 5}, s.zones().get(0).facets());
        assertArrayEquals(new int[] {4, 5, 6}, s.zones().get(1).facets());
        Files.writeString(tmp.resolve("s").resolve("zones.csv"), "zone,facet,aim\n1,0,1\n1," + mesh.facetCount()
            + ",0\n");
        InputException e = assertThrows(InputException.class,
            () -> SurveyData.read(tmp.resolve("s"), obj, mesh.facetCount()));
        assertTrue(e.getMessage().contains("zones.csv") && e.getMessage().contains("3"), e.getMessage());
    }

    @Test
    void sitesComeFromTheSiteColumn() {
        int n = 6;
        double[] site = {0, 1, 1, 0, 2, 0};
        double[] cx = {0, 1, 3, 0, 5, 0};
        double[] zero = new double[n];
        SurveyData s = SurveyData.ofColumns(java.util.Map.of("site", site, "cx_m", cx, "cy_m", zero, "cz_m", zero),
            n);
        assertEquals(2, s.sites().size());
        assertArrayEquals(new int[] {1, 2}, s.sites().get(0).facets());
        assertEquals(2.0, s.sites().get(0).centroid()[0], 0.0, "mean of the facet centroids");
        assertArrayEquals(new int[] {4}, s.sites().get(1).facets());
        FacetColouring.Result c = FacetColouring.colour(s, n, Quantity.SITES, ColourLimits.AUTO);
        assertEquals(List.of("no site", "site 1", "site 2"),
            c.legend().categories().stream().map(Legend.Swatch::label).toList());
        assertEquals(c.argb()[1], c.argb()[2], "one colour per site");
        assertTrue(c.argb()[1] != c.argb()[4] && c.argb()[0] != c.argb()[1]);
    }

    @Test
    void zonesAreCollectedByRankWithTheirCentroids() throws IOException {
        Path obj = fixture();
        SurveyData s = SurveyData.read(tmp.resolve("s"), obj, mesh.facetCount());
        List<SurveyData.Zone> z = s.zones();
        assertEquals(2, z.size());
        assertEquals(1, z.get(0).rank());
        assertArrayEquals(new int[] {0, 1, 2, 3, 4}, z.get(0).facets());
        assertArrayEquals(new int[] {5, 6, 7}, z.get(1).facets());
        double[] c = mesh.facetCentroids();
        double mx = 0;
        for (int f = 5; f < 8; f++) {
            mx += c[3 * f] / 3;
        }
        assertEquals(mx, z.get(1).centroid()[0], 1e-5); // mean of member centroids, 6-decimal CSV
    }

    @Test
    void refusesSurveyOfAModelWithAnotherFacetCount() throws IOException {
        Path obj = fixture();
        TriangleMesh other = Shapes.icosphere(3, 500.0);
        Path otherObj = SyntheticSurvey.writeObj(other, tmp.resolve("other.obj"));
        InputException e = assertThrows(InputException.class,
            () -> SurveyData.read(tmp.resolve("s"), otherObj, other.facetCount()));
        assertTrue(e.getMessage().contains("320 facets") && e.getMessage().contains("another model"), e.getMessage());
        assertFalse(e.getMessage().contains("\n"));
    }

    @Test
    void refusesSurveyWhoseModelHashDiffers() throws IOException {
        Path obj = fixture();
        // same facets, different bytes: a rescaled copy of the body
        Path moved = SyntheticSurvey.writeObj(mesh.scaled(1.001), tmp.resolve("moved.obj"));
        InputException e = assertThrows(InputException.class,
            () -> SurveyData.read(tmp.resolve("s"), moved, mesh.facetCount()));
        assertTrue(e.getMessage().contains("model_sha256") && e.getMessage().contains("another model"),
            e.getMessage());
        assertFalse(e.getMessage().contains("\n"));
    }

    @Test
    void refusesCsvWithTooFewRowsEvenIfSummaryAgrees() throws IOException {
        Path obj = fixture();
        Path csv = tmp.resolve("s/facets.csv");
        List<String> lines = Files.readAllLines(csv, StandardCharsets.UTF_8);
        Files.write(csv, lines.subList(0, lines.size() - 1), StandardCharsets.UTF_8);
        InputException e = assertThrows(InputException.class,
            () -> SurveyData.read(tmp.resolve("s"), obj, mesh.facetCount()));
        assertTrue(e.getMessage().contains("319 facet rows"), e.getMessage());
    }

    @Test
    void refusesRowsOutOfFacetOrder() throws IOException {
        Path obj = fixture();
        Path csv = tmp.resolve("s/facets.csv");
        List<String> lines = new java.util.ArrayList<>(Files.readAllLines(csv, StandardCharsets.UTF_8));
        String a = lines.get(3);
        lines.set(3, lines.get(4));
        lines.set(4, a);
        Files.write(csv, lines, StandardCharsets.UTF_8);
        InputException e = assertThrows(InputException.class,
            () -> SurveyData.read(tmp.resolve("s"), obj, mesh.facetCount()));
        assertTrue(e.getMessage().contains("facets.csv:4:"), e.getMessage());
    }

    @Test
    void refusesMissingColumnNamingIt() throws IOException {
        Path obj = fixture();
        Path csv = tmp.resolve("s/facets.csv");
        String text = Files.readString(csv).replaceFirst("slope_deg", "slope_degrees");
        Files.writeString(csv, text);
        InputException e = assertThrows(InputException.class,
            () -> SurveyData.read(tmp.resolve("s"), obj, mesh.facetCount()));
        assertTrue(e.getMessage().contains("facets.csv:1:") && e.getMessage().contains("'slope_deg'"), e.getMessage());
    }

    @Test
    void refusesDirectoryWithoutSummary() {
        InputException e = assertThrows(InputException.class,
            () -> SurveyData.read(tmp, tmp.resolve("x.obj"), 1));
        assertTrue(e.getMessage().contains("summary.json"), e.getMessage());
    }
}
