package dev.tend.playbooks.load;

import dev.tend.playbooks.ChannelDef;
import dev.tend.playbooks.CommandChannel;
import dev.tend.playbooks.EmailChannel;
import dev.tend.playbooks.HttpClientSettings;
import dev.tend.playbooks.JsonTemplate;
import dev.tend.playbooks.LogChannel;
import dev.tend.playbooks.Paging;
import dev.tend.playbooks.Template;
import dev.tend.playbooks.WebhookChannel;
import dev.tend.shared.Id;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;
import dev.tend.shared.yaml.YScalar;
import dev.tend.shared.yaml.Fields;

import java.net.URI;
import java.net.URISyntaxException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/** Reads {@code channels:} and {@code pages:} of tend.yaml. Records every problem. */
final class ChannelsReader {
    private static final List<String> KINDS = List.of("webhook", "email", "command", "log");
    private static final List<String> COMMON = List.of("give-up-after", "description");
    private static final List<String> WEBHOOK = List.of("url", "body", "timeout", "retries", "backoff");
    private static final List<String> EMAIL = List.of("host", "port", "security", "from", "to", "credentials-file", "ca-bundle", "subject",
            "timeout");
    private static final List<String> PAGES = List.of("channel", "console-url", "brake-gather", "approval-reminder");

    private final Fields f;

    private ChannelsReader(Fields f) {
        this.f = f;
    }

    /** The channels by name (broken ones left out, their problems recorded). */
    static Map<Id, ChannelDef> channels(Fields f, YNode node) {
        return new ChannelsReader(f).channels(node);
    }

    /** The {@code pages:} settings over {@code channels}; null after a problem. */
    static Paging pages(Fields f, YNode nodeOrNull, Map<Id, ChannelDef> channels) {
        return new ChannelsReader(f).pages(nodeOrNull, channels);
    }

    /**
     * Records a problem when channels are defined and {@code name} is not one of them, with
     * the nearest defined name.
     */
    static void checkNamed(Fields f, YNode at, String label, Id name, Map<Id, ChannelDef> channels) {
        String problem = unknownChannel(name, channels);
        if (problem != null) f.add(at, label.substring(label.lastIndexOf('.') + 1), label + ": " + problem);
    }

    /** Null when {@code name} may be used with these channels, else the sentence that says why not. */
    static String unknownChannel(Id name, Map<Id, ChannelDef> channels) {
        if (channels.isEmpty() || channels.containsKey(name)) return null;
        List<String> names = channels.keySet().stream().map(Id::value).toList();
        String near = Read.nearest(name.value(), names);
        return "unknown channel '" + name + "'" + (near == null ? "" : " (did you mean '" + near + "'?)")
                + "; the channels defined in tend.yaml are: " + String.join(", ", names);
    }

    private Map<Id, ChannelDef> channels(YNode node) {
        Map<Id, ChannelDef> out = new TreeMap<>();
        YMap m = f.asMap(node, "channels");
        if (m == null) return out;
        for (YMap.Entry e : m.entries()) {
            String name = e.key().value();
            if (!Id.isValid(name)) {
                f.add(e.key(), name, "channel name: " + Id.describeInvalid(name));
                continue;
            }
            ChannelDef c = channel(Id.of(name), e.value());
            if (c != null) out.put(c.name(), c);
        }
        return out;
    }

    private ChannelDef channel(Id id, YNode node) {
        String where = "channel " + id;
        YMap m = f.asMap(node, where);
        if (m == null) return null;
        List<String> kinds = new ArrayList<>();
        for (String k : KINDS) if (m.has(k)) kinds.add(k);
        if (kinds.size() != 1) {
            f.add(m, "", kinds.isEmpty() ? where + " needs exactly one of 'webhook', 'email', 'command' or 'log'"
                    : where + " has both '" + kinds.get(0) + "' and '" + kinds.get(1) + "'; a channel is exactly one kind");
            return null;
        }
        String kind = kinds.get(0);
        List<String> allowed = new ArrayList<>(COMMON);
        allowed.add(kind);
        if (kind.equals("command")) allowed.add("timeout");
        Read.allowOnly(f, m, where, allowed);
        Duration giveUp = Read.positiveDuration(f, m, "give-up-after", where, where + ".give-up-after", false);
        int before = f.problems().size();
        try {
            ChannelDef c = switch (kind) {
                case "webhook" -> webhook(id, m.get("webhook").get(), where + ".webhook", giveUp);
                case "email" -> email(id, m.get("email").get(), where + ".email", giveUp);
                case "command" -> command(id, m, where, giveUp);
                default -> new LogChannel(id);
            };
            return f.problems().size() > before ? null : c;
        } catch (IllegalArgumentException e) {
            f.add(m, "", e.getMessage());
            return null;
        }
    }

    private ChannelDef webhook(Id id, YNode node, String label, Duration giveUp) {
        YMap w = f.asMap(node, label);
        if (w == null) return null;
        List<String> allowed = new ArrayList<>(WEBHOOK);
        allowed.addAll(HttpClientReader.KEYS);
        Read.allowOnly(f, w, label, allowed);
        URI url = Read.value(f, w, "url", label, label + ".url", true, ChannelsReader::url);
        JsonTemplate body = w.get("body").map(n -> JsonBodyReader.read(f, n, label + ".body", Template.PAGE_PLACEHOLDERS))
                .map(JsonTemplate::new).orElse(null);
        Duration timeout = Read.positiveDuration(f, w, "timeout", label, label + ".timeout", false);
        Integer retries = Read.integer(f, w, "retries", label, label + ".retries", false, 0, 10);
        Duration backoff = Read.positiveDuration(f, w, "backoff", label, label + ".backoff", false);
        HttpClientSettings client = HttpClientReader.read(f, w, label);
        if (url == null || client == null) return null;
        return new WebhookChannel(id, url, body, timeout, retries == null ? WebhookChannel.DEFAULT_RETRIES : retries, backoff,
                client, giveUp);
    }

