package dev.tend.api;

import dev.tend.api.auth.Role;
import dev.tend.api.view.PlaybookView;
import dev.tend.playbooks.ActionStep;
import dev.tend.playbooks.PageStep;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.Step;
import dev.tend.playbooks.WaitHealthyStep;
import dev.tend.shared.Id;
import io.javalin.router.JavalinDefaultRouting;

import java.util.List;
import java.util.Locale;
import java.util.stream.Collectors;

/** {@code GET /api/v1/playbooks}: the playbooks the server runs, with their steps (what a run's progress is measured against). */
final class PlaybookRoutes {
    private final List<PlaybookView> views;

    PlaybookRoutes(PlaybookSet playbooks) {
        this.views = playbooks.playbooks().stream().map(PlaybookRoutes::view).toList();
    }

    void mount(JavalinDefaultRouting r) {
        r.get("/api/v1/playbooks", ctx -> ctx.json(views), Role.VIEWER);
    }

    private static PlaybookView view(Playbook p) {
        return new PlaybookView(p.id().value(), p.version(), p.description(), p.mode().name().toLowerCase(Locale.ROOT),
                p.steps().stream().map(s -> new PlaybookView.PlannedStep(s.id().value(), s.kind(), detail(s))).toList());
    }

    private static String detail(Step s) {
        if (s instanceof ActionStep a) return a.action().value();
        if (s instanceof WaitHealthyStep w) return w.signals().stream().map(Id::value).collect(Collectors.joining(", "));
        if (s instanceof PageStep n) return n.channel().value();
        throw new IllegalStateException("a step kind this route does not know: " + s.kind());
    }
}
