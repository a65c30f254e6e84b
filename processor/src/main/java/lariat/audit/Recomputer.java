package lariat.audit;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import lariat.config.StageConfig;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.clients.producer.ProducerRecord;

import java.io.BufferedWriter;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutionException;

/**
 * Recomputes published history under another configuration. Each published version in scope is
 * refitted at the same input end offset as published (so recomputed version n covers the same
 * input as published version n) through the stage's own code under the new configuration, with
 * the published version's {@code publishedAtMs}; the live topics are only read. Results go to a
 * JSON-lines file (one line per version: key, version, the published and the recomputed record,
 * and the differing fields) or, as the stage would encode them, to a separate output topic keyed
 * by model key.
 */
public final class Recomputer {

    /** One version: the published record and what the new configuration computes for it. */
    public static final class Recomputed {
        private final PublishedVersion published;
        private final InputReplay.Refitted refitted;
        private final String missing;
        private final List<FieldDifference> differences;

        private Recomputed(PublishedVersion published, InputReplay.Refitted refitted, String missing,
                           List<FieldDifference> differences) {
            this.published = published;
            this.refitted = refitted;
            this.missing = missing;
            this.differences = differences;
        }

        public PublishedVersion published() {
            return published;
        }

        /** The recomputation, or null when the input is missing. */
        public InputReplay.Refitted refitted() {
            return refitted;
        }

        /** Why nothing was recomputed, or null. */
        public String problem() {
            if (missing != null) {
                return missing;
            }
            return refitted == null ? "not replayed" : refitted.failure();
        }

        /** Fields where the recomputed record differs from the published one (publishedAtMs and buildVersion not compared). */
        public List<FieldDifference> differences() {
            return differences;
        }
    }

    private static final ObjectMapper JSON = new ObjectMapper();

    private final ClusterClients clients;
    private final StageConfig config;
    private final Path baseDir;
    private final Duration timeout;
    private final Progress progress;

    public Recomputer(ClusterClients clients, StageConfig config, Path baseDir, Duration timeout, Progress progress) {
        this.clients = clients;
        this.config = config;
        this.baseDir = baseDir;
        this.timeout = timeout;
        this.progress = progress;
    }

    /** Recomputes the versions of {@code modelTopic} in {@code scope}, by key then version. */
    public List<Recomputed> recompute(String modelTopic, AuditScope scope) {
        List<PublishedVersion> published;
        try (Consumer<byte[], byte[]> c = clients.consumer()) {
            published = new ModelTopicReader(c, timeout).read(modelTopic, scope::coversKey).versions();
        }
        HistoryReplay.Outcome o = new HistoryReplay(clients, config, baseDir, timeout, progress).run(published, scope);
        RecordComparison cmp = RecordComparison.ignoring(Auditor.NOT_COMPARED);
        List<Recomputed> out = new ArrayList<>();
        for (PublishedVersion v : o.inScope()) {
            HistoryReplay.Missing m = o.missing(v);
            InputReplay.Refitted f = o.refitted(v);
            List<FieldDifference> d = f == null || f.model() == null ? List.of() : cmp.compare(v.record(), f.model());
            out.add(new Recomputed(v, f, m == null ? null : m.why + " (missing offsets " + m.from + ".." + m.to
                    + ")", d));
        }
        return out;
    }

    /** Writes {@code results} to {@code file} as JSON lines. */
    public static void writeJson(List<Recomputed> results, Path file) throws IOException {
        try (BufferedWriter w = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            for (Recomputed r : results) {
                w.write(JSON.writeValueAsString(json(r)));
                w.newLine();
            }
        }
    }

    /** One result as a JSON object. */
    static ObjectNode json(Recomputed r) {
        ObjectNode o = JSON.createObjectNode();
        o.put("key", r.published.key());
        o.put("version", r.published.version());
        o.put("inputEndOffset", r.published.inputEndOffset());
        o.put("problem", r.problem());
        o.set("published", AvroJson.of(r.published.record()));
        o.set("recomputed", r.refitted == null || r.refitted.model() == null ? null
                : AvroJson.of(r.refitted.model()));
        ArrayNode ds = o.putArray("differences");
        for (FieldDifference d : r.differences) {
            ds.addObject().put("field", d.field()).put("published", d.expected()).put("recomputed", d.actual());
        }
        return o;
    }

    /**
     * Sends each recomputed model version to {@code topic}, keyed by model key, and waits for every
     * send to be acknowledged; returns the number sent.
     *
     * @throws IllegalStateException when a send fails
     */
    public static int send(List<Recomputed> results, Producer<byte[], byte[]> producer, String topic)
            throws InterruptedException {
        List<java.util.concurrent.Future<?>> acks = new ArrayList<>();
        for (Recomputed r : results) {
            if (r.refitted != null && r.refitted.model() != null) {
                ProducerRecord<byte[], byte[]> mv = r.refitted.records().get(0);
                acks.add(producer.send(new ProducerRecord<>(topic, mv.key(), mv.value())));
            }
        }
        producer.flush();
        for (java.util.concurrent.Future<?> a : acks) {
            try {
                a.get();
            } catch (ExecutionException e) {
                throw new IllegalStateException("sending to " + topic + " failed: " + e.getCause(), e.getCause());
            }
        }
        return acks.size();
    }
}
