package dev.tend.playbooks;

import dev.tend.shared.Id;

import java.time.Duration;
import java.util.List;
import java.util.Objects;

/**
 * Runs a program for each page: an argument list with page placeholders, never a shell.
 * Exit code 0 is delivery; any other exit, or the timeout, is tried again later.
 */
public record CommandChannel(Id name, List<Template> argv, Duration timeout, Duration giveUpAfter) implements ChannelDef {
    public static final Duration DEFAULT_TIMEOUT = Duration.ofSeconds(30);

    public CommandChannel {
        Objects.requireNonNull(name, "channel name");
        argv = List.copyOf(argv);
        if (argv.isEmpty()) throw new IllegalArgumentException("channel " + name + " command is empty; its first item is the program to run");
        if (!argv.get(0).placeholders().isEmpty()) throw new IllegalArgumentException("channel " + name + " command: the program must be fixed text");
        for (Template t : argv) {
            for (String p : t.placeholders()) {
                if (!Template.PAGE_PLACEHOLDERS.contains(p)) throw new IllegalArgumentException("channel " + name + " command uses unknown placeholder {" + p + "}");
            }
        }
        timeout = timeout == null ? DEFAULT_TIMEOUT : timeout;
        giveUpAfter = giveUpAfter == null ? DEFAULT_GIVE_UP_AFTER : giveUpAfter;
        ChannelDef.checkGiveUp(name, giveUpAfter);
    }

    @Override
    public String kind() {
        return "command";
    }
}
