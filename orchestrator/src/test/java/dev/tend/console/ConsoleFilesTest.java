package dev.tend.console;

import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.io.IOException;
import java.net.URISyntaxException;
import java.net.URL;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/** The console's static files over plain HTTP: all served, with their types, and none reaching outside the server. */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class ConsoleFilesTest {
    /** Anything that would make the browser fetch from another host: a scheme, a protocol-relative URL, an @import. */
    private static final Pattern EXTERNAL = Pattern.compile(
            "(?i)\\b[a-z][a-z0-9+.-]*://|(?:src|href|action)\\s*=\\s*[\"']?//|url\\(\\s*[\"']?//|@import|\\bfrom\\s+[\"'](?!\\./)");
    /** References between the console's files: attributes in the page, imports in the scripts. */
    private static final Pattern REFERENCE = Pattern.compile("(?:src|href)=\"([^\"#:]+)\"|from \"\\./([^\"]+)\"");

    private ConsoleServer server;
    private final HttpClient http = HttpClient.newHttpClient();

    @BeforeAll
    void start(@TempDir Path dir) {
        server = ConsoleServer.start(dir);
    }

    @AfterAll
    void stop() {
        server.close();
    }

    static Path consoleFolder() throws URISyntaxException {
        URL index = ConsoleFilesTest.class.getResource("/console/index.html");
        assertThat(index).as("the console is on the classpath").isNotNull();
        return Path.of(index.toURI()).getParent();
    }

    static List<Path> consoleFiles() throws IOException, URISyntaxException {
        Path root = consoleFolder();
        try (Stream<Path> s = Files.walk(root)) {
            return s.filter(Files::isRegularFile).map(root::relativize).sorted().toList();
        }
    }

    @Test
    void everyConsoleFileIsServedWithoutATokenAndWithItsType() throws Exception {
        List<Path> files = consoleFiles();
        assertThat(files).extracting(Path::toString).contains("index.html", "console.css", "js/app.js", "js/api.js");
        for (Path f : files) {
            String name = f.toString().replace('\\', '/');
            HttpResponse<String> r = get("/" + name);
            assertThat(r.statusCode()).as(name).isEqualTo(200);
            assertThat(r.body()).as(name).isEqualTo(Files.readString(consoleFolder().resolve(f)));
            String type = r.headers().firstValue("Content-Type").orElse("");
            if (name.endsWith(".html")) assertThat(type).as(name).startsWith("text/html");
            if (name.endsWith(".css")) assertThat(type).as(name).startsWith("text/css");
            // module scripts load only with a JavaScript type (HTML Standard, "fetch a single module script")
            if (name.endsWith(".js")) assertThat(type).as(name).containsAnyOf("javascript", "ecmascript");
        }
        assertThat(get("/").body()).isEqualTo(Files.readString(consoleFolder().resolve("index.html")));
    }

    @Test
    void noConsoleFileNamesAnAddressOutsideTheServer() throws Exception {
        List<String> found = new ArrayList<>();
        for (Path f : consoleFiles()) {
            String text = Files.readString(consoleFolder().resolve(f));
            Matcher m = EXTERNAL.matcher(text);
            while (m.find()) found.add(f + ": " + m.group());
        }
        assertThat(found).isEmpty();
    }

    @ParameterizedTest
    @ValueSource(strings = {"<script src=\"https://cdn.example/x.js\">", "<link href=\"//fonts.example/a.css\">",
            "src: url(//fonts.example/a.woff2)", "@import 'theme.css';", "import x from \"lib\";", "new WebSocket(\"wss://x.example\")",
            "<a href=//elsewhere.example>", "<form action=\"//collect.example\">"})
    void theExternalAddressCheckCatchesEveryWayOut(String sample) {
        assertThat(EXTERNAL.matcher(sample).find()).isTrue();
    }

    @ParameterizedTest
    @ValueSource(strings = {"fetch(\"api/v1/\" + path)", "import { api } from \"./api.js\";", "<link rel=\"stylesheet\" href=\"console.css\">",
            "// a comment", "<link rel=\"icon\" href=\"data:,\">"})
    void theExternalAddressCheckLetsTheConsolesOwnReferencesThrough(String sample) {
        assertThat(EXTERNAL.matcher(sample).find()).isFalse();
    }

    @Test
    void everyFileThePageOrAScriptRefersToExists() throws Exception {
        List<String> missing = new ArrayList<>();
        int refs = 0;
        for (Path f : consoleFiles()) {
            String text = Files.readString(consoleFolder().resolve(f));
            Matcher m = REFERENCE.matcher(text);
            while (m.find()) {
                String ref = m.group(1) != null ? m.group(1) : m.group(2);
                Path parent = f.getParent() == null ? Path.of("") : f.getParent();
                String path = parent.resolve(ref).normalize().toString().replace('\\', '/');
                refs++;
                if (get("/" + path).statusCode() != 200) missing.add(f + " -> " + ref);
            }
        }
        assertThat(refs).isGreaterThanOrEqualTo(8);
        assertThat(missing).isEmpty();
    }

    @Test
    void theApiBehindTheConsoleStillNeedsAToken() throws Exception {
        assertThat(get("/api/v1/health").statusCode()).isEqualTo(401);
        assertThat(server.get("/api/v1/health", ConsoleServer.VERA).status()).isEqualTo(200);
    }

    private HttpResponse<String> get(String path) throws IOException, InterruptedException {
        return http.send(HttpRequest.newBuilder(URI.create(server.url() + path)).GET().build(), HttpResponse.BodyHandlers.ofString());
    }
}
