package dev.tend.bench;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;

import java.io.BufferedReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * The floor of the cold replay benchmark, run as a fresh process like {@code tend replay}:
 * reads a recording and parses every line into a Jackson tree, the least any replay of the
 * file must do. Prints the count of lines parsed.
 */
public final class JacksonFloor {
    private JacksonFloor() {
    }

    public static void main(String[] args) throws Exception {
        ObjectMapper json = new ObjectMapper();
        long lines = 0, objects = 0;
        try (BufferedReader in = Files.newBufferedReader(Path.of(args[0]), StandardCharsets.UTF_8)) {
            for (String line = in.readLine(); line != null; line = in.readLine()) {
                lines++;
                JsonNode n = json.readTree(line);
                if (n != null && n.isObject()) objects++;
            }
        }
        System.out.println(lines + " lines, " + objects + " objects");
    }
}
