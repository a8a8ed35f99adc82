package dev.tend.page;

import javax.net.ssl.SSLContext;
import javax.net.ssl.SSLSocket;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.OutputStream;
import java.io.Writer;
import java.io.OutputStreamWriter;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.CopyOnWriteArrayList;

/**
 * A small SMTP receiver on loopback for the STARTTLS test (the mail server of the other email
 * tests has no STARTTLS): it offers STARTTLS in its EHLO answer (RFC 3207), refuses mail
 * before the connection is upgraded ({@code 530}), upgrades with the given TLS context, and
 * keeps every message received after the upgrade. One connection at a time.
 */
final class StartTlsReceiver implements AutoCloseable {
    /** A message taken over TLS: the envelope and the data as sent (dot-stuffing undone). */
    record Received(String from, List<String> to, String data, String protocol) {
    }

    private final ServerSocket server;
    private final SSLContext tls;
    private final List<Received> received = new CopyOnWriteArrayList<>();
    private final Thread thread;

    StartTlsReceiver(SSLContext tls) throws IOException {
        this.tls = tls;
        this.server = new ServerSocket(0, 10, InetAddress.getLoopbackAddress());
        this.thread = new Thread(this::serve, "starttls-receiver");
        thread.setDaemon(true);
        thread.start();
    }

    int port() {
        return server.getLocalPort();
    }

    List<Received> received() {
        return received;
    }

    private void serve() {
        while (!server.isClosed()) {
            try (Socket plain = server.accept()) {
                conversation(plain);
            } catch (IOException closedOrCut) {
                // the next connection, or the end
            }
        }
    }

    private void conversation(Socket plain) throws IOException {
        Socket s = plain;
        BufferedReader in = reader(s);
        Writer out = writer(s.getOutputStream());
        reply(out, "220 mail.larkspur.example ESMTP test receiver");
        boolean secure = false;
        String from = null;
        List<String> to = new CopyOnWriteArrayList<>();
        String line;
        while ((line = in.readLine()) != null) {
            String verb = line.split(" ", 2)[0].toUpperCase(Locale.ROOT);
            switch (verb) {
                case "EHLO" -> reply(out, secure ? "250 mail.larkspur.example" : "250-mail.larkspur.example\r\n250 STARTTLS");
                case "STARTTLS" -> {
                    reply(out, "220 2.0.0 ready to start TLS");
                    SSLSocket t = (SSLSocket) tls.getSocketFactory().createSocket(s, "127.0.0.1", s.getPort(), true);
                    t.setUseClientMode(false);
                    t.startHandshake();
                    s = t;
                    in = reader(s);
                    out = writer(s.getOutputStream());
                    secure = true;
                }
                case "QUIT" -> {
                    reply(out, "221 2.0.0 bye");
                    return;
                }
                case "NOOP", "RSET" -> reply(out, "250 2.0.0 ok");
                default -> {
                    if (!secure) {
                        reply(out, "530 5.7.0 must issue a STARTTLS command first");
                    } else if (verb.equals("MAIL")) {
                        from = line.substring(line.indexOf(':') + 1).strip();
                        to.clear();
                        reply(out, "250 2.1.0 ok");
                    } else if (verb.equals("RCPT")) {
                        to.add(line.substring(line.indexOf(':') + 1).strip());
                        reply(out, "250 2.1.5 ok");
                    } else if (verb.equals("DATA")) {
                        reply(out, "354 end data with <CR><LF>.<CR><LF>");
                        StringBuilder data = new StringBuilder();
                        String d;
                        while ((d = in.readLine()) != null && !d.equals(".")) data.append(d.startsWith("..") ? d.substring(1) : d).append('\n');
                        received.add(new Received(from, List.copyOf(to), data.toString(), ((SSLSocket) s).getSession().getProtocol()));
                        reply(out, "250 2.0.0 queued");
                    } else {
                        reply(out, "502 5.5.2 not known here");
                    }
                }
            }
        }
    }

    private static BufferedReader reader(Socket s) throws IOException {
        return new BufferedReader(new InputStreamReader(s.getInputStream(), StandardCharsets.UTF_8));
    }

    private static Writer writer(OutputStream o) {
        return new OutputStreamWriter(o, StandardCharsets.UTF_8);
    }

    private static void reply(Writer out, String text) throws IOException {
        out.write(text + "\r\n");
        out.flush();
    }

    @Override
    public void close() throws IOException {
        server.close();
    }
}
