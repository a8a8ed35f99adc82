package dev.tend.cli;

import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * The complete {@code bin/tend ...} commands of a README, in order: those in code blocks
 * (indented or fenced, with backslash continuations), then inline ones in backticks that
 * hold no placeholder (a word in capitals such as FILE, a {@code [...]} option, a
 * {@code |} choice or {@code ...}). The same rules a newcomer's script applies.
 */
final class ReadmeTour {
    private static final Pattern INLINE = Pattern.compile("`(bin/tend [^`]+)`");
    private static final Pattern PLACEHOLDER = Pattern.compile("\\b[A-Z]{2,}\\b|\\[|\\||\\.\\.\\.");

    private ReadmeTour() {
    }

    static List<String> commands(String readme) {
        List<String> cmds = new ArrayList<>();
        String cur = null;
        boolean fence = false;
        for (String l : readme.split("\n", -1)) {
            if (l.strip().startsWith("```")) {
                fence = !fence;
                continue;
            }
            boolean code = fence || l.startsWith("    ");
            String s = l.strip();
            if (cur != null) {
                cur += " " + stripContinuation(s);
                if (!s.endsWith("\\")) {
                    cmds.add(cur);
                    cur = null;
                }
                continue;
            }
            if (code && s.startsWith("bin/tend ")) {
                if (s.endsWith("\\")) cur = stripContinuation(s);
                else cmds.add(s);
            }
        }
        Matcher m = INLINE.matcher(readme);
        while (m.find()) {
            String c = m.group(1).strip();
            if (PLACEHOLDER.matcher(c).find() || cmds.contains(c)) continue;
            cmds.add(c);
        }
        return cmds;
    }

    /** A command's words as a shell would split them (single and double quotes; no expansion). */
    static List<String> words(String command) {
        List<String> words = new ArrayList<>();
        StringBuilder w = new StringBuilder();
        boolean inWord = false;
        char quote = 0;
        for (char c : command.toCharArray()) {
            if (quote != 0) {
                if (c == quote) quote = 0;
                else w.append(c);
            } else if (c == '\'' || c == '"') {
                quote = c;
                inWord = true;
            } else if (Character.isWhitespace(c)) {
                if (inWord) words.add(w.toString());
                w.setLength(0);
                inWord = false;
            } else {
                w.append(c);
                inWord = true;
            }
        }
        if (inWord) words.add(w.toString());
        return words;
    }

    private static String stripContinuation(String s) {
        return (s.endsWith("\\") ? s.substring(0, s.length() - 1) : s).strip();
    }
}
