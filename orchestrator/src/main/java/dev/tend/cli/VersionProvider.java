package dev.tend.cli;

import picocli.CommandLine;

import java.io.IOException;
import java.io.InputStream;
import java.util.Properties;

/**
 * {@code tend --version}: the version and the commit the jar was built from, as the build
 * wrote them into {@code /git.properties} (git-commit-id-maven-plugin); "commit unknown" for a
 * build made outside a git checkout.
 */
final class VersionProvider implements CommandLine.IVersionProvider {
    @Override
    public String[] getVersion() throws IOException {
        Properties p = new Properties();
        try (InputStream in = VersionProvider.class.getResourceAsStream("/git.properties")) {
            if (in != null) p.load(in);
        }
        String version = p.getProperty("git.build.version", "unknown version");
        String commit = p.getProperty("git.commit.id.abbrev", "");
        String dirty = "true".equals(p.getProperty("git.dirty")) ? ", with uncommitted changes" : "";
        String when = p.getProperty("git.commit.time", "");
        return new String[]{"tend " + version + " (commit " + (commit.isEmpty() ? "unknown" : commit) + dirty
                + (when.isEmpty() ? "" : ", " + when) + ")"};
    }
}
