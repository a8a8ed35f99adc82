package dev.tend.shared.yaml;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;

/**
 * Checks that a file is UTF-8 in one streaming pass (bounded memory, whatever its size), so
 * that a reader that streams the file can refuse a bad byte at its line and column, as
 * {@link YamlDocument#decode} does for a file read whole.
 */
final class Utf8Check {
    private static final int CHUNK = 64 * 1024;

    private Utf8Check() {
    }

    /** Throws {@link InvalidInputException} located at the first byte that is not UTF-8. */
    static void check(String source, Path file) throws IOException {
        CharsetDecoder d = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT)
                .onUnmappableCharacter(CodingErrorAction.REPORT);
        ByteBuffer in = ByteBuffer.allocate(CHUNK);
        CharBuffer out = CharBuffer.allocate(CHUNK);
        long line = 1;
        long column = 1;
        try (InputStream s = Files.newInputStream(file)) {
            boolean end = false;
            while (!end) {
                int n = s.read(in.array(), in.position(), in.remaining());
                if (n < 0) end = true;
                else in.position(in.position() + n);
                in.flip();
                int start = in.position();
                CoderResult r = d.decode(in, out, end);
                for (int i = start; i < in.position(); i++) {
                    if (in.get(i) == '\n') {
                        line++;
                        column = 1;
                    } else {
                        column++;
                    }
                }
                if (r.isError()) {
                    throw new InvalidInputException(Problem.at(source, (int) Math.min(line, Integer.MAX_VALUE),
                            (int) Math.min(column, Integer.MAX_VALUE), "",
                            "this file is not valid UTF-8: the byte here cannot start or continue a character"));
                }
                out.clear();
                in.compact();
            }
        }
    }
}
