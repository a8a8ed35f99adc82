package dev.tend.playbooks.load;

import dev.tend.playbooks.BrakePolicy;
import dev.tend.playbooks.ChannelDef;
import dev.tend.playbooks.Paging;
import dev.tend.playbooks.BrakeThreshold;
import dev.tend.playbooks.EffectiveLimits;
import dev.tend.playbooks.Freeze;
import dev.tend.playbooks.Limits;
import dev.tend.playbooks.Position;
import dev.tend.playbooks.RateLimit;
import dev.tend.playbooks.TagSelector;
import dev.tend.playbooks.TendConfig;
import dev.tend.shared.Id;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.RenamedKeys;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;

import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/** Reads {@code tend.yaml}, the fleet-wide policy. */
final class ConfigReader {
    private static final List<String> TOP = List.of("defaults", "brake", "freezes", "rate", "channels", "pages", "max-skew",
            "signals");
    private static final List<String> BRAKE = List.of("engage-at", "release-below", "auto-release", "page", "release-after");
    private static final RenamedKeys RENAMED_BRAKE = RenamedKeys.of("notify", "page");
    private static final List<String> THRESHOLD = List.of("clusters", "fraction");
    private static final List<String> FREEZE = List.of("from", "until", "reason", "clusters");

    private final Fields f;

    private ConfigReader(Fields f) {
        this.f = f;
    }

    /** The policy, or null when {@code f} has problems afterwards. */
    static TendConfig read(Fields f, YNode root, String contentHash) {
        return new ConfigReader(f).config(root, contentHash);
    }

    private TendConfig config(YNode root, String contentHash) {
        YMap m = f.asMap(root, "tend.yaml");
        if (m == null) return null;
        Read.allowOnly(f, m, "tend.yaml", TOP);
        Limits defaults = m.get("defaults").map(n -> LimitsReader.read(f, n, "defaults", new HashMap<String, Position>()))
                .orElse(Limits.none());
        BrakePolicy brake = m.get("brake").map(this::brake).orElse(BrakePolicy.builtIn());
        List<Freeze> freezes = m.get("freezes").map(this::freezes).orElse(List.of());
        RateLimit rate = Read.value(f, m, "rate", "tend.yaml", "rate", false, RateLimit::parse);
        java.time.Duration maxSkew = Read.duration(f, m, "max-skew", "tend.yaml", "max-skew", false);
        Set<Id> signals = m.get("signals").map(this::signals).orElse(Set.of());
        Map<Id, ChannelDef> channels = m.get("channels").map(n -> ChannelsReader.channels(f, n)).orElse(Map.of());
        if (brake != null && m.get("brake").orElse(null) instanceof YMap b) {
            b.get("page").ifPresent(n -> ChannelsReader.checkNamed(f, n, "brake.page", brake.pageChannel(), channels));
            if (!b.has("page") && m.get("channels").isPresent()) {
                ChannelsReader.checkNamed(f, b, "brake.page", brake.pageChannel(), channels);
            }
        }
        Paging paging = ChannelsReader.pages(f, m.get("pages").orElse(null), channels);
        if (paging == null && m.get("pages").isEmpty() && m.get("channels").isPresent()) {
            f.add(m.get("channels").get(), "channels", "tend's own pages (flapping, loops, runs that need a person, approvals)"
                    + " go to '" + Paging.DEFAULT_CHANNEL + "', which is not defined here; define it, or name another with pages.channel");
        }
        if (f.hasProblems()) return null;
        EffectiveLimits merged = EffectiveLimits.builtIn().withOverrides(defaults);
        return new TendConfig(merged, brake, freezes, rate == null ? TendConfig.BUILT_IN_FLEET_RATE : rate,
                maxSkew == null ? TendConfig.DEFAULT_MAX_SKEW : maxSkew, signals, f.source(), contentHash, paging);
    }

    /** {@code signals: [heartbeat, ...]}: the declared vocabulary; at least one, each an id, none twice. */
    private Set<Id> signals(YNode node) {
        Set<Id> out = new LinkedHashSet<>();
        YList list = f.asList(node, "signals");
        if (list == null) return out;
        if (list.items().isEmpty()) {
            f.add(node, "signals", "signals is empty; list the signals this fleet sends (like [heartbeat, storage-full]),"
                    + " or leave the key out to accept any signal");
            return out;
        }
        int n = 0;
        for (YNode item : list.items()) {
            n++;
            Id id = f.parsedNode(item, "signals[" + n + "]", Id::of);
            if (id != null && !out.add(id)) f.add(item, "signals", "signal '" + id + "' is listed twice in signals");
        }
        return out;
    }

