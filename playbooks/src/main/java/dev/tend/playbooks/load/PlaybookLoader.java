package dev.tend.playbooks.load;

import dev.tend.playbooks.Actions;
import dev.tend.playbooks.PageStep;
import dev.tend.playbooks.Playbook;
import dev.tend.playbooks.Position;
import dev.tend.playbooks.Step;
import dev.tend.playbooks.PlaybookInvalidException;
import dev.tend.playbooks.PlaybookSet;
import dev.tend.playbooks.TendConfig;
import dev.tend.shared.Id;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.json.Sha256;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;
import dev.tend.shared.yaml.YScalar;
import dev.tend.shared.yaml.YamlDocument;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Stream;

/**
 * Loads a playbook directory: every {@code *.yaml} and {@code *.yml} file in it is a
 * playbook, except {@code actions.yaml} (the actions), {@code tend.yaml} (the fleet-wide
 * policy) and {@code fleet.yaml} (a fleet file, read elsewhere); subdirectories are not
 * read. Playbooks are ordered by file name.
 *
 * <p>Every problem in every file is collected, and all are thrown together as one
 * {@link PlaybookInvalidException} (an {@link InvalidInputException}), each located as
 * {@code FILE:LINE:COL: message}: problems of actions.yaml first, then tend.yaml, then each
 * playbook in file-name order, each file's in line order. Stateless and thread-safe.
 */
public final class PlaybookLoader {
    public static final String ACTIONS_FILE = "actions.yaml";
    public static final String CONFIG_FILE = "tend.yaml";
    public static final String FLEET_FILE = "fleet.yaml";
    private static final Set<String> NOT_PLAYBOOKS = Set.of(ACTIONS_FILE, CONFIG_FILE, FLEET_FILE);

    private PlaybookLoader() {
    }

    /** Loads {@code dir}, with {@code dir/tend.yaml} as the policy when present, else the built-in one. */
    public static PlaybookSet load(Path dir) {
        return load(dir, null);
    }

    /**
     * Loads {@code dir} with the policy of {@code configFile}; null means {@code dir/tend.yaml}
     * when present, else {@link TendConfig#builtIn()}.
     */
    public static PlaybookSet load(Path dir, Path configFile) {
        return load(dir, configFile, null);
    }

    /**
     * Loads {@code dir} with the policy of {@code configFile} and the actions of
     * {@code actionsFile}; null for either means the file of that name in {@code dir}.
     */
    public static PlaybookSet load(Path dir, Path configFile, Path actionsFile) {
        Map<String, List<Problem>> problems = new LinkedHashMap<>();
        if (!Files.isDirectory(dir)) {
            throw new PlaybookInvalidException(List.of(Problem.at(dir.toString(), 0, 0, "", "is not a directory of playbooks")));
        }
        if (actionsFile != null && !Files.isRegularFile(actionsFile)) {
            throw new PlaybookInvalidException(List.of(Problem.at(actionsFile.toString(), 0, 0, "", "no such actions file")));
        }
        Path actionsPath = actionsFile != null ? actionsFile : dir.resolve(ACTIONS_FILE);
        ActionCatalog catalog = Files.exists(actionsPath) ? readActions(actionsPath, problems) : ActionCatalog.of(Actions.empty());
        Path configPath = configFile != null ? configFile : dir.resolve(CONFIG_FILE);
        TendConfig config = configFile != null || Files.exists(configPath) ? readConfig(configPath, problems) : TendConfig.builtIn();

        List<Path> files = playbookFiles(dir, problems);
        if (configFile != null) {
            // a policy file given explicitly may sit among the playbooks under another name
            files = files.stream().filter(p -> !p.toAbsolutePath().normalize().equals(configFile.toAbsolutePath().normalize())).toList();
        }
        List<Playbook> playbooks = new ArrayList<>();
        Map<Id, String> firstUse = new HashMap<>();
        for (Path file : files) {
            Playbook p = readFile(file, problems, (f, text, doc) -> {
                checkUnique(f, doc, firstUse);
                return PlaybookReader.read(f, doc, Sha256.hex(text), catalog);
            });
            if (p != null) playbooks.add(p);
        }
        if (files.isEmpty() && problems.values().stream().allMatch(List::isEmpty)) {
            problems.put(dir.toString(), List.of(Problem.at(dir.toString(), 0, 0, "",
                    "holds no playbook: no .yaml or .yml file other than actions.yaml, tend.yaml and fleet.yaml")));
        }
        for (Playbook p : playbooks) checkChannels(p, config, problems);
        throwIfAny(problems);
        return PlaybookSet.of(playbooks, catalog.actions(), config);
    }

    /** A step that pages a channel tend.yaml does not define is an error, with the nearest defined name. */
    private static void checkChannels(Playbook p, TendConfig config, Map<String, List<Problem>> problems) {
        for (Step s : p.allSteps()) {
            if (!(s instanceof PageStep n)) continue;
            String problem = ChannelsReader.unknownChannel(n.channel(), config.paging().channels());
            if (problem == null) continue;
            String section = p.steps().contains(s) ? "steps." : "on-failure.";
            Position at = p.position(section + s.id());
            problems.computeIfAbsent(p.source(), k -> new ArrayList<>())
                    .add(Problem.at(p.source(), at.line(), at.column(), s.kind(), "step " + s.id() + ": " + problem));
        }
    }

    /**
     * Null when a page may go to channel {@code name} under {@code config}; otherwise the
     * sentence that says it is not defined, with the nearest defined name.
     */
    public static String unknownChannel(TendConfig config, Id name) {
        return ChannelsReader.unknownChannel(name, config.paging().channels());
    }

