package lariat.demo;

import java.time.Duration;

import lariat.config.SelectRule;
import lariat.config.StageConfig;
import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class DemoPlanTest {

    @Test
    void stageProperties_defaultPlan_validStageConfiguration() {
        DemoPlan plan = DemoPlan.of(6, 7, Duration.ofSeconds(90), "t1");
        StageConfig c = StageConfig.of(plan.stageProperties("127.0.0.1:9092"));
        assertEquals(plan.inputTopic(), c.get(StageConfig.INPUT_TOPIC));
        assertEquals(SelectRule.RELATIVE_PENALTY, c.get(StageConfig.SELECT_RULE));
        assertEquals(DemoPlan.REFIT_EVERY_RECORDS, c.get(StageConfig.REFIT_EVERY_RECORDS));
        assertEquals(Duration.ofHours(DemoPlan.HALF_LIFE_HOURS).toMillis(), c.get(StageConfig.FORGET_HALF_LIFE_MS));
        assertEquals(0, c.get(StageConfig.METRICS_PORT), "no metrics endpoint, so runs never clash on a port");
    }

    @Test
    void scenario_defaultPlan_weekOfMinutesWithChangesAndUnchangedStations() {
        DemoPlan plan = DemoPlan.of(5, 7, Duration.ofSeconds(60), "t2");
        assertEquals(5 * DemoPlan.RECORDS_PER_STATION, plan.scenario().totalRecords());
        assertEquals(5, plan.scenario().truth().changes().size());
        assertEquals(1, plan.scenario().truth().unchangedStations().size());
        assertEquals(0, DemoPlan.RECORDS_PER_STATION % DemoPlan.REFIT_EVERY_RECORDS,
                "the week ends on a refit boundary");
    }

    @Test
    void sendRate_window_recordsPerSecondCoverTheScenario() {
        DemoPlan plan = DemoPlan.of(6, 7, Duration.ofSeconds(90), "t3");
        assertEquals(60_480 / 40.0, plan.sendRate(Duration.ofSeconds(40)), 1e-9);
    }

    @Test
    void of_badArguments_rejectedNamingThem() {
        IllegalArgumentException d = assertThrows(IllegalArgumentException.class,
                () -> DemoPlan.of(6, 7, Duration.ofMillis(10), "t"));
        assertTrue(d.getMessage().startsWith("duration"), d.getMessage());
        IllegalArgumentException r = assertThrows(IllegalArgumentException.class,
                () -> DemoPlan.of(6, 7, Duration.ofSeconds(90), "Bad Id"));
        assertTrue(r.getMessage().startsWith("runId"), r.getMessage());
    }
}
