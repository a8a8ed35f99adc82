package dev.tend.shared.wire;

import dev.tend.shared.Id;

import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.function.Function;
import java.util.function.Predicate;

/**
 * The ids one reader has met, looked up by their bytes: a repeated id gives its one {@link Id}
 * instance without a String being made for it. Each id also carries a mark, decided once when it
 * is first met (for the reader: a signal tend.yaml declares).
 *
 * <p>An open-addressing table (linear probing, at most half full). It keeps at most
 * {@value #MAX_SIZE} ids (by default); past that an unknown id is not taken in ({@link #find} gives -1), so
 * that a stream of ever new ids cannot grow it without bound: the caller then reads the line
 * its general way. Not thread-safe: one reader, one thread.
 */
final class IdsByBytes {
    static final int MAX_SIZE = 1 << 18;

    private final Predicate<String> mark;
    private final int maxSize;
    private final Function<String, Id> canonical;
    private byte[][] keys = new byte[1 << 10][];
    private int[] hashes = new int[1 << 10];
    private Id[] ids = new Id[1 << 10];
    private boolean[] marks = new boolean[1 << 10];
    private int size;

    /** {@code mark}: tested once per distinct id, on its value. */
    IdsByBytes(Predicate<String> mark) {
        this(mark, MAX_SIZE);
    }

    /** As {@link #IdsByBytes(Predicate)}, keeping at most {@code maxSize} ids. */
    IdsByBytes(Predicate<String> mark, int maxSize) {
        this(mark, maxSize, null);
    }

    /** As {@link #IdsByBytes(Predicate, int)}, each id the instance {@code canonical} gives for its value (null: a new one). */
    IdsByBytes(Predicate<String> mark, int maxSize, Function<String, Id> canonical) {
        this.mark = mark;
        this.maxSize = maxSize;
        this.canonical = canonical;
    }

    /**
     * The slot of the id written in {@code b[from, to)}, taken in when new; -1 when those bytes are
     * not an id ({@link Id#isValid}) or the table is full. The caller has checked that every byte
     * is one an id may hold ({@link #isIdByte}).
     */
    int find(byte[] b, int from, int to) {
        int n = to - from;
        if (n == 0 || n > Id.MAX_LENGTH) return -1;
        int h = 0;
        for (int i = from; i < to; i++) h = 31 * h + b[i];
        h ^= h >>> 16;
        int mask = keys.length - 1;
        for (int slot = h & mask; ; slot = (slot + 1) & mask) {
            byte[] k = keys[slot];
            if (k == null) return add(slot, h, b, from, to);
            if (hashes[slot] == h && k.length == n && same(k, b, from)) return slot;
        }
    }

    /** The id in {@code slot} (from {@link #find}). */
    Id id(int slot) {
        return ids[slot];
    }

    /** The mark of the id in {@code slot}. */
    boolean isMarked(int slot) {
        return marks[slot];
    }

    /** A byte an id may hold: a letter, a digit, or . _ : - ({@link Id#PATTERN}). */
    static boolean isIdByte(byte c) {
        return c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '.' || c == '_' || c == ':'
                || c == '-';
    }

    private static boolean same(byte[] k, byte[] b, int from) {
        for (int i = 0; i < k.length; i++) {
            if (k[i] != b[from + i]) return false;
        }
        return true;
    }

    private int add(int slot, int h, byte[] b, int from, int to) {
        if (size == maxSize) return -1;
        String value = new String(b, from, to - from, StandardCharsets.ISO_8859_1);
        if (!Id.isValid(value)) return -1;
        byte[] key = Arrays.copyOfRange(b, from, to);
        keys[slot] = key;
        hashes[slot] = h;
        ids[slot] = canonical == null ? new Id(value) : canonical.apply(value);
        marks[slot] = mark.test(value);
        size++;
        if (size * 2 > keys.length) return grow(key);
        return slot;
    }

    /** Doubles the table; returns the new slot of {@code key}. */
    private int grow(byte[] key) {
        byte[][] oldKeys = keys;
        int[] oldHashes = hashes;
        Id[] oldIds = ids;
        boolean[] oldMarks = marks;
        int capacity = oldKeys.length * 2;
        keys = new byte[capacity][];
        hashes = new int[capacity];
        ids = new Id[capacity];
        marks = new boolean[capacity];
        int mask = capacity - 1;
        int found = -1;
        for (int i = 0; i < oldKeys.length; i++) {
            if (oldKeys[i] == null) continue;
            int slot = oldHashes[i] & mask;
            while (keys[slot] != null) slot = (slot + 1) & mask;
            keys[slot] = oldKeys[i];
            hashes[slot] = oldHashes[i];
            ids[slot] = oldIds[i];
            marks[slot] = oldMarks[i];
            if (oldKeys[i] == key) found = slot;
        }
        return found;
    }
}
