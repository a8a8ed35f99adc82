package dev.tend.page;

import java.io.PrintWriter;

/** Writes each page as one line to tend's log. Always accepted. */
public final class LogSender implements PageSender {
    private final PrintWriter log;

    public LogSender(PrintWriter log) {
        this.log = log;
    }

    @Override
    public String kind() {
        return "log";
    }

    @Override
    public Answer send(Page page) {
        Object link = page.fields().get("link");
        synchronized (log) {
            log.println("tend: page " + page.channel() + " [" + page.kind() + "] " + page.message() + (link == null ? "" : " " + link));
            log.flush();
        }
        return Answer.accepted("written to the log");
    }
}
