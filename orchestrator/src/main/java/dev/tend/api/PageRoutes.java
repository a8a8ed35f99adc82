package dev.tend.api;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.tend.api.auth.Role;
import dev.tend.api.view.PageView;
import dev.tend.store.PageRow;
import dev.tend.store.Store;
import io.javalin.http.Context;
import io.javalin.router.JavalinDefaultRouting;

import java.util.Set;

/**
 * {@code GET /api/v1/pages?state=undelivered|pending|delivered|failed|all&limit=N}: the page
 * outbox, newest first (default: undelivered, that is pending and failed; limit 100, at most 1000).
 */
final class PageRoutes {
    private static final ObjectMapper JSON = new ObjectMapper();
    private final Store store;

    PageRoutes(Store store) {
        this.store = store;
    }

    void mount(JavalinDefaultRouting r) {
        r.get("/api/v1/pages", this::list, Role.VIEWER);
    }

    private void list(Context ctx) {
        String state = ctx.queryParam("state");
        if (state == null || state.isEmpty()) state = "undelivered";
        Set<String> states = switch (state) {
            case "undelivered" -> Set.of(PageRow.PENDING, PageRow.FAILED);
            case "all" -> PageRow.STATES;
            default -> {
                if (!PageRow.STATES.contains(state)) {
                    throw Requests.invalid("state", "state must be undelivered, pending, delivered, failed or all, got '" + state + "'");
                }
                yield Set.of(state);
            }
        };
        int limit = limit(ctx.queryParam("limit"));
        ctx.json(store.read(r -> r.pages(states, limit)).stream().map(PageRoutes::view).toList());
    }

    private static int limit(String v) {
        if (v == null || v.isEmpty()) return 100;
        try {
            int n = Integer.parseInt(v);
            if (n >= 1 && n <= 1000) return n;
        } catch (NumberFormatException e) {
            // answered below
        }
        throw Requests.invalid("limit", "limit must be a whole number from 1 to 1000, got '" + v + "'");
    }

    private static PageView view(PageRow p) {
        JsonNode f;
        try {
            f = JSON.readTree(p.payload());
        } catch (java.io.IOException e) {
            f = JSON.createObjectNode();
        }
        return new PageView(p.id(), p.channel(), text(f, "kind"), p.state(), text(f, "message"), text(f, "cluster"), text(f, "run"),
                p.createdAt(), p.attempts(), p.state().equals(PageRow.PENDING) ? p.nextAt() : null, p.lastAnswer(), p.endedAt());
    }

    private static String text(JsonNode f, String k) {
        JsonNode n = f.get(k);
        return n == null || n.isNull() ? null : n.asText();
    }
}
