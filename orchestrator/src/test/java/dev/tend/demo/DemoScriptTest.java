package dev.tend.demo;

import dev.tend.api.auth.Caller;
import dev.tend.api.auth.Role;
import dev.tend.api.auth.TokenFile;
import dev.tend.api.auth.Tokens;
import dev.tend.shared.Id;
import dev.tend.shared.fleet.ClusterSpec;
import dev.tend.shared.fleet.Fleet;
import dev.tend.shared.fleet.FleetFile;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.nio.file.Files;
import java.nio.file.Path;
import java.security.SecureRandom;
import java.time.Duration;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** The demo's scripted incidents, its bundled library and its tokens. */
class DemoScriptTest {
    @TempDir
    Path dir;

    /** The tier each incident's story needs: replace-silent-node asks a person on tier critical only. */
    private static final Map<String, String> TIER = Map.of("silent-standard-node", "standard", "silent-critical-node", "critical",
            "owner-filled-disks", "standard", "flapping-heartbeat", "standard");

    @Test
    void everyTargetIsANodeOfTheBundledFleetOnTheTierItsIncidentNeeds() {
        Fleet fleet = FleetFile.load(DemoLibrary.copyTo(dir.resolve("library")).resolve("fleet.yaml"));
        for (DemoScript.Incident i : DemoScript.larkspur()) {
            for (List<DemoScript.Target> cast : i.casts()) {
                for (DemoScript.Target t : cast) {
                    ClusterSpec c = fleet.cluster(Id.of(t.cluster())).orElseThrow(() -> new AssertionError("no cluster " + t));
                    assertThat(c.node(Id.of(t.node()))).as(i.name() + " " + t).isPresent();
                    assertThat(c.tags().get("tier")).as(i.name() + " " + t).isEqualTo(TIER.get(i.name()));
                }
            }
        }
    }

    @Test
    void theBundledLibraryIsCopiedWholeWithItsPlaybooksPolicyAndFleet() {
        Path lib = DemoLibrary.copyTo(dir.resolve("library"));
        assertThat(lib.resolve("replace-silent-node.yaml")).exists();
        assertThat(lib.resolve("restart-stopped-process.yaml")).exists();
        assertThat(lib.resolve("actions.yaml")).exists();
        assertThat(lib.resolve("tend.yaml")).exists();
    }

    @Test
    void eachRoundCastsTheIncidentsOnOtherNodesSoTheLastRoundsCooldownsDoNotHideThem() {
        List<DemoScript.Incident> incidents = DemoScript.larkspur();
        Set<DemoScript.Target> round0 = targets(DemoScript.round(incidents, 0));
        Set<DemoScript.Target> round1 = targets(DemoScript.round(incidents, 1));
        assertThat(round0).doesNotContainAnyElementsOf(round1);
        // the replace-silent-node cooldown is 6h: eight casts of one-hour rounds keep a target out of it
        assertThat(incidents.get(0).casts()).hasSizeGreaterThanOrEqualTo(7);
        assertThat(DemoScript.round(incidents, 8)).isEqualTo(DemoScript.round(incidents, 0));
    }

    @Test
    void aRoundIsInTimeOrderAndStaysWithinTheRound() {
        List<DemoScript.Scripted> round = DemoScript.round(DemoScript.larkspur(), 3);
        assertThat(round).extracting(DemoScript.Scripted::after).isSorted();
        assertThat(round).allSatisfy(s -> assertThat(s.after()).isLessThan(DemoScript.ROUND));
        assertThat(round).extracting(DemoScript.Scripted::incident)
                .contains("silent-standard-node", "silent-critical-node", "owner-filled-disks", "flapping-heartbeat");
    }

    static Stream<Arguments> invalidParts() {
        DemoScript.Target t = new DemoScript.Target("fares-3", "n2");
        return Stream.of(
                Arguments.of((Runnable) () -> new DemoScript.Beat(Duration.ofMinutes(60), 0, "heartbeat", "silent"),
                        "Beat.after must be from 0 to less than PT1H, got PT1H"),
                Arguments.of((Runnable) () -> new DemoScript.Beat(Duration.ofSeconds(-1), 0, "heartbeat", "silent"),
                        "Beat.after must be from 0 to less than PT1H, got PT-1S"),
                Arguments.of((Runnable) () -> new DemoScript.Beat(Duration.ZERO, -1, "heartbeat", "silent"),
                        "Beat.target must be 0 or more, got -1"),
                Arguments.of((Runnable) () -> new DemoScript.Incident("x", "d", List.of(), List.of()),
                        "Incident x needs at least one cast"),
                Arguments.of((Runnable) () -> new DemoScript.Incident("x", "d", List.of(List.of(t)),
                        List.of(new DemoScript.Beat(Duration.ZERO, 1, "heartbeat", "silent"))),
                        "Incident x: every cast needs 2 targets, got [Target[cluster=fares-3, node=n2]]"),
                Arguments.of((Runnable) () -> DemoScript.Target.of("fares-3"), "a demo target must look like fares-3/n2, got 'fares-3'"),
                Arguments.of((Runnable) () -> DemoScript.round(DemoScript.larkspur(), -1), "round must be 0 or more, got -1"),
                Arguments.of((Runnable) () -> new DemoTokens("a", "a", "b"), "DemoTokens must be three different tokens"));
    }

    @ParameterizedTest
    @MethodSource("invalidParts")
    void rejectsAnInvalidPartNamingTheFieldAndTheLimit(Runnable make, String message) {
        assertThatThrownBy(make::run).isInstanceOf(IllegalArgumentException.class).hasMessage(message);
    }

    @Test
    void demoTokensAreRandomAndTheirFileGivesEachItsRoles() throws Exception {
        DemoTokens a = DemoTokens.random(new SecureRandom());
        DemoTokens b = DemoTokens.random(new SecureRandom());
        assertThat(new HashSet<>(List.of(a.lead(), a.viewer(), a.script(), b.lead(), b.viewer(), b.script()))).hasSize(6);
        assertThat(a.lead()).hasSize(32).matches("[A-Za-z0-9_-]+");
        assertThat(a.toString()).doesNotContain(a.lead());

        Path file = Files.writeString(dir.resolve("tokens.yaml"), a.toFileText());
        assertThat(Files.readString(file)).doesNotContain(a.lead()).doesNotContain(a.viewer()).doesNotContain(a.script());
        Tokens tokens = TokenFile.load(file);
        assertThat(tokens.holderOf(a.lead())).map(Caller::roles).contains(Set.of(Role.APPROVER, Role.OPERATOR));
        assertThat(tokens.holderOf(a.viewer())).map(Caller::roles).contains(Set.of(Role.VIEWER));
        assertThat(tokens.holderOf(a.script())).map(Caller::name).contains(DemoTokens.SCRIPT);
        assertThat(tokens.holderOf(b.lead())).isEmpty();
    }

    private static Set<DemoScript.Target> targets(List<DemoScript.Scripted> round) {
        Set<DemoScript.Target> out = new HashSet<>();
        for (DemoScript.Scripted s : round) out.add(s.target());
        return out;
    }
}
