package dev.tend.api;

import dev.tend.http.PemFiles;
import dev.tend.http.PrivateFiles;
import dev.tend.shared.TendException;

import javax.net.ssl.KeyManagerFactory;
import javax.net.ssl.SSLContext;
import javax.net.ssl.X509ExtendedKeyManager;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.security.GeneralSecurityException;
import java.security.KeyStore;
import java.security.PrivateKey;
import java.security.cert.Certificate;
import java.security.cert.X509Certificate;
import java.time.Duration;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;

/**
 * The server's TLS from a PEM certificate chain and an unencrypted PKCS#8 PEM key, read again
 * when either file changes (its modification time or size, looked at every {@code checkEvery}),
 * without a restart: new connections get the new certificate, open ones keep theirs. A pair
 * that cannot be read (say, the certificate was replaced and the key not yet) is reported once
 * and the previous pair stays in use; the next change is tried again. The key file must not be
 * readable by others, at start and at every reload.
 */
public final class ServerTls implements AutoCloseable {
    private final Path cert;
    private final Path key;
    private final PrintWriter log;
    private final SwappableKeyManager keys;
    private final SSLContext context;
    private final ScheduledExecutorService watcher;
    private volatile Stamp seen;

    private record Stamp(FileTime certTime, long certSize, FileTime keyTime, long keySize) {
        static Stamp of(Path cert, Path key) {
            try {
                return new Stamp(Files.getLastModifiedTime(cert), Files.size(cert), Files.getLastModifiedTime(key), Files.size(key));
            } catch (IOException e) {
                return null;
            }
        }
    }

    private ServerTls(Path cert, Path key, Duration checkEvery, PrintWriter log) {
        this.cert = Objects.requireNonNull(cert, "cert");
        this.key = Objects.requireNonNull(key, "key");
        this.log = Objects.requireNonNull(log, "log");
        if (checkEvery.isNegative() || checkEvery.isZero()) throw new IllegalArgumentException("checkEvery must be longer than zero");
        this.seen = Stamp.of(cert, key);
        this.keys = new SwappableKeyManager(load(cert, key));
        try {
            context = SSLContext.getInstance("TLS");
            context.init(new javax.net.ssl.KeyManager[] {keys}, null, null);
        } catch (GeneralSecurityException e) {
            throw new TendException("cannot set up TLS: " + e.getMessage(), e);
        }
        watcher = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "tend-tls-reload");
            t.setDaemon(true);
            return t;
        });
        long ms = checkEvery.toMillis();
        watcher.scheduleWithFixedDelay(this::reloadIfChanged, ms, ms, TimeUnit.MILLISECONDS);
    }

    /**
     * Reads {@code cert} and {@code key} now (a {@link TendException} naming the file when
     * either cannot be used) and looks at them again every {@code checkEvery}; reloads and
     * problems are written to {@code log}.
     */
    public static ServerTls watch(Path cert, Path key, Duration checkEvery, PrintWriter log) {
        return new ServerTls(cert, key, checkEvery, log);
    }

    /** The context a TLS listener serves with; its certificate is always the latest good pair. */
    public SSLContext context() {
        return context;
    }

    /** The certificate served now (the first of the chain). */
    public X509Certificate current() {
        return keys.certificate();
    }

    /** Reloads the pair when either file changed since it was last looked at; true when a new pair is in use. */
    boolean reloadIfChanged() {
        Stamp now = Stamp.of(cert, key);
        if (now == null || now.equals(seen)) return false;
        seen = now;
        try {
            keys.swap(load(cert, key));
        } catch (RuntimeException e) {
            synchronized (log) {
                log.println("tend: warning: the changed TLS files could not be used, so the previous certificate is still served: "
                        + e.getMessage());
                log.flush();
            }
            return false;
        }
        X509Certificate c = keys.certificate();
        synchronized (log) {
            log.println("tend: reloaded the TLS certificate from " + cert + " (" + c.getSubjectX500Principal().getName()
                    + ", valid until " + c.getNotAfter().toInstant() + ")");
            log.flush();
        }
        return true;
    }

    private static X509ExtendedKeyManager load(Path cert, Path key) {
        PrivateFiles.check(key, "--tls-key");
        List<Certificate> chain = PemFiles.certificates(cert, "--tls-cert");
        PrivateKey pk = PemFiles.privateKey(key, "--tls-key");
        if (!belongTogether(chain.get(0), pk)) {
            throw new TendException("--tls-key " + key + " is not the key of the certificate in --tls-cert " + cert);
        }
        try {
            char[] pass = new char[0];
            KeyStore ks = KeyStore.getInstance("PKCS12");
            ks.load(null, null);
            ks.setKeyEntry("server", pk, pass, chain.toArray(new Certificate[0]));
            KeyManagerFactory kmf = KeyManagerFactory.getInstance(KeyManagerFactory.getDefaultAlgorithm());
            kmf.init(ks, pass);
            for (javax.net.ssl.KeyManager m : kmf.getKeyManagers()) {
                if (m instanceof X509ExtendedKeyManager x) return x;
            }
            throw new TendException("the JDK offers no X.509 key manager");
        } catch (GeneralSecurityException | IOException e) {
            throw new TendException("cannot use --tls-cert " + cert + " with --tls-key " + key + ": " + e.getMessage(), e);
        }
    }

    /** Whether {@code pk} signs what the certificate's public key verifies. */
    private static boolean belongTogether(Certificate c, PrivateKey pk) {
        String alg = switch (pk.getAlgorithm()) {
            case "RSA" -> "SHA256withRSA";
            case "EC" -> "SHA256withECDSA";
            default -> pk.getAlgorithm(); // Ed25519, EdDSA
        };
        byte[] probe = "tend-tls-key-check".getBytes(java.nio.charset.StandardCharsets.US_ASCII);
        try {
            java.security.Signature sign = java.security.Signature.getInstance(alg);
            sign.initSign(pk);
            sign.update(probe);
            byte[] sig = sign.sign();
            java.security.Signature verify = java.security.Signature.getInstance(alg);
            verify.initVerify(c.getPublicKey());
            verify.update(probe);
            return verify.verify(sig);
        } catch (GeneralSecurityException e) {
            return false;
        }
    }

    /** Stops looking at the files. */
    @Override
    public void close() {
        watcher.shutdownNow();
    }
}
