package dev.tend.cli.ops;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.type.TypeReference;
import com.fasterxml.jackson.databind.JsonNode;
import dev.tend.api.ApiJson;
import dev.tend.api.view.ApprovalOutcome;
import dev.tend.api.view.ApprovalView;
import dev.tend.api.view.BrakeView;
import dev.tend.api.view.ExclusionRequest;
import dev.tend.api.view.ExclusionView;
import dev.tend.api.view.ReasonRequest;
import dev.tend.api.view.RunView;
import dev.tend.shared.TendException;

import java.io.IOException;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.List;
import java.util.Objects;

/** {@link Operations} against a running {@code tend serve}, over its HTTP API with a bearer token. */
public final class HttpOperations implements Operations {
    private static final Duration TIMEOUT = Duration.ofSeconds(60);

    private final URI server;
    private final String token;
    private final HttpClient client;

    /** @param server the server's base URL, e.g. {@code http://127.0.0.1:7420} */
    public HttpOperations(URI server, String token) {
        this(server, token, null);
    }

    /**
     * @param server the server's base URL, e.g. {@code https://tend.larkspur.example:7420}
     * @param ca     PEM certificates to trust for an {@code https://} server instead of the JDK's, or null
     */
    public HttpOperations(URI server, String token, java.nio.file.Path ca) {
        this.server = Objects.requireNonNull(server, "server");
        this.token = Objects.requireNonNull(token, "token");
        HttpClient.Builder b = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).connectTimeout(Duration.ofSeconds(10));
        if (ca != null) {
            try {
                javax.net.ssl.SSLContext tls = javax.net.ssl.SSLContext.getInstance("TLS");
                tls.init(null, dev.tend.http.OutgoingHttp.trust(ca, "--ca").getTrustManagers(), null);
                b.sslContext(tls);
            } catch (java.security.GeneralSecurityException e) {
                throw new TendException("cannot set up TLS with --ca " + ca + ": " + e.getMessage(), e);
            }
        }
        this.client = b.build();
    }

    @Override
    public List<ApprovalView> approvals(String state) {
        return call("GET", "/api/v1/approvals?state=" + URLEncoder.encode(state, StandardCharsets.UTF_8), null,
                new TypeReference<>() { });
    }

    @Override
    public ApprovalOutcome approve(String run) {
        return call("POST", "/api/v1/approvals/" + segment(run) + "/approve", null, new TypeReference<>() { });
    }

    @Override
    public ApprovalOutcome reject(String run, String reason) {
        return call("POST", "/api/v1/approvals/" + segment(run) + "/reject", new ReasonRequest(reason), new TypeReference<>() { });
    }

    @Override
    public RunView abort(String run, String reason) {
        return call("POST", "/api/v1/runs/" + segment(run) + "/abort", new ReasonRequest(reason), new TypeReference<>() { });
    }

    @Override
    public List<ExclusionView> exclusions() {
        return call("GET", "/api/v1/exclusions", null, new TypeReference<>() { });
    }

    @Override
    public ExclusionView exclude(ExclusionRequest request) {
        return call("POST", "/api/v1/exclusions", request, new TypeReference<>() { });
    }

    @Override
    public ExclusionView unexclude(String cluster, String node) {
        return call("DELETE", "/api/v1/exclusions/" + segment(cluster) + (node == null ? "" : "/" + segment(node)), null,
                new TypeReference<>() { });
    }

    @Override
    public BrakeView brake() {
        return call("GET", "/api/v1/brake", null, new TypeReference<>() { });
    }

    @Override
    public BrakeView engageBrake(String reason) {
        return call("POST", "/api/v1/brake/engage", new ReasonRequest(reason), new TypeReference<>() { });
    }

    @Override
    public BrakeView releaseBrake(String reason) {
        return call("POST", "/api/v1/brake/release", new ReasonRequest(reason), new TypeReference<>() { });
    }

    private static String segment(String s) {
        return URLEncoder.encode(s, StandardCharsets.UTF_8).replace("+", "%20");
    }

    private <T> T call(String method, String path, Object body, TypeReference<T> type) {
        URI uri = server.resolve(path);
        HttpRequest.Builder b = HttpRequest.newBuilder(uri).timeout(TIMEOUT).header("Authorization", "Bearer " + token)
                .header("Accept", "application/json");
        try {
            if (body == null) {
                b.method(method, HttpRequest.BodyPublishers.noBody());
            } else {
                b.method(method, HttpRequest.BodyPublishers.ofByteArray(ApiJson.MAPPER.writeValueAsBytes(body)))
                        .header("Content-Type", "application/json");
            }
            HttpResponse<String> r = client.send(b.build(), HttpResponse.BodyHandlers.ofString());
            if (r.statusCode() >= 200 && r.statusCode() < 300) return ApiJson.MAPPER.readValue(r.body(), type);
            throw refused(r);
        } catch (JsonProcessingException e) {
            throw new TendException(method + " " + uri + " answered something that is not the API's JSON: " + e.getOriginalMessage(), e);
        } catch (javax.net.ssl.SSLHandshakeException e) {
            throw new TendException("tend serve at " + server + " could not be trusted (" + e.getMessage() + "); name the CA of its"
                    + " certificate with --ca FILE or TEND_CA", e);
        } catch (IOException e) {
            throw new TendException("cannot reach tend serve at " + server + " (" + e + "); is it running? "
                    + "Name it with --server URL or TEND_SERVER", e);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new TendException("interrupted while waiting for " + server, e);
        }
    }

    private static OperationRefusedException refused(HttpResponse<String> r) {
        try {
            JsonNode n = ApiJson.MAPPER.readTree(r.body());
            String error = n.path("error").asText("failed");
            String message = n.path("message").asText("HTTP " + r.statusCode());
            return new OperationRefusedException(r.statusCode(), error, message);
        } catch (JsonProcessingException notJson) {
            return new OperationRefusedException(r.statusCode(), "failed", "HTTP " + r.statusCode() + " from " + r.uri());
        }
    }
}
