package dev.tend.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;

/**
 * Keeps the terminal free of stack traces: an internal failure's full trace goes to a file
 * in the temporary folder, and the one line a person reads says where it is.
 */
final class FailureTrace {
    private FailureTrace() {
    }

    /** Writes the trace of {@code failure} and returns the sentence that names the file. */
    static String write(Throwable failure, String[] args) {
        StringWriter text = new StringWriter();
        try (PrintWriter w = new PrintWriter(text)) {
            w.println("tend " + String.join(" ", redacted(args)));
            w.println("at " + Instant.now());
            failure.printStackTrace(w);
        }
        try {
            Path file = Files.createTempFile("tend-failure-", ".txt");
            Files.writeString(file, text.toString(), StandardCharsets.UTF_8);
            return "the full trace is in " + file + "; please attach it to a report";
        } catch (IOException | RuntimeException e) {
            return "its trace could not be written (" + e.getMessage() + "): " + failure;
        }
    }

    /** The arguments with the value of any token option hidden. */
    private static String[] redacted(String[] args) {
        String[] out = args.clone();
        for (int i = 0; i < out.length; i++) {
            if (out[i].startsWith("--token=")) out[i] = "--token=***";
            else if (out[i].equals("--token") && i + 1 < out.length) out[++i] = "***";
        }
        return out;
    }
}