    private BrakePolicy brake(YNode node) {
        YMap m = f.asMap(node, "brake");
        if (m == null) return null;
        Read.allowOnly(f, m, "brake", BRAKE, RENAMED_BRAKE);
        BrakeThreshold engage = f.node(m, "engage-at", "brake", true).map(n -> threshold(n, "brake.engage-at")).orElse(null);
        BrakeThreshold release = m.get("release-below").map(n -> threshold(n, "brake.release-below")).orElse(null);
        Boolean auto = Read.bool(f, m, "auto-release", "brake", "brake.auto-release");
        Id page = Read.value(f, m, "page", "brake", "brake.page", false, Id::of);
        java.time.Duration after = Read.value(f, m, "release-after", "brake", "brake.release-after", false,
                dev.tend.shared.time.Durations::parse);
        if (engage != null && release != null) {
            try {
                BrakePolicy.checkHysteresis(engage, release);
            } catch (IllegalArgumentException e) {
                f.add(m.get("release-below").get(), "release-below", e.getMessage());
                return null;
            }
        }
        if (Boolean.TRUE.equals(auto) && !m.has("release-below")) {
            f.add(m.get("auto-release").get(), "auto-release", "brake.auto-release is true but brake has no release-below;"
                    + " give the lower threshold at which the brake lets go by itself");
            return null;
        }
        if (engage == null || (m.has("release-below") && release == null)) return null;
        return new BrakePolicy(engage, release, auto != null && auto, page == null ? BrakePolicy.builtIn().pageChannel() : page,
                after == null ? BrakePolicy.DEFAULT_RELEASE_AFTER : after);
    }

    private BrakeThreshold threshold(YNode node, String label) {
        YMap m = f.asMap(node, label);
        if (m == null) return null;
        Read.allowOnly(f, m, label, THRESHOLD);
        Integer clusters = Read.integer(f, m, "clusters", label, label + ".clusters", false, 1, 1_000_000);
        Double fraction = Read.fraction(f, m, "fraction", label, label + ".fraction", false);
        if (!m.has("clusters") && !m.has("fraction")) {
            f.add(m, label, label + " needs 'clusters' (a count), 'fraction' (of the fleet) or both");
            return null;
        }
        if ((m.has("clusters") && clusters == null) || (m.has("fraction") && fraction == null)) return null;
        return new BrakeThreshold(clusters, fraction);
    }

    private List<Freeze> freezes(YNode node) {
        List<Freeze> out = new ArrayList<>();
        YList list = f.asList(node, "freezes");
        if (list == null) return out;
        int n = 0;
        for (YNode item : list.items()) {
            n++;
            String label = "freezes[" + n + "]";
            YMap m = f.asMap(item, label);
            if (m == null) continue;
            Read.allowOnly(f, m, label, FREEZE);
            Instant from = Read.value(f, m, "from", label, label + ".from", true, ConfigReader::time);
            Instant until = Read.value(f, m, "until", label, label + ".until", true, ConfigReader::time);
            String reason = Read.value(f, m, "reason", label, label + ".reason", true, v -> v);
            TagSelector clusters = m.get("clusters").map(c -> Read.selector(f, c, label + ".clusters")).orElse(TagSelector.all());
            if (from != null && until != null && !until.isAfter(from)) {
                f.add(m.get("until").get(), "until", label + ".until (" + until + ") must be after from (" + from + ")");
                continue;
            }
            if (from != null && until != null && reason != null && clusters != null) out.add(new Freeze(from, until, reason, clusters));
        }
        return out;
    }

    static Instant time(String v) {
        try {
            return OffsetDateTime.parse(v.strip()).toInstant();
        } catch (DateTimeParseException e) {
            throw new IllegalArgumentException("a time looks like 2027-12-24T18:00:00Z or 2027-12-24T18:00:00+01:00"
                    + " (RFC 3339, with a zone), got '" + v + "'");
        }
    }
}
