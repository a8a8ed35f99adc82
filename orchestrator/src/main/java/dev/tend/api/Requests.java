package dev.tend.api;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonMappingException;
import dev.tend.api.auth.Caller;
import dev.tend.shared.Id;
import dev.tend.shared.InvalidInputException;
import dev.tend.shared.Problem;
import dev.tend.shared.wire.Rfc3339;
import io.javalin.http.Context;

import java.time.Instant;
import java.util.stream.Collectors;

/** Reading requests: the caller, the client address, typed bodies and query parameters, each validated. */
final class Requests {
    static final String CALLER = "tend.caller";
    private static final String BODY = "request body";

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

    /** The JSON body as {@code type}; an empty body is an empty object. */
    static <T> T body(Context ctx, Class<T> type) {
        String text = ctx.body();
        if (text.isBlank()) text = "{}";
        try {
            return ApiJson.MAPPER.readValue(text, type);
        } catch (JsonMappingException e) {
            JsonLocation at = e.getLocation();
            String field = e.getPath().stream().map(r -> r.getFieldName() == null ? "[" + r.getIndex() + "]" : r.getFieldName())
                    .collect(Collectors.joining("."));
            throw new InvalidInputException(Problem.at(BODY, at == null ? 0 : Math.max(0, at.getLineNr()),
                    at == null ? 0 : Math.max(0, at.getColumnNr()), field,
                    (field.isEmpty() ? "" : field + ": ") + "cannot be read: " + e.getOriginalMessage()));
        } catch (JsonProcessingException e) {
            JsonLocation at = e.getLocation();
            throw new InvalidInputException(Problem.at(BODY, at == null ? 0 : Math.max(0, at.getLineNr()),
                    at == null ? 0 : Math.max(0, at.getColumnNr()), "", "the body is not JSON: " + e.getOriginalMessage()));
        }
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
