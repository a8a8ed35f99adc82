package dev.tend.playbooks;

import java.math.BigDecimal;
import java.math.RoundingMode;

/** Decimal arithmetic on impaired-fraction, so that a fraction written 0.3 means exactly 3/10. */
public final class ImpairedShare {
    private ImpairedShare() {
    }

    /** floor(fraction * nodes), with the fraction read as the decimal it was written as. */
    public static int allowed(double fraction, int nodes) {
        return BigDecimal.valueOf(fraction).multiply(BigDecimal.valueOf(nodes)).setScale(0, RoundingMode.FLOOR).intValueExact();
    }

    /** The fraction as written, without trailing zeros: {@code 0.34}, {@code 1}. */
    public static String format(double fraction) {
        return BigDecimal.valueOf(fraction).stripTrailingZeros().toPlainString();
    }
}
