package lariat.audit;

import lariat.schema.ActiveFeature;
import lariat.schema.ActiveSetChange;
import lariat.schema.Criteria;
import lariat.schema.ExcludedFeature;
import lariat.schema.ModelVersion;
import lariat.schema.PathKnot;
import org.apache.avro.util.ClassSecurityValidator;

/**
 * Adds the generated model-version classes to the classes Avro 1.12 may instantiate when it
 * decodes or deep-copies a specific record (Avro's {@code ClassSecurityValidator}; by default it
 * trusts only java.lang and a few other classes, so decoding a {@link ModelVersion} with its nested
 * records would be refused). Keeps whatever the process already trusts.
 */
final class ModelSchemaTrust {

    private static boolean done;

    private ModelSchemaTrust() {
    }

    /** Installs the trust once per process. */
    static synchronized void ensure() {
        if (done) {
            return;
        }
        ClassSecurityValidator.setGlobal(ClassSecurityValidator.composite(ClassSecurityValidator.getGlobal(),
                ClassSecurityValidator.builder().add(ModelVersion.class).add(ActiveFeature.class)
                        .add(ExcludedFeature.class).add(Criteria.class).add(PathKnot.class)
                        .add(ActiveSetChange.class).build()));
        done = true;
    }
}
