package dev.tend.playbooks.load;

import dev.tend.playbooks.BrakePolicy;
import dev.tend.playbooks.EffectiveLimits;
import dev.tend.playbooks.FlapLimit;
import dev.tend.playbooks.Freeze;
import dev.tend.playbooks.LoopLimit;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.RateLimit;
import dev.tend.playbooks.TagSelector;
import dev.tend.playbooks.TendConfig;
import dev.tend.playbooks.TestDir;
import dev.tend.shared.Id;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;

import static dev.tend.playbooks.TestDir.column;
import static org.assertj.core.api.Assertions.assertThat;

/** tend.yaml: fleet-wide defaults, the fleet brake, freezes and the fleet rate, validated and located. */
class ConfigFileTest {
    private static List<Problem> problems(String text) {
        return TestDir.problems(() -> PlaybookLoader.parseConfig("tend.yaml", text));
    }

    @Test
    void fullConfigLoadsAndMergesDefaultsOverBuiltIns() {
        TendConfig c = PlaybookLoader.parseConfig("tend.yaml", """
                defaults: { fleet: 20, rate: 5/1h, impaired-fraction: 0.25 }
                brake:
                  engage-at: { clusters: 25, fraction: 0.08 }
                  release-below: { clusters: 10, fraction: 0.03 }
                  auto-release: true
                  page: platform-oncall
                freezes:
                  - from: 2027-12-24T00:00:00+01:00
                    until: 2027-12-27T00:00:00+01:00
                    reason: holiday timetable
                    clusters: { team: [planning] }
                rate: 50/1h
                """);

        EffectiveLimits d = c.defaults();
        assertThat(d.fleet()).isEqualTo(20);
        assertThat(d.rate()).isEqualTo(new RateLimit(5, Duration.ofHours(1)));
        assertThat(d.impairedFraction()).isEqualTo(0.25);
        assertThat(d.perCluster()).isEqualTo(1);
        assertThat(d.perZone()).isEqualTo(5);
        assertThat(d.cooldown()).isEqualTo(Duration.ofHours(1));
        assertThat(d.loop()).isEqualTo(new LoopLimit(3, Duration.ofHours(24)));
        assertThat(d.keepQuorum()).isTrue();
        assertThat(d.keepReplicas()).isTrue();
        assertThat(d.flapping()).isEqualTo(new FlapLimit(6, Duration.ofMinutes(15)));
        BrakePolicy b = c.brake();
        assertThat(b.engageAt().clusters()).isEqualTo(25);
        assertThat(b.releaseBelow().fraction()).isEqualTo(0.03);
        assertThat(b.autoRelease()).isTrue();
        assertThat(b.pageChannel()).isEqualTo(Id.of("platform-oncall"));
        assertThat(c.freezes()).containsExactly(new Freeze(Instant.parse("2027-12-23T23:00:00Z"), Instant.parse("2027-12-26T23:00:00Z"),
                "holiday timetable", TagSelector.of("team", "planning")));
        assertThat(c.freezeAt(Instant.parse("2027-12-25T12:00:00Z"), Map.of("team", "planning"))).isPresent();
        assertThat(c.freezeAt(Instant.parse("2027-12-25T12:00:00Z"), Map.of("team", "payments"))).isEmpty();
        assertThat(c.freezeAt(Instant.parse("2027-12-26T23:00:00Z"), Map.of("team", "planning"))).as("until is exclusive").isEmpty();
        assertThat(c.rate()).isEqualTo(new RateLimit(50, Duration.ofHours(1)));
    }

    @Test
    void playbookLimitsOverrideTendYamlWhichOverridesBuiltIns(@TempDir Path tmp) {
        TestDir dir = new TestDir(tmp);
        dir.write("actions.yaml", TestDir.ACTIONS);
        dir.write("tend.yaml", "defaults: { cooldown: 2h, fleet: 20 }\n");
        dir.write("p.yaml", """
                playbook: p
                trigger: { signal: heartbeat, state: silent, scope: node }
                limits: { fleet: 3 }
                steps:
                  - { id: drain, action: drain-node, timeout: 1m }
                """);
        PlaybookSet set = PlaybookLoader.load(tmp);
        Playbook p = set.playbooks().get(0);

        EffectiveLimits e = set.effectiveLimits(p);
        assertThat(e.fleet()).as("from the playbook").isEqualTo(3);
        assertThat(e.cooldown()).as("from tend.yaml").isEqualTo(Duration.ofHours(2));
        assertThat(e.rate()).as("built in").isEqualTo(new RateLimit(20, Duration.ofHours(1)));
        assertThat(set.config().source()).isEqualTo(dir.source("tend.yaml"));
    }

