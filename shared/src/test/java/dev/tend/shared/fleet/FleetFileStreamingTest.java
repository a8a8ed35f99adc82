package dev.tend.shared.fleet;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

/** A fleet file read from disk, cluster by cluster, says exactly what the same text parsed whole says. */
class FleetFileStreamingTest {
    @TempDir
    Path dir;

    @ParameterizedTest
    @ValueSource(strings = {
            // valid: anchors and aliases, flow and block style, a cluster-level list before the clusters
            "fleet: larkspur\nclusters:\n  - id: fares-1\n    tags: &t { tier: critical }\n    nodes: [{ id: n1, zone: z-a }]\n"
                    + "  - id: fares-2\n    tags: *t\n",
            // every kind of mistake the whole-text parser reports, in one file
            "fleet: larkspur\ncolor: blue\nclusters:\n  - id: fares 3\n    replication: { factor: 3, min-in-sync: 4 }\n"
                    + "    quorum: maybe\n    nodes:\n      - { id: n1, zone: z-a }\n      - { id: n1, zone: z b }\n"
                    + "  - id: dispatch-1\n    nodes: nope\n  - id: dispatch-1\n",
            // duplicate keys inside a cluster, and at the top after the list
            "fleet: larkspur\nclusters:\n  - id: fares-1\n    id: fares-2\nfleet: again\n",
            // clusters is not a list
            "fleet: larkspur\nclusters: { id: fares-1 }\n",
            // a syntax error after good clusters
            "fleet: larkspur\nclusters:\n  - id: fares-1\n  - id: [fares-2\n",
            // the top level is a list
            "- fares-1\n",
            // empty
            "",
            // an alias inside its own anchor's value
            "fleet: larkspur\nclusters:\n  - &c\n    id: fares-1\n    nodes: [*c]\n"})
    void streamedYamlAgreesWithTheWholeText(String text) throws Exception {
        Path file = Files.writeString(dir.resolve("fleet.yaml"), text);
        assertThat(outcome(() -> FleetFile.load(file))).isEqualTo(outcome(() -> FleetFile.parse(file.toString(), text)));
    }

    @Test
    void aJsonSyntaxErrorIsLocatedAtItsLineAndColumnNeverColumnZero() throws Exception {
        String text = "{\"fleet\": \"larkspur\",\n \"clusters\": [\n  {\"id\": \"fares-1\",, \"nodes\": []}\n]}\n";
        Path file = Files.writeString(dir.resolve("fleet.json"), text);
        InvalidInputException streamed = catchThrowableOfType(InvalidInputException.class, () -> FleetFile.load(file));
        assertThat(streamed.problems()).singleElement().satisfies(p -> {
            assertThat(p.line()).isEqualTo(3);
            assertThat(p.column()).as(p.toString()).isGreaterThan(0);
        });
        InvalidInputException whole = catchThrowableOfType(InvalidInputException.class, () -> FleetFile.parse(file.toString(), text));
        assertThat(whole.problems()).singleElement().satisfies(p -> {
            assertThat(p.line()).isEqualTo(3);
            assertThat(p.column()).as(p.toString()).isGreaterThan(0);
        });
    }

    @Test
    void aByteThatIsNotUtf8IsRefusedAtItsLineAndColumnLikeTheWholeTextReaderRefusesIt() throws Exception {
        byte[] good = "fleet: larkspur\nclusters:\n  - id: fares-1\n    nodes: [{ id: n1, zone: z-a }]\n".getBytes(
                java.nio.charset.StandardCharsets.UTF_8);
        // 0xFF never occurs in UTF-8 (RFC 3629, section 1); placed on line 3, after "  - id: fa"
        int at = "fleet: larkspur\nclusters:\n  - id: fa".length();
        byte[] bad = good.clone();
        bad[at] = (byte) 0xFF;
        Path file = Files.write(dir.resolve("fleet.yaml"), bad);
        InvalidInputException streamed = catchThrowableOfType(InvalidInputException.class, () -> FleetFile.load(file));
        assertThat(streamed.problems()).extracting(Problem::toString).containsExactly(
                file + ":3:11: this file is not valid UTF-8: the byte here cannot start or continue a character");
        InvalidInputException whole = catchThrowableOfType(InvalidInputException.class,
                () -> dev.tend.shared.yaml.YamlDocument.decode(file.toString(), bad));
        assertThat(whole.problems()).extracting(Problem::toString).isEqualTo(
                streamed.problems().stream().map(Problem::toString).toList());
    }

    @Test
    void jsonMistakesAreLocatedLikeYamlOnes() throws Exception {
        Path file = Files.writeString(dir.resolve("fleet.json"),
                "{\"fleet\": \"larkspur\",\n \"clusters\": [\n  {\"id\": \"fares-1\", \"quorum\": \"maybe\"},\n  {\"id\": \"fares-1\"}\n ]\n}\n");
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class, () -> FleetFile.load(file));
        assertThat(e.problems()).extracting(Problem::toString).containsExactly(
                file + ":3:31: clusters[0].quorum: must be true or false, got 'maybe'",
                file + ":4:3: clusters[1]: cluster fares-1 is listed twice; the first is clusters[0]");
    }

    @Test
    void aliasesThatWouldRepeatTooManyValuesAreRefusedLikeTheWholeTextParserRefusesThem() throws Exception {
        String text = "fleet: larkspur\nclusters:\n  - id: fares-1\n    tags: &a {" + java.util.stream.IntStream.range(0, 3000).mapToObj(i -> "k" + i + ": v, ").collect(java.util.stream.Collectors.joining()) + "z: v}\n"
                + "  - { id: fares-2, tags: *a }\n  - { id: fares-3, tags: *a }\n  - { id: fares-4, tags: *a }\n"
                + "  - { id: fares-5, tags: *a }\n";
        Path file = Files.writeString(dir.resolve("fleet.yaml"), text);
        String expected = "aliases (*name) in this document repeat more than " + dev.tend.shared.yaml.YamlDocument.MAX_ALIASED_VALUES;
        assertThat(catchThrowableOfType(InvalidInputException.class, () -> FleetFile.load(file)).getMessage()).contains(expected);
        assertThat(catchThrowableOfType(InvalidInputException.class, () -> FleetFile.parse("fleet.yaml", text)).getMessage())
                .contains(expected);
    }

    @Test
    void aSecondDocumentIsRefusedAtItsStart() throws Exception {
        Path file = Files.writeString(dir.resolve("fleet.yaml"), "fleet: a\n---\nfleet: b\n");
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class, () -> FleetFile.load(file));
        assertThat(e.problems()).extracting(Problem::toString)
                .containsExactly(file + ":2:1: this is not valid YAML: the file holds more than one document; keep one");
    }

    @Test
    void brokenJsonNamesItsLine() throws Exception {
        Path file = Files.writeString(dir.resolve("fleet.json"), "{\"fleet\": \"larkspur\",\n \"clusters\": [\n  {\"id\": \"fares-1\",}\n]}\n");
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class, () -> FleetFile.load(file));
        assertThat(e.problems()).hasSize(1);
        assertThat(e.problems().get(0).line()).isEqualTo(3);
        assertThat(e.problems().get(0).message()).startsWith("this is not valid JSON: ");
    }

    /** The fleet's clusters, or the problems as text. */
    private static Object outcome(java.util.function.Supplier<Fleet> load) {
        try {
            return List.copyOf(load.get().clusters());
        } catch (InvalidInputException e) {
            return e.problems().stream().map(p -> p.line() + ":" + p.column() + ": " + p.message()).toList();
        }
    }
}
