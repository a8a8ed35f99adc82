package dev.tend.api;

import javax.net.ssl.SSLEngine;
import javax.net.ssl.X509ExtendedKeyManager;
import java.net.Socket;
import java.security.Principal;
import java.security.PrivateKey;
import java.security.cert.X509Certificate;
import java.util.Objects;

/**
 * A key manager whose keys can be replaced while the server runs: every handshake asks the
 * current delegate, so a new certificate takes effect with the next connection.
 */
final class SwappableKeyManager extends X509ExtendedKeyManager {
    private volatile X509ExtendedKeyManager delegate;

    SwappableKeyManager(X509ExtendedKeyManager first) {
        this.delegate = Objects.requireNonNull(first, "first");
    }

    void swap(X509ExtendedKeyManager next) {
        delegate = Objects.requireNonNull(next, "next");
    }

    /** The first certificate of the current chain. */
    X509Certificate certificate() {
        X509ExtendedKeyManager d = delegate;
        for (String type : new String[] {"EC", "RSA", "EdDSA", "Ed25519"}) {
            String[] aliases = d.getServerAliases(type, null);
            if (aliases != null && aliases.length > 0) return d.getCertificateChain(aliases[0])[0];
        }
        throw new IllegalStateException("the key manager holds no server certificate");
    }

    @Override
    public String[] getClientAliases(String keyType, Principal[] issuers) {
        return delegate.getClientAliases(keyType, issuers);
    }

    @Override
    public String chooseClientAlias(String[] keyType, Principal[] issuers, Socket socket) {
        return delegate.chooseClientAlias(keyType, issuers, socket);
    }

    @Override
    public String[] getServerAliases(String keyType, Principal[] issuers) {
        return delegate.getServerAliases(keyType, issuers);
    }

    @Override
    public String chooseServerAlias(String keyType, Principal[] issuers, Socket socket) {
        return delegate.chooseServerAlias(keyType, issuers, socket);
    }

    @Override
    public String chooseEngineServerAlias(String keyType, Principal[] issuers, SSLEngine engine) {
        return delegate.chooseEngineServerAlias(keyType, issuers, engine);
    }

    @Override
    public String chooseEngineClientAlias(String[] keyType, Principal[] issuers, SSLEngine engine) {
        return delegate.chooseEngineClientAlias(keyType, issuers, engine);
    }

    @Override
    public X509Certificate[] getCertificateChain(String alias) {
        return delegate.getCertificateChain(alias);
    }

    @Override
    public PrivateKey getPrivateKey(String alias) {
        return delegate.getPrivateKey(alias);
    }
}
