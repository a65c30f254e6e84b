package lariat.demo;

import lariat.schema.ActiveFeature;
import lariat.schema.ActiveSetChange;
import lariat.schema.ChangeAlert;
import lariat.schema.Criteria;
import lariat.schema.ExcludedFeature;
import lariat.schema.ModelVersion;
import lariat.schema.PathKnot;
import lariat.schema.SignedFeature;
import org.apache.avro.util.ClassSecurityValidator;

/**
 * Lets Avro decode the stage's output into the generated classes: Avro 1.12 refuses to build
 * classes of packages it was not told to trust, so the demo adds exactly the classes it reads.
 */
final class TrustedSchemas {

    private static boolean installed;

    private TrustedSchemas() {
    }

    static synchronized void install() {
        if (installed) {
            return;
        }
        ClassSecurityValidator.setGlobal(ClassSecurityValidator.composite(ClassSecurityValidator.getGlobal(),
                ClassSecurityValidator.builder().add(ModelVersion.class).add(ActiveFeature.class)
                        .add(ExcludedFeature.class).add(Criteria.class).add(PathKnot.class)
                        .add(ActiveSetChange.class).add(SignedFeature.class).add(ChangeAlert.class).build()));
        installed = true;
    }
}
