package dev.tend.cli;

import dev.tend.shared.TendException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class StoreAddressTest {
    @TempDir
    Path dir;

    @Test
    void aPathOrASqliteUrlIsASqliteFile() {
        assertThat(StoreAddress.resolve("tend.db", null, null, Map.of()).file()).isEqualTo(Path.of("tend.db"));
        StoreAddress a = StoreAddress.resolve("jdbc:sqlite:/var/lib/tend/t.db", null, null, Map.of());
        assertThat(a.file()).isEqualTo(Path.of("/var/lib/tend/t.db"));
        assertThat(a.isPostgres()).isFalse();
    }

    @Test
    void userAndPasswordComeFromTheStandardPostgresVariablesWhenNotGiven() {
        // PGUSER and PGPASSWORD are libpq's environment variables (PostgreSQL documentation, "Environment Variables").
        StoreAddress a = StoreAddress.resolve("jdbc:postgresql://127.0.0.1:5432/tend", null, null,
                Map.of("PGUSER", "fares", "PGPASSWORD", "s3cret"));
        assertThat(a.url()).isEqualTo("jdbc:postgresql://127.0.0.1:5432/tend");
        assertThat(a.user()).isEqualTo("fares");
        assertThat(a.password()).isEqualTo("s3cret");
    }

    @Test
    void theOptionsWinOverTheEnvironmentAndThePasswordIsTheFilesFirstLine() throws Exception {
        Path file = dir.resolve("pw");
        Files.writeString(file, "from-file\nignored\n");
        StoreAddress a = StoreAddress.resolve("jdbc:postgresql://127.0.0.1:5432/tend", "dispatch", file,
                Map.of("PGUSER", "fares", "PGPASSWORD", "s3cret"));
        assertThat(a.user()).isEqualTo("dispatch");
        assertThat(a.password()).isEqualTo("from-file");
    }

    @Test
    void withNothingGivenTheDriverDefaultsApply() {
        StoreAddress a = StoreAddress.resolve("jdbc:postgresql://127.0.0.1:5432/tend", null, null, Map.of());
        assertThat(a.user()).isNull();
        assertThat(a.password()).isNull();
    }

    @Test
    void aPasswordOnTheCommandLineIsRefused() {
        assertThatThrownBy(() -> StoreAddress.resolve("jdbc:postgresql://h:5432/tend?user=u&Password=x", null, null, Map.of()))
                .isInstanceOf(TendException.class).hasMessageContaining("--db-password-file").hasMessageNotContaining("=x");
    }

    @Test
    void anEmptyOrMissingPasswordFileIsRefusedByName() throws Exception {
        Path empty = Files.createFile(dir.resolve("empty"));
        assertThatThrownBy(() -> StoreAddress.resolve("jdbc:postgresql://h:5432/tend", null, empty, Map.of()))
                .isInstanceOf(TendException.class).hasMessageContaining("--db-password-file " + empty).hasMessageContaining("empty");
        Path missing = dir.resolve("missing");
        assertThatThrownBy(() -> StoreAddress.resolve("jdbc:postgresql://h:5432/tend", null, missing, Map.of()))
                .isInstanceOf(TendException.class).hasMessageContaining("cannot read it");
    }

    @Test
    void postgresOptionsOnASqliteFileAndOtherDatabasesAreRefused() {
        assertThatThrownBy(() -> StoreAddress.resolve("tend.db", "u", null, Map.of()))
                .isInstanceOf(TendException.class).hasMessageContaining("SQLite file");
        assertThatThrownBy(() -> StoreAddress.resolve("jdbc:mysql://h/tend", null, null, Map.of()))
                .isInstanceOf(TendException.class).hasMessageContaining("jdbc:postgresql://HOST:PORT/DATABASE");
    }
}
