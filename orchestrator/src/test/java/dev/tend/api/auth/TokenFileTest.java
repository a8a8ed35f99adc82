package dev.tend.api.auth;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.Set;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** The tokens file: what it accepts, and every rule it enforces, by type and message. */
class TokenFileTest {
    /** SHA-256("abc"), FIPS 180-2 appendix B.1 example value. */
    static final String ABC = "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad";
    static final String OTHER = "d4735e3a265e16eee03f59718b9b5d03019c07d8b6c51f90da3a666eec13ab35"; // SHA-256("2") (computed)

    @Test
    void hashIsTheSha256HexOfTheTokensText() {
        assertThat(Tokens.hash("abc")).isEqualTo(ABC);
    }

    @Test
    void findsTheHolderOfATokenByItsHash() {
        Tokens t = TokenFile.parse("tokens.yaml", """
                tokens:
                  - name: vera
                    roles: [viewer, approver]
                    sha256: %s
                """.formatted(ABC));

        assertThat(t.holderOf("abc")).hasValueSatisfying(c -> {
            assertThat(c.name()).isEqualTo("vera");
            assertThat(c.roles()).containsExactlyInAnyOrder(Role.VIEWER, Role.APPROVER);
        });
        assertThat(t.holderOf("abd")).isEmpty();
        assertThat(t.holderOf("")).isEmpty();
        assertThat(t.holderOf(null)).isEmpty();
        assertThat(t.names()).containsExactly("vera");
    }

    @ParameterizedTest(name = "{0} may do what needs {1}: {2}")
    @CsvSource({
            "viewer, viewer, true", "viewer, operator, false", "viewer, approver, false",
            "operator, viewer, true", "operator, operator, true", "operator, approver, false",
            "approver, viewer, true", "approver, approver, true", "approver, operator, false"})
    void rolesGrantTheirOwnActionsAndEveryRoleMayRead(String has, String needs, boolean may) {
        assertThat(new Caller("x", Set.of(Role.parse(has))).may(Role.parse(needs))).isEqualTo(may);
    }

    static Stream<Arguments> broken() {
        return Stream.of(
                Arguments.of("- a\n- b\n", 1, 1, "a tokens file must be a mapping (key: value), got a list"),
                Arguments.of("people: []\ntokens: []\n", 1, 1,
                        "unknown key 'people' in the tokens file; expected one of: tokens"),
                Arguments.of("tokes: []\ntokens: []\n", 1, 1,
                        "unknown key 'tokes' in the tokens file (did you mean 'tokens'?); expected one of: tokens"),
                Arguments.of("{}\n", 1, 1, "the tokens file needs 'tokens'"),
                Arguments.of("tokens: vera\n", 1, 9, "tokens must be a list, got a value"),
                Arguments.of("tokens:\n  - vera\n", 2, 5, "tokens[0] must be a mapping (key: value), got a value"),
                Arguments.of("tokens:\n  - { roles: [viewer], sha256: " + ABC + " }\n", 2, 5, "tokens[0] needs 'name'"),
                Arguments.of("tokens:\n  - { name: 'vera b', roles: [viewer], sha256: " + ABC + " }\n", 2, 13,
                        "tokens[0].name: 'vera b' is not an id: use letters, digits and . _ : - only, starting with a letter or digit"),
                Arguments.of("tokens:\n  - { name: vera, sha256: " + ABC + " }\n", 2, 5, "tokens[0] needs 'roles'"),
                Arguments.of("tokens:\n  - { name: vera, roles: viewer, sha256: " + ABC + " }\n", 2, 26,
                        "tokens[0].roles must be a list, got a value"),
                Arguments.of("tokens:\n  - { name: vera, roles: [], sha256: " + ABC + " }\n", 2, 26,
                        "tokens[0].roles must name at least one of viewer, operator, approver"),
                Arguments.of("tokens:\n  - { name: vera, roles: [admin], sha256: " + ABC + " }\n", 2, 27,
                        "tokens[0].roles: must be viewer, operator or approver, got 'admin'"),
                Arguments.of("tokens:\n  - { name: vera, roles: [viewer] }\n", 2, 5, "tokens[0] needs 'sha256'"),
                Arguments.of("tokens:\n  - { name: vera, roles: [viewer], sha256: " + ABC.toUpperCase() + " }\n", 2, 44,
                        "tokens[0].sha256: must be 64 lowercase hex digits (the SHA-256 of the token), got '" + ABC.toUpperCase() + "'"),
                Arguments.of("tokens:\n  - { name: vera, roles: [viewer], sha256: abc }\n", 2, 44,
                        "tokens[0].sha256: must be 64 lowercase hex digits (the SHA-256 of the token), got 'abc'"),
                Arguments.of("tokens:\n  - { name: vera, roles: [viewer], sha256: " + ABC + ", team: fares }\n", 2, 110,
                        "unknown key 'team' in tokens[0]; expected one of: name, roles, sha256"),
                Arguments.of("tokens:\n  - { name: vera, roles: [viewer], sha256: " + ABC + " }\n  - { name: vera, roles: [operator], sha256: "
                        + OTHER + " }\n", 3, 13, "tokens[1]: the name vera is also tokens[0]'s; each holder needs their own name"),
                Arguments.of("tokens:\n  - { name: vera, roles: [viewer], sha256: " + ABC + " }\n  - { name: olga, roles: [operator], sha256: "
                        + ABC + " }\n", 3, 46, "tokens[1]: the same token as tokens[0]; each holder needs their own token"));
    }

