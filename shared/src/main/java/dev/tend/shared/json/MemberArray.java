package dev.tend.shared.json;

import com.fasterxml.jackson.databind.JsonNode;

import java.util.AbstractMap;
import java.util.AbstractSet;
import java.util.Arrays;
import java.util.Iterator;
import java.util.NoSuchElementException;
import java.util.Set;

/**
 * The members of an object {@link CanonicalReader} read, in their order, as two arrays: what a
 * Jackson object node keeps them in instead of a linked hash map (an entry has a dozen
 * members; a look-up compares names, most of them the very constants the reader asks with,
 * and a member costs no node of its own). A map like any other to Jackson: it may be changed,
 * and equals one of another kind with the same members.
 */
final class MemberArray extends AbstractMap<String, JsonNode> {
    private String[] names = new String[12];
    private JsonNode[] values = new JsonNode[12];
    private int size;

    @Override
    public int size() {
        return size;
    }

    @Override
    public JsonNode get(Object name) {
        int i = indexOf(name);
        return i < 0 ? null : values[i];
    }

    @Override
    public boolean containsKey(Object name) {
        return indexOf(name) >= 0;
    }

    private int indexOf(Object name) {
        for (int i = 0; i < size; i++) if (names[i] == name) return i;
        if (name == null) return -1;
        for (int i = 0; i < size; i++) if (names[i].equals(name)) return i;
        return -1;
    }

    @Override
    public JsonNode put(String name, JsonNode value) {
        int i = indexOf(name);
        if (i >= 0) {
            JsonNode old = values[i];
            values[i] = value;
            return old;
        }
        if (size == names.length) {
            names = Arrays.copyOf(names, size * 2);
            values = Arrays.copyOf(values, size * 2);
        }
        names[size] = name;
        values[size++] = value;
        return null;
    }

    /** Appends a member whose name none before it has (the reader checked the names ascend). */
    void append(String name, JsonNode value) {
        if (size == names.length) {
            names = Arrays.copyOf(names, size * 2);
            values = Arrays.copyOf(values, size * 2);
        }
        names[size] = name;
        values[size++] = value;
    }

    @Override
    public JsonNode remove(Object name) {
        int i = indexOf(name);
        if (i < 0) return null;
        JsonNode old = values[i];
        removeAt(i);
        return old;
    }

    private void removeAt(int i) {
        System.arraycopy(names, i + 1, names, i, size - i - 1);
        System.arraycopy(values, i + 1, values, i, size - i - 1);
        size--;
        names[size] = null;
        values[size] = null;
    }

    @Override
    public void clear() {
        Arrays.fill(names, 0, size, null);
        Arrays.fill(values, 0, size, null);
        size = 0;
    }

    @Override
    public Set<Entry<String, JsonNode>> entrySet() {
        return new AbstractSet<>() {
            @Override
            public int size() {
                return size;
            }

            @Override
            public Iterator<Entry<String, JsonNode>> iterator() {
                return new Iterator<>() {
                    private int next;
                    private int last = -1;

                    @Override
                    public boolean hasNext() {
                        return next < size;
                    }

                    @Override
                    public Entry<String, JsonNode> next() {
                        if (next >= size) throw new NoSuchElementException();
                        last = next++;
                        int at = last;
                        return new SimpleEntry<>(names[at], values[at]) {
                            @Override
                            public JsonNode setValue(JsonNode value) {
                                values[at] = value;
                                return super.setValue(value);
                            }
                        };
                    }

                    @Override
                    public void remove() {
                        if (last < 0) throw new IllegalStateException("next() first");
                        removeAt(last);
                        next = last;
                        last = -1;
                    }
                };
            }
        };
    }
}
