package lariat.stage;

import lariat.schema.ChangeAlert;
import lariat.schema.ModelVersion;
import org.apache.kafka.clients.producer.ProducerRecord;

import java.util.ArrayList;
import java.util.List;
import java.util.function.LongSupplier;

/**
 * The stage's refitter: fits the key's moments ({@link KeyFit}), takes its next version, builds
 * the model record, and asks the key's alert tracker whether the selected set is announced.
 * Model and alert records are keyed by the model key (UTF-8).
 */
final class PathRefitter implements Refitter {

    private final RefitRecipe recipe;
    private final ModelRecords records;
    private final String modelTopic;
    private final String alertTopic;
    private final int persistence;
    private final LongSupplier wallClockMs;
    private final StageMetrics metrics;

    PathRefitter(RefitRecipe recipe, ModelRecords records, StageSettings s, LongSupplier wallClockMs,
                 StageMetrics metrics) {
        this.recipe = recipe;
        this.records = records;
        this.modelTopic = s.modelTopic();
        this.alertTopic = s.alertTopic();
        this.persistence = s.alertPersistence();
        this.wallClockMs = wallClockMs;
        this.metrics = metrics;
    }

    @Override
    public List<ProducerRecord<byte[], byte[]>> refit(KeyState k) {
        KeyFit fit = KeyFit.of(k.moments().snapshot(), k.folds(), recipe);
        long version = k.takeVersion();
        ActiveSet now = ActiveSet.ofCoefficients(fit.selected().rawCoefficients());
        ModelRecords.KeyFacts facts = new ModelRecords.KeyFacts(k.modelKey(), version, k.channels(), k.count(),
                k.partition(), k.lastOffset() + 1, k.published());
        long at = wallClockMs.getAsLong();
        ModelVersion mv = records.model(facts, fit, at);
        k.published(now);
        byte[] key = Stage.utf8(k.modelKey());
        List<ProducerRecord<byte[], byte[]>> out = new ArrayList<>(2);
        out.add(new ProducerRecord<>(modelTopic, key, ModelRecords.encode(mv)));
        metrics.versionPublished();
        AlertTracker.Announcement a = k.alerts().offer(now, version, persistence);
        if (a != null) {
            ChangeAlert alert = records.alert(mv, now, a, k.channels(), at);
            out.add(new ProducerRecord<>(alertTopic, key, ModelRecords.encode(alert)));
            metrics.alertPublished();
        }
        return out;
    }
}
