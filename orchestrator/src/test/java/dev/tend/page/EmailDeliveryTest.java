package dev.tend.page;

import com.fasterxml.jackson.databind.JsonNode;
import com.icegreen.greenmail.Managers;
import com.icegreen.greenmail.mail.MailAddress;
import com.icegreen.greenmail.smtp.SmtpManager;
import com.icegreen.greenmail.smtp.SmtpServer;
import com.icegreen.greenmail.smtp.SmtpState;
import com.icegreen.greenmail.util.GreenMail;
import com.icegreen.greenmail.util.ServerSetup;
import dev.tend.http.OutgoingHttp;
import dev.tend.store.PageRow;
import dev.tend.store.Store;
import jakarta.mail.internet.MimeMessage;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Clock;
import java.time.Duration;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Pages mailed over SMTP to a real mail server in the test (GreenMail), from a real outbox. */
class EmailDeliveryTest {
    @TempDir
    Path dir;
    private Store store;
    private Courier courier;
    private GreenMail mail;
    private SmtpServer refusing;

    @AfterEach
    void stop() {
        if (courier != null) courier.close();
        if (mail != null) mail.stop();
        if (refusing != null) refusing.stopService();
        if (store != null) store.close();
    }

    private Courier courier(String yaml) {
        store = Store.openSqlite(dir.resolve("tend.db"));
        Senders senders = Senders.from(Outboxes.paging(yaml).withConsoleUrl("https://tend.larkspur.example/"), new OutgoingHttp(),
                new PrintWriter(new StringWriter()));
        return new Courier(store, senders, Clock.systemUTC(), Duration.ofSeconds(30), Courier.Listener.NONE).start();
    }

    private Path credentials(String text, String perms) throws Exception {
        Path f = dir.resolve("smtp.credentials");
        Files.writeString(f, text);
        Files.setPosixFilePermissions(f, PosixFilePermissions.fromString(perms));
        return f;
    }

    @Test
    void aPageIsMailedWithItsSubjectFieldsLinkAndIdAndLedgeredAsDelivered() throws Exception {
        mail = new GreenMail(new ServerSetup(0, "127.0.0.1", ServerSetup.PROTOCOL_SMTP).dynamicPort());
        mail.setUser("tend@larkspur.example", "tend", "s3cret-word");
        mail.start();
        Path cred = credentials("tend:s3cret-word\n", "rw-------");
        courier = courier("""
                channels:
                  oncall:
                    email:
                      host: 127.0.0.1
                      port: %d
                      security: none
                      from: tend@larkspur.example
                      to: [oncall@larkspur.example]
                      credentials-file: %s
                """.formatted(mail.getSmtp().getPort(), cred));
        Outboxes.enqueue(store, "r000042/approval", "oncall", "approval-requested", "fares-3",
                "replace-silent-node on fares-3/n2 waits for an approval");
        courier.wake();
        Outboxes.await("the mail", Duration.ofSeconds(20), () -> Outboxes.row(store, "r000042/approval").state().equals(PageRow.DELIVERED));

        MimeMessage[] got = mail.getReceivedMessages();
        assertThat(got).hasSize(1);
        assertThat(got[0].getSubject()).isEqualTo("[tend] approval-requested: replace-silent-node on fares-3/n2 waits for an approval");
        assertThat(got[0].getHeader("X-Tend-Page")).containsExactly("r000042/approval");
        assertThat(got[0].getMessageID()).isEqualTo("<r000042.approval@tend.invalid>");
        String body = ((String) got[0].getContent()).replace("\r\n", "\n");
        assertThat(body).startsWith("replace-silent-node on fares-3/n2 waits for an approval\n")
                .contains("id: r000042/approval\n").contains("cluster: fares-3\n")
                .contains("\nlink: https://tend.larkspur.example/#approvals");
        assertThat(Outboxes.ledger(store, "notification-delivered")).singleElement()
                .satisfies(d -> assertThat(d.get("answer").asText()).startsWith("accepted by 127.0.0.1:"));
    }

    @Test
    void aRefusedRecipientIsLedgeredAsFailedWithTheServersAnswer() throws Exception {
        Managers managers = new Managers() {
            private final SmtpManager smtp = new SmtpManager(getImapHostManager(), getUserManager()) {
                @Override
                public String checkRecipient(SmtpState state, MailAddress rcpt) {
                    return rcpt.getEmail().startsWith("nobody@") ? "550 5.1.1 no such mailbox here" : null;
                }
            };

            @Override
            public SmtpManager getSmtpManager() {
                return smtp;
            }
        };
        refusing = new SmtpServer(new ServerSetup(0, "127.0.0.1", ServerSetup.PROTOCOL_SMTP).dynamicPort(), managers);
        refusing.startService();
        assertThat(refusing.waitTillRunning(5000)).isTrue();
        courier = courier("""
                channels:
                  oncall:
                    email: { host: 127.0.0.1, port: %d, security: none, from: tend@larkspur.example,
                             to: [oncall@larkspur.example, nobody@larkspur.example] }
                """.formatted(refusing.getPort()));
        Outboxes.enqueue(store, "brake/3", "oncall", "brake", "fares-3", "fleet brake engaged");
        courier.wake();
        Outboxes.await("the refusal", Duration.ofSeconds(20), () -> Outboxes.row(store, "brake/3").state().equals(PageRow.FAILED));

        List<JsonNode> failed = Outboxes.ledger(store, "notification-failed");
        assertThat(failed).singleElement().satisfies(f -> {
            assertThat(f.get("final").asBoolean()).isTrue();
            assertThat(f.get("answer").asText()).contains("550 5.1.1 no such mailbox here").contains("nobody@larkspur.example");
        });
        assertThat(managers.getImapHostManager().getAllMessages()).as("nothing was sent to anyone").isEmpty();
    }

    @Test
    void aCredentialsFileReadableByOthersIsRefusedAtStart() throws Exception {
        Path cred = credentials("tend:s3cret-word\n", "rw-r--r--");
        String yaml = """
                channels:
                  oncall:
                    email: { host: 127.0.0.1, port: 2525, security: starttls, from: tend@larkspur.example,
                             to: [oncall@larkspur.example], credentials-file: %s }
                """.formatted(cred);
        assertThatThrownBy(() -> Senders.from(Outboxes.paging(yaml), new OutgoingHttp(), new PrintWriter(new StringWriter())))
                .isInstanceOf(dev.tend.shared.TendException.class)
                .hasMessage("credentials-file " + cred + " can be read or written by any user of this machine; tend refuses"
                        + " to use it. Make it private: chmod 600 " + cred);
    }
}
