package dev.tend.cli;

/**
 * The exit codes of every tend command, in one place:
 * 0 ok, 1 findings (a lint problem, a failed verify, a command the server refused),
 * 2 usage or input error (including a bad token or request, and an unreachable server).
 */
public final class ExitCodes {
    public static final int OK = 0;
    public static final int FINDINGS = 1;
    public static final int USAGE = 2;

    private ExitCodes() {
    }
}
