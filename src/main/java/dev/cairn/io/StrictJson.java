package dev.cairn.io;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.StreamReadConstraints;
import com.fasterxml.jackson.core.type.TypeReference;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.MapperFeature;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.cfg.CoercionAction;
import com.fasterxml.jackson.databind.cfg.CoercionInputShape;
import com.fasterxml.jackson.databind.json.JsonMapper;
import com.fasterxml.jackson.databind.type.LogicalType;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The one validating layer for every JSON file the program reads (model sidecars, body descriptions, table
 * sidecars, checkpoint manifests, survey summaries): strict parsing, then typed access with ranges.
 *
 * <p>Parsing refuses duplicate keys, content after the top-level value, strings given for numbers ({@code "2000"})
 * or numbers for strings, empty strings for numbers, fractions for integers, nesting deeper than
 * {@link #MAX_DEPTH}, files larger than {@link #MAX_BYTES}, and a top level that is not an object. {@link Fields}
 * then reads keys of a parsed object with the type and range each needs, and every failure is one line naming the
 * file and the key.
 */
public final class StrictJson {
    /** Deepest nesting accepted (our files nest four levels). */
    public static final int MAX_DEPTH = 64;
    /** Largest JSON file accepted, bytes (our files are a few kB; a points grid's sidecar stays far below this). */
    public static final long MAX_BYTES = 64L << 20;

    /** The strict mapper (thread-safe once configured). */
    public static final ObjectMapper MAPPER = build();

    private StrictJson() {
    }

    private static ObjectMapper build() {
        JsonMapper m = JsonMapper.builder()
            .enable(JsonParser.Feature.STRICT_DUPLICATE_DETECTION)
            .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
            .enable(DeserializationFeature.FAIL_ON_UNKNOWN_PROPERTIES)
            .enable(DeserializationFeature.FAIL_ON_NULL_FOR_PRIMITIVES)
            .enable(DeserializationFeature.FAIL_ON_READING_DUP_TREE_KEY)
            .disable(DeserializationFeature.ACCEPT_FLOAT_AS_INT)
            .disable(MapperFeature.ALLOW_COERCION_OF_SCALARS)
            .build();
        m.getFactory().setStreamReadConstraints(StreamReadConstraints.builder().maxNestingDepth(MAX_DEPTH)
            .maxNumberLength(400).maxStringLength(1 << 20).build());
        for (LogicalType t : new LogicalType[] {LogicalType.Float, LogicalType.Integer, LogicalType.Boolean,
            LogicalType.Textual}) {
            m.coercionConfigFor(t).setCoercion(CoercionInputShape.String, CoercionAction.Fail)
                .setCoercion(CoercionInputShape.EmptyString, CoercionAction.Fail)
                .setCoercion(CoercionInputShape.Integer, t == LogicalType.Textual ? CoercionAction.Fail
                    : CoercionAction.TryConvert)
                .setCoercion(CoercionInputShape.Float, t == LogicalType.Float ? CoercionAction.TryConvert
                    : CoercionAction.Fail)
                .setCoercion(CoercionInputShape.Boolean, t == LogicalType.Boolean ? CoercionAction.TryConvert
                    : CoercionAction.Fail);
        }
        return m;
    }

    /** The file's bytes, after checking it is a regular file of acceptable size. */
    public static byte[] bytes(Path file) {
        try {
            if (!Files.isRegularFile(file)) {
                throw new InputException(Messages.path(file) + (Files.exists(file) ? ": not a regular file"
                    : ": no such file"));
            }
            long size = Files.size(file);
            if (size > MAX_BYTES) {
                throw new InputException(Messages.path(file) + ": " + size + " bytes is too large for a JSON file "
                    + "here (limit " + MAX_BYTES + ")");
            }
            return Files.readAllBytes(file);
        } catch (IOException e) {
            throw new InputException(Messages.path(file) + ": cannot read: " + e.getMessage(), e);
        }
    }

    /** Reads a JSON object into a map (key order kept). */
    public static Map<String, Object> readObject(Path file, String what) {
        byte[] b = bytes(file);
        try {
            Map<String, Object> m = MAPPER.readValue(b, new TypeReference<LinkedHashMap<String, Object>>() { });
            if (m == null) {
                throw new InputException(Messages.path(file) + ": " + what + ": expected a JSON object, got null");
            }
            return m;
        } catch (JsonProcessingException e) {
            throw InputException.json(file, e, what, null);
        } catch (IOException e) {
            throw new InputException(Messages.path(file) + ": cannot read: " + e.getMessage(), e);
        }
    }

    /** Reads a JSON object into a bean of type {@code type}; {@code keysDoc} documents the keys. */
    public static <T> T read(Path file, Class<T> type, String what, String keysDoc) {
        byte[] b = bytes(file);
        try {
            T v = MAPPER.readValue(b, type);
            if (v == null) {
                throw new InputException(Messages.path(file) + ": " + what + ": expected a JSON object, got null");
            }
            return v;
        } catch (JsonProcessingException e) {
            throw InputException.json(file, e, what, keysDoc);
        } catch (IOException e) {
            throw new InputException(Messages.path(file) + ": cannot read: " + e.getMessage(), e);
        }
    }

    /** Typed, range-checked access to the keys of one JSON object; failures name the file and the key path. */
    public static final class Fields {
        private final Map<?, ?> map;
        private final String file;
        private final String prefix;

        /** @param prefix key path of this object inside the file ("" for the top level, e.g. "grid.") */
        public Fields(Map<?, ?> map, Object file, String prefix) {
            this.map = map;
            this.file = Messages.path(file);
            this.prefix = prefix;
        }

        private InputException bad(String key, String problem) {
            return new InputException(file + ": key '" + prefix + key + "' " + problem);
        }

        /** The underlying map (read only by convention). */
        public Map<?, ?> raw() {
            return map;
        }

        public boolean has(String key) {
            return map.get(key) != null;
        }

        private Object need(String key) {
            Object v = map.get(key);
            if (v == null) {
                throw bad(key, "is missing");
            }
            return v;
        }

        /** A finite number in {@code [min, max]}. */
        public double number(String key, double min, double max) {
            Object v = need(key);
            if (!(v instanceof Number n)) {
                throw bad(key, "must be a number, got " + kind(v));
            }
            double d = n.doubleValue();
            if (!Double.isFinite(d) || d < min || d > max) {
                throw bad(key, "must be a finite number from " + min + " to " + max + ", got " + d);
            }
            return d;
        }

        /** A JSON integer in {@code [min, max]}. */
        public long integer(String key, long min, long max) {
            Object v = need(key);
            if (!(v instanceof Integer || v instanceof Long || v instanceof java.math.BigInteger)) {
                throw bad(key, "must be an integer, got " + kind(v));
            }
            if (v instanceof java.math.BigInteger b && b.bitLength() > 63) {
                throw bad(key, "must be an integer from " + min + " to " + max + ", got one of " + b.bitLength()
                    + " bits");
            }
            long l = ((Number) v).longValue();
            if (l < min || l > max) {
                throw bad(key, "must be an integer from " + min + " to " + max + ", got " + l);
            }
            return l;
        }

        public int integer(String key, int min, int max) {
            return (int) integer(key, (long) min, (long) max);
        }

        public String string(String key) {
            Object v = need(key);
            if (!(v instanceof String s)) {
                throw bad(key, "must be a string, got " + kind(v));
            }
            return s;
        }

        /** A string, or null when the key is absent or null. */
        public String optString(String key) {
            return has(key) ? string(key) : null;
        }

        public Fields object(String key) {
            Object v = need(key);
            if (!(v instanceof Map<?, ?> m)) {
                throw bad(key, "must be an object, got " + kind(v));
            }
            return new Fields(m, file, prefix + key + ".");
        }

        public List<?> list(String key, int minSize, int maxSize) {
            Object v = need(key);
            if (!(v instanceof List<?> l)) {
                throw bad(key, "must be a list, got " + kind(v));
            }
            if (l.size() < minSize || l.size() > maxSize) {
                throw bad(key, "must have " + (minSize == maxSize ? String.valueOf(minSize) : minSize + " to " + maxSize)
                    + " entries, got " + l.size());
            }
            return l;
        }

        /** A list of finite numbers in {@code [min, max]}. */
        public double[] numbers(String key, int minSize, int maxSize, double min, double max) {
            List<?> l = list(key, minSize, maxSize);
            double[] d = new double[l.size()];
            for (int i = 0; i < d.length; i++) {
                Object o = l.get(i);
                if (!(o instanceof Number n) || !Double.isFinite(n.doubleValue()) || n.doubleValue() < min
                    || n.doubleValue() > max) {
                    throw bad(key, "entry " + (i + 1) + " must be a finite number from " + min + " to " + max
                        + ", got " + kind(o));
                }
                d[i] = ((Number) o).doubleValue();
            }
            return d;
        }

        /** A list of integers in {@code [min, max]}. */
        public long[] integers(String key, int minSize, int maxSize, long min, long max) {
            List<?> l = list(key, minSize, maxSize);
            long[] d = new long[l.size()];
            for (int i = 0; i < d.length; i++) {
                Object o = l.get(i);
                if (!(o instanceof Integer || o instanceof Long) || ((Number) o).longValue() < min
                    || ((Number) o).longValue() > max) {
                    throw bad(key, "entry " + (i + 1) + " must be an integer from " + min + " to " + max + ", got "
                        + kind(o));
                }
                d[i] = ((Number) o).longValue();
            }
            return d;
        }

        /** A list of strings. */
        public List<String> strings(String key, int minSize, int maxSize) {
            List<?> l = list(key, minSize, maxSize);
            List<String> out = new java.util.ArrayList<>(l.size());
            for (int i = 0; i < l.size(); i++) {
                if (!(l.get(i) instanceof String s)) {
                    throw bad(key, "entry " + (i + 1) + " must be a string, got " + kind(l.get(i)));
                }
                out.add(s);
            }
            return out;
        }

        private static String kind(Object v) {
            if (v == null) {
                return "null";
            }
            if (v instanceof String s) {
                return "the string " + Messages.quote(s);
            }
            if (v instanceof Number) {
                return String.valueOf(v).length() > 40 ? "a long number" : String.valueOf(v);
            }
            if (v instanceof Boolean) {
                return String.valueOf(v);
            }
            return v instanceof List ? "a list" : v instanceof Map ? "an object" : v.getClass().getSimpleName();
        }
    }
}
