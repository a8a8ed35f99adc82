package dev.tend.cli;

import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

import java.util.Iterator;
import java.util.List;

/**
 * The one type of every command's {@code --format}. Each command accepts the subset it can
 * write, through the converter of that subset, and a value outside it is refused in the
 * words picocli uses for any enum option ("expected one of [text, json] (case-sensitive) but
 * was 'xml'"). The same class lists the subset for shell completion ({@code completionCandidates}).
 */
enum OutputFormat {
    text, json, csv, html;

    /** {@code --format text|json}. */
    static final class TextOrJson extends Subset {
        TextOrJson() {
            super(text, json);
        }
    }

    /** {@code --format text|json|csv}. */
    static final class TextJsonOrCsv extends Subset {
        TextJsonOrCsv() {
            super(text, json, csv);
        }
    }

    /** {@code --format text|json|html}. */
    static final class TextJsonOrHtml extends Subset {
        TextJsonOrHtml() {
            super(text, json, html);
        }
    }

    /** {@code --format text|csv|html}. */
    static final class TextCsvOrHtml extends Subset {
        TextCsvOrHtml() {
            super(text, csv, html);
        }
    }

    /** Converts the formats of one command's subset, in the order it lists them, and refuses the others. */
    abstract static class Subset implements ITypeConverter<OutputFormat>, Iterable<String> {
        private final List<OutputFormat> allowed;

        Subset(OutputFormat... allowed) {
            this.allowed = List.of(allowed);
        }

        @Override
        public OutputFormat convert(String value) {
            for (OutputFormat f : allowed) if (f.name().equals(value)) return f;
            throw new TypeConversionException("expected one of " + allowed + " (case-sensitive) but was '" + value + "'");
        }

        @Override
        public Iterator<String> iterator() {
            return allowed.stream().map(OutputFormat::name).iterator();
        }
    }
}
