package dev.tend.api;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.exc.MismatchedInputException;
import io.javalin.http.HttpResponseException;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonMappingException;
import dev.tend.api.auth.Caller;
import dev.tend.shared.Id;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.wire.Rfc3339;
import io.javalin.http.Context;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.stream.Collectors;

/** Reading requests: the caller, the client address, typed bodies and query parameters, each validated. */
final class Requests {
    static final String CALLER = "tend.caller";
    private static final String BODY = "request body";
    /** Reads bodies as trees, refusing a field given twice. */
    private static final ObjectMapper STRICT = new ObjectMapper().enable(JsonParser.Feature.STRICT_DUPLICATE_DETECTION);

    private Requests() {
    }

    /** The caller the access check let through. */
    static Caller caller(Context ctx) {
        Caller c = ctx.attribute(CALLER);
        if (c == null) throw new IllegalStateException("route " + ctx.matchedPath() + " was reached without an access check");
        return c;
    }

    /** Where the request came from, as the ledger records it: the peer's address (no forwarding header is trusted). */
    static String from(Context ctx) {
        return ctx.ip();
    }

    /**
     * The body as text, at most {@link ApiServer#MAX_BODY} bytes whether its length is
     * declared or it comes in chunks; a larger body is a 413 (read no further than the cap).
     */
    static String bodyText(Context ctx) {
        long declared = ctx.req().getContentLengthLong();
        if (declared > ApiServer.MAX_BODY) throw tooLarge(declared);
        try (InputStream in = ctx.req().getInputStream()) {
            if (declared >= 0) {
                // the declared length, read into an array of that size (reading up to the cap
                // allocated and copied 8 KB chunks for a body of 200 bytes)
                byte[] bytes = new byte[(int) declared];
                int n = in.readNBytes(bytes, 0, bytes.length);
                if (n < bytes.length) throw invalid("", "the request body ended after " + n + " of its " + declared + " declared bytes");
                return new String(bytes, StandardCharsets.UTF_8);
            }
            byte[] bytes = in.readNBytes((int) ApiServer.MAX_BODY + 1);
            if (bytes.length > ApiServer.MAX_BODY) throw tooLarge(-1);
            return new String(bytes, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw invalid("", "the request body could not be read to its end: " + e.getMessage());
        }
    }

    private static HttpResponseException tooLarge(long declared) {
        return new HttpResponseException(413, "the request body is larger than " + (ApiServer.MAX_BODY >> 20)
                + " MiB" + (declared > 0 ? " (" + declared + " bytes declared)" : "") + "; send it in smaller requests");
    }

    /**
     * The JSON body as {@code type}: it must be one JSON object (an empty body counts as an
     * empty one) with each field once; every problem is a plain sentence that names the
     * field and never a class of the server.
     */
    static <T> T body(Context ctx, Class<T> type) {
        String text = bodyText(ctx);
        if (text.isBlank()) text = "{}";
        JsonNode tree;
        try (JsonParser p = STRICT.createParser(text)) {
            tree = STRICT.readTree(p);
            if (p.nextToken() != null) {
                throw new InvalidInputException(Problem.at(BODY, p.currentLocation().getLineNr(), p.currentLocation().getColumnNr(), "",
                        "the body must be one JSON object; more follows after it"));
            }
        } catch (JsonProcessingException e) {
            JsonLocation at = e.getLocation();
            throw new InvalidInputException(Problem.at(BODY, at == null ? 0 : Math.max(0, at.getLineNr()),
                    at == null ? 0 : Math.max(0, at.getColumnNr()), "", "the body is not JSON: " + plain(e.getOriginalMessage())));
        } catch (IOException e) {
            throw invalid("", "the request body could not be read: " + e.getMessage());
        }
        if (tree == null || !tree.isObject()) {
            throw invalid("", "the body must be a JSON object like {\"reason\": \"...\"}, got " + kind(tree));
        }
        try {
            return ApiJson.MAPPER.treeToValue(tree, type);
        } catch (JsonProcessingException e) {
            String field = e instanceof JsonMappingException m ? m.getPath().stream()
                    .map(r -> r.getFieldName() == null ? "[" + r.getIndex() + "]" : r.getFieldName())
                    .collect(Collectors.joining(".")) : "";
            String expected = e instanceof MismatchedInputException mi && mi.getTargetType() != null
                    ? expectedKind(mi.getTargetType()) : null;
            String sentence = expected != null ? "must be " + expected
                    : e.getCause() instanceof IllegalArgumentException iae && iae.getMessage() != null ? plain(iae.getMessage())
                    : "has a value that cannot be read here";
            throw invalid(field, (field.isEmpty() ? "the body " : "field '" + field + "' ") + sentence);
        }
    }

    /** What a person calls the JSON that a Java type is read from. */
    private static String expectedKind(Class<?> t) {
        if (t == String.class) return "a string";
        if (t == Instant.class) return "an RFC 3339 time like 2027-03-14T22:00:00Z";
        if (Number.class.isAssignableFrom(t) || t.isPrimitive() && t != boolean.class) return "a number";
        if (t == Boolean.class || t == boolean.class) return "true or false";
        if (java.util.Collection.class.isAssignableFrom(t) || t.isArray()) return "a list";
        return "an object";
    }

    private static String kind(JsonNode n) {
        if (n == null || n.isNull() || n.isMissingNode()) return "null";
        if (n.isArray()) return "a list";
        if (n.isTextual()) return "a string";
        if (n.isNumber()) return "a number";
        if (n.isBoolean()) return "true or false";
        return "something else";
    }

    /** A parser's sentence without the names of Java types (quoted in backticks) it may carry. */
    static String plain(String message) {
        if (message == null) return "it cannot be read";
        return message.replaceAll("`[A-Za-z0-9_.$\\[\\]]+`", "a value").replaceAll("\\s*\\n.*", "");
    }

    /** A required, non-blank text field of a body, at most {@code max} characters. */
    static String text(String value, String field, int max) {
        if (value == null || value.isBlank()) throw invalid(field, field + " is required");
        if (value.length() > max) throw invalid(field, field + " must be at most " + max + " characters, got " + value.length());
        return value;
    }

    /** An optional text field: null stays null, else as {@link #text}. */
    static String optionalText(String value, String field, int max) {
        return value == null ? null : text(value, field, max);
    }

    static Id id(String value, String field) {
        if (value == null) throw invalid(field, field + " is required");
        if (!Id.isValid(value)) throw invalid(field, field + ": " + Id.describeInvalid(value));
        return Id.of(value);
    }

    /** An RFC 3339 query parameter, or null when absent. */
    static Instant time(Context ctx, String name) {
        String v = ctx.queryParam(name);
        if (v == null || v.isEmpty()) return null;
        try {
            return Rfc3339.parse(v);
        } catch (IllegalArgumentException e) {
            throw invalid(name, name + " must be an RFC 3339 time like 2027-03-14T22:00:00Z, got '" + v + "'");
        }
    }

    /** An optional query parameter that must be an id when present. */
    static String idParam(Context ctx, String name) {
        String v = ctx.queryParam(name);
        if (v == null || v.isEmpty()) return null;
        return id(v, name).value();
    }

    static int limit(Context ctx, int dflt, int max) {
        String v = ctx.queryParam("limit");
        if (v == null || v.isEmpty()) return dflt;
        try {
            int n = Integer.parseInt(v);
            if (n >= 1 && n <= max) return n;
        } catch (NumberFormatException ignored) {
            // answered below
        }
        throw invalid("limit", "limit must be a whole number from 1 to " + max + ", got '" + v + "'");
    }

    static boolean flag(Context ctx, String name) {
        String v = ctx.queryParam(name);
        if (v == null || v.isEmpty() || v.equals("false")) return false;
        if (v.equals("true")) return true;
        throw invalid(name, name + " must be true or false, got '" + v + "'");
    }

    static InvalidInputException invalid(String field, String message) {
        return new InvalidInputException(Problem.at("request", 0, 0, field, message));
    }
}
