package dev.tend.cli;

import dev.tend.api.auth.Tokens;
import dev.tend.testing.TestCa;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import javax.net.ssl.SSLContext;
import javax.net.ssl.SSLSocket;
import javax.net.ssl.TrustManagerFactory;
import java.io.IOException;
import java.math.BigInteger;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.security.KeyStore;
import java.security.cert.X509Certificate;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * {@code tend serve --tls-cert --tls-key}: a real HTTPS server (its own process, on loopback)
 * with a certificate from a CA made in the test; the operator commands reach it with
 * {@code --ca}; a renewed certificate is served without a restart; plain HTTP off loopback is
 * refused unless asked for.
 */
class ServeTlsTest {
    private static final String TOKEN = "tok-tls-operator";

    @TempDir
    Path dir;

    private Process serve;

    @AfterEach
    void stop() throws InterruptedException {
        if (serve != null) {
            serve.destroy();
            if (!serve.waitFor(30, TimeUnit.SECONDS)) serve.destroyForcibly();
        }
    }

    @Test
    void operatorCommandsReachAnHttpsServerThroughItsCaAndARenewedCertificateIsServedWithoutARestart() throws Exception {
        TestCa ca = new TestCa("Larkspur test CA");
        Path caFile = TestCa.writeCert(dir.resolve("ca.pem"), ca.cert);
        TestCa.Issued first = ca.server();
        Path cert = TestCa.writeCert(dir.resolve("server.pem"), first.cert());
        Path key = TestCa.writeKey(dir.resolve("server.key"), first.key(), "rw-------");
        Files.writeString(dir.resolve("tokens.yaml"), "tokens:\n  - { name: olga, roles: [operator, viewer], sha256: "
                + Tokens.hash(TOKEN) + " }\n");
        int port = freePort();
        serve = startServe(port, "--tls-cert", cert.toString(), "--tls-key", key.toString(), "--tls-check-every", "1s");
        String url = "https://127.0.0.1:" + port;
        awaitUp(url, caFile);

        CliRun status = CliRun.of("brake", "status", "--server", url, "--token", TOKEN, "--ca", caFile.toString());
        assertThat(status.exit()).as(status.err()).isZero();
        assertThat(status.out()).contains("fleet brake released");
        CliRun engaged = CliRun.of("brake", "engage", "--reason", "zone z-b network work", "--server", url, "--token", TOKEN,
                "--ca", caFile.toString());
        assertThat(engaged.exit()).as(engaged.err()).isZero();

        // without the CA the JDK's trust store does not know the certificate: one sentence, exit 2
        CliRun untrusted = CliRun.of("brake", "status", "--server", url, "--token", TOKEN);
        assertThat(untrusted.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(untrusted.err()).contains("--ca FILE").doesNotContain("\tat ");
        // plain HTTP to the TLS port reaches no API
        CliRun plain = CliRun.of("brake", "status", "--server", "http://127.0.0.1:" + port, "--token", TOKEN);
        assertThat(plain.exit()).isEqualTo(ExitCodes.USAGE);

        assertThat(servedSerial(port, caFile)).isEqualTo(first.cert().getSerialNumber());
        TestCa.Issued renewed = ca.server();
        // as a certificate tool would: the key, then the certificate, each replaced whole
        TestCa.writeKey(dir.resolve("next.key"), renewed.key(), "rw-------");
        TestCa.writeCert(dir.resolve("next.pem"), renewed.cert());
        Files.move(dir.resolve("next.key"), key, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        Files.move(dir.resolve("next.pem"), cert, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        BigInteger served = null;
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(30);
        while (System.nanoTime() < deadline) {
            served = servedSerial(port, caFile);
            if (served.equals(renewed.cert().getSerialNumber())) break;
            Thread.sleep(100);
        }
        assertThat(served).as("the renewed certificate is served by the same process").isEqualTo(renewed.cert().getSerialNumber());
        assertThat(serve.isAlive()).isTrue();
        CliRun after = CliRun.of("brake", "status", "--server", url, "--token", TOKEN, "--ca", caFile.toString());
        assertThat(after.exit()).as(after.err()).isZero();
        assertThat(after.out()).contains("fleet brake ENGAGED");
        assertThat(Files.readString(dir.resolve("serve.err"))).contains("reloaded the TLS certificate from " + cert);
    }

    @Test
    void plainHttpOffLoopbackIsRefusedUnlessAskedForAndThenWarned() {
        // refused before anything binds: nothing listens off loopback in this test
        CliRun r = CliRun.of("serve", "--listen", "0.0.0.0:0", "--playbooks", CliRun.root().resolve("playbooks/library").toString(),
                "--fleet", CliRun.root().resolve("playbooks/library/fleet.yaml").toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err().strip().lines()).singleElement().asString().contains("not a loopback address").contains("--tls-cert")
                .contains("--insecure-http");

        assertThat(ListenSecurity.check(new Listen("127.0.0.1", 7420), false, false)).isNull();
        assertThat(ListenSecurity.check(new Listen("localhost", 7420), false, false)).isNull();
        assertThat(ListenSecurity.check(new Listen("0.0.0.0", 7420), true, false)).isNull();
        assertThat(ListenSecurity.check(new Listen("0.0.0.0", 7420), false, true)).startsWith("tend: warning: ")
                .contains("clear text");

        CliRun half = CliRun.of("serve", "--tls-cert", dir.resolve("server.pem").toString(), "--port", "0", "--playbooks",
                CliRun.root().resolve("playbooks/library").toString(), "--fleet", CliRun.root().resolve("playbooks/library/fleet.yaml").toString());
        assertThat(half.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(half.err()).contains("--tls-cert and --tls-key go together");
    }

    @Test
    void aKeyFileOthersMayReadIsRefusedAtStart() throws Exception {
        TestCa ca = new TestCa("Larkspur test CA");
        TestCa.Issued issued = ca.server();
        Path cert = TestCa.writeCert(dir.resolve("server.pem"), issued.cert());
        Path key = TestCa.writeKey(dir.resolve("server.key"), issued.key(), "rw-r--r--");
        CliRun r = CliRun.of("serve", "--port", "0", "--tls-cert", cert.toString(), "--tls-key", key.toString(),
                "--playbooks", CliRun.root().resolve("playbooks/library").toString(), "--fleet",
                CliRun.root().resolve("playbooks/library/fleet.yaml").toString(), "--db", dir.resolve("tend.db").toString());
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains("--tls-key " + key).contains("chmod 600").doesNotContain("\tat ");
    }

    private Process startServe(int port, String... tls) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        Path library = CliRun.root().resolve("playbooks/library");
        List<String> cmd = new ArrayList<>(List.of(java, "-Xmx256m", "-XX:TieredStopAtLevel=1", "-cp", System.getProperty("java.class.path"),
                "dev.tend.cli.TendMain", "serve", "--playbooks", library.toString(), "--fleet", library.resolve("fleet.yaml").toString(),
                "--db", dir.resolve("tend.db").toString(), "--tokens", dir.resolve("tokens.yaml").toString(),
                "--listen", "127.0.0.1:" + port));
        cmd.addAll(List.of(tls));
        return new ProcessBuilder(cmd).directory(dir.toFile()).redirectOutput(dir.resolve("serve.out").toFile())
                .redirectError(dir.resolve("serve.err").toFile()).start();
    }

    private void awaitUp(String url, Path caFile) throws Exception {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(90);
        while (serve.isAlive() && System.nanoTime() < deadline) {
            if (CliRun.of("brake", "status", "--server", url, "--token", TOKEN, "--ca", caFile.toString()).exit() == 0) return;
            Thread.sleep(200);
        }
        throw new AssertionError("serve did not come up: " + Files.readString(dir.resolve("serve.err")));
    }

    /** The serial number of the certificate the server presents to a new connection that trusts only the test CA. */
    private static BigInteger servedSerial(int port, Path caFile) throws Exception {
        KeyStore trust = KeyStore.getInstance("PKCS12");
        trust.load(null, null);
        trust.setCertificateEntry("ca", java.security.cert.CertificateFactory.getInstance("X.509")
                .generateCertificate(Files.newInputStream(caFile)));
        TrustManagerFactory tmf = TrustManagerFactory.getInstance(TrustManagerFactory.getDefaultAlgorithm());
        tmf.init(trust);
        SSLContext ctx = SSLContext.getInstance("TLS");
        ctx.init(null, tmf.getTrustManagers(), null);
        try (SSLSocket s = (SSLSocket) ctx.getSocketFactory().createSocket(InetAddress.getLoopbackAddress(), port)) {
            s.startHandshake();
            return ((X509Certificate) s.getSession().getPeerCertificates()[0]).getSerialNumber();
        }
    }

    private static int freePort() throws IOException {
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            return s.getLocalPort();
        }
    }
}
