package dev.tend.audit;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * A checkpoint entry of the ledger: it covers the entry just before it (its seq and hash)
 * with an HMAC-SHA-256 under the {@link LedgerKey}. Whoever rewrites the ledger and
 * recomputes every hash cannot recompute these without the key.
 *
 * @param coversSeq  the seq of the entry covered: the one before the checkpoint
 * @param coversHash that entry's hash
 * @param keyId      the {@link LedgerKey#id()} of the key it was made with
 * @param hmac       HMAC-SHA-256 of {@link #message}, hex
 */
public record Checkpoint(long coversSeq, String coversHash, String keyId, String hmac) {
    public static final String KIND = dev.tend.engine.LedgerKind.CHECKPOINT.wire();
    private static final ObjectMapper JSON = new ObjectMapper();

    /** What is signed: a fixed label, so a checkpoint's HMAC can never be taken for another's. */
    static String message(long seq, String hash) {
        return "tend-ledger-checkpoint:" + seq + ":" + hash;
    }

    static Checkpoint make(LedgerKey key, long seq, String hash) {
        return new Checkpoint(seq, hash, key.id(), key.sign(seq, hash));
    }

    /** The ledger fields of this checkpoint. */
    Map<String, Object> fields() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("covers_seq", coversSeq);
        m.put("covers_hash", coversHash);
        m.put("key_id", keyId);
        m.put("hmac", hmac);
        return m;
    }

    /** The checkpoint an entry's text holds, or null when its fields are missing or of the wrong kind. */
    static Checkpoint parse(String entryText) {
        try {
            JsonNode n = JSON.readTree(entryText);
            JsonNode seq = n.get("covers_seq"), hash = n.get("covers_hash"), id = n.get("key_id"), mac = n.get("hmac");
            if (seq == null || !seq.canConvertToLong() || hash == null || !hash.isTextual() || id == null || !id.isTextual()
                    || mac == null || !mac.isTextual()) {
                return null;
            }
            return new Checkpoint(seq.asLong(), hash.asText(), id.asText(), mac.asText());
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            return null;
        }
    }
}
