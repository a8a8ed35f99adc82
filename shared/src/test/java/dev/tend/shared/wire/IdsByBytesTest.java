package dev.tend.shared.wire;

import dev.tend.shared.Id;
import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;

import static org.assertj.core.api.Assertions.assertThat;

class IdsByBytesTest {
    @Test
    void aRepeatedIdIsOneInstanceFoundByItsBytesAsTheTableGrows() {
        AtomicInteger marked = new AtomicInteger();
        IdsByBytes ids = new IdsByBytes(v -> {
            marked.incrementAndGet();
            return v.endsWith("7");
        });
        List<Id> first = new ArrayList<>();
        for (int i = 0; i < 20_000; i++) first.add(ids.id(find(ids, "bench-" + i)));
        for (int i = 0; i < 20_000; i++) {
            // the id inside a longer line, as the reader finds it
            byte[] line = ("{\"cluster\":\"bench-" + i + "\"}").getBytes(StandardCharsets.US_ASCII);
            int slot = ids.find(line, 12, line.length - 2);
            assertThat(ids.id(slot)).isSameAs(first.get(i));
            assertThat(ids.id(slot).value()).isEqualTo("bench-" + i);
            assertThat(ids.isMarked(slot)).isEqualTo(i % 10 == 7);
        }
        assertThat(marked.get()).as("each id marked once, when first met").isEqualTo(20_000);
    }

    @Test
    void bytesThatAreNotAnIdAreNotTakenIn() {
        IdsByBytes ids = new IdsByBytes(v -> true);
        assertThat(find(ids, "")).isEqualTo(-1);
        assertThat(find(ids, "-dash-first")).isEqualTo(-1);
        assertThat(find(ids, "x".repeat(Id.MAX_LENGTH + 1))).isEqualTo(-1);
        assertThat(ids.id(find(ids, "x".repeat(Id.MAX_LENGTH))).value()).hasSize(Id.MAX_LENGTH);
    }

    @Test
    void aFullTableKnowsItsIdsAndTakesNoNewOne() {
        IdsByBytes ids = new IdsByBytes(v -> false, 3);
        int a = find(ids, "a");
        find(ids, "b");
        find(ids, "c");
        assertThat(find(ids, "d")).isEqualTo(-1);
        assertThat(find(ids, "a")).isEqualTo(a);
        assertThat(ids.id(find(ids, "c")).value()).isEqualTo("c");
    }

    private static int find(IdsByBytes ids, String id) {
        byte[] b = id.getBytes(StandardCharsets.US_ASCII);
        return ids.find(b, 0, b.length);
    }
}
