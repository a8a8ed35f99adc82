package dev.tend.playbooks;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.function.Supplier;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

/** Writes real files for loader tests and finds where text is in them. */
public final class TestDir {
    /** Two simulated actions, so playbooks in tests have something to name. */
    public static final String ACTIONS = """
            actions:
              drain-node:
                simulated: { duration: 2m }
              replace-node:
                simulated: { duration: { min: 5m, max: 15m }, success: 0.9, clears: [heartbeat] }
            """;

    private final Path dir;

    public TestDir(Path dir) {
        this.dir = dir;
    }

    public Path path() {
        return dir;
    }

    public Path write(String name, String text) {
        try {
            return Files.writeString(dir.resolve(name), text);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The file path as problems and findings name it. */
    public String source(String name) {
        return dir.resolve(name).toString();
    }

    /** 1-based column of the first {@code token} on 1-based {@code line} of {@code text}. */
    public static int column(String text, int line, String token) {
        String l = text.lines().toList().get(line - 1);
        int i = l.indexOf(token);
        if (i < 0) throw new IllegalArgumentException("'" + token + "' is not on line " + line + ": " + l);
        return i + 1;
    }

    /** The problems of the {@link InvalidInputException} that {@code load} throws. */
    public static List<Problem> problems(Supplier<?> load) {
        InvalidInputException e = catchThrowableOfType(InvalidInputException.class, load::get);
        assertThat(e).as("an InvalidInputException").isNotNull();
        assertThat(e).isInstanceOf(PlaybookInvalidException.class);
        return e.problems();
    }
}
