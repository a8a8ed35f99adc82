package dev.tend.cli;

import dev.tend.cli.ops.HttpOperations;
import dev.tend.cli.ops.Operations;
import dev.tend.shared.TendException;
import picocli.CommandLine.Option;

import java.net.URI;
import java.net.URISyntaxException;

/**
 * {@code --server URL --token T} (or the environment's {@code TEND_SERVER} and {@code TEND_TOKEN}):
 * which running {@code tend serve} an operator command goes to, and as whom.
 */
final class ServerOptions {
    @Option(names = "--server", paramLabel = "URL", defaultValue = "${env:TEND_SERVER:-http://127.0.0.1:7420}",
            description = "the running tend serve (default: $TEND_SERVER, else ${DEFAULT-VALUE})")
    String server;

    @Option(names = "--token", paramLabel = "T", defaultValue = "${env:TEND_TOKEN}",
            description = "bearer token (default: $TEND_TOKEN; prefer the environment, a command line is visible to others)")
    String token;

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
        return new HttpOperations(uri, token.strip());
    }
}
