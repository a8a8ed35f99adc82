package dev.tend.serve;

import java.io.ByteArrayOutputStream;
import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;

/**
 * A corpus of wire lines for the fault suite: good transitions, each with its own event
 * time, mixed with lines mutated the ways a careless or hostile sender breaks them (bytes
 * flipped, cut, not UTF-8, times and numbers out of range, wrong kinds, repeated and unknown
 * fields, deep nesting, huge values). Deterministic for a seed.
 */
final class WireMutator {
    /** One line of the corpus; {@code good} when it was left as made. */
    record Line(byte[] bytes, boolean good, String key) {
    }

    private static final String[] TIMES = {"2263-01-01T00:00:00Z", "9999-12-31T23:59:59Z", "0001-01-01T00:00:00Z",
            "1969-12-31T23:59:59Z", "2027-02-30T00:00:00Z", "2027-03-14T25:00:00Z", "2027-03-14T02:00:00", "yesterday", "",
            "2027-03-14T02:00:00.1234567891Z", "+999999999-12-31T23:59:59Z", "2027-03-14T02:00:00+99:00"};
    private static final String[] VALUES = {"null", "[]", "{}", "true", "-1", "1e999", "99999999999999999999999999",
            "\"\"", "\"n 2\"", "\"" + "x".repeat(5000) + "\"", "[[[[[[[[[[[[[[[[[[[[[[[[[[[[[[]]]]]]]]]]]]]]]]]]]]]]]]]]]]]]", "\"\\ud800\"",
            "\"\\u0000\"", "{\"a\":{\"b\":{\"c\":[1,2,{\"d\":null}]}}}"};
    private static final String[] FIELDS = {"at", "cluster", "node", "signal", "state", "detail", "topology", "recording"};

    private final Random rnd;
    private final List<String> clusters;
    private final Instant t0 = Instant.parse("2026-03-14T02:00:00Z");

    WireMutator(long seed, List<String> clusters) {
        this.rnd = new Random(seed);
        this.clusters = List.copyOf(clusters);
    }

    /** {@code n} lines, about one in three mutated. */
    List<Line> corpus(int n) {
        List<Line> out = new ArrayList<>(n);
        for (int i = 0; i < n; i++) {
            String cluster = clusters.get(rnd.nextInt(clusters.size()));
            String node = "n" + (1 + rnd.nextInt(3));
            String state = rnd.nextInt(4) == 0 ? "breach" : "clear";
            String at = t0.plusMillis(i * 250L).toString();
            String good = "{\"at\":\"" + at + "\",\"cluster\":\"" + cluster + "\",\"node\":\"" + node
                    + "\",\"signal\":\"disk-latency\",\"state\":\"" + state + "\",\"detail\":{\"p99_ms\":" + rnd.nextInt(900) + "}}";
            String key = at + "|" + cluster + "|" + node + "|disk-latency|" + state;
            if (rnd.nextInt(3) != 0) {
                out.add(new Line(good.getBytes(StandardCharsets.UTF_8), true, key));
            } else {
                out.add(new Line(mutate(good), false, null));
            }
        }
        return out;
    }

    private byte[] mutate(String good) {
        switch (rnd.nextInt(12)) {
            case 0: { // a byte that is never UTF-8 somewhere in the line
                byte[] b = good.getBytes(StandardCharsets.UTF_8);
                b[rnd.nextInt(b.length)] = (byte) (0xF8 + rnd.nextInt(8));
                return b;
            }
            case 1: { // a cut UTF-8 sequence
                ByteArrayOutputStream o = new ByteArrayOutputStream();
                byte[] b = good.getBytes(StandardCharsets.UTF_8);
                int at = rnd.nextInt(b.length);
                o.write(b, 0, at);
                o.write(0xE2);
                o.write(0x82);
                o.write(b, at, b.length - at);
                return o.toByteArray();
            }
            case 2: // cut short
                return good.substring(0, rnd.nextInt(good.length())).getBytes(StandardCharsets.UTF_8);
            case 3: // a time out of range or malformed
                return good.replaceFirst("\"at\":\"[^\"]*\"", "\"at\":\"" + TIMES[rnd.nextInt(TIMES.length)] + "\"")
                        .getBytes(StandardCharsets.UTF_8);
            case 4: { // a field's value of the wrong kind
                String f = FIELDS[rnd.nextInt(6)];
                return good.replaceFirst("\"" + f + "\":(\"[^\"]*\"|\\{[^}]*\\})", "\"" + f + "\":"
                        + java.util.regex.Matcher.quoteReplacement(VALUES[rnd.nextInt(VALUES.length)])).getBytes(StandardCharsets.UTF_8);
            }
            case 5: // a field given twice
                return good.replace("}}", "},\"cluster\":\"fares-1\"}").getBytes(StandardCharsets.UTF_8);
            case 6: // a field dropped
                return good.replaceFirst("\"" + FIELDS[rnd.nextInt(5)] + "\":\"[^\"]*\",?", "").getBytes(StandardCharsets.UTF_8);
            case 7: { // a random byte flipped
                byte[] b = good.getBytes(StandardCharsets.UTF_8);
                int i = rnd.nextInt(b.length);
                b[i] = (byte) (b[i] ^ (1 << rnd.nextInt(7)));
                return b;
            }
            case 8: // marks of another kind of line
                return good.replace("\"state\"", rnd.nextBoolean() ? "\"topology\"" : "\"recording\"").getBytes(StandardCharsets.UTF_8);
            case 9: // not an object at all
                return VALUES[rnd.nextInt(VALUES.length)].getBytes(StandardCharsets.UTF_8);
            case 10: { // control characters and a NUL inside
                String s = good.replace("disk-latency", "disk\u0000lat\u0007ency");
                return s.getBytes(StandardCharsets.UTF_8);
            }
            default: // deeply nested detail
                return good.replaceFirst("\"detail\":\\{[^}]*\\}", "\"detail\":{\"x\":" + "[".repeat(3000) + "]".repeat(3000) + "}")
                        .getBytes(StandardCharsets.UTF_8);
        }
    }

    /** The corpus as one file's bytes, a line break after each line. */
    static byte[] join(List<Line> lines) {
        ByteArrayOutputStream o = new ByteArrayOutputStream();
        for (Line l : lines) {
            o.writeBytes(l.bytes());
            o.write('\n');
        }
        return o.toByteArray();
    }
}
