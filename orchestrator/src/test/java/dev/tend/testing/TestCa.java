package dev.tend.testing;

import org.bouncycastle.asn1.x500.X500Name;
import org.bouncycastle.asn1.x509.BasicConstraints;
import org.bouncycastle.asn1.x509.ExtendedKeyUsage;
import org.bouncycastle.asn1.x509.Extension;
import org.bouncycastle.asn1.x509.GeneralName;
import org.bouncycastle.asn1.x509.GeneralNames;
import org.bouncycastle.asn1.x509.KeyPurposeId;
import org.bouncycastle.asn1.x509.KeyUsage;
import org.bouncycastle.cert.X509v3CertificateBuilder;
import org.bouncycastle.cert.jcajce.JcaX509CertificateConverter;
import org.bouncycastle.cert.jcajce.JcaX509v3CertificateBuilder;
import org.bouncycastle.operator.jcajce.JcaContentSignerBuilder;

import javax.net.ssl.KeyManagerFactory;
import javax.net.ssl.SSLContext;
import javax.net.ssl.TrustManagerFactory;
import java.math.BigInteger;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.security.KeyPair;
import java.security.KeyPairGenerator;
import java.security.KeyStore;
import java.security.cert.X509Certificate;
import java.time.Duration;
import java.time.Instant;
import java.util.Base64;
import java.util.Date;
import java.util.concurrent.atomic.AtomicLong;

/**
 * A certificate authority made in the test with Bouncy Castle (EC P-256, SHA-256 with
 * ECDSA): it issues server certificates for 127.0.0.1 and localhost and client certificates,
 * written as PEM files, and builds a server's TLS context (which trusts only this CA for clients).
 */
public final class TestCa {
    private static final AtomicLong SERIAL = new AtomicLong(1);
    public final KeyPair key;
    public final X509Certificate cert;

    public record Issued(KeyPair key, X509Certificate cert) {
    }

    public TestCa(String name) throws Exception {
        key = keyPair();
        X500Name dn = new X500Name("CN=" + name);
        X509v3CertificateBuilder b = builder(dn, dn, key);
        b.addExtension(Extension.basicConstraints, true, new BasicConstraints(true));
        b.addExtension(Extension.keyUsage, true, new KeyUsage(KeyUsage.keyCertSign | KeyUsage.cRLSign));
        cert = sign(b, key);
    }

    public Issued server() throws Exception {
        KeyPair k = keyPair();
        X509v3CertificateBuilder b = builder(new X500Name(cert.getSubjectX500Principal().getName()), new X500Name("CN=pager.larkspur.example"), k);
        b.addExtension(Extension.subjectAlternativeName, false, new GeneralNames(new GeneralName[] {
                new GeneralName(GeneralName.iPAddress, "127.0.0.1"), new GeneralName(GeneralName.dNSName, "localhost")}));
        b.addExtension(Extension.extendedKeyUsage, false, new ExtendedKeyUsage(KeyPurposeId.id_kp_serverAuth));
        return new Issued(k, sign(b, key));
    }

    public Issued client(String cn) throws Exception {
        KeyPair k = keyPair();
        X509v3CertificateBuilder b = builder(new X500Name(cert.getSubjectX500Principal().getName()), new X500Name("CN=" + cn), k);
        b.addExtension(Extension.extendedKeyUsage, false, new ExtendedKeyUsage(KeyPurposeId.id_kp_clientAuth));
        return new Issued(k, sign(b, key));
    }

    /** TLS for a server presenting {@code server}, trusting clients issued by this CA. */
    public SSLContext serverContext(Issued server) throws Exception {
        char[] pass = "test".toCharArray();
        KeyStore ks = KeyStore.getInstance("PKCS12");
        ks.load(null, null);
        ks.setKeyEntry("server", server.key().getPrivate(), pass, new java.security.cert.Certificate[] {server.cert(), cert});
        KeyManagerFactory kmf = KeyManagerFactory.getInstance(KeyManagerFactory.getDefaultAlgorithm());
        kmf.init(ks, pass);
        KeyStore ts = KeyStore.getInstance("PKCS12");
        ts.load(null, null);
        ts.setCertificateEntry("ca", cert);
        TrustManagerFactory tmf = TrustManagerFactory.getInstance(TrustManagerFactory.getDefaultAlgorithm());
        tmf.init(ts);
        SSLContext ctx = SSLContext.getInstance("TLS");
        ctx.init(kmf.getKeyManagers(), tmf.getTrustManagers(), null);
        return ctx;
    }

    public static Path writeCert(Path file, X509Certificate c) throws Exception {
        Files.writeString(file, pem("CERTIFICATE", c.getEncoded()), StandardCharsets.US_ASCII);
        return file;
    }

    /** The key as unencrypted PKCS#8 PEM, with the given permissions (such as rw-------). */
    public static Path writeKey(Path file, KeyPair k, String perms) throws Exception {
        Files.writeString(file, pem("PRIVATE KEY", k.getPrivate().getEncoded()), StandardCharsets.US_ASCII);
        Files.setPosixFilePermissions(file, PosixFilePermissions.fromString(perms));
        return file;
    }

    private static String pem(String type, byte[] der) {
        return "-----BEGIN " + type + "-----\n" + Base64.getMimeEncoder(64, "\n".getBytes(StandardCharsets.US_ASCII)).encodeToString(der)
                + "\n-----END " + type + "-----\n";
    }

    private static KeyPair keyPair() throws Exception {
        KeyPairGenerator g = KeyPairGenerator.getInstance("EC");
        g.initialize(256);
        return g.generateKeyPair();
    }

    private static X509v3CertificateBuilder builder(X500Name issuer, X500Name subject, KeyPair k) {
        Instant now = Instant.now();
        return new JcaX509v3CertificateBuilder(issuer, BigInteger.valueOf(SERIAL.getAndIncrement()), Date.from(now.minus(Duration.ofHours(1))),
                Date.from(now.plus(Duration.ofDays(1))), subject, k.getPublic());
    }

    private static X509Certificate sign(X509v3CertificateBuilder b, KeyPair issuer) throws Exception {
        return new JcaX509CertificateConverter().getCertificate(b.build(new JcaContentSignerBuilder("SHA256withECDSA").build(issuer.getPrivate())));
    }
}
