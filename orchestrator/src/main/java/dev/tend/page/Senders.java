package dev.tend.page;

import dev.tend.http.OutgoingHttp;
import dev.tend.playbooks.ChannelDef;
import dev.tend.playbooks.CommandChannel;
import dev.tend.playbooks.EmailChannel;
import dev.tend.playbooks.LogChannel;
import dev.tend.playbooks.Paging;
import dev.tend.playbooks.WebhookChannel;
import dev.tend.shared.Id;

import java.io.PrintWriter;
import java.time.Duration;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.ConcurrentHashMap;

/**
 * The senders of the configured channels, built once at start: building one reads and checks
 * its files (CA bundle, client key, token, credentials), so a bad file stops tend before it
 * serves. Without {@code channels:} in tend.yaml every channel name writes to the log.
 */
public final class Senders {
    private final Paging paging;
    private final Map<Id, PageSender> byName = new ConcurrentHashMap<>();
    private final LogSender log;

    private Senders(Paging paging, OutgoingHttp http, PrintWriter logOut) {
        this.paging = paging;
        this.log = new LogSender(logOut);
        for (ChannelDef c : paging.channels().values()) byName.put(c.name(), build(c, http));
    }

    /** Builds every configured channel's sender; throws {@link dev.tend.shared.TendException} for a bad file. */
    public static Senders from(Paging paging, OutgoingHttp http, PrintWriter log) {
        return new Senders(paging, http, log);
    }

    private PageSender build(ChannelDef c, OutgoingHttp http) {
        if (c instanceof WebhookChannel w) {
            http.check(w.client());
            return new WebhookSender(w, http);
        }
        if (c instanceof EmailChannel e) return new EmailSender(e);
        if (c instanceof CommandChannel cmd) return new CommandSender(cmd);
        if (c instanceof LogChannel) return log;
        throw new IllegalStateException("no sender for channel kind " + c.kind());
    }

    /** The sender of the channel named {@code name}; empty when tend.yaml defines channels but not this one. */
    public Optional<PageSender> sender(String name) {
        if (!paging.isConfigured()) return Optional.of(log);
        if (!Id.isValid(name)) return Optional.empty();
        return Optional.ofNullable(byName.get(Id.of(name)));
    }

    /** How long delivery to {@code name} is tried before it is given up. */
    public Duration giveUpAfter(String name) {
        if (Id.isValid(name)) {
            ChannelDef c = paging.channels().get(Id.of(name));
            if (c != null) return c.giveUpAfter();
        }
        return ChannelDef.DEFAULT_GIVE_UP_AFTER;
    }

    /** The console's base URL for links, or null. */
    public String consoleUrl() {
        return paging.consoleUrl();
    }

    /** True when no channel is configured, so pages reach only the log. */
    public boolean logOnly() {
        return !paging.isConfigured();
    }
}
