package dev.tend.api;

import dev.tend.api.auth.Caller;
import dev.tend.api.auth.Role;
import dev.tend.api.view.FleetHealth;
import dev.tend.metrics.TendMetrics;
import io.javalin.router.JavalinDefaultRouting;

import java.util.Map;
import java.util.function.Supplier;

/**
 * {@code GET /api/v1/health}: the fleet's health (unhealthy clusters by zone, the brake);
 * {@code GET /api/v1/me}: the caller's token name and roles (what a console shows and hides);
 * {@code GET /metrics}: Prometheus text format, without a token (it holds only counts).
 */
final class HealthRoutes {
    private final Supplier<FleetHealth> health;
    private final TendMetrics metrics;

    HealthRoutes(Supplier<FleetHealth> health, TendMetrics metrics) {
        this.health = health;
        this.metrics = metrics;
    }

    void mount(JavalinDefaultRouting r) {
        r.get("/api/v1/health", ctx -> ctx.json(health.get()), Role.VIEWER);
        r.get("/api/v1/me", ctx -> {
            Caller c = Requests.caller(ctx);
            ctx.json(Map.of("name", c.name(), "roles", c.roles().stream().map(Role::wireName).sorted().toList()));
        }, Role.VIEWER);
        r.get("/metrics", ctx -> ctx.contentType(TendMetrics.contentType()).result(metrics.scrape()));
    }
}
