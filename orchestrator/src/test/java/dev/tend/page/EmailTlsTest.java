package dev.tend.page;

import com.icegreen.greenmail.util.DummySSLServerSocketFactory;
import com.icegreen.greenmail.util.GreenMail;
import com.icegreen.greenmail.util.ServerSetup;
import dev.tend.http.OutgoingHttp;
import dev.tend.testing.TestCa;
import jakarta.mail.internet.MimeMessage;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.OutputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.KeyStore;
import java.util.LinkedHashMap;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Pages mailed over an encrypted connection, with the server's certificate trusted through
 * the channel's {@code ca-bundle} (a CA made in the test), never by turning the checks off:
 * TLS from the first byte against a real mail server (GreenMail's SMTPS, given a certificate
 * of the test CA), and STARTTLS (RFC 3207) against {@link StartTlsReceiver}.
 */
class EmailTlsTest {
    @TempDir
    Path dir;
    private GreenMail mail;
    private StartTlsReceiver receiver;

    @AfterEach
    void stop() throws Exception {
        if (mail != null) mail.stop();
        if (receiver != null) receiver.close();
    }

    private static Page page(String id) {
        Map<String, Object> f = new LinkedHashMap<>();
        f.put("id", id);
        f.put("channel", "oncall");
        f.put("at", "2027-03-14T02:17:00Z");
        f.put("kind", "needs-human");
        f.put("cluster", "fares-3");
        f.put("message", "run r000042 on fares-3/n2 needs a person");
        return new Page(f);
    }

    private PageSender sender(String security, int port, Path ca) {
        String yaml = """
                channels:
                  oncall:
                    email:
                      host: 127.0.0.1
                      port: %d
                      security: %s
                      from: tend@larkspur.example
                      to: [oncall@larkspur.example]
                      timeout: 10s
                %s""".formatted(port, security, ca == null ? "" : "      ca-bundle: " + ca + "\n");
        return Senders.from(Outboxes.paging(yaml), new OutgoingHttp(), new PrintWriter(new StringWriter())).sender("oncall").orElseThrow();
    }

    @Test
    void implicitTlsDeliversThroughTheChannelsCaBundleAndNotWithoutIt() throws Exception {
        TestCa ca = new TestCa("Larkspur mail CA");
        Path caFile = TestCa.writeCert(dir.resolve("mail-ca.pem"), ca.cert);
        TestCa.Issued server = ca.server();
        Path keystore = dir.resolve("mail.p12");
        KeyStore ks = KeyStore.getInstance("PKCS12");
        ks.load(null, null);
        ks.setKeyEntry("mail", server.key().getPrivate(), "changeit".toCharArray(),
                new java.security.cert.Certificate[] {server.cert(), ca.cert});
        try (OutputStream o = Files.newOutputStream(keystore)) {
            ks.store(o, "changeit".toCharArray());
        }
        // the mail server's TLS certificate: one of the test CA, naming 127.0.0.1 (read once per JVM, on first use)
        System.setProperty(DummySSLServerSocketFactory.GREENMAIL_KEYSTORE_FILE_PROPERTY, keystore.toString());
        System.setProperty(DummySSLServerSocketFactory.GREENMAIL_KEYSTORE_PASSWORD_PROPERTY, "changeit");
        System.setProperty(DummySSLServerSocketFactory.GREENMAIL_KEY_PASSWORD_PROPERTY, "changeit");
        mail = new GreenMail(new ServerSetup(0, "127.0.0.1", ServerSetup.PROTOCOL_SMTPS).dynamicPort());
        mail.start();
        int port = mail.getSmtps().getPort();

        Answer untrusted = sender("tls", port, null).send(page("r000042/needs-human"));
        assertThat(untrusted.outcome()).as("the JDK's trust store does not know the test CA").isEqualTo(Answer.Outcome.RETRY);
        assertThat(mail.getReceivedMessages()).isEmpty();

        Answer a = sender("tls", port, caFile).send(page("r000042/needs-human"));
        assertThat(a.outcome()).as(a.text()).isEqualTo(Answer.Outcome.ACCEPTED);
        MimeMessage[] got = mail.getReceivedMessages();
        assertThat(got).hasSize(1);
        assertThat(got[0].getSubject()).isEqualTo("[tend] needs-human: run r000042 on fares-3/n2 needs a person");
        assertThat(got[0].getHeader("X-Tend-Page")).containsExactly("r000042/needs-human");
    }

    @Test
    void startTlsUpgradesBeforeAnyMailIsSentAndTrustsTheChannelsCaBundle() throws Exception {
        TestCa ca = new TestCa("Larkspur mail CA");
        Path caFile = TestCa.writeCert(dir.resolve("mail-ca.pem"), ca.cert);
        receiver = new StartTlsReceiver(ca.serverContext(ca.server()));

        Answer untrusted = sender("starttls", receiver.port(), null).send(page("r000043/needs-human"));
        assertThat(untrusted.outcome()).isEqualTo(Answer.Outcome.RETRY);
        assertThat(receiver.received()).isEmpty();

        Answer a = sender("starttls", receiver.port(), caFile).send(page("r000043/needs-human"));
        assertThat(a.outcome()).as(a.text()).isEqualTo(Answer.Outcome.ACCEPTED);
        assertThat(receiver.received()).singleElement().satisfies(m -> {
            assertThat(m.protocol()).startsWith("TLSv1.");
            assertThat(m.from()).isEqualTo("<tend@larkspur.example>");
            assertThat(m.to()).containsExactly("<oncall@larkspur.example>");
            assertThat(m.data()).contains("Subject: [tend] needs-human: run r000042 on fares-3/n2 needs a person")
                    .contains("X-Tend-Page: r000043/needs-human");
        });
    }

    @Test
    void startTlsIsRequiredNotMerelyTriedSoAServerWithoutItGetsNoMail() throws Exception {
        mail = new GreenMail(new ServerSetup(0, "127.0.0.1", ServerSetup.PROTOCOL_SMTP).dynamicPort());
        mail.start();
        TestCa ca = new TestCa("Larkspur mail CA");
        Path caFile = TestCa.writeCert(dir.resolve("mail-ca.pem"), ca.cert);
        Answer a = sender("starttls", mail.getSmtp().getPort(), caFile).send(page("r000044/needs-human"));
        assertThat(a.outcome()).isNotEqualTo(Answer.Outcome.ACCEPTED);
        assertThat(a.text()).containsIgnoringCase("STARTTLS");
        assertThat(mail.getReceivedMessages()).as("nothing went out in clear text").isEmpty();
    }
}
