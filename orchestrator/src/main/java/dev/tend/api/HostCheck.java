package dev.tend.api;

import io.javalin.http.Context;
import io.javalin.http.HttpResponseException;

import java.util.Collection;
import java.util.Locale;
import java.util.Set;
import java.util.TreeSet;

/**
 * Answers only requests addressed to this server: the Host header (without its port) must
 * be a loopback name, the address listened on, or a name allowed with {@code --allow-host}.
 * A page elsewhere that makes a browser resolve its own name to 127.0.0.1 (DNS rebinding)
 * then reaches nothing, the unauthenticated {@code /metrics} included.
 */
final class HostCheck {
    private final Set<String> allowed = new TreeSet<>();

    HostCheck(String listenHost, Collection<String> allowHosts) {
        allowed.addAll(Set.of("localhost", "127.0.0.1", "::1"));
        if (!listenHost.isEmpty() && !listenHost.equals("0.0.0.0") && !listenHost.equals("::")) allowed.add(bare(listenHost));
        for (String h : allowHosts) allowed.add(bare(h));
    }

    void check(Context ctx) {
        String host = ctx.header("Host");
        if (host == null || host.isBlank()) throw new HttpResponseException(400, "the request has no Host header");
        String name = bare(withoutPort(host.strip()));
        if (!allowed.contains(name)) {
            throw new HttpResponseException(421, "this server answers to " + String.join(", ", allowed) + ", not to the Host '"
                    + host.strip() + "'; start it with --allow-host " + name + " if clients reach it by that name");
        }
    }

    private static String withoutPort(String host) {
        if (host.startsWith("[")) {
            int end = host.indexOf(']');
            return end > 0 ? host.substring(0, end + 1) : host;
        }
        int colon = host.indexOf(':');
        return colon >= 0 && host.indexOf(':', colon + 1) < 0 ? host.substring(0, colon) : host;
    }

    private static String bare(String host) {
        String h = host.toLowerCase(Locale.ROOT);
        if (h.startsWith("[") && h.endsWith("]")) h = h.substring(1, h.length() - 1);
        return h.endsWith(".") ? h.substring(0, h.length() - 1) : h;
    }
}