    /** Parses one playbook; action steps are checked against {@code actions}. For tests and tools. */
    public static Playbook parse(String source, String yamlText, Actions actions) {
        Fields f = new Fields(source);
        Playbook p = PlaybookReader.read(f, parseYaml(source, yamlText), Sha256.hex(bytes(yamlText)), ActionCatalog.of(actions));
        throwIfAny(Map.of(source, f.problems()));
        return p;
    }

    /** Parses the text of an actions.yaml. */
    public static Actions parseActions(String source, String yamlText) {
        Fields f = new Fields(source);
        ActionsReader.Result r = ActionsReader.read(f, parseYaml(source, yamlText));
        throwIfAny(Map.of(source, f.problems()));
        return new Actions(r.actions(), source, Sha256.hex(bytes(yamlText)));
    }

    /** Parses the text of a tend.yaml. */
    public static TendConfig parseConfig(String source, String yamlText) {
        Fields f = new Fields(source);
        TendConfig c = ConfigReader.read(f, parseYaml(source, yamlText), Sha256.hex(bytes(yamlText)));
        throwIfAny(Map.of(source, f.problems()));
        return c;
    }

    /** Loads one tend.yaml file. */
    public static TendConfig loadConfig(Path file) {
        Map<String, List<Problem>> problems = new LinkedHashMap<>();
        TendConfig c = readConfig(file, problems);
        throwIfAny(problems);
        return c;
    }

    /** Loads one actions.yaml file. */
    public static Actions loadActions(Path file) {
        Map<String, List<Problem>> problems = new LinkedHashMap<>();
        ActionCatalog c = readActions(file, problems);
        throwIfAny(problems);
        return c.actions();
    }

    /** Turns one parsed document into a value, recording its problems in {@code f}. */
    private interface DocumentReader<T> {
        T read(Fields f, byte[] text, YNode doc);
    }

    /** Playbook ids are compared as written, so a duplicate is found even in a file with other problems. */
    private static void checkUnique(Fields f, YNode doc, Map<Id, String> firstUse) {
        if (!(doc instanceof YMap m) || !(m.get("playbook").orElse(null) instanceof YScalar s) || !Id.isValid(s.value())) return;
        String here = f.source() + ":" + s.line() + ":" + s.column();
        String first = firstUse.putIfAbsent(Id.of(s.value()), here);
        if (first != null) {
            f.add(s, "playbook", "playbook id '" + s.value() + "' is already used by " + first
                    + "; playbook ids must be unique in a directory");
        }
    }

    private static ActionCatalog readActions(Path file, Map<String, List<Problem>> problems) {
        ActionCatalog c = readFile(file, problems, (f, text, doc) -> {
            ActionsReader.Result r = ActionsReader.read(f, doc);
            return new ActionCatalog(new Actions(r.actions(), f.source(), Sha256.hex(text)), r.declared(), true, true);
        });
        return c != null ? c : ActionCatalog.unreadable();
    }

    private static TendConfig readConfig(Path file, Map<String, List<Problem>> problems) {
        TendConfig c = readFile(file, problems, (f, text, doc) -> ConfigReader.read(f, doc, Sha256.hex(text)));
        return c != null ? c : TendConfig.builtIn();
    }

    /**
     * Reads, parses and converts one file, recording its problems. Null when the file cannot
     * be read or parsed; otherwise what {@code reader} made of it, which may be partial.
     */
    private static <T> T readFile(Path file, Map<String, List<Problem>> problems, DocumentReader<T> reader) {
        String source = file.toString();
        List<Problem> mine = problems.computeIfAbsent(source, k -> new ArrayList<>());
        byte[] text;
        try {
            text = Files.readAllBytes(file);
        } catch (java.nio.file.NoSuchFileException e) {
            mine.add(Problem.at(source, 0, 0, "", "the file does not exist"));
            return null;
        } catch (IOException e) {
            mine.add(Problem.at(source, 0, 0, "", "cannot read the file: " + e.getMessage()));
            return null;
        }
        YNode doc;
        try {
            doc = YamlDocument.parse(source, YamlDocument.decode(source, text));
        } catch (InvalidInputException e) {
            mine.addAll(e.problems());
            return null;
        }
        Fields f = new Fields(source);
        T value = reader.read(f, text, doc);
        mine.addAll(f.problems());
        return value;
    }

    private static List<Path> playbookFiles(Path dir, Map<String, List<Problem>> problems) {
        try (Stream<Path> s = Files.list(dir)) {
            return s.filter(Files::isRegularFile)
                    .filter(p -> {
                        String name = p.getFileName().toString();
                        return (name.endsWith(".yaml") || name.endsWith(".yml")) && !NOT_PLAYBOOKS.contains(name);
                    })
                    .sorted(Comparator.comparing(p -> p.getFileName().toString()))
                    .toList();
        } catch (IOException e) {
            problems.computeIfAbsent(dir.toString(), k -> new ArrayList<>())
                    .add(Problem.at(dir.toString(), 0, 0, "", "cannot list the directory: " + e.getMessage()));
            return List.of();
        }
    }

    private static YNode parseYaml(String source, String text) {
        try {
            return YamlDocument.parse(source, text);
        } catch (InvalidInputException e) {
            throw new PlaybookInvalidException(e.problems());
        }
    }

    private static byte[] bytes(String text) {
        return text.getBytes(StandardCharsets.UTF_8);
    }

    private static void throwIfAny(Map<String, List<Problem>> problems) {
        List<Problem> all = new ArrayList<>();
        for (List<Problem> file : problems.values()) {
            List<Problem> sorted = new ArrayList<>(file);
            sorted.sort(Comparator.comparingInt(Problem::line).thenComparingInt(Problem::column));
            all.addAll(sorted);
        }
        if (!all.isEmpty()) throw new PlaybookInvalidException(all);
    }
}
