package dev.tend.bench;

import java.io.File;
import java.net.URISyntaxException;
import java.net.URL;
import java.net.URLClassLoader;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * The class path for a fresh {@code java} that a benchmark starts beside itself (a floor such as
 * {@link LedgerRowsFloor}): the one this process loaded its own classes from. Run with
 * {@code java -cp ...} that is {@code java.class.path}; run by {@code mvn -Pbench} (the exec
 * plugin's {@code java} goal) {@code java.class.path} is Maven's own launcher, and the classes come
 * from a class loader over the module's test class path, whose entries are used instead.
 */
final class BenchClasspath {
    private BenchClasspath() {
    }

    static String ofThisProcess() {
        ClassLoader loader = BenchClasspath.class.getClassLoader();
        if (loader instanceof URLClassLoader urls && urls.getURLs().length > 0) {
            List<String> entries = new ArrayList<>();
            for (URL u : urls.getURLs()) {
                try {
                    entries.add(Path.of(u.toURI()).toString());
                } catch (URISyntaxException | IllegalArgumentException e) {
                    throw new IllegalStateException("a class path entry that is not a file: " + u, e);
                }
            }
            return String.join(File.pathSeparator, entries);
        }
        return System.getProperty("java.class.path");
    }
}
