package dev.tend.replay;

import dev.tend.engine.Input;
import dev.tend.shared.Id;
import dev.tend.shared.Target;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

class AgendaTest {
    private static final Instant T0 = Instant.parse("2027-03-16T01:00:00Z");

    private static Agenda.Answer answer(String run) {
        return new Agenda.Answer(new Input.ExecutorResult(run, "drain", 1, true, "ok", List.of(), Map.of()), List.of(),
                Target.node(Id.of("tickets-12"), Id.of("n2")), "drain-node");
    }

    private static List<String> drain(Agenda a, Instant until) {
        List<String> out = new ArrayList<>();
        Agenda.Item i;
        while ((i = a.next(until)) != null) out.add(i.isTimer() ? i.timerKey() : i.answer().result().runId());
        return out;
    }

    @Test
    void handsOutInTimeOrderAnswersBeforeTimersAtTheSameInstantAndEachKindInTheOrderScheduled() {
        Agenda a = new Agenda();
        a.arm("step:r1", T0.plusSeconds(60));
        a.answer(answer("r1"), T0.plusSeconds(60));
        a.arm("recheck:x", T0.plusSeconds(30));
        a.arm("recheck:y", T0.plusSeconds(60));
        a.answer(answer("r2"), T0.plusSeconds(60));
        assertThat(drain(a, T0.plusSeconds(60))).containsExactly("recheck:x", "r1", "r2", "step:r1", "recheck:y");
        assertThat(a.size()).isZero();
    }

    @Test
    void leavesWhatIsNotDueYet() {
        Agenda a = new Agenda();
        a.arm("later", T0.plusSeconds(120));
        assertThat(a.next(T0.plusSeconds(119))).isNull();
        assertThat(drain(a, T0.plusSeconds(120))).containsExactly("later");
    }

    @Test
    void armingAnArmedTimerMovesItAndCancellingRemovesIt() {
        Agenda a = new Agenda();
        a.arm("recheck:x", T0.plusSeconds(10));
        a.arm("recheck:y", T0.plusSeconds(20));
        a.arm("recheck:x", T0.plusSeconds(30));
        a.cancel("recheck:y");
        a.cancel("never-armed");
        assertThat(a.next(T0.plusSeconds(25))).isNull();
        assertThat(drain(a, T0.plusSeconds(30))).containsExactly("recheck:x");
    }

    @Test
    void aTimerArmedAgainAtTheSameInstantGoesToTheBack() {
        Agenda a = new Agenda();
        a.arm("a", T0);
        a.arm("b", T0);
        a.arm("a", T0);
        assertThat(drain(a, T0)).containsExactly("b", "a");
    }
}
