package dev.tend.api.view;

import com.fasterxml.jackson.annotation.JsonInclude;

import java.util.List;

/**
 * Every error answer of the API.
 *
 * @param error      a stable code: unauthenticated, forbidden, not-found, invalid-input, refused, unavailable, failed
 * @param message    a sentence a person understands
 * @param roleNeeded with {@code forbidden}: the role the route needs
 * @param problems   with {@code invalid-input}: each problem, located where that makes sense
 */
@JsonInclude(JsonInclude.Include.NON_NULL)
public record ErrorBody(String error, String message, String roleNeeded, List<LineProblem> problems) {
    public static ErrorBody of(String error, String message) {
        return new ErrorBody(error, message, null, null);
    }
}
