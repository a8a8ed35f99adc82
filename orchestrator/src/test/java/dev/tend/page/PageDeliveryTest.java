package dev.tend.page;

import dev.tend.http.OutgoingHttp;
import dev.tend.store.PageRow;
import dev.tend.store.Store;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;

import static org.assertj.core.api.Assertions.assertThat;

/** Only the process that owns the engine sends pages: delivery starts and stops at one seam, and what waits is sent by the next start. */
class PageDeliveryTest {
    @TempDir
    Path dir;

    @Test
    void aStoppedDeliverySendsNothingAndTheNextStartSendsWhatWaitedOnce() throws Exception {
        StringWriter log = new StringWriter();
        Senders senders = Senders.from(Outboxes.paging("channels:\n  oncall:\n    log: {}\n"), new OutgoingHttp(), new PrintWriter(log, true));
        try (Store store = Store.openSqlite(dir.resolve("tend.db"));
             PageDelivery pages = new PageDelivery(store, senders, Clock.systemUTC(), Duration.ofSeconds(5), Courier.Listener.NONE)) {
            assertThat(pages.isDelivering()).isFalse();
            Outboxes.enqueue(store, "brake/1", "oncall", "brake", "fares-3", "fleet brake engaged");
            pages.wake();
            Thread.sleep(600); // more than two polling periods of a running courier
            assertThat(Outboxes.row(store, "brake/1").state()).as("a standby sends nothing").isEqualTo(PageRow.PENDING);

            pages.start();
            pages.start(); // idempotent: still one courier
            Outboxes.await("the first page", Duration.ofSeconds(10), () -> Outboxes.row(store, "brake/1").state().equals(PageRow.DELIVERED));

            pages.stop();
            assertThat(pages.isDelivering()).isFalse();
            Outboxes.enqueue(store, "r000007/needs-human", "oncall", "needs-human", "dispatch-1", "run r000007 needs a person");
            pages.wake();
            Thread.sleep(600);
            assertThat(Outboxes.row(store, "r000007/needs-human").state()).isEqualTo(PageRow.PENDING);

            pages.start(); // taken back: what waited goes out
            Outboxes.await("the second page", Duration.ofSeconds(10),
                    () -> Outboxes.row(store, "r000007/needs-human").state().equals(PageRow.DELIVERED));
            assertThat(Outboxes.ledger(store, "notification-delivered")).hasSize(2);
        }
        assertThat(log.toString().lines().filter(l -> l.contains("fleet brake engaged")).count()).isEqualTo(1);
    }
}
