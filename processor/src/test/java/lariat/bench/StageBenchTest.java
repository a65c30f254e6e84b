package lariat.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;

import lariat.codec.Decoded;
import lariat.codec.KeyLayouts;
import lariat.codec.Reading;
import lariat.codec.RecordDecoder;
import lariat.config.StageConfig;
import org.junit.jupiter.api.Test;

/** The bench stage's input is what its stage configuration decodes, and its JSON has the contract keys. */
class StageBenchTest {

    private static final double EXACT = 0.0;

    @Test
    void records_decodedWithBenchStageConfig_everyRecordAcceptedWithTargetFromTrueModel() {
        StageBenchRecords in = StageBenchRecords.of(5, 3, 60, 2, 7);
        RecordDecoder decoder = RecordDecoder.create(
                StageConfig.of(StageBench.stageProperties("localhost:9092", "in", "bench", 5)));
        KeyLayouts layouts = KeyLayouts.create();
        for (int i = 0; i < in.count(); i++) {
            Decoded d = decoder.decode(in.key(i), in.value(i), 0L, layouts);
            Reading r = assertInstanceOf(Reading.class, d, "record " + i);
            assertEquals(StageBenchRecords.station(i % 3), r.key());
            assertEquals(List.of("x000", "x001", "x002", "x003", "x004"), r.channels());
            double[] z = r.z();
            double residual = r.target() - (z[0] - 0.5 * z[1] + 0.25 * z[2]);
            // the noise is N(0, 0.1^2): a residual beyond 8 standard deviations would mean a wrong target
            assertTrue(Math.abs(residual) < 0.8, "record " + i + " residual " + residual);
            assertEquals(1.0, r.weight(), EXACT);
            assertEquals(i % 3 % 2, in.partition(i));
        }
    }

    @Test
    void toJson_twoRounds_contractKeysFromLastRound() {
        StageBenchResult.Round first = StageBenchResult.Round.of(StageBenchResult.Phase.of(1000, 1.0, 1.0, 0.5, 0.2, 0, 0),
                StageBenchResult.Phase.of(1000, 4.0, 3.0, 2.0, 0.7, 3, 0.9));
        StageBenchResult.Round last = StageBenchResult.Round.of(StageBenchResult.Phase.of(1000, 0.5, 0.4, 0.3, 0.1, 0, 0),
                StageBenchResult.Phase.of(1000, 2.0, 1.5, 1.2, 0.4, 2, 0.25));
        Map<String, Object> json = StageBenchResult.of(32, 8, 1000, 4, 460.0, StageBench.STAGE_SETTINGS,
                List.of(first, last), 2, 1.0, 1.5).toJson();
        assertEquals(List.of("stage_records_per_s", "consumer_records_per_s", "ratio"),
                List.copyOf(json.keySet()).subList(0, 3));
        assertEquals(500.0, (double) json.get("stage_records_per_s"), EXACT);
        assertEquals(2000.0, (double) json.get("consumer_records_per_s"), EXACT);
        assertEquals(0.25, (double) json.get("ratio"), EXACT);
        // polling-thread CPU: 0.3 s and 1.2 s for 1000 records are 300 and 1200 microseconds per record
        assertEquals(300.0, (double) json.get("consumer_poll_cpu_us_per_record"), 1e-9);
        assertEquals(1200.0, (double) json.get("stage_poll_cpu_us_per_record"), 1e-9);
        assertEquals(0.25, (double) json.get("poll_cpu_ratio"), 1e-12);
        assertEquals(2, ((List<?>) json.get("rounds")).size());
        Map<?, ?> lastRound = (Map<?, ?>) ((List<?>) json.get("rounds")).get(1);
        assertEquals(0.1, (double) lastRound.get("consumer_jit_s"), EXACT);
        assertEquals(0.4, (double) lastRound.get("stage_jit_s"), EXACT);
        assertEquals(0.25, (double) lastRound.get("stage_commit_s"), EXACT);
        assertEquals(2L, lastRound.get("stage_transactions"));
    }

    @Test
    void settings_overrides_laidOverDefaultsAndShownInJsonAndTable() {
        Map<String, String> s = StageBench.settings(Map.of("producer.batch.size", "16384",
                "moments.block.records", "256"));
        assertEquals("16384", s.get("producer.batch.size"));
        assertEquals("256", s.get("moments.block.records"));
        assertEquals(StageBench.STAGE_SETTINGS.get("select.rule"), s.get("select.rule"));
        StageBenchResult.Phase p = StageBenchResult.Phase.of(1000, 1.0, 1.0, 0.5, 0.2, 0, 0);
        StageBenchResult r = StageBenchResult.of(32, 8, 1000, 4, 460.0, s, List.of(StageBenchResult.Round.of(p, p)),
                2, 1.0, 1.5);
        assertEquals(s, r.toJson().get("stage_settings"));
        assertTrue(r.table().contains("stage settings over the defaults: moments.block.records=256, "
                + "producer.batch.size=16384"), r.table());
    }

    @Test
    void settings_overrideOfAnInputKey_refusedNamingTheKey() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> StageBench.settings(Map.of("input.topic", "elsewhere")));
        assertTrue(e.getMessage().startsWith("input.topic: "), e.getMessage());
    }
}
