package dev.cairn.mesh;

import java.net.URISyntaxException;
import java.net.URL;
import java.nio.file.Path;

/** Locates the OBJ fixtures under {@code src/test/resources/obj/}. */
public final class ObjFixtures {
    private ObjFixtures() {
    }

    /** The fixture file {@code obj/NAME}. */
    public static Path path(String name) {
        URL url = ObjFixtures.class.getResource("/obj/" + name);
        if (url == null) {
            throw new IllegalArgumentException("no fixture " + name);
        }
        try {
            return Path.of(url.toURI());
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }
}
