package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Locale;
import java.util.Objects;

/**
 * Mails each page as plain text over SMTP. The SMTP server's acceptance of the message is
 * delivery; a refused recipient or sender (a 5xx reply) refuses the page for good; anything
 * else (a failed connection, a 4xx reply) is tried again later.
 *
 * @param security        how the connection is protected
 * @param credentialsFile a file holding {@code user:password} on its first line, or null to send without logging in
 * @param caBundle        PEM certificates to trust for the server's TLS instead of the JDK's, or null
 * @param subject         the subject, with page placeholders
 */
public record EmailChannel(Id name, String host, int port, Security security, String from, List<String> to,
                           Path credentialsFile, Path caBundle, Template subject, Duration timeout, Duration giveUpAfter) implements ChannelDef {
    public static final Duration DEFAULT_TIMEOUT = Duration.ofSeconds(30);
    public static final Template DEFAULT_SUBJECT = new Template("[tend] {kind}: {message}");

    /** STARTTLS on a plain connection (port 587), TLS from the first byte (port 465), or none (a relay on the same host only). */
    public enum Security {
        STARTTLS, TLS, NONE;

        public static Security parse(String v) {
            try {
                return valueOf(v.strip().toUpperCase(Locale.ROOT));
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException("must be starttls, tls or none, got '" + v + "'");
            }
        }

        public String wireName() {
            return name().toLowerCase(Locale.ROOT);
        }
    }

    public EmailChannel {
        Objects.requireNonNull(name, "channel name");
        if (host == null || host.isBlank()) throw new IllegalArgumentException("channel " + name + " needs the SMTP host");
        if (port < 1 || port > 65535) throw new IllegalArgumentException("channel " + name + " port must be between 1 and 65535, got " + port);
        Objects.requireNonNull(security, "channel " + name + " security");
        if (from == null || !from.contains("@")) throw new IllegalArgumentException("channel " + name + " from must be a mail address, got '" + from + "'");
        to = List.copyOf(to);
        if (to.isEmpty()) throw new IllegalArgumentException("channel " + name + " needs at least one address in to");
        for (String t : to) if (!t.contains("@")) throw new IllegalArgumentException("channel " + name + " to: '" + t + "' is not a mail address");
        if (credentialsFile != null && !credentialsFile.isAbsolute()) throw new IllegalArgumentException("credentials-file must be absolute here");
        if (caBundle != null && !caBundle.isAbsolute()) throw new IllegalArgumentException("ca-bundle must be absolute here");
        if (caBundle != null && security == Security.NONE) {
            throw new IllegalArgumentException("channel " + name + " has a ca-bundle but security none: a CA is for starttls or tls");
        }
        subject = subject == null ? DEFAULT_SUBJECT : subject;
        timeout = timeout == null ? DEFAULT_TIMEOUT : timeout;
        giveUpAfter = giveUpAfter == null ? DEFAULT_GIVE_UP_AFTER : giveUpAfter;
        ChannelDef.checkGiveUp(name, giveUpAfter);
    }

    @Override
    public String kind() {
        return "email";
    }
}
