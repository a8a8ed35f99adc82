package dev.tend.engine;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import dev.tend.shared.fleet.SignalNumbering;
import org.junit.jupiter.api.Test;

import java.time.Instant;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class NumberedTransitionTest {
    private static final Instant T0 = Instant.parse("2027-03-14T02:00:00Z");

    @Test
    void aTransitionCarriesItsOwnSignalsNumberedKeyOnly() {
        HealthTransition t = HealthTransition.of(T0, "fares-3", "n1", "heartbeat", SignalState.SILENT);
        SignalNumbering numbering = new SignalNumbering();
        SignalNumbering.Numbered own = numbering.of(Id.of("fares-3"), Id.of("n1"), Id.of("heartbeat"));
        assertThat(new Input.Transition(t, null, own).key()).isSameAs(own.key());
        assertThat(new Input.Transition(t).key()).isEqualTo(own.key());
        SignalNumbering.Numbered other = numbering.of(Id.of("fares-3"), Id.of("n2"), Id.of("heartbeat"));
        assertThatThrownBy(() -> new Input.Transition(t, null, other))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("fares-3/n2/heartbeat");
    }
}
