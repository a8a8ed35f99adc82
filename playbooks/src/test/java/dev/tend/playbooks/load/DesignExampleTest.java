package dev.tend.playbooks.load;

import dev.tend.playbooks.ActionStep;
import dev.tend.playbooks.Actions;
import dev.tend.playbooks.ApprovalPolicy;
import dev.tend.playbooks.ChangeWindow;
import dev.tend.playbooks.Limits;
import dev.tend.playbooks.LoopLimit;
import dev.tend.playbooks.MaskRule;
import dev.tend.playbooks.Mode;
import dev.tend.playbooks.PageStep;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.RateLimit;
import dev.tend.playbooks.Scope;
import dev.tend.playbooks.TagSelector;
import dev.tend.playbooks.Template;
import dev.tend.playbooks.TestDir;
import dev.tend.playbooks.Trigger;
import dev.tend.playbooks.WaitHealthyStep;
import dev.tend.shared.Id;
import dev.tend.shared.SignalState;
import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.time.Duration;
import java.time.ZoneId;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.EnumSet;
import java.time.DayOfWeek;
import java.time.LocalTime;

import static org.assertj.core.api.Assertions.assertThat;

/** The example playbook of DESIGN.md section 5, verbatim, loads into the values it describes. */
class DesignExampleTest {
    static final String EXAMPLE = """
            playbook: replace-silent-node
            version: 3
            description: Replace a node that stopped reporting.
            mode: live                 # live | shadow (decide and record, never execute)
            trigger:
              signal: heartbeat
              state: silent
              scope: node              # node | cluster
              confirm-for: 5m
              clusters: { tier: [standard, bulk] }
            unless:
              - { signal: storage-full, on: node }
              - { signal: key-revoked, on: cluster }
            limits:
              per-cluster: 1
              fleet: 5
              rate: 10/1h
              cooldown: 6h
              loop: 3/24h
              impaired-fraction: 0.34
              keep-quorum: true
              keep-replicas: true
            window: { days: [mon, tue, wed, thu, fri], from: "01:00", until: "05:00", zone: Europe/Berlin }
            approval:
              clusters: { tier: [critical] }
              expires-after: 30m
            steps:
              - { id: drain,   action: drain-node,   timeout: 10m }
              - { id: replace, action: replace-node, timeout: 30m, retries: 1 }
              - { id: settle,  wait-healthy: [heartbeat], within: 20m }
            on-failure:
              - { page: oncall, message: "replacing {node} in {cluster} failed at {step}" }
            """;

    static Actions actions() {
        return PlaybookLoader.parseActions("actions.yaml", TestDir.ACTIONS);
    }

