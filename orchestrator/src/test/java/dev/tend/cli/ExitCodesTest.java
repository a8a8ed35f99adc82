package dev.tend.cli;

import dev.tend.cli.ops.OperationRefusedException;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** One mapping from a failure to an exit code, one meaning per code. */
class ExitCodesTest {
    @Test
    void aCommandTheEngineRefusedIsAFinding() {
        assertThat(ExitCodes.forFailure(new OperationRefusedException(409, "refused", "the brake is not engaged")))
                .isEqualTo(ExitCodes.FINDINGS);
    }

    @Test
    void everyOtherFailureIsAUsageOrInputError() {
        assertThat(ExitCodes.forFailure(new OperationRefusedException(401, "unauthenticated", "bad token"))).isEqualTo(ExitCodes.USAGE);
        assertThat(ExitCodes.forFailure(new OperationRefusedException(404, "not-found", "no run r1"))).isEqualTo(ExitCodes.USAGE);
        assertThat(ExitCodes.forFailure(new InvalidInputException(List.of(Problem.at("fleet.yaml", 2, 1, "x", "bad")))))
                .isEqualTo(ExitCodes.USAGE);
        assertThat(ExitCodes.forFailure(new IllegalStateException("unexpected"))).isEqualTo(ExitCodes.USAGE);
    }

    @Test
    void helpListsEachCodeWithItsMeaning() {
        StringWriter out = new StringWriter();
        new CommandLine(new TendMain()).usage(new PrintWriter(out, true));
        assertThat(out.toString()).contains("Exit codes:", "0   ok", "1   findings (a lint problem, a failed verify,"
                + " a command the server refused)", "2   usage or input error");
    }

    @Test
    void anUnknownOptionExitsWithTheUsageCode() {
        int code = TendMain.run(new String[]{"check", "--no-such-option"}, new PrintWriter(new StringWriter()),
                new PrintWriter(new StringWriter()));
        assertThat(code).isEqualTo(ExitCodes.USAGE);
    }
}
