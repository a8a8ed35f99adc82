package dev.tend.api.auth;

import dev.tend.shared.json.Sha256;

import java.util.Collection;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.regex.Pattern;

/**
 * The bearer tokens a server accepts, each known only by the SHA-256 (hex) of its text, so
 * the file that lists them gives nobody a usable token. Immutable and thread-safe.
 */
public final class Tokens {
    private static final Pattern SHA256_HEX = Pattern.compile("[0-9a-f]{64}");
    private final Map<String, Caller> byHash;

    /** One accepted token: who holds it, and the SHA-256 hex digest of the token's text. */
    public record Entry(Caller caller, String sha256) {
        public Entry {
            Objects.requireNonNull(caller, "caller");
            requireSha256(sha256);
        }
    }

    /** {@code text} when it is 64 lowercase hex digits; else {@link IllegalArgumentException} saying so. */
    public static String requireSha256(String text) {
        Objects.requireNonNull(text, "sha256");
        if (!SHA256_HEX.matcher(text).matches()) {
            throw new IllegalArgumentException("must be 64 lowercase hex digits (the SHA-256 of the token), got '"
                    + (text.length() > 80 ? text.substring(0, 80) + "..." : text) + "'");
        }
        return text;
    }

    private Tokens(Map<String, Caller> byHash) {
        this.byHash = Map.copyOf(byHash);
    }

    /** Accepts no token at all: every request that needs one is refused. */
    public static Tokens none() {
        return new Tokens(Map.of());
    }

    /** Throws {@link IllegalArgumentException} when two entries share a name or a hash. */
    public static Tokens of(Collection<Entry> entries) {
        Map<String, Caller> byHash = new HashMap<>();
        Map<String, String> names = new HashMap<>();
        for (Entry e : entries) {
            if (names.put(e.caller().name(), e.sha256()) != null) {
                throw new IllegalArgumentException("token name " + e.caller().name() + " is used twice; each holder needs their own");
            }
            Caller before = byHash.putIfAbsent(e.sha256(), e.caller());
            if (before != null) {
                throw new IllegalArgumentException("tokens " + before.name() + " and " + e.caller().name()
                        + " have the same sha256; each holder needs their own token");
            }
        }
        return new Tokens(byHash);
    }

    /** The SHA-256 hex digest of a token's text (UTF-8), as the tokens file stores it. */
    public static String hash(String token) {
        return Sha256.hex(token);
    }

    /** The holder of {@code token}, if it is one of these. */
    public Optional<Caller> holderOf(String token) {
        if (token == null || token.isEmpty()) return Optional.empty();
        return Optional.ofNullable(byHash.get(hash(token)));
    }

    public boolean isEmpty() {
        return byHash.isEmpty();
    }

    public List<String> names() {
        return byHash.values().stream().map(Caller::name).sorted().toList();
    }
}
