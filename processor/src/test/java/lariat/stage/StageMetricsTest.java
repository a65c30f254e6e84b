package lariat.stage;

import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

class StageMetricsTest {

    @Test
    void render_counters_inPrometheusTextFormat() {
        StageMetrics m = new StageMetrics();
        m.recordIn();
        m.recordIn();
        m.rejected("BAD_MARKER");
        m.refit(0.25);
        m.lag(17);
        String text = m.render();
        assertTrue(text.contains("# TYPE lariat_records_in_total counter\nlariat_records_in_total 2\n"), text);
        assertTrue(text.contains("lariat_records_rejected_total{reason=\"BAD_MARKER\"} 1\n"), text);
        assertTrue(text.contains("lariat_refit_seconds_total 0.25\n"), text);
        assertTrue(text.contains("# TYPE lariat_consumer_lag_records gauge\nlariat_consumer_lag_records 17\n"), text);
    }

    @Test
    void transactionCommitted_sumsCommitSeconds() {
        StageMetrics m = new StageMetrics();
        m.transactionCommitted(0.25);
        m.transactionCommitted(0.5);
        assertEquals(2, m.transactionsCommitted());
        assertEquals(0.75, m.commitSeconds(), 0.0);
        String text = m.render();
        assertTrue(text.contains("lariat_transactions_committed_total 2\n"), text);
        assertTrue(text.contains("# TYPE lariat_commit_seconds_total counter\nlariat_commit_seconds_total 0.75\n"),
                text);
    }

    @Test
    void restoreOffsetMismatch_countedAndRendered() {
        StageMetrics m = new StageMetrics();
        m.restoreOffsetMismatch();
        assertEquals(1, m.restoreOffsetMismatches());
        assertTrue(m.render().contains("# TYPE lariat_restore_offset_mismatches_total counter\n"
                + "lariat_restore_offset_mismatches_total 1\n"), m.render());
    }

    @Test
    void render_keyClaims_conflictCounterAndClaimGauge() {
        StageMetrics m = new StageMetrics();
        m.keyClaimConflict();
        m.keyClaims(4);
        String text = m.render();
        assertTrue(text.contains("# TYPE lariat_key_claim_conflicts_total counter\n"
                + "lariat_key_claim_conflicts_total 1\n"), text);
        assertTrue(text.contains("# TYPE lariat_key_claims gauge\nlariat_key_claims 4\n"), text);
    }
}
