package dev.tend.cli;

import dev.tend.cli.ops.OperationRefusedException;

/**
 * The exit codes of every tend command, in one place, one meaning each (DESIGN.md section 8):
 * 0 ok; 1 findings (a lint problem, a failed verify, a command the server refused); 2 usage
 * or input error (a bad option, file or token, an unreachable server), and anything the
 * command could not finish for another reason. {@link #forFailure} is the one mapping from
 * an exception to a code; the texts below are what {@code tend --help} lists.
 */
public final class ExitCodes {
    public static final int OK = 0;
    public static final int FINDINGS = 1;
    public static final int USAGE = 2;

    static final String OK_TEXT = "0:ok";
    static final String FINDINGS_TEXT = "1:findings (a lint problem, a failed verify, a command the server refused)";
    static final String USAGE_TEXT = "2:usage or input error (a bad token or request, an unreachable server)";

    private ExitCodes() {
    }

    /**
     * The code for a command that ended with {@code failure}: {@link #FINDINGS} when the server
     * refused the command (its answer is a finding about the fleet's state, not a mistake of
     * the caller), {@link #USAGE} for everything else.
     */
    public static int forFailure(Throwable failure) {
        return failure instanceof OperationRefusedException r && r.isRefusal() ? FINDINGS : USAGE;
    }
}
