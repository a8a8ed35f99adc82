package dev.tend.api;

import dev.tend.api.view.TransitionsOutcome;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** The answer to a body without problems is written by hand: it must be the text the API's mapper writes. */
class TransitionsAnswerTest {
    @ParameterizedTest
    @CsvSource({"0,0", "1,0", "16,0", "100,3", "2147483648,9"})
    void anAnswerWithoutProblemsIsTheMappersText(long accepted, long rejected) throws Exception {
        String mapped = ApiJson.MAPPER.writeValueAsString(new TransitionsOutcome(accepted, rejected, List.of()));

        assertThat(TransitionRoutes.answerWithoutProblems(accepted, rejected)).isEqualTo(mapped);
    }
}
