package dev.cairn.tables;

import dev.cairn.io.InputException;
import java.io.DataInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * NumPy {@code .npy} format version 1.0 for little-endian float64 arrays in C order (NumPy Enhancement Proposal
 * NEP 1, "A simple file format for NumPy arrays", and the {@code numpy.lib.format} documentation): the magic
 * {@code \x93NUMPY}, version bytes {@code 1 0}, a little-endian uint16 header length, an ASCII Python-literal
 * dictionary {@code {'descr': '<f8', 'fortran_order': False, 'shape': (...), }} padded with spaces and ended by
 * {@code \n} so that magic + version + length + header is a multiple of 64 bytes, then the raw data.
 */
public final class Npy {
    /** Alignment of the data start (the format documentation asks for a multiple of 64 bytes). */
    public static final int ALIGN = 64;
    private static final byte[] MAGIC = {(byte) 0x93, 'N', 'U', 'M', 'P', 'Y'};

    private Npy() {
    }

    /** The complete header bytes (magic to the end of the padded dictionary) for a float64 C-order array. */
    public static byte[] header(long[] shape) {
        StringBuilder sb = new StringBuilder("{'descr': '<f8', 'fortran_order': False, 'shape': (");
        for (int i = 0; i < shape.length; i++) {
            sb.append(shape[i]).append(shape.length == 1 ? "," : i + 1 < shape.length ? ", " : "");
        }
        sb.append("), }");
        int unpadded = MAGIC.length + 2 + 2 + sb.length() + 1;
        int pad = (ALIGN - unpadded % ALIGN) % ALIGN;
        sb.append(" ".repeat(pad)).append('\n');
        byte[] dict = sb.toString().getBytes(StandardCharsets.US_ASCII);
        if (dict.length > 65535) {
            throw new IllegalArgumentException("npy header too long");
        }
        ByteBuffer b = ByteBuffer.allocate(MAGIC.length + 4 + dict.length).order(ByteOrder.LITTLE_ENDIAN);
        b.put(MAGIC).put((byte) 1).put((byte) 0).putShort((short) dict.length).put(dict);
        return b.array();
    }

    /** Writes {@code count} doubles from {@code data[from..]} little-endian to {@code out}. */
    public static void writeDoubles(OutputStream out, double[] data, int from, int count) throws IOException {
        ByteBuffer b = ByteBuffer.allocate(8 * 4096).order(ByteOrder.LITTLE_ENDIAN);
        int end = from + count;
        for (int i = from; i < end; ) {
            b.clear();
            int m = Math.min(4096, end - i);
            for (int k = 0; k < m; k++) {
                b.putDouble(data[i + k]);
            }
            out.write(b.array(), 0, 8 * m);
            i += m;
        }
    }

    /** Reads {@code count} little-endian doubles into {@code data[from..]}. */
    public static void readDoubles(DataInputStream in, double[] data, int from, int count) throws IOException {
        byte[] buf = new byte[8 * 4096];
        ByteBuffer b = ByteBuffer.wrap(buf).order(ByteOrder.LITTLE_ENDIAN);
        int end = from + count;
        for (int i = from; i < end; ) {
            int m = Math.min(4096, end - i);
            in.readFully(buf, 0, 8 * m);
            b.clear();
            for (int k = 0; k < m; k++) {
                data[i + k] = b.getDouble();
            }
            i += m;
        }
    }

    private static final Pattern DESCR = Pattern.compile("'descr'\\s*:\\s*'([^']*)'");
    private static final Pattern FORTRAN = Pattern.compile("'fortran_order'\\s*:\\s*(True|False)");
    private static final Pattern SHAPE = Pattern.compile("'shape'\\s*:\\s*\\(([^)]*)\\)");

    /**
     * Reads and checks a header: only version 1.0, {@code '<f8'} and C order are accepted.
     *
     * @return the shape
     * @throws InputException naming {@code file} when the header is malformed or of another type
     */
    public static long[] readHeader(InputStream in, String file) throws IOException {
        return readHeader(in, file, -1);
    }

    /**
     * As {@link #readHeader(InputStream, String)}, also requiring that the data after the header fill the file of
     * {@code fileSize} bytes exactly (when not negative): a header whose length field or shape was changed is
     * refused instead of being read at the wrong offset.
     */
    public static long[] readHeader(InputStream in, String file, long fileSize) throws IOException {
        file = dev.cairn.io.Messages.path(file);
        byte[] pre = in.readNBytes(10);
        if (pre.length < 10) {
            throw new InputException(file + ": not a .npy file (too short)");
        }
        for (int i = 0; i < MAGIC.length; i++) {
            if (pre[i] != MAGIC[i]) {
                throw new InputException(file + ": not a .npy file (bad magic)");
            }
        }
        if (pre[6] != 1 || pre[7] != 0) {
            throw new InputException(file + ": .npy version " + pre[6] + "." + pre[7] + " not supported (need 1.0)");
        }
        int len = (pre[8] & 0xff) | (pre[9] & 0xff) << 8;
        byte[] dict = in.readNBytes(len);
        if (dict.length < len) {
            throw new InputException(file + ": truncated .npy header");
        }
        String h = new String(dict, StandardCharsets.US_ASCII);
        Matcher d = DESCR.matcher(h);
        Matcher f = FORTRAN.matcher(h);
        Matcher s = SHAPE.matcher(h);
        if (!d.find() || !f.find() || !s.find()) {
            throw new InputException(file + ": malformed .npy header: " + dev.cairn.io.Messages.quote(h.strip()));
        }
        if (!d.group(1).equals("<f8")) {
            throw new InputException(file + ": .npy dtype " + d.group(1) + " not supported (need '<f8')");
        }
        if (f.group(1).equals("True")) {
            throw new InputException(file + ": Fortran-order .npy not supported (need C order)");
        }
        if ((10 + len) % ALIGN != 0 || !h.endsWith("\n")) {
            throw new InputException(file + ": malformed .npy header (length " + len + " not padded to "
                + ALIGN + " bytes)");
        }
        String[] parts = s.group(1).split(",", -1);
        long[] shape = new long[parts.length];
        int n = 0;
        for (int i = 0; i < parts.length; i++) {
            String p = parts[i].strip();
            if (p.isEmpty() && i == parts.length - 1 && i > 0) {
                continue; // trailing comma of a Python tuple
            }
            if (!p.matches("[0-9]{1,10}")) {
                throw new InputException(file + ": malformed .npy shape " + dev.cairn.io.Messages.quote(s.group(1)));
            }
            shape[n++] = Long.parseLong(p);
        }
        if (n == 0) {
            throw new InputException(file + ": .npy shape () is a scalar, not a table");
        }
        shape = java.util.Arrays.copyOf(shape, n);
        double values = 1;
        for (long dim : shape) {
            values *= dim;
        }
        if (fileSize >= 0 && values * 8 != fileSize - 10 - len) {
            throw new InputException(file + ": .npy header says " + java.util.Arrays.toString(shape) + " ("
                + String.format(java.util.Locale.ROOT, "%.0f", values * 8) + " data bytes) but the file holds "
                + (fileSize - 10 - len) + " bytes after the header");
        }
        return shape;
    }
}
