package dev.tend.playbooks;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class TemplateTest {
    private static final Map<String, String> VALUES = Map.of("cluster", "fares-3", "node", "n2", "step", "replace",
            "run", "r-9", "playbook", "replace-silent-node");

    @ParameterizedTest(name = "''{0}'' renders as ''{1}''")
    @CsvSource(delimiter = '|', value = {
            "replacing {node} in {cluster} failed at {step} | replacing n2 in fares-3 failed at replace",
            "{playbook}/{run}                               | replace-silent-node/r-9",
            "no placeholders                                | no placeholders",
            "braces {} and { node } stay as written         | braces {} and { node } stay as written",
    })
    void placeholdersAreReplacedAndOtherBracesKept(String text, String rendered) {
        assertThat(Template.parse(text, Template.MESSAGE_PLACEHOLDERS).render(VALUES)).isEqualTo(rendered);
    }

    @Test
    void unknownPlaceholdersAreNamedWithTheAllowedOnes() {
        assertThatThrownBy(() -> Template.parse("{nod} and {zone}", Template.MESSAGE_PLACEHOLDERS))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("unknown placeholders {nod}, {zone} in '{nod} and {zone}'; the placeholders here are"
                        + " {cluster} {node} {playbook} {run} {step}");
    }

    @Test
    void renderingWithoutAValueForAPlaceholderFails() {
        assertThatThrownBy(() -> new Template("{node} failed").render(Map.of("cluster", "fares-3")))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessage("no value for {node} in '{node} failed'");
    }

    @Test
    void placeholdersAreListedInOrderOfFirstUse() {
        assertThat(new Template("{step} {node} {step}").placeholders()).containsExactly("step", "node");
    }
}
