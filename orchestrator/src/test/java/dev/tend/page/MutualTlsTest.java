package dev.tend.page;

import dev.tend.engine.Effect;
import dev.tend.engine.Input;
import dev.tend.executor.HttpExecutor;
import dev.tend.http.OutgoingHttp;
import dev.tend.playbooks.Actions;
import dev.tend.playbooks.HttpAction;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.Id;
import dev.tend.shared.Target;
import dev.tend.shared.TendException;
import dev.tend.store.LedgerFilter;
import dev.tend.store.PageRow;
import dev.tend.store.Store;
import dev.tend.testing.TestCa;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Clock;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * Webhooks and http actions share one client configuration: a real HTTPS receiver on
 * loopback whose certificate comes from a CA made in the test, requiring a client
 * certificate from the same CA (mutual TLS, RFC 8446 client authentication), plus a bearer
 * token read from a file and an extra header.
 */
class MutualTlsTest {
    @TempDir
    Path dir;
    private TestCa ca;
    private PageReceiver receiver;
    private Store store;
    private Courier courier;
    private Path caFile, certFile, keyFile, tokenFile;

    @BeforeEach
    void makeCa() throws Exception {
        ca = new TestCa("Larkspur Test CA");
        receiver = PageReceiver.https(ca.serverContext(ca.server()));
        TestCa.Issued client = ca.client("tend-larkspur");
        caFile = TestCa.writeCert(dir.resolve("ca.pem"), ca.cert);
        certFile = TestCa.writeCert(dir.resolve("client.pem"), client.cert());
        keyFile = TestCa.writeKey(dir.resolve("client.key"), client.key(), "rw-------");
        tokenFile = secret("pager.token", "t0ken-one\n");
    }

    @AfterEach
    void stop() {
        if (courier != null) courier.close();
        receiver.close();
        if (store != null) store.close();
    }

    private Path secret(String name, String text) throws Exception {
        Path f = dir.resolve(name);
        Files.writeString(f, text);
        Files.setPosixFilePermissions(f, PosixFilePermissions.fromString("rw-------"));
        return f;
    }

    private String clientKeys() {
        return "headers: { X-Larkspur-Team: platform }, bearer-token-file: " + tokenFile + ", ca-bundle: " + caFile
                + ", client-cert: " + certFile + ", client-key: " + keyFile;
    }

    @Test
    void aWebhookPresentsItsClientCertificateAndTokenAndPicksUpARotatedToken() throws Exception {
        store = Store.openSqlite(dir.resolve("tend.db"));
        String yaml = "channels:\n  oncall:\n    webhook: { url: \"" + receiver.url() + "\", " + clientKeys() + " }\n";
        Senders senders = Senders.from(Outboxes.paging(yaml), new OutgoingHttp(), new PrintWriter(new StringWriter()));
        courier = new Courier(store, senders, Clock.systemUTC(), Duration.ofSeconds(30), Courier.Listener.NONE).start();

        Outboxes.enqueue(store, "brake/1", "oncall", "brake", "fares-3", "fleet brake engaged");
        Outboxes.await("delivery over mutual TLS", Duration.ofSeconds(20), () -> Outboxes.row(store, "brake/1").state().equals(PageRow.DELIVERED));
        Files.writeString(tokenFile, "t0ken-two-rotated\n");
        Outboxes.enqueue(store, "brake/2", "oncall", "brake", "fares-3", "fleet brake engaged again");
        Outboxes.await("delivery with the new token", Duration.ofSeconds(20), () -> Outboxes.row(store, "brake/2").state().equals(PageRow.DELIVERED));

        List<PageReceiver.Request> got = receiver.requests();
        assertThat(got).hasSize(2);
        assertThat(got).allSatisfy(r -> {
            assertThat(r.clientSubject()).isEqualTo("CN=tend-larkspur");
            assertThat(r.headers()).containsEntry("x-larkspur-team", "platform");
        });
        assertThat(got.get(0).headers()).containsEntry("authorization", "Bearer t0ken-one");
        assertThat(got.get(1).headers()).containsEntry("authorization", "Bearer t0ken-two-rotated");
        List<String> ledger = new ArrayList<>();
        store.read(r -> {
            r.forEachLedger(LedgerFilter.all(), e -> ledger.add(e.entry()));
            return null;
        });
        assertThat(ledger).isNotEmpty().noneMatch(e -> e.contains("t0ken"));
    }

    @Test
    void anHttpActionUsesTheSameClientSettings() throws Exception {
        Actions actions = PlaybookLoader.parseActions(dir.resolve("actions.yaml").toString(), """
                actions:
                  restart-process:
                    http: { url: "%s", %s }
                """.formatted(receiver.url(), clientKeys()));
        HttpAction action = (HttpAction) actions.get(Id.of("restart-process")).orElseThrow();
        HttpExecutor ex = HttpExecutor.withDefaults(new OutgoingHttp());
        try {
            CompletableFuture<Input.ExecutorResult> f = new CompletableFuture<>();
            ex.execute(new Effect.CallExecutor("r000007", "restart", 1, "r000007/restart/1", action,
                    Target.node(Id.of("fares-3"), Id.of("n2")), "restart-stopped-process", Duration.ofSeconds(10)), f::complete);
            Input.ExecutorResult result = f.get(20, TimeUnit.SECONDS);
            assertThat(result.success()).as(result.message()).isTrue();
        } finally {
            ex.close();
        }
        assertThat(receiver.requests()).singleElement().satisfies(r -> {
            assertThat(r.key()).isEqualTo("r000007/restart/1");
            assertThat(r.clientSubject()).isEqualTo("CN=tend-larkspur");
            assertThat(r.headers()).containsEntry("authorization", "Bearer t0ken-one").containsEntry("x-larkspur-team", "platform");
        });
    }

    @Test
    void withoutTheTestCaInItsBundleTheReceiversCertificateIsNotTrusted() throws Exception {
        store = Store.openSqlite(dir.resolve("tend.db"));
        String yaml = "channels:\n  oncall:\n    webhook: { url: \"" + receiver.url() + "\", retries: 0 }\n";
        Senders senders = Senders.from(Outboxes.paging(yaml), new OutgoingHttp(), new PrintWriter(new StringWriter()));
        courier = new Courier(store, senders, Clock.systemUTC(), Duration.ofSeconds(30), Courier.Listener.NONE).start();
        Outboxes.enqueue(store, "brake/1", "oncall", "brake", "fares-3", "fleet brake engaged");
        Outboxes.await("a failed attempt", Duration.ofSeconds(20), () -> Outboxes.row(store, "brake/1").attempts() == 1);

        assertThat(Outboxes.row(store, "brake/1").state()).isEqualTo(PageRow.PENDING);
        assertThat(Outboxes.row(store, "brake/1").lastAnswer()).startsWith("could not reach 127.0.0.1:");
        assertThat(receiver.requests()).isEmpty();
    }

    @Test
    void aClientKeyReadableByOthersIsRefusedAtStart() throws Exception {
        Files.setPosixFilePermissions(keyFile, PosixFilePermissions.fromString("rw-r--r--"));
        String yaml = "channels:\n  oncall:\n    webhook: { url: \"" + receiver.url() + "\", " + clientKeys() + " }\n";
        assertThatThrownBy(() -> Senders.from(Outboxes.paging(yaml), new OutgoingHttp(), new PrintWriter(new StringWriter())))
                .isInstanceOf(TendException.class)
                .hasMessageContaining("client-key " + keyFile + " can be read or written by any user of this machine; tend refuses");
    }
}
