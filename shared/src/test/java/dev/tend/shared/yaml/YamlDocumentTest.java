package dev.tend.shared.yaml;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

class YamlDocumentTest {
    @Test
    void locatesEveryNodeByLineAndColumn() {
        YMap root = (YMap) YamlDocument.parse("f.yaml", "fleet: larkspur\nclusters:\n  - id: fares-3\n    quorum: true\n");
        assertThat(root.keys()).containsExactly("fleet", "clusters");
        YList clusters = (YList) root.get("clusters").orElseThrow();
        YMap first = (YMap) clusters.items().get(0);
        YScalar quorum = (YScalar) first.get("quorum").orElseThrow();
        assertThat(quorum.value()).isEqualTo("true");
        assertThat(quorum.line()).isEqualTo(4);
        assertThat(quorum.column()).isEqualTo(13);
        assertThat(first.line()).isEqualTo(3);
        assertThat(first.column()).isEqualTo(5);
    }

    @Test
    void tellsAnEmptyValueFromAQuotedEmptyString() {
        YMap root = (YMap) YamlDocument.parse("f.yaml", "a:\nb: ''\nc: ~\nd: null\ne: \"null\"\n");
        assertThat(((YScalar) root.get("a").orElseThrow()).plainNull()).isTrue();
        assertThat(((YScalar) root.get("b").orElseThrow()).plainNull()).isFalse();
        assertThat(((YScalar) root.get("c").orElseThrow()).plainNull()).isTrue();
        assertThat(((YScalar) root.get("d").orElseThrow()).plainNull()).isTrue();
        assertThat(((YScalar) root.get("e").orElseThrow()).plainNull()).isFalse();
    }

    @Test
    void locatesASyntaxError() {
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class,
                () -> YamlDocument.parse("fleet.yaml", "fleet: larkspur\nclusters:\n  - id: fares-3\n    tags: { tier: critical\n  - id: x\n"));
        assertThat(e.problems()).hasSize(1);
        Problem p = e.problems().get(0);
        assertThat(p.line()).isEqualTo(5);
        assertThat(p.column()).isEqualTo(7);
        assertThat(p.message()).startsWith("this is not valid YAML: ");
        assertThat(p.toString()).startsWith("fleet.yaml:5:7: this is not valid YAML: ");
    }

    @Test
    void locatesAMisplacedMappingValue() {
        assertThatThrownBy(() -> YamlDocument.parse("f.yaml", "a: b\n c: d\n"))
                .isInstanceOf(InvalidInputException.class)
                .hasMessage("f.yaml:2:3: this is not valid YAML: mapping values are not allowed here");
    }

    @Test
    void locatesEveryDuplicateKeyAndPointsToTheFirst() {
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class,
                () -> YamlDocument.parse("f.yaml", "fleet: larkspur\nclusters:\n  - id: a\n    id: b\nfleet: other\n"));
        assertThat(e.problems()).extracting(Problem::toString).containsExactlyInAnyOrder(
                "f.yaml:4:5: 'id' is given twice; the first is at line 3",
                "f.yaml:5:1: 'fleet' is given twice; the first is at line 1");
        assertThat(e.problems()).extracting(Problem::field).containsExactlyInAnyOrder("id", "fleet");
    }

    @Test
    void findsADuplicateKeyInJsonToo() {
        assertThatThrownBy(() -> YamlDocument.parse("f.json", "{\"a\": 1, \"a\": 2}"))
                .isInstanceOf(InvalidInputException.class)
                .hasMessage("f.json:1:10: 'a' is given twice; the first is at line 1");
    }

    @Test
    void readsAnEmptyDocumentAsAnEmptyMapping() {
        YNode root = YamlDocument.parse("f.yaml", "");
        assertThat(root).isEqualTo(new YMap(java.util.List.of(), 1, 1));
    }

    @Test
    void reportsAMissingFileAsAProblem(@TempDir Path dir) {
        Path missing = dir.resolve("nope.yaml");
        assertThatThrownBy(() -> YamlDocument.read(missing))
                .isInstanceOf(InvalidInputException.class)
                .hasMessageStartingWith(missing + ": cannot read the file: ");
    }

    @Test
    void readsAFile(@TempDir Path dir) throws Exception {
        Path file = Files.writeString(dir.resolve("f.yaml"), "a: 1\n");
        assertThat(((YMap) YamlDocument.read(file)).keys()).containsExactly("a");
    }

    @Test
    void refusesAnAliasInsideItsOwnValueWithALocatedProblem() {
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class,
                () -> YamlDocument.parse("fleet.yaml", "fleet: larkspur\nloop: &r [1, *r]\n"));
        Problem p = e.problems().get(0);
        assertThat(p.line()).isEqualTo(2);
        assertThat(p.column()).isGreaterThan(0);
        assertThat(p.message()).contains("inside its own value");
    }

    @Test
    void refusesADoublingChainOfAliasesAtItsLimitInsteadOfExpandingIt() {
        StringBuilder doc = new StringBuilder("a0: &a0 [x, x]\n");
        for (int i = 1; i <= 48; i++) {
            doc.append("a").append(i).append(": &a").append(i).append(" [*a").append(i - 1).append(", *a").append(i - 1).append("]\n");
        }
        // Expanded, the last alias would stand for 2^49 values: the refusal naming the limit is the
        // proof that the parser stopped counting there (no wall-clock bound: the suite keeps none)
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class, () -> YamlDocument.parse("tend.yaml", doc.toString()));
        assertThat(e.problems().get(0).line()).isGreaterThan(0);
        assertThat(e.problems().get(0).message()).contains("repeat more than " + YamlDocument.MAX_ALIASED_VALUES);
    }

    @Test
    void keepsAFewAliasesThatRepeatLittle() {
        YMap root = (YMap) YamlDocument.parse("f.yaml", "base: &b {tier: standard}\none: *b\ntwo: *b\n");
        assertThat(((YMap) root.get("two").orElseThrow()).keys()).containsExactly("tier");
    }

    @Test
    void locatesACharacterYamlDoesNotAllow() {
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class,
                () -> YamlDocument.parse("tend.yaml", "fleet: larkspur\nname: fa\u0007res\n"));
        Problem p = e.problems().get(0);
        assertThat(p.line()).isEqualTo(2);
        assertThat(p.column()).isEqualTo(9);
        assertThat(p.message()).contains("U+0007");
    }

    @Test
    void locatesEveryParserLimitAtLeastAtTheDocumentStart() {
        StringBuilder deep = new StringBuilder();
        for (int i = 0; i < 300; i++) deep.append('[');
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class, () -> YamlDocument.parse("f.yaml", deep.toString()));
        assertThat(e.problems().get(0).line()).isGreaterThan(0);
        assertThat(e.problems().get(0).column()).isGreaterThan(0);
    }

    @Test
    void locatesAByteThatIsNotUtf8InAFile(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("fleet.yaml");
        byte[] text = "fleet: larkspur\nclusters:\n  - id: fares-3X\n".getBytes(java.nio.charset.StandardCharsets.UTF_8);
        text[text.length - 2] = (byte) 0xFF;
        Files.write(f, text);
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class, () -> YamlDocument.read(f));
        Problem p = e.problems().get(0);
        assertThat(p.line()).isEqualTo(3);
        assertThat(p.column()).isEqualTo(16);
        assertThat(p.message()).contains("not valid UTF-8");
    }
}
