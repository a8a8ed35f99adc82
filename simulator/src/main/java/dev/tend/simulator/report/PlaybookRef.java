package dev.tend.simulator.report;

import java.util.Objects;

/** Which playbook (and which content of it) a replay ran: its id, version and the SHA-256 of its file. */
public record PlaybookRef(String id, int version, String sha256) {
    public PlaybookRef {
        Objects.requireNonNull(id, "id");
        Objects.requireNonNull(sha256, "sha256");
    }
}
