package lariat.codec;

import org.apache.avro.util.ClassSecurityValidator;

/**
 * Lets Avro decode into the classes generated from {@code schemas/}. Avro 1.12 instantiates, when it
 * decodes or deep-copies a specific record, only classes its {@code ClassSecurityValidator} trusts (by
 * default java.lang and a few others, plus the packages named in the system property
 * {@code org.apache.avro.SERIALIZABLE_PACKAGES}). This adds every class of the generated package
 * {@code lariat.schema}, nested records included, and keeps whatever the process already trusts.
 */
public final class SchemaTrust {

    /** The package the Avro Maven plugin generates the schema classes into. */
    public static final String GENERATED_PACKAGE = "lariat.schema";

    private static boolean installed;

    private SchemaTrust() {
    }

    /** Installs the trust once per process; later calls do nothing. */
    public static synchronized void ensure() {
        if (installed) {
            return;
        }
        ClassSecurityValidator.ClassSecurityPredicate generated =
                c -> GENERATED_PACKAGE.equals(c.getPackageName());
        ClassSecurityValidator.setGlobal(ClassSecurityValidator.composite(ClassSecurityValidator.getGlobal(), generated));
        installed = true;
    }
}
