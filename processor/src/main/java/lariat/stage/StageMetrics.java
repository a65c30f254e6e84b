package lariat.stage;

import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.atomic.DoubleAdder;
import java.util.concurrent.atomic.LongAdder;

/**
 * The stage's counters and gauges, rendered in the Prometheus text exposition format
 * (version 0.0.4: {@code # HELP}, {@code # TYPE}, then {@code name{label="value"} number} lines).
 * Thread-safe: the loop thread writes, the HTTP thread reads.
 */
public final class StageMetrics {

    private final LongAdder recordsIn = new LongAdder();
    private final LongAdder recordsAccepted = new LongAdder();
    private final Map<String, LongAdder> rejectedByReason = new ConcurrentHashMap<>();
    private final LongAdder skipped = new LongAdder();
    private final LongAdder refits = new LongAdder();
    private final DoubleAdder refitSeconds = new DoubleAdder();
    private final LongAdder refitsFailed = new LongAdder();
    private final LongAdder versionsPublished = new LongAdder();
    private final LongAdder alerts = new LongAdder();
    private final LongAdder committed = new LongAdder();
    private final DoubleAdder commitSeconds = new DoubleAdder();
    private final LongAdder aborted = new LongAdder();
    private final LongAdder fatalRecoveries = new LongAdder();
    private final DoubleAdder restoreSeconds = new DoubleAdder();
    private final LongAdder restores = new LongAdder();
    private final LongAdder snapshotBytes = new LongAdder();
    private final LongAdder snapshotsIncomplete = new LongAdder();
    private final LongAdder restoreOffsetMismatches = new LongAdder();
    private final LongAdder keysOnTwoPartitions = new LongAdder();
    private final LongAdder keyClaimConflicts = new LongAdder();
    private final AtomicLong keyClaims = new AtomicLong();
    private final AtomicLong lag = new AtomicLong();
    private final AtomicLong keys = new AtomicLong();

    /** Counts one consumed input record, good or bad. */
    public void recordIn() {
        recordsIn.increment();
    }

    /** Counts one record that reached a key's moments. */
    public void recordAccepted() {
        recordsAccepted.increment();
    }

    /** Counts one dead-lettered record under its reason. */
    public void rejected(String reason) {
        rejectedByReason.computeIfAbsent(reason, r -> new LongAdder()).increment();
    }

    /** Counts one record skipped by the missing-channel policy. */
    public void skipped() {
        skipped.increment();
    }

    /** Counts one refit that took {@code seconds}. */
    public void refit(double seconds) {
        refits.increment();
        refitSeconds.add(seconds);
    }

    /** Counts one refit that threw. */
    public void refitFailed() {
        refitsFailed.increment();
    }

    public void versionPublished() {
        versionsPublished.increment();
    }

    public void alertPublished() {
        alerts.increment();
    }

    /**
     * Counts one committed transaction whose commit took {@code seconds}: from beginning the
     * transaction to the return of {@code commitTransaction} (sending the cycle's records and
     * offsets, then committing), the time the polling thread does not read input.
     */
    public void transactionCommitted(double seconds) {
        committed.increment();
        commitSeconds.add(seconds);
    }

    /** Wall seconds spent committing transactions so far ({@link #transactionCommitted(double)}). */
    public double commitSeconds() {
        return commitSeconds.sum();
    }

    public void transactionAborted() {
        aborted.increment();
    }

    public void fatalRecovery() {
        fatalRecoveries.increment();
    }

    /** Counts one restore of assigned partitions that took {@code seconds}. */
    public void restored(double seconds) {
        restores.increment();
        restoreSeconds.add(seconds);
    }

    public void snapshotBytes(long bytes) {
        snapshotBytes.add(bytes);
    }

    /**
     * Counts one partition restored from a snapshot whose position differed from the committed offset:
     * the moments then miss, or fold in twice, the records in between.
     */
    public void restoreOffsetMismatch() {
        restoreOffsetMismatches.increment();
    }

    /** Partitions restored with a snapshot position other than the committed offset, so far. */
    public long restoreOffsetMismatches() {
        return restoreOffsetMismatches.sum();
    }

    public void snapshotIncomplete() {
        snapshotsIncomplete.increment();
    }

    public void keyOnTwoPartitions() {
        keysOnTwoPartitions.increment();
    }

    /**
     * Counts one key dropped from a partition of this instance because the claims topic shows that
     * another partition claimed it first.
     */
    public void keyClaimConflict() {
        keyClaimConflicts.increment();
    }

    /** Sets the number of key claims read from the claims topic. */
    public void keyClaims(long count) {
        keyClaims.set(count);
    }

    /** Keys dropped because another partition claimed them first. */
    public long keyClaimConflicts() {
        return keyClaimConflicts.sum();
    }

    /** Key claims read from the claims topic. */
    public long keyClaims() {
        return keyClaims.get();
    }

