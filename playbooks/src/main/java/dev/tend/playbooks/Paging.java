package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.time.Duration;
import java.util.Collections;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.TreeMap;

/**
 * Where pages go ({@code channels:} and {@code pages:} in tend.yaml). Without
 * {@code channels:} every channel name is delivered to tend's log, as a {@link LogChannel}
 * (and tend warns at start that pages reach nobody else); with it, every channel named
 * anywhere must be defined.
 *
 * @param channels         the defined channels by name; empty when tend.yaml defines none
 * @param channel          the channel of tend's own pages (flapping, loop, needs a person, approvals)
 * @param consoleUrl       the console's base URL for links in pages (ends with '/'), or null
 * @param brakeGather      after the brake engages, how long its page waits so that it carries the event's size
 * @param approvalReminder how long before an approval lapses a reminder is paged; zero: none
 */
public record Paging(Map<Id, ChannelDef> channels, Id channel, String consoleUrl, Duration brakeGather,
                     Duration approvalReminder) {
    public static final Id DEFAULT_CHANNEL = Id.of("oncall");
    public static final Duration DEFAULT_BRAKE_GATHER = Duration.ofSeconds(30);
    public static final Duration DEFAULT_APPROVAL_REMINDER = Duration.ofMinutes(10);
    private static final Paging BUILT_IN = new Paging(Map.of(), DEFAULT_CHANNEL, null, DEFAULT_BRAKE_GATHER, DEFAULT_APPROVAL_REMINDER);

    public Paging {
        channels = Collections.unmodifiableMap(new TreeMap<>(channels));
        Objects.requireNonNull(channel, "pages.channel");
        if (consoleUrl != null) {
            if (!consoleUrl.startsWith("http://") && !consoleUrl.startsWith("https://")) {
                throw new IllegalArgumentException("pages.console-url must start with http:// or https://, got '" + consoleUrl + "'");
            }
            if (!consoleUrl.endsWith("/")) consoleUrl = consoleUrl + "/";
        }
        Objects.requireNonNull(brakeGather, "pages.brake-gather");
        if (brakeGather.isNegative()) throw new IllegalArgumentException("pages.brake-gather must not be negative");
        Objects.requireNonNull(approvalReminder, "pages.approval-reminder");
        if (approvalReminder.isNegative()) throw new IllegalArgumentException("pages.approval-reminder must not be negative");
    }

    /** No channel defined: every page goes to the log. */
    public static Paging builtIn() {
        return BUILT_IN;
    }

    /** True when tend.yaml defines channels (then unknown names are errors). */
    public boolean isConfigured() {
        return !channels.isEmpty();
    }

    /** The channel of this name: the defined one, or a log channel when none are defined; empty when undefined. */
    public Optional<ChannelDef> channel(Id name) {
        if (!isConfigured()) return Optional.of(new LogChannel(name));
        return Optional.ofNullable(channels.get(name));
    }

    public Paging withConsoleUrl(String url) {
        return new Paging(channels, channel, url, brakeGather, approvalReminder);
    }
}
