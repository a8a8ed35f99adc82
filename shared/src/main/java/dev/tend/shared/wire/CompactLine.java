package dev.tend.shared.wire;

import java.time.Instant;

/**
 * A wire line as the input journal keeps it: without its leading {@code at} and
 * {@code cluster} members, which the journal row holds in columns of its own. Every
 * transition and topology line {@link WireWriter#line} writes begins with these two; kept
 * whole, they were about two fifths of the journal's bytes, and every byte of a row is bound,
 * written to the log and copied into the store by each commit (DEVELOPERS.md, "Ingest").
 *
 * <p>The compact form begins with the comma that followed the cluster, so it is never taken
 * for a whole line (which begins with a brace); {@link #whole} gives back the line byte for
 * byte, and a whole line it is given back as it is.
 */
public final class CompactLine {
    private static final String AT = "{\"at\":\"";
    private static final String CLUSTER = "\",\"cluster\":\"";

    private CompactLine() {
    }

    /**
     * {@code line}, a line as {@link WireWriter#line} writes it (its time in
     * {@link Rfc3339#format}'s text, so that {@link #whole} can write it again), without its
     * {@code at} and {@code cluster}; {@code line} itself when it does not begin with them, or
     * they are not followed by another member.
     */
    public static String of(String line) {
        if (!line.startsWith(AT)) return line;
        int atEnd = line.indexOf('"', AT.length());
        if (atEnd < 0 || !line.startsWith(CLUSTER, atEnd)) return line;
        int clusterEnd = line.indexOf('"', atEnd + CLUSTER.length());
        if (clusterEnd < 0 || clusterEnd + 1 >= line.length() || line.charAt(clusterEnd + 1) != ',') return line;
        return line.substring(clusterEnd + 1);
    }

    /** True when {@code stored} is a compact line ({@link #of}), not a whole one. */
    public static boolean isCompact(String stored) {
        return !stored.isEmpty() && stored.charAt(0) == ',';
    }

    /**
     * The whole line of {@code stored}: a compact line given its event time {@code at} and its
     * {@code cluster} back; any other text as it is.
     */
    public static String whole(String stored, Instant at, String cluster) {
        if (!isCompact(stored) || at == null || cluster == null) return stored;
        return AT + Rfc3339.format(at) + CLUSTER + cluster + '"' + stored;
    }
}
