package dev.cairn.body;

import dev.cairn.io.StrictJson;
import dev.cairn.io.InputException;
import com.fasterxml.jackson.annotation.JsonIgnoreProperties;
import com.fasterxml.jackson.annotation.JsonProperty;
import java.nio.file.Path;

/**
 * The optional JSON file {@code NAME.json} beside a model {@code NAME.obj}: the model's length unit, its density or
 * mass or GM, and its spin state. Every key is optional; command-line options override them. Keys are documented in
 * {@code docs/model-sidecar.md}. Unknown keys are refused (a misspelt key would otherwise be silently ignored),
 * except the free-text keys {@code description}, {@code note}, {@code _comment} and {@code _note}.
 */
@JsonIgnoreProperties(value = {"_comment", "_note"}, ignoreUnknown = false)
public final class ModelSidecar {
    @JsonProperty("name")
    public String name;
    @JsonProperty("description")
    public String description;
    @JsonProperty("note")
    public String note;
    /** "m" or "km": unit of the OBJ coordinates. */
    @JsonProperty("length_unit")
    public String lengthUnit;
    @JsonProperty("density_kg_m3")
    public Double densityKgM3;
    @JsonProperty("gm_m3_s2")
    public Double gmM3S2;
    @JsonProperty("mass_kg")
    public Double massKg;
    /** Sidereal spin period, seconds. */
    @JsonProperty("spin_period_s")
    public Double spinPeriodS;
    /** Spin pole, model frame, any length (normalised on use). */
    @JsonProperty("spin_axis")
    public double[] spinAxis;

    /** The sidecar path for a model: same folder and base name, extension {@code .json}. */
    public static Path pathFor(Path model) {
        String fn = model.getFileName().toString();
        int dot = fn.lastIndexOf('.');
        String base = dot > 0 ? fn.substring(0, dot) : fn;
        return model.resolveSibling(base + ".json");
    }

    /** Reads a sidecar strictly ({@link StrictJson}); a malformed file gives an {@link InputException} naming the file, line and problem. */
    public static ModelSidecar read(Path file) {
        return StrictJson.read(file, ModelSidecar.class, "bad model sidecar", "docs/model-sidecar.md");
    }
}
