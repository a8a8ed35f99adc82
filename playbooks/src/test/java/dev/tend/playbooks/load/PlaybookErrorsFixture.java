package dev.tend.playbooks.load;

import dev.tend.playbooks.TestDir;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Path;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** A playbook directory with the actions file, and the checks the load-error tests share. */
abstract class PlaybookErrorsFixture {
    @TempDir
    Path tmp;
    TestDir dir;

    @BeforeEach
    void actions() {
        dir = new TestDir(tmp);
        dir.write("actions.yaml", TestDir.ACTIONS);
    }

    List<Problem> load(String name, String text) {
        dir.write(name, text);
        return TestDir.problems(() -> PlaybookLoader.load(tmp));
    }

    void assertOnly(List<Problem> problems, String file, int line, int col, String message) {
        assertThat(problems).hasSize(1);
        Problem p = problems.get(0);
        assertThat(p.source()).isEqualTo(dir.source(file));
        assertThat(p.line()).as("line").isEqualTo(line);
        assertThat(p.column()).as("column").isEqualTo(col);
        assertThat(p.message()).isEqualTo(message);
        assertThat(p.toString()).isEqualTo(dir.source(file) + ":" + line + ":" + col + ": " + message);
    }
}
