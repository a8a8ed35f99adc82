package dev.tend.demo;

import dev.tend.shared.TendException;

import java.io.IOException;
import java.io.InputStream;
import java.net.URI;
import java.net.URISyntaxException;
import java.net.URL;
import java.nio.file.FileSystem;
import java.nio.file.FileSystems;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;

/**
 * The bundled playbook library and the Larkspur demo fleet ({@code playbooks/library} of the
 * repository, packed into the jar as {@code /demo/library}), copied out to a folder so that
 * {@code tend demo} needs nothing but the jar.
 */
public final class DemoLibrary {
    static final String FOLDER = "/demo/library";

    private DemoLibrary() {
    }

    /** Copies every file of the bundled library into {@code dir} (created if needed) and returns {@code dir}. */
    public static Path copyTo(Path dir) {
        URL marker = DemoLibrary.class.getResource(FOLDER + "/fleet.yaml");
        if (marker == null) {
            throw new TendException("this build has no bundled playbook library (" + FOLDER + "); build the jar with"
                    + " `mvn -B -DskipTests package` from the repository root");
        }
        try {
            Files.createDirectories(dir);
            URI uri = marker.toURI();
            if (uri.getScheme().equals("jar")) {
                try (FileSystem jar = FileSystems.newFileSystem(uri, Map.of())) {
                    copyFiles(jar.getPath(FOLDER), dir);
                }
            } else {
                copyFiles(Path.of(uri).getParent(), dir);
            }
            return dir;
        } catch (IOException | URISyntaxException e) {
            throw new TendException("could not copy the bundled playbook library to " + dir + ": " + e.getMessage(), e);
        }
    }

    private static void copyFiles(Path from, Path to) throws IOException {
        List<Path> files;
        try (Stream<Path> s = Files.list(from)) {
            files = s.filter(Files::isRegularFile).toList();
        }
        for (Path f : files) {
            try (InputStream in = Files.newInputStream(f)) {
                Files.copy(in, to.resolve(f.getFileName().toString()), StandardCopyOption.REPLACE_EXISTING);
            }
        }
    }
}
