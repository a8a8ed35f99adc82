package dev.tend.cli;

import dev.tend.audit.LedgerKey;
import picocli.CommandLine.Option;

import java.nio.file.Path;

/** {@code --ledger-key FILE}: the key of the ledger's checkpoints (DESIGN.md section 6). */
final class LedgerKeyOption {
    @Option(names = "--ledger-key", paramLabel = "FILE",
            description = "key of the ledger's checkpoints: a file of at least 32 bytes that only its owner may read"
                    + " (head -c 32 /dev/urandom > FILE && chmod 600 FILE)")
    Path file;

    /** The key, or null when no --ledger-key was given. */
    LedgerKey load() {
        return file == null ? null : LedgerKey.load(file);
    }
}
