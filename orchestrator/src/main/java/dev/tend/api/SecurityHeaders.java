package dev.tend.api;

import io.javalin.http.Context;

/**
 * Headers on every answer that keep the console out of other sites' frames and keep its
 * pages from loading anything but the server's own files (content security policy, W3C
 * CSP Level 3; X-Frame-Options, RFC 7034, for browsers without frame-ancestors). The API's
 * own pages (the handover report as HTML) carry their style inline and load nothing else.
 */
final class SecurityHeaders {
    static final String CONSOLE_POLICY = "default-src 'self'; script-src 'self'; style-src 'self'; img-src 'self' data:;"
            + " connect-src 'self'; object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'";
    static final String API_POLICY = "default-src 'none'; style-src 'unsafe-inline'; img-src data:; base-uri 'none';"
            + " form-action 'none'; frame-ancestors 'none'";

    private SecurityHeaders() {
    }

    static void add(Context ctx) {
        ctx.header("X-Frame-Options", "DENY");
        ctx.header("X-Content-Type-Options", "nosniff");
        ctx.header("Referrer-Policy", "no-referrer");
        ctx.header("Content-Security-Policy", ctx.path().startsWith("/api/") || ctx.path().equals("/metrics")
                ? API_POLICY : CONSOLE_POLICY);
    }
}