    /** Sets the summed consumer lag over assigned partitions, in records. */
    public void lag(long records) {
        lag.set(records);
    }

    /** Sets the number of keys held in memory. */
    public void keys(long count) {
        keys.set(count);
    }

    public long transactionsCommitted() {
        return committed.sum();
    }

    public long transactionsAborted() {
        return aborted.sum();
    }

    public long recordsIn() {
        return recordsIn.sum();
    }

    /** Rejected count for one reason (0 when never seen). */
    public long rejectedCount(String reason) {
        LongAdder a = rejectedByReason.get(reason);
        return a == null ? 0 : a.sum();
    }

    /** The Prometheus text exposition of every metric. */
    public String render() {
        StringBuilder out = new StringBuilder(2048);
        counter(out, "lariat_records_in_total", "Input records consumed, good or bad.", recordsIn.sum());
        counter(out, "lariat_records_accepted_total", "Input records added to a key's moments.",
                recordsAccepted.sum());
        out.append("# HELP lariat_records_rejected_total Input records sent to the dead-letter topic, by reason.\n")
                .append("# TYPE lariat_records_rejected_total counter\n");
        for (Map.Entry<String, LongAdder> e : new TreeMap<>(rejectedByReason).entrySet()) {
            out.append("lariat_records_rejected_total{reason=\"").append(escape(e.getKey())).append("\"} ")
                    .append(e.getValue().sum()).append('\n');
        }
        counter(out, "lariat_records_skipped_total", "Input records skipped by the missing-channel policy.",
                skipped.sum());
        counter(out, "lariat_refits_total", "Path refits computed.", refits.sum());
        counter(out, "lariat_refit_seconds_total", "Wall seconds spent in refits.", refitSeconds.sum());
        counter(out, "lariat_refits_failed_total", "Refits that failed; the key published nothing then.",
                refitsFailed.sum());
        counter(out, "lariat_versions_published_total", "Model versions sent in committed or open transactions.",
                versionsPublished.sum());
        counter(out, "lariat_alerts_total", "Change alerts sent.", alerts.sum());
        counter(out, "lariat_transactions_committed_total", "Transactions committed.", committed.sum());
        counter(out, "lariat_commit_seconds_total", "Wall seconds from beginning a transaction to its commit "
                + "returning (sends, offsets, commit), committed transactions only.", commitSeconds.sum());
        counter(out, "lariat_transactions_aborted_total", "Transactions aborted.", aborted.sum());
        counter(out, "lariat_fatal_recoveries_total", "Client re-creations after a fatal error.",
                fatalRecoveries.sum());
        counter(out, "lariat_restores_total", "Partition restores from the snapshot topic.", restores.sum());
        counter(out, "lariat_restore_seconds_total", "Wall seconds spent restoring from snapshots.",
                restoreSeconds.sum());
        counter(out, "lariat_snapshot_bytes_total", "Snapshot state bytes written.", snapshotBytes.sum());
        counter(out, "lariat_snapshots_incomplete_total", "Snapshots skipped on restore as incomplete.",
                snapshotsIncomplete.sum());
        counter(out, "lariat_restore_offset_mismatches_total", "Partitions restored from a snapshot whose position "
                + "differed from the committed offset (offsets moved on purpose, or the snapshot still hidden after "
                + "restore.timeout.ms); their moments miss or repeat the records in between.",
                restoreOffsetMismatches.sum());
        counter(out, "lariat_keys_on_two_partitions_total", "Records whose key lives on, or is owned by, another "
                + "partition.",
                keysOnTwoPartitions.sum());
        counter(out, "lariat_key_claim_conflicts_total", "Keys dropped from a partition of this instance because "
                + "the claims topic shows another partition claimed them first.", keyClaimConflicts.sum());
        gauge(out, "lariat_key_claims", "Key claims read from the claims topic (model key and input partition pairs).",
                keyClaims.get());
        gauge(out, "lariat_consumer_lag_records", "Summed lag of the assigned input partitions.", lag.get());
        gauge(out, "lariat_keys", "Model keys held in memory.", keys.get());
        return out.toString();
    }

    private static void counter(StringBuilder out, String name, String help, double value) {
        metric(out, name, help, "counter", value);
    }

    private static void gauge(StringBuilder out, String name, String help, double value) {
        metric(out, name, help, "gauge", value);
    }

    private static void metric(StringBuilder out, String name, String help, String type, double value) {
        out.append("# HELP ").append(name).append(' ').append(help).append('\n')
                .append("# TYPE ").append(name).append(' ').append(type).append('\n')
                .append(name).append(' ').append(format(value)).append('\n');
    }

    private static String format(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : Double.toString(v);
    }

    private static String escape(String s) {
        return s.replace("\\", "\\\\").replace("\"", "\\\"").replace("\n", "\\n");
    }
}
