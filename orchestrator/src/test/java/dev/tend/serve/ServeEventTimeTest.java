package dev.tend.serve;

import com.fasterxml.jackson.databind.JsonNode;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.RegisterExtension;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;

import static dev.tend.serve.ServeFixture.OLGA;
import static dev.tend.serve.ServeFixture.VERA;
import static dev.tend.serve.ServeFixture.awaitTrue;
import static dev.tend.serve.ServeFixture.transition;
import static org.assertj.core.api.Assertions.assertThat;

/** In serve, event time follows processing time: a problem is confirmed even when nothing more is said about it. */
class ServeEventTimeTest {
    @TempDir
    Path dir;

    @RegisterExtension
    final ServeFixture serve = new ServeFixture().confirmFor(Duration.ofSeconds(2)).eventTimeLag(Duration.ofSeconds(1));

    @Test
    void aProblemIsConfirmedWithoutAnyFurtherTransition() {
        serve.start(dir);
        Instant sent = Instant.now();
        serve.post("/api/v1/transitions", OLGA, transition("dispatch-1", "n2", "heartbeat", "silent"));

        awaitTrue("the held candidate started", Duration.ofSeconds(10),
                () -> serve.get("/api/v1/runs?cluster=dispatch-1", VERA).json().size() == 1);

        JsonNode verdicts = serve.get("/api/v1/ledger?kind=verdict&cluster=dispatch-1", VERA).json().get("entries");
        assertThat(verdicts).extracting(v -> v.get("verdict").asText()).containsExactly("hold", "start");
        assertThat(verdicts.get(0).get("reasons")).extracting(JsonNode::asText).containsExactly("unconfirmed");
        // confirmed once event time (processing time less the 1s lag) passed the 2s confirm-for
        assertThat(Instant.parse(verdicts.get(1).get("at").asText())).isAfterOrEqualTo(sent.plusSeconds(3).minusMillis(50));
    }
}
