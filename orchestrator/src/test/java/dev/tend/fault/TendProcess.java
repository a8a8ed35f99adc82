package dev.tend.fault;

import java.io.IOException;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * tend as a process of its own, for the tests that kill it: started with this JVM's java and
 * class path (small heap, quick start) in a test's folder, its output in files there so that
 * a failure can be read afterwards.
 */
public final class TendProcess {
    private TendProcess() {
    }

    /**
     * Starts {@code tend ARGS} in {@code dir}; standard output goes to {@code dir/NAME.out} and
     * standard error to {@code dir/NAME.err}.
     */
    public static Process start(Path dir, String name, List<String> args) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        List<String> cmd = new ArrayList<>(List.of(java, "-Xmx256m", "-XX:TieredStopAtLevel=1", "-cp", System.getProperty("java.class.path"),
                "dev.tend.cli.TendMain"));
        cmd.addAll(args);
        return new ProcessBuilder(cmd).directory(dir.toFile())
                .redirectOutput(dir.resolve(name + ".out").toFile())
                .redirectError(dir.resolve(name + ".err").toFile()).start();
    }

    /** A free port on loopback (free a moment ago). */
    public static int freePort() throws IOException {
        try (ServerSocket s = new ServerSocket(0, 1, InetAddress.getLoopbackAddress())) {
            return s.getLocalPort();
        }
    }
}
