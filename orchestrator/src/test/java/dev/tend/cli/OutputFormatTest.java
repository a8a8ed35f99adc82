package dev.tend.cli;

import org.junit.jupiter.api.Test;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/** Every command's {@code --format} shares one type, and accepts and refuses exactly what each did with an enum of its own. */
class OutputFormatTest {
    /** The values each command accepts, as its help and the README name them. */
    private static final Map<List<String>, List<String>> ACCEPTED = Map.of(
            List.of("runs"), List.of("text", "json"),
            List.of("check", CliRun.root().resolve("playbooks/library").toString()), List.of("text", "json"),
            List.of("approvals"), List.of("text", "json"),
            List.of("audit"), List.of("text", "json", "csv"),
            List.of("handover"), List.of("text", "csv", "html"),
            List.of("replay", "x.jsonl", "--playbooks", "p"), List.of("text", "json", "html"));

    enum PlainTextOrJson { text, json }

    @Command(name = "plain")
    static final class Plain {
        @Option(names = "--format", defaultValue = "text")
        PlainTextOrJson format;
    }

    @Test
    void aValueOutsideACommandsFormatsIsRefusedInPicocliOwnWordsForAnEnum() {
        // the reference: picocli's own refusal of a value outside an enum option's constants
        String reference = "";
        try {
            new CommandLine(new Plain()).parseArgs("--format", "csv");
        } catch (CommandLine.ParameterException e) {
            reference = e.getMessage();
        }
        assertThat(reference).isEqualTo("Invalid value for option '--format': expected one of [text, json] (case-sensitive) but was 'csv'");
        CliRun r = CliRun.of("runs", "--format", "csv");
        assertThat(r.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(r.err()).contains(reference);
    }

    @Test
    void eachCommandRefusesTheFormatsItDoesNotWriteNamingTheOnesItDoes() {
        ACCEPTED.forEach((words, formats) -> {
            for (String f : List.of("text", "json", "csv", "html")) {
                if (formats.contains(f)) continue;
                String[] args = java.util.stream.Stream.concat(words.stream(), java.util.stream.Stream.of("--format", f)).toArray(String[]::new);
                CliRun r = CliRun.of(args);
                assertThat(r.exit()).as(String.join(" ", args)).isEqualTo(ExitCodes.USAGE);
                assertThat(r.err()).as(String.join(" ", args)).contains("Invalid value for option '--format': expected one of "
                        + formats + " (case-sensitive) but was '" + f + "'");
            }
        });
    }

    @Test
    void completionOffersEachCommandsOwnFormats() {
        assertThat(new OutputFormat.TextCsvOrHtml()).containsExactly("text", "csv", "html");
        assertThat(new OutputFormat.TextJsonOrCsv()).containsExactly("text", "json", "csv");
        assertThat(new OutputFormat.TextJsonOrHtml().convert("html")).isEqualTo(OutputFormat.html);
    }
}
