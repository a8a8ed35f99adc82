package dev.tend.cli;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;

/** Runs the CLI in-process and keeps what it printed. */
record CliRun(int exit, String out, String err) {
    static CliRun of(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = TendMain.run(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new CliRun(code, out.toString(), err.toString());
    }

    /** The repository root, found from the module's working directory during the build. */
    static Path root() {
        Path p = Path.of("").toAbsolutePath();
        while (p != null && !p.resolve("playbooks/library").toFile().isDirectory()) p = p.getParent();
        if (p == null) throw new IllegalStateException("cannot find the repository root from " + Path.of("").toAbsolutePath());
        return p;
    }
}
