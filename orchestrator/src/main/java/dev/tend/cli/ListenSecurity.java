package dev.tend.cli;

import dev.tend.shared.TendException;

import java.net.InetAddress;
import java.net.UnknownHostException;

/**
 * Bearer tokens must not cross a network in clear text: {@code tend serve} listens on an
 * address other than loopback only over TLS, or when told with {@code --insecure-http} (then
 * with a warning, for a server behind a TLS terminator on the same host or network).
 */
final class ListenSecurity {
    private ListenSecurity() {
    }

    /**
     * Null when {@code listen} needs no warning; the warning to print when plain HTTP was chosen
     * off loopback; a {@link TendException} (exit 2) when plain HTTP off loopback was not chosen.
     */
    static String check(Listen listen, boolean tls, boolean insecureHttp) {
        if (tls || isLoopback(listen.host())) return null;
        if (!insecureHttp) {
            throw new TendException("--listen " + listen.host() + " is not a loopback address, so tend serve listens there only over TLS"
                    + " (--tls-cert FILE --tls-key FILE), or with --insecure-http if a TLS terminator protects it");
        }
        return "tend: warning: listening on " + listen.host() + ":" + listen.port() + " over plain HTTP (--insecure-http):"
                + " bearer tokens cross the network in clear text unless something in front of tend adds TLS";
    }

    static boolean isLoopback(String host) {
        try {
            for (InetAddress a : InetAddress.getAllByName(host)) if (!a.isLoopbackAddress()) return false;
            return true;
        } catch (UnknownHostException e) {
            throw new TendException("--listen " + host + " is not an address or a name this machine can resolve");
        }
    }
}