    @Test
    void withoutTendYamlTheBuiltInPolicyApplies(@TempDir Path tmp) {
        TestDir dir = new TestDir(tmp);
        dir.write("actions.yaml", TestDir.ACTIONS);
        dir.write("p.yaml", """
                playbook: p
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 1m }
                """);

        PlaybookSet set = PlaybookLoader.load(tmp);

        assertThat(set.config()).isEqualTo(TendConfig.builtIn());
        assertThat(set.effectiveLimits(set.playbooks().get(0))).isEqualTo(EffectiveLimits.builtIn());
        assertThat(TendConfig.builtIn().brake()).isEqualTo(BrakePolicy.builtIn());
        assertThat(TendConfig.builtIn().rate()).isEqualTo(new RateLimit(50, Duration.ofHours(1)));
    }

    @Test
    void explicitConfigFileIsUsedInsteadOfTheDirectorysOwn(@TempDir Path tmp, @TempDir Path elsewhere) {
        TestDir dir = new TestDir(tmp);
        dir.write("actions.yaml", TestDir.ACTIONS);
        dir.write("tend.yaml", "rate: 5/1h\n");
        dir.write("p.yaml", """
                playbook: p
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 1m }
                """);
        Path config = new TestDir(elsewhere).write("policy.yaml", "rate: 7/1h\n");

        assertThat(PlaybookLoader.load(tmp, config).config().rate()).isEqualTo(new RateLimit(7, Duration.ofHours(1)));
        assertThat(TestDir.problems(() -> PlaybookLoader.load(tmp, elsewhere.resolve("missing.yaml"))))
                .extracting(Problem::toString).containsExactly(elsewhere.resolve("missing.yaml") + ": the file does not exist");
    }

    @Test
    void explicitConfigFileInsideTheDirectoryIsNotReadAsAPlaybook(@TempDir Path tmp) {
        TestDir dir = new TestDir(tmp);
        dir.write("actions.yaml", TestDir.ACTIONS);
        dir.write("p.yaml", """
                playbook: p
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 1m }
                """);
        Path policy = dir.write("policy.yaml", "rate: 7/1h\n");

        PlaybookSet set = PlaybookLoader.load(tmp, policy);

        assertThat(set.playbooks()).extracting(p -> p.id().value()).containsExactly("p");
        assertThat(set.config().source()).isEqualTo(policy.toString());
    }

    @Test
    void releaseThresholdNotBelowEngageThresholdIsRejected() {
        String text = """
                brake:
                  engage-at: { clusters: 10 }
                  release-below: { clusters: 10 }
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly("tend.yaml:3:18: brake.release-below.clusters (10)"
                + " must be lower than engage-at.clusters (10), or the brake would release as soon as it engages");
    }

    @Test
    void releaseFractionAboveEngageFractionIsRejected() {
        String text = """
                brake:
                  engage-at: { clusters: 25, fraction: 0.08 }
                  release-below: { clusters: 10, fraction: 0.1 }
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly("tend.yaml:3:18: brake.release-below.fraction (0.1)"
                + " must be lower than engage-at.fraction (0.08), or the brake would release as soon as it engages");
    }

    @Test
    void releaseMeasureThatEngageDoesNotGiveIsRejected() {
        String text = """
                brake:
                  engage-at: { clusters: 25 }
                  release-below: { fraction: 0.03 }
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly("tend.yaml:3:18: brake.release-below.fraction has no"
                + " engage-at.fraction to be lower than; give both or neither");
    }

    @Test
    void autoReleaseNeedsAReleaseThreshold() {
        String text = """
                brake:
                  engage-at: { clusters: 25 }
                  auto-release: true
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly("tend.yaml:3:17: brake.auto-release is true but brake"
                + " has no release-below; give the lower threshold at which the brake lets go by itself");
    }

