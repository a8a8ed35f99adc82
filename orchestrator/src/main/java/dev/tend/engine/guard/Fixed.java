package dev.tend.engine.guard;

import java.math.BigDecimal;
import java.math.RoundingMode;

/**
 * A number with a fixed count of decimals, as {@code String.format(Locale.ROOT, "%.Nf", x)}
 * writes it (the shortest decimal digits of {@code x}, rounded half up), without a Formatter:
 * guards write such numbers into their objections at every decision they hold, and the
 * Formatter was a visible share of a replay's time.
 */
final class Fixed {
    private Fixed() {
    }

    /** {@code x} (finite) with {@code places} decimals. */
    static String of(double x, int places) {
        if (!Double.isFinite(x)) throw new IllegalArgumentException("not a finite number: " + x);
        String s = new BigDecimal(Double.toString(x)).setScale(places, RoundingMode.HALF_UP).toPlainString();
        // the Formatter keeps the sign of a negative number that rounds to zero, as BigDecimal does not
        return x < 0 && s.charAt(0) != '-' ? "-" + s : s;
    }
}
