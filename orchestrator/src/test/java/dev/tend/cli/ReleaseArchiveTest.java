package dev.tend.cli;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The release archive as an operator installs it, unpacked with the system's {@code tar}:
 * {@code bin/tend} runs with nothing but bash, a few core tools and {@code java} on the PATH
 * (no Maven), the jar answers, the example library passes {@code tend check}, the systemd
 * unit and the container build file refer to files the archive holds and to options
 * {@code tend serve} has, and the README says how to install from it.
 *
 * <p>It needs the archive, so it runs after {@code package} in the {@code release} profile
 * (the property {@code tend.release.archive} names the file); the default build leaves it out:
 * <pre>mvn -B -Prelease -pl orchestrator -am verify -Dtend.skipUnitTests=true</pre>
 */
class ReleaseArchiveTest {
    static final String ARCHIVE = "tend.release.archive";

    @TempDir
    Path dir;

    @Test
    void theArchiveInstallsAndRunsWithoutMaven() throws Exception {
        String archive = System.getProperty(ARCHIVE);
        assertThat(archive).as("run with: mvn -B -Prelease -pl orchestrator -am verify -Dtend.skipUnitTests=true"
                + " (the archive is made in the package phase)").isNotBlank();
        assertThat(Path.of(archive)).isRegularFile();
        Path opt = Files.createDirectories(dir.resolve("opt"));
        assertThat(run(List.of("tar", "xzf", archive, "-C", opt.toString()), dir, null).exit).isZero();
        Path home;
        try (Stream<Path> top = Files.list(opt)) {
            home = top.filter(p -> p.getFileName().toString().startsWith("tend-")).findFirst().orElseThrow();
        }

        for (String f : List.of("bin/tend", "lib/tend.jar", "library/fleet.yaml", "library/actions.yaml", "library/tend.yaml",
                "library/replace-silent-node.yaml", "systemd/tend.service", "Containerfile", "README.md")) {
            assertThat(home.resolve(f)).as(f).isRegularFile();
        }
        assertThat(Files.isExecutable(home.resolve("bin/tend"))).as("bin/tend is executable").isTrue();

        // a PATH with bash, the tools the launcher uses and java: no mvn anywhere on it
        Path tools = Files.createDirectories(dir.resolve("tools"));
        for (String tool : List.of("bash", "dirname", "readlink")) {
            Files.createSymbolicLink(tools.resolve(tool), which(tool));
        }
        Files.createSymbolicLink(tools.resolve("java"), Path.of(System.getProperty("java.home"), "bin", "java"));
        String path = tools.toString();

        Result version = run(List.of(home.resolve("bin/tend").toString(), "--version"), dir, path);
        assertThat(version.exit).as(version.out).isZero();
        assertThat(version.out).startsWith("tend ");
        // through a symbolic link, from another folder, as /usr/local/bin/tend -> /opt/tend/bin/tend would be
        Path link = dir.resolve("tend-link");
        Files.createSymbolicLink(link, home.resolve("bin/tend"));
        Result check = run(List.of(link.toString(), "check", home.resolve("library").toString(), "--fleet",
                home.resolve("library/fleet.yaml").toString()), Files.createDirectories(dir.resolve("elsewhere")), path);
        assertThat(check.exit).as(check.out).isZero();

        Result serveHelp = run(List.of(home.resolve("bin/tend").toString(), "serve", "--help"), dir, path);
        assertThat(serveHelp.exit).isZero();
        String unit = Files.readString(home.resolve("systemd/tend.service"));
        assertThat(unit).contains("ExecStart=/opt/tend/bin/tend serve").contains("[Install]");
        assertThat(options(unit.substring(unit.indexOf("ExecStart=")).split("\n#|\n\\[|\nKillSignal")[0]))
                .isNotEmpty().allSatisfy(o -> assertThat(serveHelp.out).as("serve has " + o).contains(o));
        String containerfile = Files.readString(home.resolve("Containerfile"));
        Matcher copy = Pattern.compile("(?m)^COPY (\\S+) ").matcher(containerfile);
        int copies = 0;
        while (copy.find()) {
            copies++;
            assertThat(home.resolve(copy.group(1))).as("the Containerfile copies " + copy.group(1)).exists();
        }
        assertThat(copies).isGreaterThanOrEqualTo(3);
        assertThat(containerfile).contains("ENTRYPOINT [\"/opt/tend/bin/tend\"]");
        String cmd = containerfile.substring(containerfile.indexOf("CMD ["));
        assertThat(options(cmd)).isNotEmpty().allSatisfy(o -> assertThat(serveHelp.out).as("serve has " + o).contains(o));

        String readme = Files.readString(home.resolve("README.md"));
        assertThat(readme).contains("## Install from the release archive").contains("mvn -B -DskipTests -Prelease package")
                .contains("tar xzf tend-VERSION.tar.gz");
    }

    private static List<String> options(String text) {
        List<String> out = new ArrayList<>();
        Matcher m = Pattern.compile("(--[a-z][a-z-]+)").matcher(text);
        while (m.find()) out.add(m.group(1));
        return out;
    }

    private static Path which(String tool) {
        for (String d : List.of("/usr/bin", "/bin")) {
            Path p = Path.of(d, tool);
            if (Files.isExecutable(p)) return p;
        }
        throw new AssertionError(tool + " not found in /usr/bin or /bin");
    }

    private record Result(int exit, String out) {
    }

    private static Result run(List<String> command, Path in, String path) throws IOException, InterruptedException {
        Path out = Files.createTempFile(in, "out", ".txt");
        ProcessBuilder pb = new ProcessBuilder(command).directory(in.toFile()).redirectErrorStream(true).redirectOutput(out.toFile())
                .redirectInput(ProcessBuilder.Redirect.from(new File("/dev/null")));
        if (path != null) {
            pb.environment().clear();
            pb.environment().put("PATH", path);
            pb.environment().put("HOME", in.toString());
        }
        Process p = pb.start();
        if (!p.waitFor(120, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new AssertionError(command + " still running after 120 s");
        }
        return new Result(p.exitValue(), Files.readString(out));
    }
}
