package dev.cairn;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * The package map of DEVELOPERS.md as a check on the sources (project rule, no outside source): the packages
 * below may use only the packages listed for them, so {@code io} stays file formats only and the old
 * {@code io} ↔ {@code regions} cycle cannot come back. References are found as {@code dev.cairn.NAME.} in
 * imports and fully qualified names of the main sources (comments and javadoc left out: a mention is not a use).
 */
class PackageDependencyTest {
    private static final Path MAIN = Path.of("src/main/java/dev/cairn");
    private static final Pattern REF = Pattern.compile("dev\\.cairn\\.([a-z]+)\\.");

    private static final Map<String, Set<String>> ALLOWED = Map.of(
        "io", Set.of(),
        "util", Set.of(),
        "mesh", Set.of("io", "util"),
        "mass", Set.of("mesh", "gravity", "io", "util"), // gravity: Constants.G only
        "regions", Set.of("gravity", "mascon", "mesh", "mass", "io", "util", "rotation"),
        "body", Set.of("io", "regions", "mesh", "mass", "gravity", "rotation", "mascon", "util"));

    @Test
    void packagesUseOnlyWhatTheMapAllows() throws IOException {
        Map<String, Set<String>> found = new TreeMap<>();
        for (String pkg : ALLOWED.keySet()) {
            Set<String> used = new TreeSet<>();
            try (Stream<Path> files = Files.list(MAIN.resolve(pkg))) {
                for (Path f : (Iterable<Path>) files.filter(p -> p.toString().endsWith(".java"))::iterator) {
                    Matcher m = REF.matcher(withoutComments(Files.readString(f)));
                    while (m.find()) {
                        String other = m.group(1);
                        if (!other.equals(pkg) && !ALLOWED.get(pkg).contains(other)) {
                            used.add(other + " (in " + f.getFileName() + ")");
                        }
                    }
                }
            }
            found.put(pkg, used);
        }
        for (Map.Entry<String, Set<String>> e : found.entrySet()) {
            assertEquals(Set.of(), e.getValue(), "package " + e.getKey() + " uses packages outside its row");
        }
        assertTrue(Files.isDirectory(MAIN.resolve("body")), "the body package exists");
    }

    /** The source without block and line comments (string literals holding comment markers do not occur here). */
    static String withoutComments(String src) {
        return src.replaceAll("(?s)/\\*.*?\\*/", " ").replaceAll("//[^\n]*", " ");
    }
}
