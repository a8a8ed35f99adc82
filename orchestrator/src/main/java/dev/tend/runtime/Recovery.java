package dev.tend.runtime;

/**
 * What {@link Orchestrator#recover()} found.
 *
 * @param snapshotSeq    the journal seq of the snapshot started from; 0 when the whole journal was replayed
 * @param inputsReplayed journaled inputs replayed (after the snapshot, if any)
 */
public record Recovery(long snapshotSeq, long inputsReplayed, int timersArmed, int callsAskedAgain, int callsUnknown) {
    /** One line for a person: where the engine came from. */
    public String describe() {
        return (snapshotSeq > 0 ? "snapshot at journal seq " + snapshotSeq + " loaded, " : "") + inputsReplayed
                + " journaled inputs replayed, " + timersArmed + " timers armed, " + callsAskedAgain
                + " calls asked again by key, " + callsUnknown + " runs stopped for a person";
    }
}
