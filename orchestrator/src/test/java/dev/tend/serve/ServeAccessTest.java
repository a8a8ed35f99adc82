package dev.tend.serve;

import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.nio.file.Path;
import java.util.stream.Stream;

import static dev.tend.serve.ServeFixture.ANNA;
import static dev.tend.serve.ServeFixture.OLGA;
import static dev.tend.serve.ServeFixture.VERA;
import static org.assertj.core.api.Assertions.assertThat;

/** Every route checks its role: no token 401, an unknown token 401, a token without the role 403. */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class ServeAccessTest {
    @RegisterExtension
    final ServeFixture serve = ServeFixture.perClass();

    @BeforeAll
    void start(@TempDir Path dir) {
        serve.start(dir);
    }

    /** Mutating routes, the role they need, and a token that lacks it. */
    static Stream<Arguments> mutatingRoutes() {
        return Stream.of(
                Arguments.of("POST", "/api/v1/runs/r000001/abort", "{}", "operator", ANNA),
                Arguments.of("POST", "/api/v1/approvals/r000001/approve", "", "approver", OLGA),
                Arguments.of("POST", "/api/v1/approvals/r000001/reject", "{\"reason\":\"no\"}", "approver", OLGA),
                Arguments.of("POST", "/api/v1/exclusions", "{\"cluster\":\"fares-3\",\"reason\":\"r\",\"owner\":\"o\"}", "operator", ANNA),
                Arguments.of("DELETE", "/api/v1/exclusions/fares-3", null, "operator", ANNA),
                Arguments.of("DELETE", "/api/v1/exclusions/fares-3/n2", null, "operator", VERA),
                Arguments.of("POST", "/api/v1/brake/engage", "{\"reason\":\"r\"}", "operator", ANNA),
                Arguments.of("POST", "/api/v1/brake/release", "{\"reason\":\"r\"}", "operator", VERA),
                Arguments.of("POST", "/api/v1/transitions", ServeFixture.transition("fares-3", "n1", "process-down", "breach"),
                        "operator", VERA));
    }

    static Stream<Arguments> readRoutes() {
        return Stream.of("/api/v1/health", "/api/v1/me", "/api/v1/runs", "/api/v1/runs/r000001", "/api/v1/approvals",
                "/api/v1/exclusions", "/api/v1/brake", "/api/v1/ledger").map(Arguments::of);
    }

    @ParameterizedTest(name = "{0} {1} without a token is 401")
    @MethodSource("mutatingRoutes")
    void mutatingRouteRefusedWithoutAToken(String method, String path, String body, String role, String wrongToken) {
        ServeFixture.Response r = serve.send(method, path, null, body);

        assertThat(r.status()).as(r.text()).isEqualTo(401);
        assertThat(r.json().get("error").asText()).isEqualTo("unauthenticated");
        assertThat(r.json().get("message").asText()).isEqualTo("this needs a bearer token: send the header Authorization: Bearer <token>");
    }

    @ParameterizedTest(name = "{0} {1} with an unknown token is 401")
    @MethodSource("mutatingRoutes")
    void mutatingRouteRefusedWithAnUnknownToken(String method, String path, String body, String role, String wrongToken) {
        ServeFixture.Response r = serve.send(method, path, "tok-forged", body);

        assertThat(r.status()).as(r.text()).isEqualTo(401);
        assertThat(r.json().get("message").asText()).isEqualTo("the bearer token is not one this server accepts");
    }

    @ParameterizedTest(name = "{0} {1} needs {3}")
    @MethodSource("mutatingRoutes")
    void mutatingRouteRefusedWithTheWrongRole(String method, String path, String body, String role, String wrongToken) {
        ServeFixture.Response r = serve.send(method, path, wrongToken, body);

        assertThat(r.status()).as(r.text()).isEqualTo(403);
        assertThat(r.json().get("error").asText()).isEqualTo("forbidden");
        assertThat(r.json().get("role_needed").asText()).isEqualTo(role);
        assertThat(r.json().get("message").asText()).startsWith("this needs a token with the role " + role + "; token ");
    }

    @ParameterizedTest(name = "GET {0} needs a token")
    @MethodSource("readRoutes")
    void readRouteRefusedWithoutAToken(String path) {
        assertThat(serve.get(path, null).status()).isEqualTo(401);
        assertThat(serve.get(path, "tok-forged").status()).isEqualTo(401);
    }

    @ParameterizedTest(name = "GET {0} is open to a viewer")
    @MethodSource("readRoutes")
    void readRouteOpenToAViewer(String path) {
        ServeFixture.Response r = serve.get(path, VERA);

        assertThat(r.status()).as(r.text()).isIn(200, 404); // 404: the run does not exist, but access was granted
    }

    @ParameterizedTest(name = "a malformed Authorization header is 401: {0}")
    @org.junit.jupiter.params.provider.ValueSource(strings = {"Basic b2xnYTpzZWNyZXQ=", "tok-vera-viewer", "Bearer"})
    void malformedAuthorizationIsRefused(String header) throws Exception {
        var req = java.net.http.HttpRequest.newBuilder(java.net.URI.create(serve.server().url() + "/api/v1/health"))
                .header("Authorization", header).build();
        var r = java.net.http.HttpClient.newHttpClient().send(req, java.net.http.HttpResponse.BodyHandlers.ofString());

        assertThat(r.statusCode()).isEqualTo(401);
        assertThat(r.headers().firstValue("WWW-Authenticate")).hasValue("Bearer realm=\"tend\"");
    }
}
