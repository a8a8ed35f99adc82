package dev.tend.cli;

import picocli.CommandLine;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import java.io.IOException;
import java.net.InetAddress;
import java.net.ServerSocket;

/**
 * Where {@code tend serve} and {@code tend demo} listen, with the same two options and the
 * same meaning in both: {@code --listen HOST:PORT}, and {@code --port N} as a short way to
 * change only the port (on the host of {@code --listen}, 127.0.0.1 unless given).
 */
final class ListenOptions {
    static final String DEFAULT_HOST = "127.0.0.1";
    static final int DEFAULT_PORT = 7420;

    @Spec(Spec.Target.MIXEE)
    CommandSpec mixee;

    @Option(names = "--listen", paramLabel = "HOST:PORT", converter = ListenConverter.class,
            description = "address and port to listen on (default: 127.0.0.1:7420; port 0: any free port)")
    Listen listen;

    @Option(names = "--port", paramLabel = "N",
            description = "the port to listen on, on the host of --listen (default: 7420; 0: any free port)")
    Integer port;

    /** The address to listen on; a usage error when --listen and --port name two different ports. */
    Listen resolve() {
        Listen base = listen != null ? listen : new Listen(DEFAULT_HOST, DEFAULT_PORT);
        if (port == null) return base;
        if (port < 0 || port > 65535) throw usage("--port must be from 0 to 65535, got " + port);
        if (listen != null && listen.port() != port) {
            throw usage("--listen " + listen.host() + ":" + listen.port() + " and --port " + port + " name two ports; give one");
        }
        return new Listen(base.host(), port);
    }

    /** Whether the user chose the address; when not, a command may move off a taken default port. */
    boolean isExplicit() {
        return listen != null || port != null;
    }

    /** Whether a listener could bind {@code l} right now (a check before starting, not a reservation). */
    static boolean isFree(Listen l) {
        try (ServerSocket s = new ServerSocket(l.port(), 1, InetAddress.getByName(l.host()))) {
            s.setReuseAddress(true);
            return true;
        } catch (IOException taken) {
            return false;
        }
    }

    private CommandLine.ParameterException usage(String message) {
        return new CommandLine.ParameterException(mixee.commandLine(), message);
    }

    static final class ListenConverter implements CommandLine.ITypeConverter<Listen> {
        @Override
        public Listen convert(String value) {
            return Listen.parse(value);
        }
    }
}
