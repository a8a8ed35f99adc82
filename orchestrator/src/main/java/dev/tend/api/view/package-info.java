/**
 * The JSON bodies of the HTTP API (version 1), as immutable records. The server writes
 * them and the CLI front ends read them, with {@link dev.tend.api.ApiJson#MAPPER}: field
 * names in snake_case, times in RFC 3339 (UTC), absent values as null.
 */
package dev.tend.api.view;
