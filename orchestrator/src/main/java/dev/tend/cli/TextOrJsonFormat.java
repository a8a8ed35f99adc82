package dev.tend.cli;

import picocli.CommandLine.Option;

/** {@code --format text|json}: declared once for every command that prints text or JSON. */
final class TextOrJsonFormat {
    @Option(names = "--format", defaultValue = "text", converter = OutputFormat.TextOrJson.class,
            completionCandidates = OutputFormat.TextOrJson.class, description = "text or json (default: ${DEFAULT-VALUE})")
    OutputFormat format;

    /** True for {@code --format json}. */
    boolean json() {
        return format == OutputFormat.json;
    }
}
