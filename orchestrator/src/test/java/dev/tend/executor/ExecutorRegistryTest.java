package dev.tend.executor;

import dev.tend.http.OutgoingHttp;
import org.junit.jupiter.api.Test;

import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

class ExecutorRegistryTest {
    @Test
    void everyRegisteredKindIsServedByTheExecutorBuiltForIt() {
        assertThat(ExecutorRegistry.kinds()).containsExactly("command", "simulated", "http");
        try (ExecutorRegistry.Built built = ExecutorRegistry.open(
                new ExecutorRegistry.Settings(Path.of("").toAbsolutePath(), 7, 1.0, new OutgoingHttp()))) {
            assertThat(built.byKind().keySet()).containsExactlyElementsOf(ExecutorRegistry.kinds());
            built.byKind().forEach((kind, e) -> assertThat(e.kind()).isEqualTo(kind));
        }
    }
}
