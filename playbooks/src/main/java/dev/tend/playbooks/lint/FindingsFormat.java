package dev.tend.playbooks.lint;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;

import java.io.UncheckedIOException;
import java.util.List;

/** Renders lint findings for people (text) and programs (JSON). Stateless and thread-safe. */
public final class FindingsFormat {
    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private FindingsFormat() {
    }

    /**
     * One finding per line, {@code FILE:LINE:COL: severity: message [code]}, then a summary
     * line such as {@code 2 findings (1 error, 1 warning)} or {@code no findings}.
     */
    public static String text(List<Finding> findings) {
        StringBuilder sb = new StringBuilder();
        int errors = 0;
        for (Finding f : findings) {
            sb.append(f).append('\n');
            if (f.severity() == Severity.ERROR) errors++;
        }
        int warnings = findings.size() - errors;
        if (findings.isEmpty()) {
            sb.append("no findings\n");
        } else {
            sb.append(findings.size()).append(findings.size() == 1 ? " finding (" : " findings (")
                    .append(errors).append(errors == 1 ? " error, " : " errors, ")
                    .append(warnings).append(warnings == 1 ? " warning)" : " warnings)").append('\n');
        }
        return sb.toString();
    }

    /**
     * A JSON array with one object per finding, with the fields {@code code}, {@code severity},
     * {@code file}, {@code line}, {@code column}, {@code playbook} and {@code message}.
     */
    public static String json(List<Finding> findings) {
        ArrayNode array = JSON.createArrayNode();
        for (Finding f : findings) {
            ObjectNode o = array.addObject();
            o.put("code", f.code());
            o.put("severity", f.severity().wireName());
            o.put("file", f.file());
            o.put("line", f.line());
            o.put("column", f.column());
            o.put("playbook", f.playbook());
            o.put("message", f.message());
        }
        try {
            return JSON.writeValueAsString(array) + "\n";
        } catch (JsonProcessingException e) {
            throw new UncheckedIOException(e);
        }
    }
}
