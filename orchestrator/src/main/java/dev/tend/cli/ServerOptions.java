package dev.tend.cli;

import dev.tend.cli.ops.HttpOperations;
import dev.tend.cli.ops.Operations;
import dev.tend.shared.TendException;
import picocli.CommandLine.Option;

import java.net.URI;
import java.net.URISyntaxException;

/**
 * {@code --server URL --token T [--ca FILE]} (or the environment's {@code TEND_SERVER}, {@code TEND_TOKEN}
 * and {@code TEND_CA}): which running {@code tend serve} an operator command goes to, as whom, and
 * which certificates it trusts when the server is {@code https://}.
 */
final class ServerOptions {
    @Option(names = "--server", paramLabel = "URL", defaultValue = "${env:TEND_SERVER:-http://127.0.0.1:7420}",
            description = "the running tend serve (default: $TEND_SERVER, else ${DEFAULT-VALUE})")
    String server;

    @Option(names = "--token", paramLabel = "T", defaultValue = "${env:TEND_TOKEN}",
            description = "bearer token (default: $TEND_TOKEN; prefer the environment, a command line is visible to others)")
    String token;

    @Option(names = "--ca", paramLabel = "FILE", defaultValue = "${env:TEND_CA}",
            description = "PEM certificates to trust for an https:// server instead of the JDK's (default: $TEND_CA)")
    java.nio.file.Path ca;

    Operations operations() {
        if (token == null || token.isBlank()) {
            throw new TendException("this needs a token: set TEND_TOKEN or pass --token T");
        }
        URI uri;
        try {
            uri = new URI(server.endsWith("/") ? server.substring(0, server.length() - 1) : server);
        } catch (URISyntaxException e) {
            throw new TendException("--server '" + server + "' is not a URL: " + e.getMessage());
        }
        if (!"http".equals(uri.getScheme()) && !"https".equals(uri.getScheme()) || uri.getHost() == null) {
            throw new TendException("--server must be an http:// or https:// URL with a host, got '" + server + "'");
        }
        if (ca != null && !"https".equals(uri.getScheme())) {
            throw new TendException("--ca is for an https:// server; --server is '" + server + "'");
        }
        return new HttpOperations(uri, token.strip(), ca);
    }
}
