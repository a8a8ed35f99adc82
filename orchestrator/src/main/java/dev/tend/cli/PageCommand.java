package dev.tend.cli;

import dev.tend.engine.PageKind;
import dev.tend.http.OutgoingHttp;
import dev.tend.page.Answer;
import dev.tend.page.Page;
import dev.tend.page.PageSender;
import dev.tend.page.Senders;
import dev.tend.playbooks.TendConfig;
import dev.tend.playbooks.load.PlaybookLoader;
import dev.tend.shared.Id;
import dev.tend.shared.TendException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import java.io.PrintWriter;
import java.net.InetAddress;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.Callable;

/** {@code tend page test CHANNEL}: pages through a channel of tend.yaml, to see that it reaches people. */
@Command(name = "page", mixinStandardHelpOptions = true, subcommands = {PageCommand.Test.class},
        description = "Pages: try a channel of tend.yaml.")
public final class PageCommand extends CommandGroup {

    @Command(name = "test", mixinStandardHelpOptions = true,
            description = "Send a test page through CHANNEL now, directly (not through a server's outbox), and print the receiver's"
                    + " answer. Exit 0 when the receiver accepted it, 1 when it did not, 2 for an unknown channel or a bad tend.yaml.")
    public static final class Test implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Parameters(index = "0", paramLabel = "CHANNEL", description = "a channel defined in tend.yaml")
        String channel;

        @Option(names = "--playbooks", paramLabel = "DIR", description = "playbook directory whose tend.yaml defines the channels")
        Path playbooks;

        @Option(names = "--config", paramLabel = "FILE", description = "the tend.yaml (default: DIR/tend.yaml)")
        Path config;

        @Override
        public Integer call() throws Exception {
            PrintWriter out = spec.commandLine().getOut();
            Path file = config != null ? config : playbooks != null ? playbooks.resolve(PlaybookLoader.CONFIG_FILE) : null;
            if (file == null) throw new TendException("give --playbooks DIR or --config FILE: the channels are defined in tend.yaml");
            TendConfig cfg = Files.exists(file) || config != null ? PlaybookLoader.loadConfig(file) : TendConfig.builtIn();
            if (!Id.isValid(channel)) throw new TendException("channel name: " + Id.describeInvalid(channel));
            String unknown = PlaybookLoader.unknownChannel(cfg, Id.of(channel));
            if (unknown != null) throw new TendException(unknown);
            Senders senders = Senders.from(cfg.paging(), new OutgoingHttp(), spec.commandLine().getErr());
            PageSender sender = senders.sender(channel).orElseThrow();
            Instant now = Instant.now();
            Map<String, Object> f = new LinkedHashMap<>();
            f.put("id", "test/" + now.toEpochMilli());
            f.put("channel", channel);
            f.put("at", now.toString());
            f.put("kind", PageKind.TEST);
            f.put("message", "test page from tend on " + InetAddress.getLocalHost().getHostName() + ": channel " + channel
                    + " reaches you; nothing needs doing");
            Answer a = sender.send(new Page(f).withLink(senders.consoleUrl()));
            out.println("page " + f.get("id") + " through " + channel + " (" + sender.kind() + "): " + a.outcome().name().toLowerCase(java.util.Locale.ROOT)
                    + ": " + a.text());
            for (int i = 0; i < a.tries().size() && a.tries().size() > 1; i++) out.println("  try " + (i + 1) + ": " + a.tries().get(i));
            return a.outcome() == Answer.Outcome.ACCEPTED ? ExitCodes.OK : ExitCodes.FINDINGS;
        }
    }
}
