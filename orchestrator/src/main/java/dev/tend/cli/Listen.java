package dev.tend.cli;

import picocli.CommandLine;

/**
 * {@code --listen HOST:PORT}: an address and port to listen on; IPv6 addresses in brackets
 * ({@code [::1]:7420}); port 0 means any free port.
 */
record Listen(String host, int port) {
    Listen {
        if (host == null || host.isEmpty()) throw new IllegalArgumentException("--listen needs a host before the colon");
        if (port < 0 || port > 65535) throw new IllegalArgumentException("--listen port must be between 0 and 65535, got " + port);
    }

    static Listen parse(String text) {
        int colon = text.lastIndexOf(':');
        if (colon < 0) throw new CommandLine.TypeConversionException("'" + text + "' is not HOST:PORT, e.g. 127.0.0.1:7420");
        String host = text.substring(0, colon);
        if (host.startsWith("[") && host.endsWith("]")) host = host.substring(1, host.length() - 1);
        int port;
        try {
            port = Integer.parseInt(text.substring(colon + 1));
        } catch (NumberFormatException e) {
            throw new CommandLine.TypeConversionException("'" + text + "' is not HOST:PORT: the port must be a number");
        }
        try {
            return new Listen(host, port);
        } catch (IllegalArgumentException e) {
            throw new CommandLine.TypeConversionException(e.getMessage());
        }
    }
}