    @Test
    void thresholdWithNoMeasureIsRejected() {
        String text = """
                brake:
                  engage-at: {}
                """;
        assertThat(problems(text)).extracting(Problem::toString)
                .containsExactly("tend.yaml:2:14: brake.engage-at needs 'clusters' (a count), 'fraction' (of the fleet) or both");
    }

    @Test
    void freezeTimesNeedAZoneAndUntilAfterFrom() {
        String text = """
                freezes:
                  - { from: 2027-12-24, until: 2027-12-27T00:00:00Z, reason: holidays }
                  - { from: 2027-12-24T00:00:00Z, until: 2027-12-23T00:00:00Z, reason: holidays }
                  - { from: 2027-12-24T00:00:00Z, until: 2027-12-25T00:00:00Z }
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly(
                "tend.yaml:2:13: freezes[1].from: a time looks like 2027-12-24T18:00:00Z or 2027-12-24T18:00:00+01:00"
                        + " (RFC 3339, with a zone), got '2027-12-24'",
                "tend.yaml:3:" + column(text, 3, "2027-12-23") + ": freezes[2].until (2027-12-23T00:00:00Z) must be after from"
                        + " (2027-12-24T00:00:00Z)",
                "tend.yaml:4:5: freezes[3] needs 'reason'");
    }

    @Test
    void defaultsAreValidatedAndLocatedLikePlaybookLimits() {
        String text = """
                defaults:
                  per-cluster: 0
                  cooldown: 1 hour
                  impaired-fraction: 1.5
                brakes: {}
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly(
                "tend.yaml:2:16: defaults.per-cluster: must be between 1 and 1000, got 0",
                "tend.yaml:3:13: defaults.cooldown: a duration looks like 30s, 5m, 6h or 1d, got '1 hour'",
                "tend.yaml:4:22: defaults.impaired-fraction: must be more than 0 and at most 1, got 1.5",
                "tend.yaml:5:1: unknown key 'brakes' in tend.yaml (did you mean 'brake'?); the keys allowed here are: brake, channels,"
                        + " defaults, freezes, max-skew, pages, rate, signals");
    }

    @Test
    void tendYamlProblemsAreReportedWithThePlaybooks(@TempDir Path tmp) {
        TestDir dir = new TestDir(tmp);
        dir.write("actions.yaml", TestDir.ACTIONS);
        dir.write("tend.yaml", "rate: 10 per hour\n");
        dir.write("p.yaml", "playbook: p\n");
        assertThat(TestDir.problems(() -> PlaybookLoader.load(tmp))).extracting(Problem::source)
                .containsExactly(dir.source("tend.yaml"), dir.source("p.yaml"), dir.source("p.yaml"));
    }

    @Test
    void maxSkewIsFiveMinutesUnlessTendYamlSaysOtherwise() {
        assertThat(PlaybookLoader.parseConfig("tend.yaml", "rate: 10/1h\n").maxSkew()).isEqualTo(java.time.Duration.ofMinutes(5));
        assertThat(PlaybookLoader.parseConfig("tend.yaml", "max-skew: 90s\n").maxSkew()).isEqualTo(java.time.Duration.ofSeconds(90));
        assertThat(problems("max-skew: soon\n")).singleElement().asString().startsWith("tend.yaml:1:11: max-skew: ");
    }

    @Test
    void declaredSignalsAreIdsListedOnceAndNotEmpty() {
        TendConfig c = PlaybookLoader.parseConfig("tend.yaml", "signals: [heartbeat, storage-full]\n");
        assertThat(c.declaresSignals()).isTrue();
        assertThat(c.signals()).extracting(dev.tend.shared.Id::value).containsExactly("heartbeat", "storage-full");
        assertThat(PlaybookLoader.parseConfig("tend.yaml", "rate: 10/1h\n").declaresSignals()).isFalse();
        assertThat(problems("signals: []\n")).singleElement().asString().contains("signals is empty");
        assertThat(problems("signals: [heartbeat, heartbeat]\n")).singleElement().asString()
                .contains("signal 'heartbeat' is listed twice in signals");
        assertThat(problems("signals: [\"heart beat\"]\n")).singleElement().asString().startsWith("tend.yaml:1:11: signals[1]: ");
    }
}
