package lariat.stage;

import lariat.moments.Moments;
import lariat.path.ExcludedColumn;
import lariat.path.Knot;
import lariat.path.LassoPath;
import lariat.schema.ActiveFeature;
import lariat.schema.ActiveSetChange;
import lariat.schema.ChangeAlert;
import lariat.schema.ExcludedFeature;
import lariat.schema.ModelVersion;
import lariat.schema.PathKnot;
import lariat.select.CvCurve;
import lariat.select.LeastSquaresFit;
import lariat.select.SelectedModel;
import lariat.select.SelectionRule;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;

/**
 * Builds the Avro model-version and change-alert records of one refit and encodes them with
 * Avro's single-object encoding (Avro 1.12 specification, "Single-object encoding": marker
 * C3 01, the schema's 8-byte CRC-64-AVRO fingerprint, then the binary body).
 */
public final class ModelRecords {

    private final String inputTopic;
    private final String configHash;
    private final String buildVersion;

    public ModelRecords(String inputTopic, String configHash, String buildVersion) {
        this.inputTopic = inputTopic;
        this.configHash = configHash;
        this.buildVersion = buildVersion;
    }

    /** Facts about the key that are not part of the fit itself. */
    static final class KeyFacts {
        final String key;
        final long version;
        final String[] channels;
        final long recordCount;
        final int partition;
        final long endOffset;
        final ActiveSet previous;

        KeyFacts(String key, long version, String[] channels, long recordCount, int partition, long endOffset,
                 ActiveSet previous) {
            this.key = key;
            this.version = version;
            this.channels = channels;
            this.recordCount = recordCount;
            this.partition = partition;
            this.endOffset = endOffset;
            this.previous = previous;
        }
    }

    /** The model version of {@code fit} for the key described by {@code f}. */
    ModelVersion model(KeyFacts f, KeyFit fit, long publishedAtMs) {
        SelectedModel sel = fit.selected();
        Moments m = fit.moments();
        int p = f.channels.length - 1;
        List<String> features = Arrays.asList(f.channels).subList(0, p);
        ActiveSet now = ActiveSet.ofCoefficients(sel.rawCoefficients());
        lariat.select.Criteria c = sel.criteria();
        CvCurve cv = fit.cv();
        Integer cvIndex = cv == null ? null : fit.cvIndex();
        LeastSquaresFit refit = sel.refit();
        return ModelVersion.newBuilder()
                .setKey(f.key)
                .setVersion(f.version)
                .setFirstEventTimeMs(Instant.ofEpochMilli(m.minEventTimeMs()))
                .setLastEventTimeMs(Instant.ofEpochMilli(m.maxEventTimeMs()))
                .setRecordCount(f.recordCount)
                .setTotalWeight(m.totalWeight())
                .setEffectiveWeight(m.effectiveSize())
                .setInputTopic(inputTopic)
                .setInputPartition(f.partition)
                .setInputEndOffset(f.endOffset)
                .setChannels(new ArrayList<>(features))
                .setTarget(f.channels[p])
                .setSelectionRule(sel.rule().label())
                .setSelectionParameter(hasParameter(sel.rule()) ? sel.parameter() : null)
                .setPenalty(sel.penalty())
                .setRelativePenalty(sel.relativePenalty())
                .setIntercept(sel.intercept())
                .setRefitIntercept(refit == null ? null : refit.intercept())
                .setFeatures(activeFeatures(fit.path(), sel, features))
                .setExcluded(excluded(fit.path(), features))
                .setR2(sel.r2())
                .setRss(sel.rss())
                .setDf(sel.df())
                .setCoefficientScale(sel.coefficientScale())
                .setCriteria(lariat.schema.Criteria.newBuilder()
                        .setCp(c == null ? null : c.cp())
                        .setAic(c == null ? null : c.aic())
                        .setBic(c == null ? null : c.bic())
                        .setSigma2(c == null ? null : c.sigma2())
                        .setCvError(cvIndex == null ? null : cv.mean()[cvIndex])
                        .setCvStandardError(cvIndex == null ? null : cv.standardError()[cvIndex])
                        .build())
                .setPath(knots(fit.path(), features))
                .setChange(ActiveSetChange.newBuilder()
                        .setPreviousVersion(f.version > 1 ? f.version - 1 : null)
                        .setEntered(names(now.enteredSince(f.previous), features))
                        .setLeft(names(now.leftSince(f.previous), features))
                        .setSignFlipped(names(now.flippedSince(f.previous), features))
                        .build())
                .setMomentsFingerprint(fit.fingerprint())
                .setConfigHash(configHash)
                .setBuildVersion(buildVersion)
                .setPublishedAtMs(Instant.ofEpochMilli(publishedAtMs))
                .build();
    }

