package dev.tend.engine;

import dev.tend.shared.Id;
import dev.tend.shared.Target;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.List;

import static dev.tend.shared.SignalState.SILENT;
import static org.assertj.core.api.Assertions.assertThat;

/** Every operator command gets exactly one typed answer from the engine: done, refused with its reason, or not found. */
class CommandAnswerTest {
    private static final String FLEET = EngineHarness.TIERED_FLEET;
    private static final String APPROVED_PLAYBOOK = EngineHarness.APPROVAL_PLAYBOOK;

    private static CommandAnswer answer(List<Effect> fx) {
        List<Effect.Answered> answers = fx.stream().filter(e -> e instanceof Effect.Answered).map(e -> (Effect.Answered) e).toList();
        assertThat(answers).hasSize(1);
        return answers.get(0).answer();
    }


    @Test
    void approvalsAreDoneOnceRefusedByTheTwoPersonRuleAndWhenNoLongerPendingAndNotFoundWithoutARequest() {
        EngineHarness h = new EngineHarness(FLEET, null, APPROVED_PLAYBOOK);
        h.at(0, "fares-1", "n2", "heartbeat", SILENT);
        String run = h.pendingRun();
        assertThat(answer(h.send(new Input.Approve(run, Engine.AUTOMATION, "api"))))
                .isEqualTo(new CommandAnswer.Refused(CommandAnswer.Refusal.TWO_PERSON_RULE,
                        "two-person rule: whoever requested a run cannot approve it"));
        assertThat(answer(h.send(new Input.Approve(run, "ana", "cli")))).isInstanceOf(CommandAnswer.Done.class);
        assertThat(answer(h.send(new Input.Reject(run, "too late", "ben", "cli"))))
                .isInstanceOfSatisfying(CommandAnswer.Refused.class, r -> {
                    assertThat(r.why()).isEqualTo(CommandAnswer.Refusal.NOT_PENDING);
                    assertThat(r.reason()).startsWith("the run was already approved by ana");
                });
        assertThat(answer(h.send(new Input.Approve("r999999", "ana", "cli"))))
                .isEqualTo(new CommandAnswer.NotFound("no approval was requested for run r999999"));
    }

    @Test
    void releasingABrakeThatIsNotEngagedIsRefusedEngagingAndReleasingAreDone() {
        EngineHarness h = new EngineHarness(FLEET, null, APPROVED_PLAYBOOK);
        assertThat(answer(h.send(new Input.ReleaseBrake("nothing to release", "ana", "cli"))))
                .isEqualTo(new CommandAnswer.Refused(CommandAnswer.Refusal.NOT_ENGAGED,
                        "the fleet brake is not engaged; nothing was released"));
        assertThat(answer(h.send(new Input.EngageBrake("maintenance", "ana", "cli")))).isInstanceOf(CommandAnswer.Done.class);
        assertThat(answer(h.send(new Input.ReleaseBrake("over", "ana", "cli")))).isInstanceOf(CommandAnswer.Done.class);
    }

    @Test
    void abortingIsDoneForAnActiveRunRefusedForAnEndedOneAndNotFoundForNone() {
        EngineHarness h = new EngineHarness(FLEET, null, APPROVED_PLAYBOOK);
        h.at(0, "fares-1", "n2", "heartbeat", SILENT);
        String run = h.pendingRun();
        assertThat(answer(h.send(new Input.AbortRun(run, "not now", "ana", "cli")))).isInstanceOf(CommandAnswer.Done.class);
        assertThat(answer(h.send(new Input.AbortRun(run, null, "ana", "cli"))))
                .isEqualTo(new CommandAnswer.Refused(CommandAnswer.Refusal.ENDED, "run " + run + " already ended: cancelled"));
        assertThat(answer(h.send(new Input.AbortRun("r424242", null, "ana", "cli"))))
                .isEqualTo(new CommandAnswer.NotFound("no run r424242"));
    }

    @Test
    void anExclusionOfAnUnknownClusterOrNodeIsRefusedAsSuchAndRemovingNoneIsNotFound() {
        EngineHarness h = new EngineHarness(FLEET, null, APPROVED_PLAYBOOK);
        Instant until = h.now.plusSeconds(3600);
        assertThat(answer(h.send(new Input.Exclude(Target.cluster(Id.of("fares-2")), "owner work", "ops", until, "ana", "cli"))))
                .isInstanceOfSatisfying(CommandAnswer.Refused.class, r -> {
                    assertThat(r.why()).isEqualTo(CommandAnswer.Refusal.UNKNOWN_CLUSTER);
                    assertThat(r.reason()).startsWith("cluster fares-2 is not in the topology");
                });
        assertThat(answer(h.send(new Input.Exclude(Target.node(Id.of("fares-1"), Id.of("n7")), "owner work", "ops", until, "ana", "cli"))))
                .isInstanceOfSatisfying(CommandAnswer.Refused.class, r -> assertThat(r.why()).isEqualTo(CommandAnswer.Refusal.UNKNOWN_NODE));
        assertThat(answer(h.send(new Input.Exclude(Target.cluster(Id.of("fares-1")), "owner work", "ops", until, "ana", "cli"))))
                .isInstanceOf(CommandAnswer.Done.class);
        assertThat(answer(h.send(new Input.Unexclude(Target.cluster(Id.of("fares-1")), "ana", "cli")))).isInstanceOf(CommandAnswer.Done.class);
        assertThat(answer(h.send(new Input.Unexclude(Target.cluster(Id.of("fares-1")), "ana", "cli"))))
                .isEqualTo(new CommandAnswer.NotFound("fares-1 is not excluded"));
    }
}
