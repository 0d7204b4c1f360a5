package dev.cairn.mesh;

import java.util.Arrays;

/** Open-addressing hash map from {@code long} keys to non-negative {@code int} values; no boxing. */
final class LongIntHashMap {
    private long[] keys;
    private int[] values;
    private int size;
    private int mask;

    LongIntHashMap(int expected) {
        int cap = Integer.highestOneBit(Math.max(16, expected * 2 - 1)) << 1;
        keys = new long[cap];
        values = new int[cap];
        Arrays.fill(values, -1);
        mask = cap - 1;
    }

    private static int slot(long key, int mask) {
        long h = key * 0x9E3779B97F4A7C15L;
        return (int) (h ^ (h >>> 32)) & mask;
    }

    /** Value for {@code key}, or -1 when absent. */
    int get(long key) {
        int i = slot(key, mask);
        while (values[i] >= 0) {
            if (keys[i] == key) {
                return values[i];
            }
            i = (i + 1) & mask;
        }
        return -1;
    }

    /** Stores {@code value >= 0} for {@code key}. */
    void put(long key, int value) {
        if (2 * (size + 1) > keys.length) {
            grow();
        }
        int i = slot(key, mask);
        while (values[i] >= 0) {
            if (keys[i] == key) {
                values[i] = value;
                return;
            }
            i = (i + 1) & mask;
        }
        keys[i] = key;
        values[i] = value;
        size++;
    }

    int size() {
        return size;
    }

    private void grow() {
        long[] ok = keys;
        int[] ov = values;
        keys = new long[ok.length * 2];
        values = new int[ok.length * 2];
        Arrays.fill(values, -1);
        mask = keys.length - 1;
        size = 0;
        for (int i = 0; i < ok.length; i++) {
            if (ov[i] >= 0) {
                put(ok[i], ov[i]);
            }
        }
    }
}
