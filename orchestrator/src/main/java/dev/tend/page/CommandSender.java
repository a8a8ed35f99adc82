package dev.tend.page;

import dev.tend.playbooks.CommandChannel;
import dev.tend.playbooks.Template;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;

/**
 * Runs the channel's program with the page's fields in its arguments (never through a
 * shell: each argument is one argument whatever it holds). Exit 0 is delivery; any other
 * exit or the timeout is tried again later.
 */
public final class CommandSender implements PageSender {
    private static final int OUTPUT_LIMIT = 1024;
    private final CommandChannel channel;

    public CommandSender(CommandChannel channel) {
        this.channel = channel;
    }

    @Override
    public String kind() {
        return "command";
    }

    @Override
    public Answer send(Page page) {
        Map<String, String> values = page.placeholders();
        List<String> argv = new ArrayList<>();
        for (Template t : channel.argv()) argv.add(t.render(values));
        Process p;
        try {
            p = new ProcessBuilder(argv).redirectErrorStream(true).redirectInput(ProcessBuilder.Redirect.from(new java.io.File("/dev/null"))).start();
        } catch (IOException e) {
            return Answer.retry("could not start " + argv.get(0) + ": " + e.getMessage());
        }
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        Thread reader = new Thread(() -> drain(p.getInputStream(), out), "tend-page-command-output");
        reader.setDaemon(true);
        reader.start();
        try {
            if (!p.waitFor(channel.timeout().toMillis(), TimeUnit.MILLISECONDS)) {
                p.descendants().forEach(ProcessHandle::destroyForcibly);
                p.destroyForcibly();
                return Answer.retry("timed out after " + channel.timeout().toMillis() + " ms");
            }
            reader.join(1000);
        } catch (InterruptedException e) {
            p.destroyForcibly();
            Thread.currentThread().interrupt();
            return Answer.retry("interrupted");
        }
        String text;
        synchronized (out) {
            text = out.toString(StandardCharsets.UTF_8).strip();
        }
        String answer = "exit " + p.exitValue() + (text.isEmpty() ? "" : ": " + text);
        return p.exitValue() == 0 ? Answer.accepted(answer) : Answer.retry(answer);
    }

    private static void drain(InputStream in, ByteArrayOutputStream out) {
        byte[] buf = new byte[4096];
        try (in) {
            int n;
            while ((n = in.read(buf)) >= 0) {
                synchronized (out) {
                    int room = OUTPUT_LIMIT - out.size();
                    if (room > 0) out.write(buf, 0, Math.min(room, n));
                }
            }
        } catch (IOException e) {
            // the process ended; what was read is kept
        }
    }
}
