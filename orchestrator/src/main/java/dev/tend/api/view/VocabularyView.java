package dev.tend.api.view;

import java.util.List;

/**
 * The words the server writes, for clients that filter or explain them (the console's ledger
 * filter, its approvals page) instead of keeping copies: every ledger kind with the fields it
 * may carry, and every guard's reason code with the verdict it gives and what it means.
 */
public record VocabularyView(List<Kind> ledgerKinds, List<Reason> reasonCodes) {
    public VocabularyView {
        ledgerKinds = List.copyOf(ledgerKinds);
        reasonCodes = List.copyOf(reasonCodes);
    }

    /** A ledger kind as stored, e.g. {@code run-started}, and the fields an entry of it may carry. */
    public record Kind(String kind, List<String> fields) {
        public Kind {
            fields = List.copyOf(fields);
        }
    }

    /** A reason code, e.g. {@code fleet-brake}, in guard order. */
    public record Reason(String code, String verdict, String meaning) {
    }
}
