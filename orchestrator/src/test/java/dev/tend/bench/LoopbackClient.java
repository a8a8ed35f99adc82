package dev.tend.bench;

import java.io.BufferedInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.util.Locale;

/**
 * One keep-alive HTTP/1.1 connection to a server on loopback, as light as a client can be
 * (a socket, a request written in one piece, the answer read by its Content-Length or its
 * chunks), so that a benchmark measures the server and not the client.
 */
final class LoopbackClient implements AutoCloseable {
    private final Socket socket;
    private final OutputStream out;
    private final InputStream in;
    private final String head;

    LoopbackClient(int port, String path, String token) throws IOException {
        socket = new Socket(InetAddress.getLoopbackAddress(), port);
        socket.setTcpNoDelay(true);
        out = socket.getOutputStream();
        in = new BufferedInputStream(socket.getInputStream(), 16 * 1024);
        head = "POST " + path + " HTTP/1.1\r\nHost: 127.0.0.1:" + port + "\r\n"
                + (token == null ? "" : "Authorization: Bearer " + token + "\r\n")
                + "Content-Type: application/x-ndjson\r\nContent-Length: ";
    }

    /** Posts {@code body} and reads the whole answer; returns its status code. */
    int post(String body) throws IOException {
        byte[] b = body.getBytes(StandardCharsets.UTF_8);
        byte[] h = (head + b.length + "\r\n\r\n").getBytes(StandardCharsets.US_ASCII);
        byte[] all = new byte[h.length + b.length];
        System.arraycopy(h, 0, all, 0, h.length);
        System.arraycopy(b, 0, all, h.length, b.length);
        out.write(all);
        out.flush();
        return readAnswer();
    }

    private int readAnswer() throws IOException {
        String status = line();
        int code = Integer.parseInt(status.substring(9, 12));
        long length = -1;
        boolean chunked = false;
        for (String l = line(); !l.isEmpty(); l = line()) {
            int colon = l.indexOf(':');
            if (colon < 0) continue;
            String name = l.substring(0, colon).trim().toLowerCase(Locale.ROOT);
            String value = l.substring(colon + 1).trim();
            if (name.equals("content-length")) length = Long.parseLong(value);
            else if (name.equals("transfer-encoding") && value.toLowerCase(Locale.ROOT).contains("chunked")) chunked = true;
        }
        if (chunked) {
            while (true) {
                String size = line();
                int semi = size.indexOf(';');
                long n = Long.parseLong((semi < 0 ? size : size.substring(0, semi)).trim(), 16);
                if (n == 0) {
                    while (!line().isEmpty()) { } // trailers
                    break;
                }
                skip(n);
                line();
            }
        } else if (length > 0) {
            skip(length);
        } else if (length < 0) {
            throw new IOException("an answer with neither Content-Length nor chunks: " + status);
        }
        return code;
    }

    private void skip(long n) throws IOException {
        while (n > 0) {
            long k = in.skip(n);
            if (k <= 0) {
                if (in.read() < 0) throw new IOException("the server closed the connection");
                k = 1;
            }
            n -= k;
        }
    }

    private String line() throws IOException {
        ByteArrayOutputStream b = new ByteArrayOutputStream(64);
        int c;
        while ((c = in.read()) >= 0) {
            if (c == '\n') break;
            if (c != '\r') b.write(c);
        }
        if (c < 0 && b.size() == 0) throw new IOException("the server closed the connection");
        return b.toString(StandardCharsets.US_ASCII);
    }

    @Override
    public void close() throws IOException {
        socket.close();
    }
}
