package dev.tend.simulator.report;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.PrettyPrinter;
import com.fasterxml.jackson.core.StreamWriteFeature;
import dev.tend.shared.Id;
import dev.tend.shared.wire.Rfc3339;

import java.io.IOException;
import java.io.Writer;
import java.time.Instant;
import java.util.ArrayDeque;
import java.util.Deque;

/**
 * The JSON form shared by the report renderers: fields in the order written, {@code \n} line
 * breaks whatever the platform, two-space indents for the outer levels and one line per
 * array element below them (a report of a million decisions stays a file one can grep).
 */
final class JsonOutput {
    private static final JsonFactory FACTORY = JsonFactory.builder().disable(StreamWriteFeature.AUTO_CLOSE_TARGET).build();

    private JsonOutput() {
    }

    static JsonGenerator generator(Writer out) throws IOException {
        JsonGenerator g = FACTORY.createGenerator(out);
        g.setPrettyPrinter(new LinePrinter());
        return g;
    }

    static void time(JsonGenerator g, String field, Instant t) throws IOException {
        if (t == null) g.writeNullField(field);
        else g.writeStringField(field, Rfc3339.format(t));
    }

    static void id(JsonGenerator g, String field, Id id) throws IOException {
        if (id == null) g.writeNullField(field);
        else g.writeStringField(field, id.value());
    }

    static void text(JsonGenerator g, String field, String s) throws IOException {
        if (s == null) g.writeNullField(field);
        else g.writeStringField(field, s);
    }

    /** Objects are expanded to the second level, arrays to the third; anything deeper stays on one line. */
    private static final class LinePrinter implements PrettyPrinter {
        private static final int EXPAND_OBJECTS = 2;
        private static final int EXPAND_ARRAYS = 3;
        private final Deque<Boolean> open = new ArrayDeque<>();

        private boolean expanded() {
            return !open.isEmpty() && open.peek();
        }

        private void newline(JsonGenerator g) throws IOException {
            g.writeRaw('\n');
            for (int i = 0; i < open.size(); i++) g.writeRaw("  ");
        }

        @Override
        public void writeRootValueSeparator(JsonGenerator g) throws IOException {
            g.writeRaw('\n');
        }

        @Override
        public void writeStartObject(JsonGenerator g) throws IOException {
            open.push(open.size() < EXPAND_OBJECTS);
            g.writeRaw('{');
        }

        @Override
        public void writeEndObject(JsonGenerator g, int entries) throws IOException {
            boolean was = open.pop();
            if (was && entries > 0) newline(g);
            g.writeRaw('}');
        }

        @Override
        public void writeObjectEntrySeparator(JsonGenerator g) throws IOException {
            g.writeRaw(',');
            if (expanded()) newline(g);
        }

        @Override
        public void writeObjectFieldValueSeparator(JsonGenerator g) throws IOException {
            g.writeRaw(expanded() ? ": " : ":");
        }

        @Override
        public void writeStartArray(JsonGenerator g) throws IOException {
            open.push(open.size() < EXPAND_ARRAYS);
            g.writeRaw('[');
        }

        @Override
        public void writeEndArray(JsonGenerator g, int values) throws IOException {
            boolean was = open.pop();
            if (was && values > 0) newline(g);
            g.writeRaw(']');
        }

        @Override
        public void writeArrayValueSeparator(JsonGenerator g) throws IOException {
            g.writeRaw(',');
            if (expanded()) newline(g);
        }

        @Override
        public void beforeArrayValues(JsonGenerator g) throws IOException {
            if (expanded()) newline(g);
        }

        @Override
        public void beforeObjectEntries(JsonGenerator g) throws IOException {
            if (expanded()) newline(g);
        }
    }
}
