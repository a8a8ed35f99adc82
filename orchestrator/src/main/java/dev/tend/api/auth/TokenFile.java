package dev.tend.api.auth;

import dev.tend.shared.Id;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.yaml.Fields;
import dev.tend.shared.yaml.YList;
import dev.tend.shared.yaml.YMap;
import dev.tend.shared.yaml.YNode;
import dev.tend.shared.yaml.YamlDocument;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * Reads the tokens file of {@code tend serve --tokens FILE} (YAML or JSON):
 * <pre>
 * tokens:
 *   - name: vera                 # an id; the ledger records operator actions under it
 *     roles: [viewer, approver]  # viewer, operator, approver
 *     sha256: 9f86d08...         # SHA-256 hex of the token: printf %s "$TOKEN" | sha256sum
 * </pre>
 * Every problem is reported at once through {@link InvalidInputException}, located.
 */
public final class TokenFile {
    private static final List<String> TOP = List.of("tokens");
    private static final List<String> ENTRY = List.of("name", "roles", "sha256");

    private TokenFile() {
    }

    public static Tokens load(Path file) {
        return parse(file.toString(), YamlDocument.read(file));
    }

    public static Tokens parse(String source, String text) {
        return parse(source, YamlDocument.parse(source, text));
    }

    private static Tokens parse(String source, YNode root) {
        Fields f = new Fields(source);
        YMap top = f.asMap(root, "a tokens file");
        if (top == null) throw new InvalidInputException(f.problems());
        f.allowOnly(top, "the tokens file", TOP);
        YList list = f.node(top, "tokens", "the tokens file", true).map(n -> f.asList(n, "tokens")).orElse(null);
        List<Tokens.Entry> entries = new ArrayList<>();
        Map<String, Integer> names = new HashMap<>();
        Map<String, Integer> hashes = new HashMap<>();
        if (list != null) {
            for (int i = 0; i < list.items().size(); i++) {
                String where = "tokens[" + i + "]";
                YMap m = f.asMap(list.items().get(i), where);
                if (m == null) continue;
                Tokens.Entry e = entry(f, m, where);
                if (e == null) continue;
                Integer first = names.putIfAbsent(e.caller().name(), i);
                if (first != null) {
                    f.add(m.get("name").orElse(m), "name", where + ": the name " + e.caller().name()
                            + " is also tokens[" + first + "]'s; each holder needs their own name");
                    continue;
                }
                first = hashes.putIfAbsent(e.sha256(), i);
                if (first != null) {
                    f.add(m.get("sha256").orElse(m), "sha256", where + ": the same token as tokens[" + first
                            + "]; each holder needs their own token");
                    continue;
                }
                entries.add(e);
            }
        }
        f.throwIfAny();
        return Tokens.of(entries);
    }

    private static Tokens.Entry entry(Fields f, YMap m, String where) {
        if (m.has("token")) {
            f.add(m.get("token").get(), "token", where + ": never store a token itself; store its SHA-256 as sha256"
                    + " (printf %s \"$TOKEN\" | sha256sum)");
        }
        f.allowOnly(m, where, m.has("token") ? withToken() : ENTRY);
        Id name = f.id(m, "name", where, true);
        Set<Role> roles = EnumSet.noneOf(Role.class);
        Optional<YNode> rolesNode = f.node(m, "roles", where, true);
        if (rolesNode.isPresent()) {
            YList l = f.asList(rolesNode.get(), where + ".roles");
            if (l != null && l.items().isEmpty()) f.add(l, "roles", where + ".roles must name at least one of viewer, operator, approver");
            if (l != null) for (YNode item : l.items()) {
                Role r = f.parsedNode(item, where + ".roles", Role::parse);
                if (r != null) roles.add(r);
            }
        }
        String sha = f.parsed(m, "sha256", where, true, Tokens::requireSha256);
        if (name == null || roles.isEmpty() || sha == null) return null;
        return new Tokens.Entry(new Caller(name.value(), roles), sha);
    }

    private static List<String> withToken() {
        List<String> l = new ArrayList<>(ENTRY);
        l.add("token");
        return l;
    }
}
