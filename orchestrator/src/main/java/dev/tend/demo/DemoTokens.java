package dev.tend.demo;

import dev.tend.api.auth.Tokens;

import java.security.SecureRandom;
import java.util.Base64;
import java.util.Objects;

/**
 * The bearer tokens of one {@code tend demo}, new at each start: one for a person who
 * approves and operates, one for a viewer, and one the incident script sends transitions with.
 * Only their SHA-256 goes into the tokens file.
 */
public record DemoTokens(String lead, String viewer, String script) {
    public static final String LEAD = "demo-lead";
    public static final String VIEWER = "demo-viewer";
    public static final String SCRIPT = "incident-script";

    public DemoTokens {
        Objects.requireNonNull(lead, "DemoTokens.lead must not be null");
        Objects.requireNonNull(viewer, "DemoTokens.viewer must not be null");
        Objects.requireNonNull(script, "DemoTokens.script must not be null");
        if (lead.equals(viewer) || lead.equals(script) || viewer.equals(script)) {
            throw new IllegalArgumentException("DemoTokens must be three different tokens");
        }
    }

    /** Three tokens of 24 random bytes each, URL-safe Base64. */
    public static DemoTokens random(SecureRandom random) {
        return new DemoTokens(token(random), token(random), token(random));
    }

    private static String token(SecureRandom random) {
        byte[] b = new byte[24];
        random.nextBytes(b);
        return Base64.getUrlEncoder().withoutPadding().encodeToString(b);
    }

    /** The tokens file for {@code tend serve}: names, roles and hashes. */
    public String toFileText() {
        return "# tend demo tokens: new at each start; only the hashes are kept here\n"
                + "tokens:\n"
                + "  - { name: " + LEAD + ", roles: [approver, operator], sha256: " + Tokens.hash(lead) + " }\n"
                + "  - { name: " + VIEWER + ", roles: [viewer], sha256: " + Tokens.hash(viewer) + " }\n"
                + "  - { name: " + SCRIPT + ", roles: [operator], sha256: " + Tokens.hash(script) + " }\n";
    }

    @Override
    public String toString() {
        return "DemoTokens[three tokens, not shown]";
    }
}
