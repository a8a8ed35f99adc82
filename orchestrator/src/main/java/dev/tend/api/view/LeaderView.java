package dev.tend.api.view;

/**
 * Which instance leads, as this instance sees it (instances sharing a PostgreSQL store).
 *
 * @param role        {@code leader} or {@code standby}: this instance's part
 * @param instance    this instance's name
 * @param epoch       the lease's epoch (rises at every takeover); 0 before any instance led
 * @param leader      the name of the instance that holds the lease, or null while none does
 * @param leaderUrl   where the leader's API answers, or null
 * @param journalLag  journaled inputs this standby has not read yet (0 on the leader)
 */
public record LeaderView(String role, String instance, long epoch, String leader, String leaderUrl, long journalLag) {
}
