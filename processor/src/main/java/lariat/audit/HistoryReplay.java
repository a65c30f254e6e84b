package lariat.audit;

import lariat.config.StageConfig;
import lariat.stage.PartitionReplay;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.common.TopicPartition;

import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * Replays the input behind a set of published versions under one configuration: for every key in
 * scope, each version up to the highest one in scope is refitted at its recorded end offset, one
 * replay from offset 0 per input partition. A version whose input is no longer in the log (a log
 * start offset above 0, or an end offset beyond the last stable offset) is not replayed; its
 * missing offsets are returned instead.
 */
public final class HistoryReplay {

    /** Input offsets a version depends on that the log no longer holds (inclusive bounds). */
    public static final class Missing {
        final long from;
        final long to;
        final String why;

        private Missing(long from, long to, String why) {
            this.from = from;
            this.to = to;
            this.why = why;
        }
    }

    /** Everything a replay of a history produced. */
    public static final class Outcome {
        final Map<String, KeyHistory> histories;
        final List<PublishedVersion> inScope;
        final Map<String, InputReplay.Refitted> refitted = new HashMap<>();
        final Map<String, Missing> missing = new HashMap<>();
        final List<AuditReport.Replay> replays = new ArrayList<>();

        private Outcome(Map<String, KeyHistory> histories, List<PublishedVersion> inScope) {
            this.histories = histories;
            this.inScope = inScope;
        }

        /** The versions in scope, by key then version. */
        public List<PublishedVersion> inScope() {
            return inScope;
        }

        /** The recomputation of {@code v}, or null when it was not replayed. */
        public InputReplay.Refitted refitted(PublishedVersion v) {
            return refitted.get(id(v.key(), v.version()));
        }

        /** The input {@code v} depends on that is missing, or null. */
        public Missing missing(PublishedVersion v) {
            return missing.get(id(v.key(), v.version()));
        }

        public List<AuditReport.Replay> replays() {
            return replays;
        }
    }

    private final ClusterClients clients;
    private final StageConfig config;
    private final Path baseDir;
    private final Duration timeout;
    private final Progress progress;

    public HistoryReplay(ClusterClients clients, StageConfig config, Path baseDir, Duration timeout,
                         Progress progress) {
        this.clients = clients;
        this.config = config;
        this.baseDir = baseDir;
        this.timeout = timeout;
        this.progress = progress;
    }

    /** Replays the input behind the versions of {@code published} that {@code scope} covers. */
    public Outcome run(List<PublishedVersion> published, AuditScope scope) {
        Map<String, KeyHistory> histories = new TreeMap<>();
        for (PublishedVersion v : published) {
            histories.computeIfAbsent(v.key(), k -> KeyHistory.of(k, published));
        }
        Map<TopicPartition, List<PublishedVersion>> needed = new LinkedHashMap<>();
        List<PublishedVersion> inScope = new ArrayList<>();
        for (KeyHistory h : histories.values()) {
            long upTo = h.versions().stream().filter(scope::covers).mapToLong(PublishedVersion::version).max()
                    .orElse(0);
            for (PublishedVersion v : h.versions()) {
                if (v.version() <= upTo) {
                    needed.computeIfAbsent(new TopicPartition(v.inputTopic(), v.inputPartition()),
                            tp -> new ArrayList<>()).add(v);
                }
                if (scope.covers(v)) {
                    inScope.add(v);
                }
            }
        }
        Outcome out = new Outcome(histories, List.copyOf(inScope));
        for (Map.Entry<TopicPartition, List<PublishedVersion>> e : needed.entrySet()) {
            replayPartition(e.getKey(), e.getValue(), out);
        }
        return out;
    }

    private void replayPartition(TopicPartition tp, List<PublishedVersion> versions, Outcome out) {
        long logStart;
        long logEnd;
        try (Consumer<byte[], byte[]> c = clients.consumer()) {
            if (c.partitionsFor(tp.topic(), timeout).stream().noneMatch(p -> p.partition() == tp.partition())) {
                for (PublishedVersion v : versions) {
                    out.missing.put(id(v.key(), v.version()), new Missing(0, v.inputEndOffset() - 1,
                            "input partition " + tp + " does not exist"));
                }
                return;
            }
            logStart = c.beginningOffsets(List.of(tp), timeout).get(tp);
            logEnd = c.endOffsets(List.of(tp), timeout).get(tp);
        }
        List<RefitPoint> points = new ArrayList<>();
        long target = 0;
        for (PublishedVersion v : versions) {
            long end = v.inputEndOffset();
            if (end > 0 && logStart > 0) {
                out.missing.put(id(v.key(), v.version()), new Missing(0, Math.min(logStart, end) - 1,
                        "input offsets below the log start offset " + logStart + " were removed (retention or "
                                + "deleteRecords); this version depends on offsets 0.." + (end - 1)));
            } else if (end > logEnd) {
                out.missing.put(id(v.key(), v.version()), new Missing(Math.max(logEnd, 0), end - 1,
                        "the partition's last stable offset is " + logEnd + ", below this version's end offset "
                                + end));
            } else {
                points.add(RefitPoint.of(v));
                target = Math.max(target, end);
            }
        }
        if (points.isEmpty()) {
            return;
        }
        PartitionReplay replay = PartitionReplay.create(config, baseDir, tp.partition());
        InputReplay.Result r;
        try (Consumer<byte[], byte[]> c = clients.consumer()) {
            r = new InputReplay(c, timeout, progress).replay(replay, tp, points);
        }
        out.replays.add(AuditReport.Replay.of(tp.topic(), tp.partition(), target, r));
        for (InputReplay.Refitted f : r.refits()) {
            out.refitted.put(id(f.point().key(), f.point().version()), f);
        }
    }

    static String id(String key, long version) {
        return version + "\u0000" + key;
    }
}
