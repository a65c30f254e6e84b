package lariat.audit;

import lariat.config.StageConfig;
import lariat.schema.ModelVersion;
import org.apache.kafka.clients.consumer.Consumer;

import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;

/**
 * Audits published model versions against a configuration. For each audited version: the
 * recorded configuration hash is compared with {@link StageConfig#configHash()}; the input
 * partition the version names is replayed from offset 0 through the stage's own code
 * ({@link lariat.stage.PartitionReplay}), refitting every version of the key up to the audited one at its
 * recorded end offset (the earlier versions fix the version number and the previous active set
 * the audited one is compared with); and the recomputed record is compared with the published
 * one field by field, bit for bit ({@link RecordComparison}), except {@code publishedAtMs} (the
 * refit's wall-clock time, copied) and {@code buildVersion} (reported as a note when it differs).
 *
 * <p>A partition whose log start offset is above 0 no longer holds the first records, so no
 * version on it can be replayed from the beginning: its versions are reported with the missing
 * offsets, as are versions whose end offset lies beyond the partition's last stable offset
 * ({@link HistoryReplay}).
 */
public final class Auditor {

    /** Top-level fields not compared: the wall-clock time and the build that computed the record. */
    static final Set<String> NOT_COMPARED = Set.of("publishedAtMs", "buildVersion");

    private final ClusterClients clients;
    private final StageConfig config;
    private final Path baseDir;
    private final Duration timeout;
    private final Progress progress;

    /**
     * @param baseDir  directory relative schema files of {@code config} resolve against
     * @param timeout  longest wait without progress on any read
     * @param progress receives each replay's progress
     */
    public Auditor(ClusterClients clients, StageConfig config, Path baseDir, Duration timeout, Progress progress) {
        this.clients = clients;
        this.config = config;
        this.baseDir = baseDir;
        this.timeout = timeout;
        this.progress = progress;
    }

    /** Audits the versions in {@code modelTopic} that {@code scope} covers. */
    public AuditReport audit(String modelTopic, AuditScope scope) {
        ModelTopicReader.Result read;
        try (Consumer<byte[], byte[]> c = clients.consumer()) {
            read = new ModelTopicReader(c, timeout).read(modelTopic, scope::coversKey);
        }
        return audit(modelTopic, read.versions(), scope, read.undecodable());
    }

    /** Audits the versions of {@code published} that {@code scope} covers. */
    AuditReport audit(String modelTopic, List<PublishedVersion> published, AuditScope scope, long undecodable) {
        String hash = config.configHash();
        HistoryReplay.Outcome o = new HistoryReplay(clients, config, baseDir, timeout, progress).run(published, scope);
        RecordComparison cmp = RecordComparison.ignoring(NOT_COMPARED);
        List<VersionVerdict> out = new ArrayList<>();
        for (PublishedVersion v : o.inScope()) {
            VersionVerdict.Builder b = VersionVerdict.builder(v, hash);
            HistoryReplay.Missing m = o.missing(v);
            InputReplay.Refitted f = o.refitted(v);
            if (m != null) {
                b.missing(m.from, m.to, m.why);
            } else if (f == null) {
                b.failed("not replayed");
            } else if (f.model() == null) {
                b.failed(f.failure());
            } else {
                ModelVersion recorded = v.record();
                b.actual(f.model().getMomentsFingerprint(), cmp.compare(recorded, f.model()));
                if (!recorded.getBuildVersion().equals(f.model().getBuildVersion())) {
                    b.note("published by build " + recorded.getBuildVersion() + ", audited with build "
                            + f.model().getBuildVersion());
                }
            }
            out.add(b.build());
        }
        return AuditReport.of(modelTopic, hash, out, o.replays(), undecodable);
    }
}
