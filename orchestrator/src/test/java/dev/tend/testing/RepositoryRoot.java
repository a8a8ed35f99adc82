package dev.tend.testing;

import java.nio.file.Path;

/** The repository root, found from the module's working directory during the build. */
public final class RepositoryRoot {
    private RepositoryRoot() {
    }

    public static Path path() {
        Path p = Path.of("").toAbsolutePath();
        while (p != null && !p.resolve("playbooks/library").toFile().isDirectory()) p = p.getParent();
        if (p == null) throw new IllegalStateException("cannot find the repository root from " + Path.of("").toAbsolutePath());
        return p;
    }
}
