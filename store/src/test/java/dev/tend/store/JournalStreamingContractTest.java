package dev.tend.store;

import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/**
 * forEachInput streams: 200,000 inputs of about 1.5 KB (some 300 MB of payload) read in a
 * JVM of 256 MB heap. Maven runs these classes in their own surefire execution with
 * -Xmx256m (store/pom.xml, execution "streaming-in-256m"); elsewhere they are skipped.
 */
abstract class JournalStreamingContractTest extends StoreTestBase {
    static final int ROWS = 200_000;
    static final int PER_TRANSACTION = 10_000;

    @Test
    void twoHundredThousandInputsStreamInOrderWithinA256MegabyteHeap() {
        assumeTrue("256m".equals(System.getProperty("tend.test.heap")),
                "runs in the surefire execution streaming-in-256m, which sets -Xmx256m and tend.test.heap");
        assertThat(Runtime.getRuntime().maxMemory()).as("the heap the surefire execution promises")
                .isLessThanOrEqualTo(256L * 1024 * 1024);
        String padding = "x".repeat(1500);
        for (int from = 0; from < ROWS; from += PER_TRANSACTION) {
            int start = from;
            store.useTransaction(tx -> {
                List<InputRow> batch = new ArrayList<>(PER_TRANSACTION);
                for (int i = start; i < start + PER_TRANSACTION; i++) {
                    batch.add(InputRow.of(InputRow.TRANSITION, T0.plusMillis(i), T0.plusMillis(i), "fares-3",
                            "{\"i\":" + i + ",\"pad\":\"" + padding + "\"}"));
                }
                tx.appendInputs(batch);
            });
        }

        long[] seen = {0, 0};
        boolean[] inOrder = {true};
        store.read(r -> {
            r.forEachInput(0, row -> {
                if (row.seq() != seen[0] + 1 || !row.payload().startsWith("{\"i\":" + seen[0] + ",")) inOrder[0] = false;
                seen[0] = row.seq();
                seen[1]++;
            });
            return null;
        });
        assertThat(seen[1]).isEqualTo(ROWS);
        assertThat(seen[0]).isEqualTo(ROWS);
        assertThat(inOrder[0]).as("every row in seq order with its own payload").isTrue();
    }
}
