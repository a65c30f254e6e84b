package lariat.audit;

import lariat.codec.SchemaTrust;
import lariat.schema.ModelVersion;

/**
 * One model version as read from the model topic, with where it was read: the model topic's
 * partition and offset. Immutable (the record is copied in and out).
 */
public final class PublishedVersion {

    private final ModelVersion record;
    private final int modelPartition;
    private final long modelOffset;

    private PublishedVersion(ModelVersion record, int modelPartition, long modelOffset) {
        this.record = record;
        this.modelPartition = modelPartition;
        this.modelOffset = modelOffset;
    }

    /**
     * @throws IllegalArgumentException when {@code record} is null or a coordinate is negative
     */
    public static PublishedVersion of(ModelVersion record, int modelPartition, long modelOffset) {
        if (record == null) {
            throw new IllegalArgumentException("record must not be null");
        }
        if (modelPartition < 0 || modelOffset < 0) {
            throw new IllegalArgumentException("modelPartition and modelOffset must be >= 0, were " + modelPartition
                    + " and " + modelOffset);
        }
        SchemaTrust.ensure();
        return new PublishedVersion(ModelVersion.newBuilder(record).build(), modelPartition, modelOffset);
    }

    /** A copy of the record. */
    public ModelVersion record() {
        return ModelVersion.newBuilder(record).build();
    }

    public String key() {
        return record.getKey();
    }

    public long version() {
        return record.getVersion();
    }

    public int modelPartition() {
        return modelPartition;
    }

    public long modelOffset() {
        return modelOffset;
    }

    /** Last event time of the records in the version's moments, epoch ms. */
    public long lastEventTimeMs() {
        return record.getLastEventTimeMs().toEpochMilli();
    }

    /** Wall-clock time of publication, epoch ms. */
    public long publishedAtMs() {
        return record.getPublishedAtMs().toEpochMilli();
    }

    public String inputTopic() {
        return record.getInputTopic();
    }

    public int inputPartition() {
        return record.getInputPartition();
    }

    public long inputEndOffset() {
        return record.getInputEndOffset();
    }

    @Override
    public String toString() {
        return key() + " v" + version() + " (model partition " + modelPartition + " offset " + modelOffset + ")";
    }
}
