package dev.tend.bench;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import io.javalin.Javalin;
import io.javalin.json.JavalinJackson;

import java.io.BufferedReader;
import java.io.StringReader;
import java.util.List;
import java.util.Map;

/**
 * The floor of the live benchmark, as its own process: the server stack of {@code tend serve}
 * (Javalin with Jackson) with one route, {@code POST /api/v1/transitions}, that only parses
 * each line of the body into a JSON tree and answers with the count. No token, no engine, no
 * store: whatever tend's answer costs beyond this is tend's own work.
 *
 * <p>Arguments: the port. Prints {@code listening on PORT} once it accepts requests.
 */
public final class BareEndpoint {
    public static void main(String[] args) throws Exception {
        int port = Integer.parseInt(args[0]);
        ObjectMapper json = new ObjectMapper();
        Javalin app = Javalin.create(cfg -> {
            cfg.showJavalinBanner = false;
            cfg.startupWatcherEnabled = false;
            cfg.jsonMapper(new JavalinJackson(json, false));
            cfg.router.mount(r -> r.post("/api/v1/transitions", ctx -> {
                int accepted = 0;
                try (BufferedReader lines = new BufferedReader(new StringReader(ctx.body()))) {
                    for (String line = lines.readLine(); line != null; line = lines.readLine()) {
                        if (line.isBlank()) continue;
                        JsonNode n = json.readTree(line);
                        if (n.isObject() && n.has("at")) accepted++;
                    }
                }
                ctx.json(Map.of("accepted", accepted, "rejected", 0, "problems", List.of()));
            }));
        });
        app.start("127.0.0.1", port);
        System.out.println("listening on " + app.port());
        System.out.flush();
        Thread.currentThread().join();
    }
}
