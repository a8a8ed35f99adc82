package dev.tend.playbooks.load;

import dev.tend.playbooks.HttpClientSettings;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;
import dev.tend.shared.yaml.YScalar;

import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads the outgoing HTTP client keys that {@code http} actions (actions.yaml) and
 * {@code webhook} channels (tend.yaml) share: {@code headers}, {@code bearer-token-file},
 * {@code ca-bundle}, {@code client-cert}, {@code client-key}. Relative paths are resolved
 * against the folder of the file they are written in. Whether the files exist and are
 * private enough is checked when tend starts, on the machine that uses them.
 */
final class HttpClientReader {
    static final List<String> KEYS = List.of("headers", "bearer-token-file", "ca-bundle", "client-cert", "client-key");

    private HttpClientReader() {
    }

    /** The settings in {@code m} (other keys ignored), or null after a problem. */
    static HttpClientSettings read(Fields f, YMap m, String label) {
        int before = f.problems().size();
        Map<String, String> headers = new LinkedHashMap<>();
        m.get("headers").ifPresent(n -> {
            YMap h = f.asMap(n, label + ".headers");
            if (h == null) return;
            for (YMap.Entry e : h.entries()) {
                String name = e.key().value();
                if (!(e.value() instanceof YScalar s) || s.plainNull()) {
                    f.add(e.value(), name, label + ".headers." + name + " must be one value, got " + Read.kind(e.value()));
                    continue;
                }
                try {
                    HttpClientSettings.checkHeader(name, s.value());
                    headers.put(name, s.value());
                } catch (IllegalArgumentException ex) {
                    f.add(e.key(), name, label + ".headers: " + ex.getMessage());
                }
            }
        });
        Path token = path(f, m, "bearer-token-file", label);
        Path ca = path(f, m, "ca-bundle", label);
        Path cert = path(f, m, "client-cert", label);
        Path key = path(f, m, "client-key", label);
        if (m.has("client-cert") != m.has("client-key")) {
            YNode at = m.get("client-cert").or(() -> m.get("client-key")).get();
            f.add(at, m.has("client-cert") ? "client-cert" : "client-key",
                    label + ": client-cert and client-key go together (mutual TLS needs the certificate and its key)");
        }
        if (f.problems().size() > before) return null;
        return new HttpClientSettings(headers, token, ca, cert, key);
    }

    /** A path value resolved against the folder of {@code f}'s file. */
    static Path path(Fields f, YMap m, String key, String label) {
        return Read.value(f, m, key, label, label + "." + key, false, v -> {
            if (v.isBlank()) throw new IllegalArgumentException("must be a file path");
            Path p = Path.of(v.strip());
            if (p.isAbsolute()) return p.normalize();
            Path base = Path.of(f.source()).toAbsolutePath().getParent();
            return (base == null ? p.toAbsolutePath() : base.resolve(p)).normalize();
        });
    }
}
