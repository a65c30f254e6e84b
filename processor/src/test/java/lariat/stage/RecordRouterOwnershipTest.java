package lariat.stage;

import lariat.codec.KeyLayouts;
import lariat.codec.RecordDecoder;
import lariat.config.StageConfig;
import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.util.Map;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The router's use of key claims: a key the claims give to another partition never starts a state. */
class RecordRouterOwnershipTest {

    private static final StageConfig CONFIG = StageConfig.of(Map.of(
            "input.topic", "station-readings",
            "input.format", "json",
            "field.target", "motor_current_a",
            "field.features.map", "channels",
            "field.time", "time"));

    private static RecordRouter router(RecordRouter.Ownership ownership) {
        return new RecordRouter(CONFIG.get(StageConfig.FIELD_TARGET), RecordDecoder.create(CONFIG)::decodeInto,
                StageAssembly.settings(CONFIG), ownership);
    }

    /** Claims in which partition 0 claimed {@code key}, by instance lariat-a, at offset 0. */
    private static KeyClaims ownedByPartition0(String key) {
        KeyClaims claims = new KeyClaims("lariat.claims");
        claims.add(key, 0, "lariat-a", 0);
        return claims;
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }

    private static byte[] reading(double flow, double current) {
        return utf8("{\"time\":1767225600000,\"channels\":{\"flow_m3h\":" + flow + ",\"motor_current_a\":" + current
                + "}}");
    }

    @Test
    void route_newKeyClaimedByAnotherPartition_deadLetterNamingTheOwnerAndNothingTouched() {
        RecordRouter r = router(ownedByPartition0("north-03"));
        PartitionStates states = new PartitionStates();
        KeyLayouts layouts = KeyLayouts.create();

        RecordRouter.Outcome o = r.route(states, layouts, 1, 40, utf8("north-03"), reading(88, 31.5), 0);

        assertEquals(RecordRouter.Kind.REJECTED, o.kind);
        assertEquals(DeadLetters.KEY_ON_TWO_PARTITIONS, o.reason);
        assertEquals("north-03", o.key);
        assertTrue(o.detail.contains("owned elsewhere") && o.detail.contains("input partition 0"), o.detail);
        assertNull(states.get("north-03"), "no state started on partition 1");
        assertTrue(layouts.of("north-03").isEmpty(), "no channel layout kept on partition 1");
    }

    @Test
    void route_ownersPartitionAndOtherKeys_accepted() {
        RecordRouter r = router(ownedByPartition0("north-03"));
        PartitionStates states = new PartitionStates();

        assertEquals(RecordRouter.Kind.ACCEPTED,
                r.route(states, KeyLayouts.create(), 0, 7, utf8("north-03"), reading(88, 31.5), 0).kind);
        assertEquals(RecordRouter.Kind.ACCEPTED,
                r.route(states, KeyLayouts.create(), 1, 8, utf8("south-01"), reading(90, 30.0), 0).kind);
        assertEquals(0, states.get("north-03").partition());
        assertEquals(7, states.get("north-03").firstOffset(), "the first accepted record's offset, for its claim");
        assertEquals(1, states.get("south-01").partition());
    }

    @Test
    void route_anyOwnership_keyStartsWherever() {
        RecordRouter r = router(RecordRouter.Ownership.ANY);
        PartitionStates states = new PartitionStates();
        assertEquals(RecordRouter.Kind.ACCEPTED,
                r.route(states, KeyLayouts.create(), 3, 0, utf8("north-03"), reading(88, 31.5), 0).kind);
    }
}
