package dev.tend.api.view;

/** A body carrying only a reason: brake engage and release, reject, abort. */
public record ReasonRequest(String reason) {
}