    /** The alert announcing {@code now} for the model {@code mv}. */
    ChangeAlert alert(ModelVersion mv, ActiveSet now, AlertTracker.Announcement a, String[] channels,
                      long publishedAtMs) {
        List<String> features = Arrays.asList(channels).subList(0, channels.length - 1);
        return ChangeAlert.newBuilder()
                .setKey(mv.getKey())
                .setVersion(mv.getVersion())
                .setPreviousVersion(a.beforeVersion > 0 ? a.beforeVersion : null)
                .setEntered(names(now.enteredSince(a.before), features))
                .setLeft(names(now.leftSince(a.before), features))
                .setSignFlipped(names(now.flippedSince(a.before), features))
                .setEventTimeMs(mv.getLastEventTimeMs())
                .setFirstSeenVersion(a.firstSeenVersion)
                .setPersistedRefits(a.heldRefits)
                .setConfigHash(configHash)
                .setPublishedAtMs(Instant.ofEpochMilli(publishedAtMs))
                .build();
    }

    /** Single-object encoding of {@code mv}. */
    static byte[] encode(ModelVersion mv) {
        try {
            return bytes(mv.toByteBuffer());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Single-object encoding of {@code a}. */
    static byte[] encode(ChangeAlert a) {
        try {
            return bytes(a.toByteBuffer());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static byte[] bytes(ByteBuffer b) {
        byte[] out = new byte[b.remaining()];
        b.get(out);
        return out;
    }

    private static boolean hasParameter(SelectionRule r) {
        return r != SelectionRule.CP && r != SelectionRule.AIC && r != SelectionRule.BIC;
    }

    /** Active features in order of their last entry into the path. */
    private static List<ActiveFeature> activeFeatures(LassoPath path, SelectedModel sel, List<String> features) {
        int p = features.size();
        int[] enteredAt = new int[p];
        Arrays.fill(enteredAt, Integer.MAX_VALUE);
        for (Knot k : path.knots()) {
            if (k.entered() >= 0) {
                enteredAt[k.entered()] = k.step();
            }
        }
        double[] raw = sel.rawCoefficients();
        double[] std = sel.standardizedCoefficients();
        LeastSquaresFit refit = sel.refit();
        double[] refitCoef = refit == null ? null : refit.coefficients();
        int[] refitCols = refit == null ? new int[0] : refit.columns();
        List<Integer> order = new ArrayList<>();
        for (int j : sel.active()) {
            order.add(j);
        }
        order.sort(Comparator.<Integer>comparingInt(j -> enteredAt[j]).thenComparingInt(j -> j));
        List<ActiveFeature> out = new ArrayList<>(order.size());
        for (int j : order) {
            Double r = null;
            for (int i = 0; i < refitCols.length; i++) {
                if (refitCols[i] == j) {
                    r = refitCoef[j];
                }
            }
            out.add(ActiveFeature.newBuilder().setName(features.get(j)).setCoefficient(raw[j])
                    .setStandardizedCoefficient(std[j]).setRefitCoefficient(r).build());
        }
        return out;
    }

    private static List<ExcludedFeature> excluded(LassoPath path, List<String> features) {
        List<ExcludedFeature> out = new ArrayList<>();
        for (ExcludedColumn e : path.excluded()) {
            String reason = e.reason() == ExcludedColumn.Reason.CONSTANT ? "zero-variance" : "collinear";
            out.add(ExcludedFeature.newBuilder().setName(features.get(e.column())).setReason(reason).build());
        }
        return out;
    }

    private static List<PathKnot> knots(LassoPath path, List<String> features) {
        List<PathKnot> out = new ArrayList<>(path.knots().size());
        for (Knot k : path.knots()) {
            out.add(PathKnot.newBuilder()
                    .setStep(k.step())
                    .setPenalty(k.penalty())
                    .setRelativePenalty(k.relativePenalty())
                    .setEntered(k.entered() >= 0 ? features.get(k.entered()) : null)
                    .setLeft(k.left() >= 0 ? features.get(k.left()) : null)
                    .setR2(k.r2())
                    .setActiveCount(k.active().length)
                    .build());
        }
        return out;
    }

    private static List<String> names(int[] idx, List<String> features) {
        List<String> out = new ArrayList<>(idx.length);
        for (int j : idx) {
            out.add(features.get(j));
        }
        return out;
    }
}
