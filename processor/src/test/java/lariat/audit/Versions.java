package lariat.audit;

import lariat.schema.ActiveFeature;
import lariat.schema.ActiveSetChange;
import lariat.schema.Criteria;
import lariat.schema.ModelVersion;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;

/** Hand-made model versions for the unit tests. */
final class Versions {

    private Versions() {
    }

    /** Version {@code v} of {@code key} with features {@code names} and coefficients {@code coef}. */
    static ModelVersion of(String key, long v, long lastEventMs, long publishedMs, String[] names, double[] coef) {
        List<ActiveFeature> fs = new ArrayList<>();
        for (int i = 0; i < names.length; i++) {
            fs.add(ActiveFeature.newBuilder().setName(names[i]).setCoefficient(coef[i])
                    .setStandardizedCoefficient(coef[i] / 2).setRefitCoefficient(null).build());
        }
        return ModelVersion.newBuilder().setKey(key).setVersion(v).setFirstEventTimeMs(Instant.ofEpochMilli(0))
                .setLastEventTimeMs(Instant.ofEpochMilli(lastEventMs)).setRecordCount(10 * v).setTotalWeight(10.0 * v)
                .setEffectiveWeight(10.0 * v).setInputTopic("in").setInputPartition(0).setInputEndOffset(20 * v)
                .setChannels(List.of("a", "b", "c")).setTarget("y").setSelectionRule("bic").setSelectionParameter(null)
                .setPenalty(1.0 / v).setRelativePenalty(0.5).setIntercept(1.0).setRefitIntercept(null).setFeatures(fs)
                .setExcluded(List.of()).setR2(0.9).setRss(1.0).setDf(names.length)
                .setCriteria(Criteria.newBuilder().build()).setPath(List.of())
                .setChange(ActiveSetChange.newBuilder().setPreviousVersion(null).build())
                .setMomentsFingerprint("f" + v).setConfigHash("h").setBuildVersion("test")
                .setPublishedAtMs(Instant.ofEpochMilli(publishedMs)).build();
    }

    static PublishedVersion published(ModelVersion mv, long offset) {
        return PublishedVersion.of(mv, 0, offset);
    }
}