    @Test
    void designExampleLoadsIntoTheExpectedValues() throws Exception {
        Playbook p = PlaybookLoader.parse("replace-silent-node.yaml", EXAMPLE, actions());

        assertThat(p.id()).isEqualTo(Id.of("replace-silent-node"));
        assertThat(p.version()).isEqualTo(3);
        assertThat(p.description()).isEqualTo("Replace a node that stopped reporting.");
        assertThat(p.mode()).isEqualTo(Mode.LIVE);
        assertThat(p.trigger()).isEqualTo(new Trigger(Id.of("heartbeat"), SignalState.SILENT, Scope.NODE, Duration.ofMinutes(5),
                TagSelector.of("tier", "standard", "bulk")));
        assertThat(p.unless()).containsExactly(new MaskRule(Id.of("storage-full"), Scope.NODE),
                new MaskRule(Id.of("key-revoked"), Scope.CLUSTER));
        assertThat(p.limits()).isEqualTo(Limits.builder().perCluster(1).fleet(5).rate(new RateLimit(10, Duration.ofHours(1)))
                .cooldown(Duration.ofHours(6)).loop(new LoopLimit(3, Duration.ofHours(24))).impairedFraction(0.34)
                .keepQuorum(true).keepReplicas(true).build());
        assertThat(p.window()).isEqualTo(new ChangeWindow(EnumSet.range(DayOfWeek.MONDAY, DayOfWeek.FRIDAY),
                LocalTime.of(1, 0), LocalTime.of(5, 0), ZoneId.of("Europe/Berlin")));
        assertThat(p.approval()).isEqualTo(new ApprovalPolicy(TagSelector.of("tier", "critical"), Duration.ofMinutes(30)));
        assertThat(p.steps()).containsExactly(
                new ActionStep(Id.of("drain"), Id.of("drain-node"), Duration.ofMinutes(10), 0),
                new ActionStep(Id.of("replace"), Id.of("replace-node"), Duration.ofMinutes(30), 1),
                new WaitHealthyStep(Id.of("settle"), List.of(Id.of("heartbeat")), Duration.ofMinutes(20)));
        assertThat(p.onFailure()).containsExactly(new PageStep(Id.of("on-failure-1"), Id.of("oncall"),
                new Template("replacing {node} in {cluster} failed at {step}")));
        assertThat(p.source()).isEqualTo("replace-silent-node.yaml");
        // FIPS 180-4 SHA-256 of the file's bytes, computed here with the JDK's own provider
        String expected = HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(EXAMPLE.getBytes(StandardCharsets.UTF_8)));
        assertThat(p.contentHash()).isEqualTo(expected);
        assertThat(p.line()).isEqualTo(1);
        assertThat(p.column()).isEqualTo(11);
        assertThat(p.position("trigger").line()).isEqualTo(6);
        assertThat(p.position("steps.replace").line()).isEqualTo(29);
        assertThat(p.position("limits.impaired-fraction")).extracting("line", "column").containsExactly(20, 3);
    }

    @Test
    void designExampleMessageRendersWithRunValues() {
        Playbook p = PlaybookLoader.parse("replace-silent-node.yaml", EXAMPLE, actions());
        PageStep page = (PageStep) p.onFailure().get(0);

        assertThat(page.message().render(Map.of("node", "n2", "cluster", "fares-3", "step", "replace")))
                .isEqualTo("replacing n2 in fares-3 failed at replace");
    }

    @Test
    void unwrittenOptionalKeysTakeTheirDocumentedDefaults() {
        Playbook p = PlaybookLoader.parse("p.yaml", """
                playbook: minimal
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node }
                """, actions());

        assertThat(p.version()).isEqualTo(1);
        assertThat(p.description()).isEmpty();
        assertThat(p.mode()).isEqualTo(Mode.LIVE);
        assertThat(p.trigger().confirmFor()).isEqualTo(Duration.ZERO);
        assertThat(p.trigger().clusters()).isEqualTo(TagSelector.all());
        assertThat(p.unless()).isEmpty();
        assertThat(p.limits()).isEqualTo(Limits.none());
        assertThat(p.window()).isNull();
        assertThat(p.approval()).isNull();
        assertThat(p.onFailure()).isEmpty();
        assertThat(((ActionStep) p.steps().get(0)).timeout()).isNull();
        assertThat(((ActionStep) p.steps().get(0)).retries()).isZero();
    }

    @Test
    void shadowModeAndExtraLimitKeysLoad() {
        Playbook p = PlaybookLoader.parse("p.yaml", """
                playbook: candidate
                mode: shadow
                trigger: { signal: heartbeat, state: silent, scope: node }
                limits: { per-zone: 2, flapping: 4/10m }
                approval: { clusters: {} }
                steps:
                  - { id: drain, action: drain-node, timeout: 5m }
                """, actions());

        assertThat(p.isShadow()).isTrue();
        assertThat(p.limits().perZone()).isEqualTo(2);
        assertThat(p.limits().flapping().changes()).isEqualTo(4);
        assertThat(p.limits().flapping().period()).isEqualTo(Duration.ofMinutes(10));
        assertThat(p.approval().isRequiredFor(Map.of())).isTrue();
        assertThat(p.approval().expiresAfter()).isEqualTo(ApprovalPolicy.DEFAULT_EXPIRY);
    }
}
