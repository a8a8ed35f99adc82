package dev.tend.shared.wire;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.MalformedInputException;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;

/**
 * Splits a byte stream into lines at {@code \n} (a {@code \r} before it is dropped) and
 * decodes each line as strict UTF-8 on its own, so that a line that is not valid UTF-8 is
 * refused by its number and the lines after it are still read. A decoding {@link java.io.Reader}
 * would instead stop at the first bad byte, or replace it unseen.
 */
final class Utf8Lines {
    /** A line's text, or the 1-based byte column where its encoding went wrong. */
    record Line(String text, int badColumn) {
        boolean isValid() {
            return text != null;
        }
    }

    private final InputStream in;
    private final byte[] buf = new byte[1 << 16];
    private int pos;
    private int end;
    private boolean eof;
    private byte[] line = new byte[256];
    private int length;
    private boolean ascii;
    private final CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
            .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT);

    Utf8Lines(InputStream in) {
        this.in = in;
    }

    /** The next line, or null at the end of the stream. */
    Line next() throws IOException {
        return advance() ? decode() : null;
    }

    /**
     * Reads the next line's bytes ({@link #bytes()}, {@link #length()}), not yet decoded; false at
     * the end of the stream. A reader that can take the line from its bytes saves the String.
     */
    boolean advance() throws IOException {
        int len = 0;
        boolean plain = true;
        while (true) {
            if (pos == end) {
                if (eof || !fill()) {
                    if (len == 0) return false;
                    return ended(len, plain);
                }
            }
            int i = pos;
            while (i < end && buf[i] != '\n') {
                if (buf[i] < 0) plain = false;
                i++;
            }
            int n = i - pos;
            if (len + n > line.length) line = Arrays.copyOf(line, Math.max(line.length * 2, len + n));
            System.arraycopy(buf, pos, line, len, n);
            len += n;
            if (i < end) {
                pos = i + 1;
                return ended(len, plain);
            }
            pos = end;
        }
    }

    private boolean ended(int len, boolean plain) {
        if (len > 0 && line[len - 1] == '\r') len--;
        length = len;
        ascii = plain;
        return true;
    }

    /** The bytes of the line {@link #advance()} read, without its line break: {@code bytes()[0, length())}; valid until the next call. */
    byte[] bytes() {
        return line;
    }

    /** How many bytes the line {@link #advance()} read has. */
    int length() {
        return length;
    }

    private boolean fill() throws IOException {
        int n = in.read(buf, 0, buf.length);
        if (n <= 0) {
            eof = true;
            return false;
        }
        pos = 0;
        end = n;
        return true;
    }

    /** The text of the line {@link #advance()} read, or the column of its first byte that is not UTF-8. */
    Line decode() {
        int len = length;
        if (ascii) return new Line(new String(line, 0, len, StandardCharsets.ISO_8859_1), 0);
        ByteBuffer bytes = ByteBuffer.wrap(line, 0, len);
        try {
            CharBuffer chars = decoder.reset().decode(bytes);
            return new Line(chars.toString(), 0);
        } catch (MalformedInputException e) {
            return new Line(null, firstBad(len) + 1);
        } catch (CharacterCodingException e) {
            return new Line(null, firstBad(len) + 1);
        }
    }

    /** The 0-based offset of the first byte that does not start or continue a valid UTF-8 sequence. */
    private int firstBad(int len) {
        CharsetDecoder d = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT);
        ByteBuffer bytes = ByteBuffer.wrap(line, 0, len);
        CharBuffer out = CharBuffer.allocate(len + 1);
        var result = d.decode(bytes, out, true);
        return result.isError() ? bytes.position() : 0;
    }
}