    @ParameterizedTest(name = "[{index}] {3}")
    @MethodSource("broken")
    void rejectsABrokenFileNamingTheProblemAndWhereItIs(String yaml, int line, int column, String message) {
        assertThatThrownBy(() -> TokenFile.parse("tokens.yaml", yaml))
                .isInstanceOfSatisfying(InvalidInputException.class, e -> {
                    assertThat(e.problems()).extracting(Problem::message).containsExactly(message);
                    assertThat(e.problems().get(0).line()).isEqualTo(line);
                    assertThat(e.problems().get(0).column()).isEqualTo(column);
                    assertThat(e.problems().get(0).source()).isEqualTo("tokens.yaml");
                });
    }

    @Test
    void refusesATokenStoredInPlainText() {
        assertThatThrownBy(() -> TokenFile.parse("tokens.yaml", "tokens:\n  - { name: vera, roles: [viewer], token: s3cret }\n"))
                .isInstanceOfSatisfying(InvalidInputException.class, e -> assertThat(e.problems()).extracting(Problem::message)
                        .containsExactly("tokens[0]: never store a token itself; store its SHA-256 as sha256"
                                + " (printf %s \"$TOKEN\" | sha256sum)", "tokens[0] needs 'sha256'"));
    }

    @Test
    void reportsEveryProblemAtOnce() {
        assertThatThrownBy(() -> TokenFile.parse("tokens.yaml", "tokens:\n  - { name: vera }\n  - { roles: [x], sha256: y }\n"))
                .isInstanceOfSatisfying(InvalidInputException.class, e -> assertThat(e.problems()).hasSize(5));
    }

    @ParameterizedTest(name = "a caller {0}")
    @MethodSource("badCallers")
    void callerIsValidated(String name, Set<Role> roles, String message) {
        assertThatThrownBy(() -> new Caller(name, roles)).isInstanceOf(IllegalArgumentException.class).hasMessage(message);
    }

    static Stream<Arguments> badCallers() {
        return Stream.of(
                Arguments.of("", Set.of(Role.VIEWER), "token name: an id must not be empty"),
                Arguments.of("vera", Set.of(), "token vera needs at least one role"));
    }

    @Test
    void twoEntriesWithOneHashAreRefusedInCode() {
        assertThatThrownBy(() -> Tokens.of(java.util.List.of(new Tokens.Entry(new Caller("a", Set.of(Role.VIEWER)), ABC),
                new Tokens.Entry(new Caller("b", Set.of(Role.VIEWER)), ABC))))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("tokens a and b have the same sha256; each holder needs their own token");
    }
}