    private static URI url(String v) {
        try {
            URI u = new URI(v.strip());
            if (!("http".equals(u.getScheme()) || "https".equals(u.getScheme())) || u.getHost() == null) {
                throw new IllegalArgumentException("must be an absolute http:// or https:// URL with a host, got '" + v + "'");
            }
            return u;
        } catch (URISyntaxException e) {
            throw new IllegalArgumentException("is not a URL: " + e.getMessage());
        }
    }

    private ChannelDef email(Id id, YNode node, String label, Duration giveUp) {
        YMap e = f.asMap(node, label);
        if (e == null) return null;
        Read.allowOnly(f, e, label, EMAIL);
        String host = Read.value(f, e, "host", label, label + ".host", true, String::strip);
        EmailChannel.Security security = Read.value(f, e, "security", label, label + ".security", true, EmailChannel.Security::parse);
        Integer port = Read.integer(f, e, "port", label, label + ".port", false, 1, 65535);
        String from = Read.value(f, e, "from", label, label + ".from", true, ChannelsReader::address);
        List<String> to = e.get("to").isEmpty() ? null : addresses(e.get("to").get(), label + ".to");
        if (to == null && !e.has("to")) f.add(e, "to", label + " needs 'to': the addresses that receive pages");
        Path cred = HttpClientReader.path(f, e, "credentials-file", label);
        Path ca = HttpClientReader.path(f, e, "ca-bundle", label);
        if (ca != null && security == EmailChannel.Security.NONE) {
            f.add(e, "ca-bundle", label + ".ca-bundle is for security starttls or tls; with security none nothing is encrypted");
            return null;
        }
        Template subject = e.get("subject").map(n -> Read.template(f, n, label + ".subject", Template.PAGE_PLACEHOLDERS)).orElse(null);
        Duration timeout = Read.positiveDuration(f, e, "timeout", label, label + ".timeout", false);
        if (host == null || security == null || from == null || to == null) return null;
        int p = port != null ? port : switch (security) {
            case TLS -> 465;
            case STARTTLS -> 587;
            case NONE -> 25;
        };
        return new EmailChannel(id, host, p, security, from, to, cred, ca, subject, timeout, giveUp);
    }

    private List<String> addresses(YNode n, String label) {
        List<YNode> items = n instanceof YList l ? l.items() : List.of(n);
        List<String> out = new ArrayList<>();
        for (YNode item : items) {
            String a = f.parsedNode(item, label, ChannelsReader::address);
            if (a == null) return null;
            out.add(a);
        }
        if (out.isEmpty()) {
            f.add(n, "to", label + " lists no address");
            return null;
        }
        return out;
    }

    private static String address(String v) {
        String a = v.strip();
        int at = a.indexOf('@');
        if (at < 1 || at != a.lastIndexOf('@') || at == a.length() - 1 || a.chars().anyMatch(c -> c <= ' ' || c == ',')) {
            throw new IllegalArgumentException("must be one mail address such as oncall@larkspur.example, got '" + v + "'");
        }
        return a;
    }

    private ChannelDef command(Id id, YMap m, String where, Duration giveUp) {
        YNode cmd = m.get("command").get();
        Duration timeout = Read.positiveDuration(f, m, "timeout", where, where + ".timeout", false);
        if (cmd instanceof YScalar s && !s.plainNull()) {
            f.add(cmd, "command", where + ".command must be a list of arguments such as [notify-desk, \"{message}\"], not one"
                    + " string: tend never runs a shell");
            return null;
        }
        YList list = f.asList(cmd, where + ".command");
        if (list == null) return null;
        List<Template> argv = new ArrayList<>();
        for (int i = 0; i < list.items().size(); i++) {
            Template t = Read.template(f, list.items().get(i), where + ".command[" + i + "]", Template.PAGE_PLACEHOLDERS);
            if (t != null) argv.add(t);
        }
        if (argv.size() != list.items().size()) return null;
        return new CommandChannel(id, argv, timeout, giveUp);
    }

    private Paging pages(YNode node, Map<Id, ChannelDef> channels) {
        Paging d = Paging.builtIn();
        if (node == null) {
            if (unknownChannel(d.channel(), channels) != null) {
                return null; // reported by the caller, which knows where channels are written
            }
            return new Paging(channels, d.channel(), null, d.brakeGather(), d.approvalReminder());
        }
        YMap m = f.asMap(node, "pages");
        if (m == null) return null;
        Read.allowOnly(f, m, "pages", PAGES);
        Id channel = Read.value(f, m, "channel", "pages", "pages.channel", false, Id::of);
        if (channel != null) checkNamed(f, m.get("channel").get(), "pages.channel", channel, channels);
        String url = Read.value(f, m, "console-url", "pages", "pages.console-url", false, v -> {
            URI u = url(v);
            return u.toString();
        });
        Duration gather = Read.duration(f, m, "brake-gather", "pages", "pages.brake-gather", false);
        Duration reminder = Read.duration(f, m, "approval-reminder", "pages", "pages.approval-reminder", false);
        Id ch = channel != null ? channel : d.channel();
        if (channel == null && unknownChannel(ch, channels) != null) {
            f.add(m, "channel", "pages.channel: " + unknownChannel(ch, channels) + "; tend's own pages go to 'oncall' unless pages.channel names another");
        }
        if (f.hasProblems()) return null;
        return new Paging(channels, ch, url, gather == null ? d.brakeGather() : gather, reminder == null ? d.approvalReminder() : reminder);
    }
}
