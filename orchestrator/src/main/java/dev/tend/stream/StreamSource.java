package dev.tend.stream;

import java.util.Objects;
import java.util.regex.Pattern;

/**
 * The topic {@code tend serve} consumes transitions from ({@code --kafka}, {@code --topic},
 * {@code --group}).
 *
 * @param bootstrap the brokers to start from, {@code HOST:PORT[,HOST:PORT...]}
 * @param topic     the topic; every one of its partitions is read
 * @param group     the consumer group the positions are also reported to (for the usual lag
 *                  tools); tend itself seeks to the positions kept in its store
 */
public record StreamSource(String bootstrap, String topic, String group) {
    public static final String DEFAULT_GROUP = "tend";
    private static final Pattern HOST_PORT = Pattern.compile("(\\[[0-9A-Fa-f:.]+\\]|[A-Za-z0-9._-]+):[0-9]{1,5}");
    /** The characters a topic name may hold, and its longest length (the broker's own rule, from memory). */
    private static final Pattern TOPIC = Pattern.compile("[A-Za-z0-9._-]{1,249}");

    public StreamSource {
        Objects.requireNonNull(bootstrap, "bootstrap");
        Objects.requireNonNull(topic, "topic");
        Objects.requireNonNull(group, "group");
        for (String part : bootstrap.split(",", -1)) {
            if (!HOST_PORT.matcher(part.strip()).matches()) {
                throw new IllegalArgumentException("--kafka wants HOST:PORT (several separated by commas), got '" + part.strip() + "'");
            }
        }
        if (!TOPIC.matcher(topic).matches() || topic.equals(".") || topic.equals("..")) {
            throw new IllegalArgumentException("--topic wants a topic name of letters, digits, '.', '_' and '-' (at most 249),"
                    + " got '" + topic + "'");
        }
        if (group.isBlank()) throw new IllegalArgumentException("--group must not be blank");
    }

    /** How the log names it, e.g. {@code topic larkspur-health at 10.0.4.7:9092}. */
    public String describe() {
        return "topic " + topic + " at " + bootstrap;
    }
}
