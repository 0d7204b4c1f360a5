package dev.cairn.regions;

import com.fasterxml.jackson.annotation.JsonIgnoreProperties;
import com.fasterxml.jackson.annotation.JsonProperty;
import java.util.List;

/**
 * The body description file (JSON): a body made of regions of different densities. Keys are documented in
 * {@code docs/mascons.md}; unknown keys are refused (a misspelt key would otherwise be silently ignored), except
 * {@code _comment}/{@code _note}, {@code description} and {@code note}, which are free text.
 *
 * <pre>
 * {
 *   "name": "two-layer body",
 *   "length_unit": "km",
 *   "spin_period_s": 18000, "spin_axis": [0, 0, 1],
 *   "regions": [
 *     {"name": "mantle", "shape": "body.obj", "density_kg_m3": 1700},
 *     {"name": "core",   "shape": "core.obj", "density_kg_m3": 2600}
 *   ],
 *   "measured_gm_m3_s2": 12.5, "solve_density_of": "core"
 * }
 * </pre>
 * The first region is the outer shape; every other region must lie inside it. Regions nest (a region inside
 * another) or are disjoint; they may not cross. Shape paths are relative to the description's folder.
 */
@JsonIgnoreProperties(value = {"_comment", "_note"}, ignoreUnknown = false)
public final class BodyDescription {
    @JsonProperty("name")
    public String name;
    @JsonProperty("description")
    public String description;
    @JsonProperty("note")
    public String note;
    /** "m" or "km": unit of every region's OBJ coordinates. */
    @JsonProperty("length_unit")
    public String lengthUnit;
    @JsonProperty("spin_period_s")
    public Double spinPeriodS;
    @JsonProperty("spin_axis")
    public double[] spinAxis;
    @JsonProperty("regions")
    public List<Region> regions;
    /** Measured GM of the whole body, m^3/s^2, used with {@link #solveDensityOf}. */
    @JsonProperty("measured_gm_m3_s2")
    public Double measuredGm;
    /** Name of the region whose density is solved so that the total GM equals {@link #measuredGm}. */
    @JsonProperty("solve_density_of")
    public String solveDensityOf;

    /** One region: a closed OBJ and its density. */
    @JsonIgnoreProperties(value = {"_comment", "_note"}, ignoreUnknown = false)
    public static final class Region {
        @JsonProperty("name")
        public String name;
        @JsonProperty("description")
        public String description;
        /** Path of the closed OBJ, relative to the description's folder. */
        @JsonProperty("shape")
        public String shape;
        /** Density, kg/m^3, ≥ 0 (0 for a void); may be omitted only for the region being solved for. */
        @JsonProperty("density_kg_m3")
        public Double density;
        /**
         * Optional density increase with depth below the outer surface, kg/m^3 per metre: the region's density at a
         * point is {@code density_kg_m3 + gradient · depth}. Honoured by the mascon route only.
         */
        @JsonProperty("density_gradient_kg_m3_per_m")
        public Double densityGradient;
    }
}
