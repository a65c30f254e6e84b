package lariat.stage;

import lariat.codec.ChannelLayout;
import lariat.codec.KeyLayouts;
import org.apache.kafka.clients.consumer.CloseOptions;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.consumer.ConsumerRebalanceListener;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.ConsumerRecords;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.KafkaException;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.errors.InterruptException;
import org.apache.kafka.common.errors.RetriableException;
import org.apache.kafka.common.errors.TimeoutException;
import org.apache.kafka.common.errors.WakeupException;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Collection;
import java.util.Collections;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.OptionalLong;
import java.util.Set;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;

/**
 * The stage's loop: Kafka's consume-transform-produce pattern with one transaction per cycle.
 *
 * <p>A cycle polls until the consumer has caught up with its partitions or {@code cycle.interval.ms}
 * of wall time has passed, routing each record to its key's moments or to a dead letter; then it refits every
 * key whose refit is due, and in one transaction sends the model versions, alerts, dead
 * letters, a snapshot of every key that changed (plus each partition's position marker) and
 * the consumed offsets with the consumer's group metadata. Wall time only decides when a cycle
 * ends; what a refit computes depends only on the key's records.
 *
 * <p>Each cycle also reads the claims topic without waiting ({@link ClaimLog}, {@link KeyClaims}) and
 * its transaction claims every held key whose (key, partition) pair has no claim yet. A new key whose
 * earliest claim names another partition is a dead letter; a held key that another partition turns out
 * to have claimed first (two instances started it at about the same time) is dropped and its snapshot
 * tombstoned, so its later records there are dead letters too.
 *
 * <p>Failures are handled in three places: a bad record becomes a dead letter in
 * {@link #route}; an abortable client error aborts the transaction and restores the assigned
 * partitions from their snapshots ({@link #recoverAbortable}); a fatal one closes both clients
 * and creates new ones ({@link #recoverFatal}). Rebalances drop revoked partitions and restore
 * assigned ones before any of their records is processed.
 *
 * <p>Not thread-safe, except {@link #shutdown()}, {@link #live()} and {@link #ready()}.
 */
