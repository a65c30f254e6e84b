package lariat.audit;

import lariat.schema.ModelVersion;
import org.junit.jupiter.api.Test;

import java.util.List;
import java.util.Set;

import static org.junit.jupiter.api.Assertions.assertEquals;

/** Bit-exact comparison of records; IEEE 754 facts (signed zero, NaN bits) are common practice. */
class RecordComparisonTest {

    private static final RecordComparison CMP = RecordComparison.ignoring(Set.of("publishedAtMs", "buildVersion"));

    private static ModelVersion base() {
        return Versions.of("k", 2, 200, 2000, new String[] {"flow", "temp"}, new double[] {2.0, -0.5});
    }

    @Test
    void compare_identicalButForIgnoredFields_hasNoDifference() {
        ModelVersion b = base();
        b.setBuildVersion("other");
        b.setPublishedAtMs(java.time.Instant.ofEpochMilli(1));
        assertEquals(List.of(), CMP.compare(base(), b));
    }

    @Test
    void compare_nestedCoefficientOneUlpApart_namesThePath() {
        ModelVersion b = base();
        b.getFeatures().get(1).setCoefficient(Math.nextDown(-0.5));
        List<FieldDifference> d = CMP.compare(base(), b);
        assertEquals(List.of("features[1].coefficient"), d.stream().map(FieldDifference::field).toList());
        assertEquals("-0.5 [0xbfe0000000000000]", d.get(0).expected());
    }

    @Test
    void compare_signedZero_differsAndNaNEqualsNaN() {
        ModelVersion a = base();
        ModelVersion b = base();
        a.setIntercept(0.0);
        b.setIntercept(-0.0);
        a.setR2(Double.NaN);
        b.setR2(Double.NaN);
        assertEquals(List.of("intercept"), CMP.compare(a, b).stream().map(FieldDifference::field).toList());
    }

    @Test
    void compare_differentFeatureCount_reportsLengthFirstInSchemaOrder() {
        ModelVersion b = Versions.of("k", 2, 200, 2000, new String[] {"flow"}, new double[] {2.0});
        List<String> fields = CMP.compare(base(), b).stream().map(FieldDifference::field).toList();
        assertEquals("features.length", fields.get(0));
        assertEquals(List.of("features.length", "df"), fields);
    }
}
