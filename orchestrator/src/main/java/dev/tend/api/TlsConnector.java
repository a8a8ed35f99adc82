package dev.tend.api;

import org.eclipse.jetty.server.HttpConfiguration;
import org.eclipse.jetty.server.HttpConnectionFactory;
import org.eclipse.jetty.server.SecureRequestCustomizer;
import org.eclipse.jetty.server.Server;
import org.eclipse.jetty.server.ServerConnector;
import org.eclipse.jetty.server.SslConnectionFactory;
import org.eclipse.jetty.util.ssl.SslContextFactory;

/** The HTTPS listener of {@code tend serve}: HTTP/1.1 over TLS with the context of a {@link ServerTls}. */
final class TlsConnector {
    private TlsConnector() {
    }

    static ServerConnector of(Server server, HttpConfiguration http, ServerTls tls, String host, int port) {
        // the Host header is checked by HostCheck; the certificate is not asked to name it
        http.addCustomizer(new SecureRequestCustomizer(false));
        SslContextFactory.Server ssl = new SslContextFactory.Server();
        ssl.setSslContext(tls.context());
        ServerConnector c = new ServerConnector(server, new SslConnectionFactory(ssl, "http/1.1"),
                new HttpConnectionFactory(http));
        c.setHost(host);
        c.setPort(port);
        return c;
    }
}