public final class Stage implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger(Stage.class);
    private static final Duration IDLE_POLL = Duration.ofMillis(200);
    private static final long REOPEN_BACKOFF_MIN_MS = 500;
    private static final long REOPEN_BACKOFF_MAX_MS = 5_000;
    /** Longest single wait for committed offsets during a restore. */
    static final long COMMITTED_ATTEMPT_MS = 5_000;

    private final StageSettings s;
    private final Refitter refitter;
    private final ClientFactory clients;
    private final StageMetrics metrics;
    private final PartitionStates states = new PartitionStates();
    private final Map<Integer, PartitionWork> work = new LinkedHashMap<>();
    private final Map<Integer, KeyLayouts> layouts = new HashMap<>();
    private final RecordRouter router;
    private final Set<TopicPartition> assigned = new HashSet<>();
    private final CountDownLatch stopped = new CountDownLatch(1);
    private volatile boolean stopping;
    private volatile boolean live;
    private volatile boolean ready;
    private boolean inTransaction;
    private volatile int metricsPort = -1;
    private volatile java.util.function.Consumer<Map<TopicPartition, OffsetAndMetadata>> commitListener = o -> { };
    private Consumer<byte[], byte[]> consumer;
    private Consumer<byte[], byte[]> restoreConsumer;
    private Producer<byte[], byte[]> producer;
    private SnapshotReader reader;

    private final KeyClaims claims;
    private Consumer<byte[], byte[]> claimConsumer;
    private ClaimLog claimLog;

    /** Offsets (-1: no record read), dead letters and snapshot tombstones of one partition in the open cycle. */
    private static final class PartitionWork {
        long nextOffset = -1;
        final List<ProducerRecord<byte[], byte[]>> deadLetters = new ArrayList<>();
        final List<ProducerRecord<byte[], byte[]>> tombstones = new ArrayList<>();
    }

    Stage(StageSettings settings, String targetName, InputDecoder decoder, Refitter refitter, ClientFactory clients,
          StageMetrics metrics) {
        this.s = settings;
        this.claims = new KeyClaims(settings.claimTopic());
        this.router = new RecordRouter(targetName, decoder, settings, claims);
        this.refitter = refitter;
        this.clients = clients;
        this.metrics = metrics;
    }

    /** Whether the loop thread is running. */
    public boolean live() {
        return live;
    }

    /** Whether every assigned partition has been restored and the loop is processing. */
    public boolean ready() {
        return ready;
    }

    /** Longest wait for the clients to close on shutdown, in ms. */
    public long closeTimeoutMs() {
        return s.closeTimeoutMs();
    }

    /** The bound metrics port, or -1 when there is no endpoint (yet). */
    public int metricsPort() {
        return metricsPort;
    }

    public StageMetrics metrics() {
        return metrics;
    }

    /**
     * Sets what is told, on the loop thread right after each committed transaction, the input
     * offsets that transaction committed (an unmodifiable map; only partitions read in that cycle).
     * Replaces any earlier listener; set it before {@link #run()}. A listener must be quick and
     * must not throw.
     *
     * @throws IllegalArgumentException if {@code listener} is null
     */
    public void onCommit(java.util.function.Consumer<Map<TopicPartition, OffsetAndMetadata>> listener) {
        if (listener == null) {
            throw new IllegalArgumentException("listener must not be null");
        }
        commitListener = listener;
    }

    /**
     * Runs until {@link #shutdown()}: creates missing topics (refusing ill-fitting ones),
     * creates the clients and loops over cycles.
     *
     * @throws TopicSetup.TopicMismatchException when a topic does not fit
     */
    public void run() throws InterruptedException {
        live = true;
        MetricsServer server = null;
        try {
            if (s.metricsPort() >= 0) {
                try {
                    server = MetricsServer.start(s.metricsPort(), metrics, this::live, this::ready);
                    metricsPort = server.port();
                    LOG.info("metrics on port {}", metricsPort);
                } catch (IOException e) {
                    throw new IllegalStateException("metrics.port " + s.metricsPort() + " cannot be bound: " + e, e);
                }
            }
            try (var admin = clients.admin()) {
                new TopicSetup(admin, s).ensure();
            }
            openClients();
            while (!stopping) {
                runOneCycle();
            }
        } finally {
            closeClients(Duration.ofMillis(s.closeTimeoutMs()));
            live = false;
            ready = false;
            if (server != null) {
                server.close();
            }
            stopped.countDown();
        }
    }

    /** Asks the loop to finish its cycle and close; returns at once. Safe from any thread. */
    public void shutdown() {
        stopping = true;
        Consumer<byte[], byte[]> c = consumer;
        if (c != null) {
            c.wakeup();
        }
    }

    /** Waits up to {@code timeoutMs} for {@link #run()} to return. */
    public boolean awaitStopped(long timeoutMs) throws InterruptedException {
        return stopped.await(timeoutMs, TimeUnit.MILLISECONDS);
    }

    @Override
    public void close() {
        shutdown();
    }

    private void runOneCycle() {
        boolean committing = false;
        try {
            readClaims();
            pollCycle();
            committing = true;
            commitCycle();
        } catch (WakeupException e) {
            if (!stopping) {
                throw e;
            }
            finishOnShutdown();
        } catch (InterruptException e) {
            stopping = true;
            Thread.currentThread().interrupt();
        } catch (KafkaException e) {
            FailureKind kind = FailureKind.of(e, committing);
            LOG.warn("cycle failed ({}): {}", kind, e.toString());
            if (kind == FailureKind.ABORTABLE) {
                recoverAbortable();
            } else {
                recoverFatal();
            }
        }
    }

    /**
     * Applies the claims read since the last cycle, then drops each held key that another partition
     * claimed first: one WARN and one count per key and partition, its snapshot tombstoned in this
     * cycle's transaction, and the router makes its later records there dead letters.
     */
    private void readClaims() {
        claimLog.poll();
        metrics.keyClaims(claims.size());
        List<KeyState> dropped = claims.ownedElsewhere(states.all());
        for (KeyState k : dropped) {
            KeyClaims.Claim owner = claims.owner(k.modelKey());
            if (claims.firstReport(k.modelKey(), k.partition())) {
                metrics.keyClaimConflict();
                LOG.warn("model key '{}' is held on input partition {} but input partition {} claimed it first "
                        + "({}); its state on partition {} is dropped and its records there become dead letters: "
                        + "the input must be partitioned by model key", k.modelKey(), k.partition(), owner.partition,
                        owner, k.partition());
            }
            states.remove(k);
            KeyLayouts l = layouts.get(k.partition());
            if (l != null) {
                l.remove(k.modelKey());
            }
            PartitionWork w = work.computeIfAbsent(k.partition(), p -> new PartitionWork());
            for (SnapshotFormat.Entry e : SnapshotFormat.tombstones(k.modelKey(), k.chunkCount())) {
                w.tombstones.add(new ProducerRecord<>(s.snapshotTopic(), k.partition(), e.key(), e.value()));
            }
        }
        if (!dropped.isEmpty()) {
            metrics.keys(states.size());
        }
    }

    /**
     * Polls and routes until {@code cycle.interval.ms} of wall time has passed, or earlier once the
     * consumer has caught up: a poll returned nothing and no assigned partition has records beyond
     * the position ({@link #caughtUp}). An empty poll while records are still waiting only means the
     * next fetch has not arrived, so the cycle goes on with a poll that returns as soon as it does;
     * under a backlog a cycle therefore lasts the configured interval instead of one fetch.
     */
    private void pollCycle() {
        long start = System.nanoTime();
        long budget = TimeUnit.MILLISECONDS.toNanos(s.cycleIntervalMs());
        Duration wait = IDLE_POLL;
        while (!stopping) {
            ConsumerRecords<byte[], byte[]> batch = consumer.poll(wait);
            for (ConsumerRecord<byte[], byte[]> r : batch) {
                route(r);
            }
            long left = budget - (System.nanoTime() - start);
            if (left <= 0 || (batch.isEmpty() && caughtUp())) {
                return;
            }
            wait = batch.isEmpty() ? Duration.ofNanos(Math.min(left, IDLE_POLL.toNanos())) : Duration.ZERO;
        }
    }

    /**
     * Whether no assigned partition is known to hold records beyond the consumer's position (the lag
     * of the last fetch: last stable offset minus position under read_committed); a partition whose
     * lag is not known counts as caught up.
     */
    private boolean caughtUp() {
        for (TopicPartition tp : assigned) {
            OptionalLong lag = consumer.currentLag(tp);
            if (lag.isPresent() && lag.getAsLong() > 0) {
                return false;
            }
        }
        return true;
    }

    /** Skippable failures end here: a bad record becomes a dead letter, the moments untouched. */
    private void route(ConsumerRecord<byte[], byte[]> r) {
        metrics.recordIn();
        PartitionWork w = work.computeIfAbsent(r.partition(), p -> new PartitionWork());
        w.nextOffset = r.offset() + 1;
        KeyLayouts partitionLayouts = layouts.computeIfAbsent(r.partition(), p -> KeyLayouts.create());
        RecordRouter.Outcome o = router.route(states, partitionLayouts, r.partition(), r.offset(), r.key(),
                r.value(), r.timestamp());
        switch (o.kind) {
            case SKIPPED:
                metrics.skipped();
                break;
            case REJECTED:
                if (DeadLetters.KEY_ON_TWO_PARTITIONS.equals(o.reason)) {
                    metrics.keyOnTwoPartitions();
                    LOG.error("model key '{}' arrived on input partition {} but {}: the input must be "
                            + "partitioned by model key", o.key, r.partition(), o.detail);
                }
                reject(w, r, o.reason, o.detail, o.exceptionClass);
                break;
            default:
                metrics.recordAccepted();
                break;
        }
    }

    private void reject(PartitionWork w, ConsumerRecord<byte[], byte[]> r, String reason, String detail,
                        String exceptionClass) {
        metrics.rejected(reason);
        w.deadLetters.add(DeadLetters.of(s.deadLetterTopic(), r, reason, detail, exceptionClass));
    }

    private void commitCycle() {
        List<KeyState> unclaimed = claims.unclaimed(states.all());
        if (work.isEmpty() && unclaimed.isEmpty()) {
            updateLag();
            return;
        }
        List<ProducerRecord<byte[], byte[]>> out = new ArrayList<>();
        for (KeyState k : states.all()) {
            if (k.dirty() && k.refitDue(s.refitEveryRecords(), s.refitEveryEventMs())) {
                refit(k, out);
            }
        }
        long now = System.currentTimeMillis();
        for (KeyState k : unclaimed) {
            out.add(claimLog.claim(k, now));
        }
        long begin = System.nanoTime();
        producer.beginTransaction();
        inTransaction = true;
        for (ProducerRecord<byte[], byte[]> r : out) {
            producer.send(r);
        }
        Map<TopicPartition, OffsetAndMetadata> offsets = new HashMap<>();
        Map<KeyState, Integer> newChunkCounts = new HashMap<>();
        for (Map.Entry<Integer, PartitionWork> e : work.entrySet()) {
            int p = e.getKey();
            PartitionWork w = e.getValue();
            for (ProducerRecord<byte[], byte[]> dl : w.deadLetters) {
                producer.send(dl);
            }
            for (ProducerRecord<byte[], byte[]> r : w.tombstones) {
                producer.send(r);
            }
            for (KeyState k : states.of(p)) {
                if (k.dirty()) {
                    newChunkCounts.put(k, sendSnapshot(k));
                }
            }
            if (w.nextOffset >= 0) {
                SnapshotFormat.Entry marker = SnapshotFormat.offsetMarker(w.nextOffset);
                producer.send(new ProducerRecord<>(s.snapshotTopic(), p, marker.key(), marker.value()));
                offsets.put(new TopicPartition(s.inputTopic(), p), new OffsetAndMetadata(w.nextOffset));
            }
        }
        if (!offsets.isEmpty()) {
            producer.sendOffsetsToTransaction(offsets, consumer.groupMetadata());
        }
        producer.commitTransaction();
        inTransaction = false;
        metrics.transactionCommitted((System.nanoTime() - begin) / 1e9);
        for (KeyState k : unclaimed) {
            claims.sent(k.modelKey(), k.partition());
        }
        commitListener.accept(Collections.unmodifiableMap(offsets));
        for (Map.Entry<KeyState, Integer> e : newChunkCounts.entrySet()) {
            e.getKey().chunkCount(e.getValue());
            e.getKey().clean();
        }
        work.clear();
        metrics.keys(states.size());
        updateLag();
    }

    private void refit(KeyState k, List<ProducerRecord<byte[], byte[]>> out) {
        long t0 = System.nanoTime();
        try {
            out.addAll(refitter.refit(k));
        } catch (RuntimeException e) {
            metrics.refitFailed();
            LOG.error("refit of key '{}' failed; no version published for it this cycle", k.modelKey(), e);
        }
        k.refitted();
        metrics.refit((System.nanoTime() - t0) / 1e9);
    }

    private int sendSnapshot(KeyState k) {
        byte[] state = k.toBytes();
        List<SnapshotFormat.Entry> entries = SnapshotFormat.encode(k.modelKey(), k.count(), state,
                s.snapshotChunkBytes(), k.chunkCount());
        int chunks = 0;
        for (SnapshotFormat.Entry e : entries) {
            producer.send(new ProducerRecord<>(s.snapshotTopic(), k.partition(), e.key(), e.value()));
            if (e.value() != null && SnapshotFormat.kindOf(e.key()) == SnapshotFormat.Kind.CHUNK) {
                chunks++;
            }
        }
        metrics.snapshotBytes(state.length);
        return chunks;
    }

    private void updateLag() {
        long lag = 0;
        for (TopicPartition tp : assigned) {
            OptionalLong l = consumer.currentLag(tp);
            lag += l.orElse(0);
        }
        metrics.lag(lag);
    }

    /** Shutdown arrived mid-cycle: commit what was consumed, or abort if that fails. */
    private void finishOnShutdown() {
        try {
            commitCycle();
        } catch (KafkaException e) {
            LOG.warn("final commit on shutdown failed, aborting: {}", e.toString());
            abortIfOpen();
        }
    }

    private void recoverAbortable() {
        try {
            abortIfOpen();
        } catch (KafkaException e) {
            LOG.warn("abort failed; recreating clients: {}", e.toString());
            recoverFatal();
            return;
        }
        work.clear();
        try {
            restore(new ArrayList<>(assigned));
        } catch (KafkaException e) {
            LOG.warn("restore after abort failed; recreating clients: {}", e.toString());
            recoverFatal();
        }
    }

    private void abortIfOpen() {
        if (inTransaction) {
            inTransaction = false;
            metrics.transactionAborted();
            producer.abortTransaction();
        }
    }

    private void recoverFatal() {
        if (inTransaction) {
            inTransaction = false;
            metrics.transactionAborted();
        }
        metrics.fatalRecovery();
        work.clear();
        states.clear();
        layouts.clear();
        claims.clear();
        assigned.clear();
        ready = false;
        closeClients(Duration.ofMillis(s.closeTimeoutMs()));
        reopenClients();
    }

    /**
     * Opens new clients until it works or the stage is stopping. While the cluster cannot be
     * reached, {@code initTransactions} throws a retriable {@code TimeoutException} after
     * {@code max.block.ms}; letting it escape would end the stage during a broker outage, so it is
     * retried with a capped exponential backoff. A non-retriable error (e.g. authorization) still
     * ends the stage.
     */
    private void reopenClients() {
        long backoffMs = REOPEN_BACKOFF_MIN_MS;
        while (!stopping) {
            try {
                openClients();
                return;
            } catch (RetriableException e) {
                LOG.warn("cannot create the clients ({}); retrying in {} ms", e.toString(), backoffMs);
                closeClients(Duration.ofMillis(s.closeTimeoutMs()));
                pauseUnlessStopping(backoffMs);
                backoffMs = Math.min(2 * backoffMs, REOPEN_BACKOFF_MAX_MS);
            }
        }
    }

    private void pauseUnlessStopping(long ms) {
        long end = System.nanoTime() + TimeUnit.MILLISECONDS.toNanos(ms);
        try {
            while (!stopping && System.nanoTime() < end) {
                Thread.sleep(50);
            }
        } catch (InterruptedException e) {
            stopping = true;
            Thread.currentThread().interrupt();
        }
    }

    private void openClients() {
        producer = clients.producer();
        producer.initTransactions();
        restoreConsumer = clients.restoreConsumer();
        reader = new SnapshotReader(restoreConsumer, metrics, Duration.ofMillis(s.restoreTimeoutMs()));
        claimConsumer = clients.claimConsumer();
        claimLog = new ClaimLog(claimConsumer, s, claims);
        consumer = clients.groupConsumer();
        consumer.subscribe(List.of(s.inputTopic()), new Listener());
    }

    private void closeClients(Duration timeout) {
        if (consumer != null) {
            closeQuietly(consumer, timeout);
            consumer = null;
        }
        if (restoreConsumer != null) {
            closeQuietly(restoreConsumer, timeout);
            restoreConsumer = null;
        }
        if (claimConsumer != null) {
            closeQuietly(claimConsumer, timeout);
            claimConsumer = null;
        }
        if (producer != null) {
            try {
                producer.close(timeout);
            } catch (KafkaException e) {
                LOG.warn("producer close failed: {}", e.toString());
            }
            producer = null;
        }
    }

    private static void closeQuietly(Consumer<byte[], byte[]> c, Duration timeout) {
        try {
            c.close(CloseOptions.timeout(timeout));
        } catch (KafkaException e) {
            LOG.warn("consumer close failed: {}", e.toString());
        }
    }

    /**
     * Replaces the state of {@code partitions} with their snapshots and seeks each to its
     * committed offset. The committed offsets are fetched first: that fetch waits until no
     * transaction that could still commit offsets for them is open, so the snapshot read after
     * it is the one those offsets belong to. The claims are read to their end after that fetch too,
     * so the pairs the previous owner of the partitions claimed are known before any is claimed again.
     *
     * @throws RestoreTimeoutException when the committed offsets are not known within
     *                                 {@code restore.timeout.ms}
     */
    private void restore(Collection<TopicPartition> partitions) {
        if (partitions.isEmpty()) {
            return;
        }
        boolean wasReady = ready;
        ready = false;
        long t0 = System.nanoTime();
        Map<TopicPartition, OffsetAndMetadata> committed = committedOffsets(new HashSet<>(partitions));
        claimLog.catchUp(Duration.ofMillis(s.restoreTimeoutMs()));
        metrics.keyClaims(claims.size());
        for (TopicPartition tp : partitions) {
            states.drop(tp.partition());
            work.remove(tp.partition());
            layouts.remove(tp.partition());
            OffsetAndMetadata c = committed.get(tp);
            SnapshotReader.Partition snap = readNotBehind(tp, c);
            for (Map.Entry<String, SnapshotReader.Restored> e : snap.states.entrySet()) {
                install(tp, e.getKey(), e.getValue());
            }
            long position = c != null ? c.offset() : Math.max(snap.nextOffset, 0);
            if (c != null && snap.nextOffset >= 0 && snap.nextOffset != c.offset()) {
                metrics.restoreOffsetMismatch();
                LOG.warn("{}: committed offset {} differs from the snapshot's position {}; using the committed one, "
                        + "so the moments {} the {} records in between (lariat_restore_offset_mismatches_total)",
                        tp, c.offset(), snap.nextOffset, c.offset() > snap.nextOffset ? "miss" : "count twice",
                        Math.abs(c.offset() - snap.nextOffset));
            }
            consumer.seek(tp, position);
            LOG.info("restored {}: {} keys, resuming at offset {}", tp, states.of(tp.partition()).size(), position);
        }
        metrics.restored((System.nanoTime() - t0) / 1e9);
        metrics.keys(states.size());
        ready = wasReady;
    }

    /**
     * The committed offsets of {@code partitions}, asked for in attempts of at most
     * {@value #COMMITTED_ATTEMPT_MS} ms until {@code restore.timeout.ms} has passed, so that a
     * fetch held back for long (by an open transaction that added offsets for these partitions,
     * or by a coordinator still loading after a broker restart) is logged while it lasts and
     * ends when the stage stops.
     *
     * @throws RestoreTimeoutException when the offsets are not known by the deadline, or the
     *                                 stage is stopping
     */
    private Map<TopicPartition, OffsetAndMetadata> committedOffsets(Set<TopicPartition> partitions) {
        long deadline = System.nanoTime() + TimeUnit.MILLISECONDS.toNanos(s.restoreTimeoutMs());
        for (int attempt = 1; ; attempt++) {
            long leftMs = TimeUnit.NANOSECONDS.toMillis(deadline - System.nanoTime());
            try {
                return consumer.committed(partitions, Duration.ofMillis(Math.max(1, Math.min(COMMITTED_ATTEMPT_MS,
                        leftMs))));
            } catch (TimeoutException e) {
                if (stopping || System.nanoTime() - deadline >= 0) {
                    throw new RestoreTimeoutException("committed offsets of " + partitions + " not known within "
                            + "restore.timeout.ms = " + s.restoreTimeoutMs() + " (" + attempt + " attempts)", e);
                }
                LOG.info("committed offsets of {} not known yet (attempt {}: {}); asking again", partitions, attempt,
                        e.getMessage());
            }
        }
    }

    /**
     * Reads the snapshot partition of {@code tp}, again every 500 ms while its position marker is
     * behind the committed offset {@code c}, for at most {@code restore.timeout.ms}. Marker and
     * offsets commit in one transaction, yet a read_committed read ends at the last stable offset:
     * an open transaction of a dead instance (one killed before it added its offsets, so nothing
     * holds back the committed-offset fetch) hides every snapshot committed after it until the
     * coordinator aborts it after {@code transaction.timeout.ms}, while the group offsets live in
     * another log and move on. Restoring that stale state and seeking to {@code c} would skip the
     * records in between. After the timeout the last read is returned and the caller keeps the
     * committed offset, as for offsets reset on purpose.
     */
    private SnapshotReader.Partition readNotBehind(TopicPartition tp, OffsetAndMetadata c) {
        TopicPartition stp = new TopicPartition(s.snapshotTopic(), tp.partition());
        long deadline = System.nanoTime() + TimeUnit.MILLISECONDS.toNanos(s.restoreTimeoutMs());
        SnapshotReader.Partition snap = reader.read(stp);
        boolean logged = false;
        while (c != null && snap.nextOffset < c.offset() && !stopping && System.nanoTime() < deadline) {
            if (!logged) {
                LOG.info("{}: snapshot position {} is behind the committed offset {} (an open transaction on {}?); "
                        + "waiting for it to end", tp, snap.nextOffset, c.offset(), stp);
                logged = true;
            }
            pauseUnlessStopping(500);
            snap = reader.read(stp);
        }
        return snap;
    }

    private void install(TopicPartition tp, String key, SnapshotReader.Restored r) {
        try {
            KeyState k = KeyState.fromBytes(r.state, r.chunkCount);
            if (!k.modelKey().equals(key) || k.partition() != tp.partition()) {
                LOG.error("snapshot of key '{}' in partition {} names key '{}' on partition {}; not applied",
                        key, tp.partition(), k.modelKey(), k.partition());
                metrics.snapshotIncomplete();
                return;
            }
            int other = states.ownerOf(key);
            if (other >= 0 && other != tp.partition()) {
                LOG.error("model key '{}' has snapshots on partitions {} and {}", key, other, tp.partition());
                metrics.keyOnTwoPartitions();
                return;
            }
            String[] ch = k.channels();
            layouts.computeIfAbsent(tp.partition(), p -> KeyLayouts.create())
                    .put(key, ChannelLayout.of(List.of(ch).subList(0, ch.length - 1)));
            states.put(k);
        } catch (IOException | IllegalArgumentException e) {
            metrics.snapshotIncomplete();
            LOG.error("snapshot of key '{}' in partition {} cannot be decoded; not applied: {}", key,
                    tp.partition(), e.toString());
        }
    }

    /** Drops revoked or lost partitions; restores assigned ones before their records are processed. */
    private final class Listener implements ConsumerRebalanceListener {
        @Override
        public void onPartitionsRevoked(Collection<TopicPartition> partitions) {
            forget(partitions);
        }

        @Override
        public void onPartitionsLost(Collection<TopicPartition> partitions) {
            forget(partitions);
        }

        /**
         * Restores {@code partitions}. A restore that times out here escapes from {@code poll} as a
         * {@link RestoreTimeoutException}, which {@link FailureKind} makes fatal: restoring again with
         * the same clients would wait as long again, while new clients start with a new producer
         * whose {@code initTransactions} ends any transaction this stage left open.
         */
        @Override
        public void onPartitionsAssigned(Collection<TopicPartition> partitions) {
            assigned.addAll(partitions);
            try {
                restore(partitions);
            } catch (TimeoutException e) {
                throw new RestoreTimeoutException("restore of " + partitions + " timed out: " + e.getMessage(), e);
            }
            ready = true;
        }

        private void forget(Collection<TopicPartition> partitions) {
            for (TopicPartition tp : partitions) {
                states.drop(tp.partition());
                work.remove(tp.partition());
                layouts.remove(tp.partition());
                assigned.remove(tp);
            }
            metrics.keys(states.size());
        }
    }

    static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}
