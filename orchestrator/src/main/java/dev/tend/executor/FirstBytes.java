package dev.tend.executor;

import java.io.ByteArrayOutputStream;
import java.net.http.HttpResponse;
import java.nio.ByteBuffer;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.util.List;
import java.util.concurrent.Flow;

/**
 * Keeps the first {@code limit} bytes of a response body and reads past the rest, so that
 * a large answer neither fills memory nor stalls the connection.
 */
final class FirstBytes implements Flow.Subscriber<List<ByteBuffer>> {
    private final ByteArrayOutputStream kept = new ByteArrayOutputStream();
    private final int limit;

    private FirstBytes(int limit) {
        this.limit = limit;
    }

    static HttpResponse.BodySubscriber<byte[]> subscriber(int limit) {
        FirstBytes f = new FirstBytes(limit);
        return HttpResponse.BodySubscribers.fromSubscriber(f, s -> s.kept.toByteArray());
    }

    /** The bytes as UTF-8 text; a character cut at the limit becomes U+FFFD. */
    static String text(byte[] bytes) {
        try {
            return StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPLACE)
                    .onUnmappableCharacter(CodingErrorAction.REPLACE).decode(ByteBuffer.wrap(bytes)).toString();
        } catch (java.nio.charset.CharacterCodingException e) {
            throw new IllegalStateException("a replacing decoder does not throw", e);
        }
    }

    @Override
    public void onSubscribe(Flow.Subscription subscription) {
        subscription.request(Long.MAX_VALUE);
    }

    @Override
    public void onNext(List<ByteBuffer> items) {
        for (ByteBuffer b : items) {
            int room = limit - kept.size();
            if (room <= 0) return;
            int n = Math.min(room, b.remaining());
            byte[] chunk = new byte[n];
            b.get(chunk);
            kept.write(chunk, 0, n);
        }
    }

    @Override
    public void onError(Throwable throwable) {
        // the response future fails with it; what was kept is not used then
    }

    @Override
    public void onComplete() {
        // nothing to flush: the bytes are in memory
    }
}
