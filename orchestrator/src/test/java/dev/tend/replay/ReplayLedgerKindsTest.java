package dev.tend.replay;

import dev.tend.engine.Effect;
import dev.tend.engine.Engine;
import dev.tend.engine.Input;
import dev.tend.engine.LedgerKind;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.HealthTransition;
import dev.tend.shared.TopologyEvent;
import dev.tend.shared.fleet.FleetFile;
import dev.tend.simulator.Recording;
import org.junit.jupiter.api.Test;

import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.TreeMap;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * A replay's engine builds only the ledger entries the report reads; it must decide exactly as
 * an engine that builds them all.
 */
class ReplayLedgerKindsTest {
    private static final Path ROOT = ReplayFiles.root();

    @Test
    void anEngineKeepingOnlyTheKindsAReplayReadsGivesEveryOtherEffectOfAnEngineKeepingAll() {
        int ledgered = 0;
        int kept = 0;
        for (String name : List.of("zone-outage", "flapping-signal", "quiet-night")) {
            Replayer replayer = Replayer.of(PlaybookLoader.load(ROOT.resolve("playbooks/library")),
                    FleetFile.load(ROOT.resolve("playbooks/library/fleet.yaml")), 1);
            Engine all = new Engine(replayer.setup());
            Engine some = new Engine(replayer.setup(), ReportCollector.LEDGER_READ);
            TreeMap<String, Instant> timers = new TreeMap<>();
            List<Effect> fromAll = new ArrayList<>();
            List<Effect> fromSome = new ArrayList<>();
            Instant[] now = {null};
            Recording.open(ROOT.resolve("simulator/recordings/" + name + ".jsonl")).read((e, line) -> {
                if (now[0] == null || e.at().isAfter(now[0])) now[0] = e.at();
                Input in = e instanceof HealthTransition t ? new Input.Transition(t) : new Input.Topology((TopologyEvent) e);
                List<Effect> a = all.handle(in, now[0]);
                fromAll.addAll(a);
                fromSome.addAll(some.handle(in, now[0]));
                for (Effect x : a) {
                    if (x instanceof Effect.ArmTimer t) timers.put(t.key(), t.due());
                    else if (x instanceof Effect.CancelTimer t) timers.remove(t.key());
                }
            });
            List<Effect> expected = new ArrayList<>();
            for (Effect e : fromAll) {
                if (e instanceof Effect.Ledger l) {
                    ledgered++;
                    if (!ReportCollector.LEDGER_READ.contains(l.type())) continue;
                    kept++;
                }
                expected.add(e);
            }
            assertThat(fromSome).as(name).containsExactlyElementsOf(expected);
            assertThat(some.runs()).as(name).isEqualTo(all.runs());
            assertThat(some.armedTimers()).as(name).isEqualTo(all.armedTimers()).isEqualTo(timers);
        }
        assertThat(kept).as("verdicts among the entries").isPositive();
        assertThat(ledgered).as("entries of other kinds, left out").isGreaterThan(kept);
    }

    @Test
    void theReportReadsVerdictsAndApprovalRequestsOnly() {
        assertThat(ReportCollector.LEDGER_READ).containsExactlyInAnyOrder(LedgerKind.VERDICT, LedgerKind.APPROVAL_REQUESTED);
    }
}
