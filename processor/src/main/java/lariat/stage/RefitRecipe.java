package lariat.stage;

import lariat.config.StageConfig;
import lariat.path.PathMethod;
import lariat.path.PathOptions;
import lariat.select.SelectionRule;
import lariat.select.SelectionSpec;

/**
 * What a refit computes: the path options, the selection spec and whether a ridge path's chosen
 * coefficients are rescaled to the elastic-net estimate ({@link lariat.select.RidgeRescale}), read
 * once from the configuration. Immutable.
 */
public final class RefitRecipe {

    private final PathOptions pathOptions;
    private final SelectionSpec spec;
    private final int cvFolds;
    private final boolean ridgeRescale;

    private RefitRecipe(PathOptions pathOptions, SelectionSpec spec, int cvFolds, boolean ridgeRescale) {
        this.pathOptions = pathOptions;
        this.spec = spec;
        this.cvFolds = cvFolds;
        this.ridgeRescale = ridgeRescale;
    }

    /**
     * A recipe from explicit parts; {@code cvFolds} must be &gt;= 2 exactly when the rule is CV;
     * {@code ridgeRescale} asks for the (1 + λ₂) rescaling of the chosen model (a no-op when the
     * path's ridge is 0).
     *
     * @throws IllegalArgumentException when {@code cvFolds} does not fit the rule
     */
    public static RefitRecipe of(PathOptions pathOptions, SelectionSpec spec, int cvFolds, boolean ridgeRescale) {
        boolean cv = spec.rule() == SelectionRule.CV;
        if (cv ? cvFolds < 2 : cvFolds != 0) {
            throw new IllegalArgumentException("cvFolds must be >= 2 for rule cv and 0 otherwise, was " + cvFolds
                    + " for rule " + spec.rule().label());
        }
        return new RefitRecipe(pathOptions, spec, cvFolds, ridgeRescale);
    }

    /** The recipe the configuration describes. */
    public static RefitRecipe of(StageConfig c) {
        PathOptions.Builder b = PathOptions.builder()
                .method(c.get(StageConfig.PATH_METHOD) == lariat.config.PathMethod.LAR ? PathMethod.LAR
                        : PathMethod.LASSO)
                .positive(c.get(StageConfig.PATH_POSITIVE))
                .ridge(c.get(StageConfig.PATH_RIDGE))
                .collinearTolerance(c.get(StageConfig.PATH_COLLINEAR_TOLERANCE))
                .minRelativePenalty(c.get(StageConfig.PATH_MIN_RELATIVE_PENALTY))
                .targetR2(c.get(StageConfig.PATH_MAX_R2));
        if (c.get(StageConfig.PATH_MAX_ACTIVE) > 0) {
            b.maxActive(c.get(StageConfig.PATH_MAX_ACTIVE));
        }
        if (c.get(StageConfig.PATH_MAX_STEPS) > 0) {
            b.maxSteps(c.get(StageConfig.PATH_MAX_STEPS));
        }
        SelectionRule rule = SelectionRule.parse(c.get(StageConfig.SELECT_RULE).id());
        double value;
        switch (rule) {
            case RELATIVE_PENALTY:
                value = c.get(StageConfig.SELECT_RELATIVE_PENALTY);
                break;
            case MAX_ACTIVE:
                value = c.get(StageConfig.SELECT_MAX_ACTIVE);
                break;
            case TARGET_R2:
                value = c.get(StageConfig.SELECT_TARGET_R2);
                break;
            default:
                value = Double.NaN;
                break;
        }
        SelectionSpec spec = SelectionSpec.of(rule, value, c.get(StageConfig.SELECT_CV_ONE_SE),
                c.get(StageConfig.SELECT_REFIT));
        return of(b.build(), spec, rule == SelectionRule.CV ? c.get(StageConfig.SELECT_CV_FOLDS) : 0,
                c.get(StageConfig.PATH_RIDGE_RESCALE));
    }

    public PathOptions pathOptions() {
        return pathOptions;
    }

    public SelectionSpec spec() {
        return spec;
    }

    /** Whether the chosen model is rescaled by 1 + λ₂ when the path has a ridge penalty λ₂ &gt; 0. */
    public boolean ridgeRescale() {
        return ridgeRescale;
    }

    /** Fold moments kept per key: 0 unless the rule is CV. */
    public int cvFolds() {
        return cvFolds;
    }
}
