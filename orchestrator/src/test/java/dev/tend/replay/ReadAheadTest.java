package dev.tend.replay;

import dev.tend.shared.HealthTransition;
import dev.tend.shared.Id;
import dev.tend.shared.Problem;
import dev.tend.shared.WireEvent;
import dev.tend.shared.wire.ReadSummary;
import dev.tend.simulator.Recording;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class ReadAheadTest {
    @TempDir
    Path dir;

    private Path recording(int events, int badEvery) throws Exception {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < events; i++) {
            if (badEvery > 0 && i % badEvery == badEvery - 1) sb.append("{\"at\":\"nope\"}\n");
            else sb.append("{\"at\":\"2027-03-16T01:00:00Z\",\"cluster\":\"tickets-").append(i % 7).append("\",\"node\":\"n").append(i)
                    .append("\",\"signal\":\"cpu-high\",\"state\":\"breach\"}\n");
        }
        Path f = dir.resolve("r.jsonl");
        Files.writeString(f, sb.toString());
        return f;
    }

    @Test
    void handsEveryEventOverInFileOrderAcrossBatchesWithTheProblems() throws Exception {
        Path f = recording(10_000, 1000);
        Collected got = new Collected();
        ReadSummary s = ReadAhead.read(Recording.open(f), got, List.of());
        assertThat(s.events()).isEqualTo(9_990);
        assertThat(got.lines).hasSize(9_990).isSorted();
        assertThat(got.problems).hasSize(10).extracting(Problem::line).startsWith(1000, 2000);
    }

    @Test
    void idsEqualToAKnownOneAreThatInstance() throws Exception {
        Path f = recording(20, 0);
        Id known = Id.of("tickets-3");
        List<Id> clusters = new ArrayList<>();
        ReadAhead.read(Recording.open(f), (e, line) -> clusters.add(((HealthTransition) e).cluster()), List.of(known));
        assertThat(clusters).filteredOn(c -> c.value().equals("tickets-3")).isNotEmpty().allSatisfy(c -> assertThat(c).isSameAs(known));
        assertThat(clusters.get(0)).isSameAs(clusters.get(7));
    }

    @Test
    void whatTheSinkThrowsStopsTheReadingAndPassesThrough() throws Exception {
        Path f = recording(50_000, 0);
        int[] seen = {0};
        assertThatThrownBy(() -> ReadAhead.read(Recording.open(f), (e, line) -> {
            if (++seen[0] == 3000) throw new IllegalStateException("stop here");
        }, List.of())).isInstanceOf(IllegalStateException.class).hasMessage("stop here");
        assertThat(seen[0]).isEqualTo(3000);
    }

    @Test
    void twoConsumersOfOneReadingEachReceiveEveryEventAndProblem() throws Exception {
        Path f = recording(100_000, 997);
        ReadAhead.Reading reading = ReadAhead.start(Recording.open(f), List.of(), 2);
        Collected second = new Collected();
        Thread other = new Thread(() -> reading.take(1, second));
        other.start();
        Collected first = new Collected();
        ReadSummary s = reading.take(0, first);
        other.join();
        assertThat(s.events()).isEqualTo(100_000 - 100);
        assertThat(first.lines).hasSize(100_000 - 100).isSorted().isEqualTo(second.lines);
        assertThat(first.problems).hasSize(100).extracting(Problem::line)
                .isEqualTo(second.problems.stream().map(Problem::line).toList());
    }

    @Test
    void aConsumerThatStopsLeavesTheOtherReadingToTheEnd() throws Exception {
        Path f = recording(100_000, 0);
        ReadAhead.Reading reading = ReadAhead.start(Recording.open(f), List.of(), 2);
        assertThatThrownBy(() -> reading.take(0, (e, line) -> {
            if (line == 10) throw new IllegalStateException("stop here");
        })).hasMessage("stop here");
        long[] seen = {0};
        ReadSummary s = reading.take(1, (e, line) -> seen[0]++);
        assertThat(seen[0]).isEqualTo(100_000);
        assertThat(s.events()).isEqualTo(100_000);
    }

    /** A sink that keeps the line numbers of the events and the problems it is handed, in order. */
    private static final class Collected implements Recording.Sink {
        final List<Long> lines = new ArrayList<>();
        final List<Problem> problems = new ArrayList<>();

        @Override
        public void event(WireEvent event, long line) {
            lines.add(line);
        }

        @Override
        public void problem(Problem problem) {
            problems.add(problem);
        }
    }
}
