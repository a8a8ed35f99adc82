package dev.tend.store;

import org.junit.jupiter.api.Test;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Open receipts: summed by kind and caller across commits, taken once, kept by a rollback and by a new Store. */
abstract class OpenReceiptContractTest extends StoreTestBase {
    private static final String KIND = "transitions-received";
    private static final String OLGA = "{\"by\":\"olga\",\"from\":\"10.0.0.7\"}";
    private static final String OTTO = "{\"by\":\"otto\",\"from\":\"10.0.0.8\"}";

    private static OpenReceipt receipt(String caller, long accepted, long rejected, long requests, int firstSecond, int lastSecond) {
        return new OpenReceipt(KIND, caller, accepted, rejected, requests, T0.plusSeconds(firstSecond), T0.plusSeconds(lastSecond));
    }

    private List<OpenReceipt> take() {
        return store.inTransaction(StoreTx::takeOpenReceipts);
    }

    @Test
    void receiptsOfOneCallerAreSummedAcrossCommitsAndTakenOnceOldestFirst() {
        store.useTransaction(tx -> tx.addToOpenReceipts(List.of(receipt(OTTO, 1, 0, 1, 2, 2), receipt(OLGA, 3, 1, 2, 1, 1))));
        store.useTransaction(tx -> tx.addToOpenReceipts(List.of(receipt(OTTO, 5, 2, 4, 3, 4))));
        store.useTransaction(tx -> tx.addToOpenReceipts(List.of(receipt(OLGA, 1, 0, 1, 0, 0))));

        List<OpenReceipt> taken = take();

        assertThat(taken).containsExactly(receipt(OLGA, 4, 1, 3, 0, 1), receipt(OTTO, 6, 2, 5, 2, 4));
        assertThat(take()).as("a receipt is taken once").isEmpty();
    }

    @Test
    void aTakeRolledBackLeavesTheReceiptsOpen() {
        store.useTransaction(tx -> tx.addToOpenReceipts(List.of(receipt(OLGA, 2, 0, 1, 0, 0))));

        assertThatThrownBy(() -> store.useTransaction(tx -> {
            assertThat(tx.takeOpenReceipts()).hasSize(1);
            throw new IllegalStateException("the ledger append failed");
        })).hasMessageContaining("the ledger append failed");

        assertThat(take()).containsExactly(receipt(OLGA, 2, 0, 1, 0, 0));
    }

    @Test
    void openReceiptsOutliveTheStoreThatWroteThem() {
        store.useTransaction(tx -> tx.addToOpenReceipts(List.of(receipt(OTTO, 7, 0, 7, 0, 6))));
        store.close();
        store = db.open();

        assertThat(take()).containsExactly(receipt(OTTO, 7, 0, 7, 0, 6));
    }

    @Test
    void receiptsAreRefusedWithTheFieldThatIsWrong() {
        assertThatThrownBy(() -> receipt(OLGA, 1, 0, 0, 0, 0)).hasMessageContaining("OpenReceipt.requests");
        assertThatThrownBy(() -> receipt(OLGA, -1, 0, 1, 0, 0)).hasMessageContaining("OpenReceipt counts");
        assertThatThrownBy(() -> receipt(OLGA, 1, 0, 1, 5, 4)).hasMessageContaining("OpenReceipt.last");
    }
}
