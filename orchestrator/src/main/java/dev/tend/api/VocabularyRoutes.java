package dev.tend.api;

import dev.tend.api.auth.Role;
import dev.tend.api.view.VocabularyView;
import dev.tend.engine.LedgerKind;
import dev.tend.shared.ReasonCode;
import io.javalin.router.JavalinDefaultRouting;

import java.util.Arrays;
import java.util.List;

/**
 * {@code GET /api/v1/vocabulary}: the ledger kinds ({@link LedgerKind}) and reason codes
 * ({@link ReasonCode}) this server writes, taken from their one definition, so a client never
 * keeps a list of its own that can fall behind.
 */
final class VocabularyRoutes {
    private static final VocabularyView VOCABULARY = new VocabularyView(
            Arrays.stream(LedgerKind.values()).map(k -> new VocabularyView.Kind(k.wire(), List.copyOf(k.fields()))).toList(),
            Arrays.stream(ReasonCode.values()).map(r -> new VocabularyView.Reason(r.code(), r.verdict().wireName(), r.meaning()))
                    .toList());

    void mount(JavalinDefaultRouting r) {
        r.get("/api/v1/vocabulary", ctx -> ctx.json(VOCABULARY), Role.VIEWER);
    }
}
