package lariat.it.faults;

import lariat.it.support.StageProcess;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Collections;
import java.util.EnumMap;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.concurrent.Future;

import lariat.schema.StationReading;
import org.apache.avro.generic.GenericRecord;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.producer.RecordMetadata;
import org.apache.kafka.common.header.Header;
import org.junit.jupiter.api.Test;

/**
 * Bad input goes to the dead-letter topic and nowhere else. Over a thousand bad records of every
 * {@link PoisonKind} (random bytes, wrong marker, truncated Avro, trailing bytes, an unknown
 * schema fingerprint, NaN and infinite values, 1e308, a missing target or feature, nulls, wrong
 * types, bad weights, times and keys), each keyed by a real station, are shuffled among good
 * readings of two stations (the very first record is bad, the last fifty are good) and sent while
 * the stage runs.
 *
 * <p>Checked: the dead-letter topic holds exactly the bad records, each with its original bytes
 * and headers naming the documented reason and the source topic, partition and offset; each
 * station's last model covers only its good readings, with moments fingerprint equal to the
 * offline {@link MomentOracle} fed the good readings alone; versions are 1..n; the stage still runs.
 */
class PoisonRecordsGoToDeadLetterIT {

    private static final long SEED = 0x5EED_0004L;
    private static final int PER_KIND = 60;
    private static final int GOOD = 1_500;
    private static final int GOOD_TAIL = 50;
    private static final Duration SETTLE = Duration.ofSeconds(180);

    @Test
    void poison_everyKindInterleaved_allDeadLetteredWithReasonAndMomentsOfGoodOnly() throws Exception {
        Random rnd = new Random(SEED);
        StationFeed feed = StationFeed.of(SEED, 2);
        try (FaultRun run = FaultRun.create("poison", 1, Map.of("input.schema.file", "loose-reading.avsc"))) {
            Path dir = run.directory();
            Files.writeString(dir.resolve("loose-reading.avsc"), LooseReadings.SCHEMA_JSON, StandardCharsets.UTF_8);
            List<PoisonKind> slots = new ArrayList<>();
            for (PoisonKind k : PoisonKind.values()) {
                slots.addAll(Collections.nCopies(PER_KIND, k));
            }
            slots.addAll(Collections.nCopies(GOOD - GOOD_TAIL, null));
            Collections.shuffle(slots, rnd);
            slots.add(0, PoisonKind.RANDOM_BYTES);
            slots.addAll(Collections.nCopies(GOOD_TAIL, null));

            StageProcess stage = run.start("0");
            MomentOracle oracle = MomentOracle.of(FaultRun.BLOCK, FaultRun.HALF_LIFE_MS);
            List<Future<RecordMetadata>> sent = new ArrayList<>();
            List<byte[]> values = new ArrayList<>();
            for (PoisonKind k : slots) {
                StationReading r = feed.next();
                GenericRecord good = LooseReadings.of(r);
                byte[] v = k == null ? LooseReadings.encode(good) : k.make(good, rnd);
                if (k == null) {
                    oracle.add(r);
                }
                values.add(v);
                sent.add(run.sendRaw(r.getStation().toString(), v));
            }
            run.flush();
            Map<Long, Integer> slotOfOffset = new HashMap<>();
            for (int i = 0; i < sent.size(); i++) {
                slotOfOffset.put(sent.get(i).get().offset(), i);
            }

            run.await("the last models cover every good reading", SETTLE, () -> run.modelsCover(oracle.counts()));
            ExactlyOnce.assertHolds(run.modelsByKey(), oracle, run.logTails());

            List<ConsumerRecord<byte[], byte[]>> dead = run.readAll(run.deadLetters);
            int bad = slots.size() - GOOD;
            assertEquals(bad, dead.size(), "dead letters: one per bad record\n" + run.logTails());
            Map<PoisonKind, Integer> seen = new EnumMap<>(PoisonKind.class);
            for (ConsumerRecord<byte[], byte[]> d : dead) {
                long offset = Long.parseLong(header(d, "lariat.source.offset"));
                int slot = slotOfOffset.get(offset);
                PoisonKind kind = slots.get(slot);
                assertTrue(kind != null, "good reading at offset " + offset + " was dead-lettered: "
                        + header(d, "lariat.reason") + " " + header(d, "lariat.detail"));
                assertEquals(kind.reason, header(d, "lariat.reason"), kind + " at offset " + offset + ": "
                        + header(d, "lariat.detail"));
                assertEquals(run.input, header(d, "lariat.source.topic"), "source topic header");
                assertEquals("0", header(d, "lariat.source.partition"), "source partition header");
                assertArrayEquals(values.get(slot), d.value(), "original bytes of " + kind + " at offset " + offset);
                seen.merge(kind, 1, Integer::sum);
            }
            for (PoisonKind k : PoisonKind.values()) {
                assertEquals(k == PoisonKind.RANDOM_BYTES ? PER_KIND + 1 : PER_KIND, seen.getOrDefault(k, 0),
                        "dead letters of kind " + k);
            }
            assertTrue(stage.alive(), "the stage must still run\n" + run.logTails());
        }
    }

    private static String header(ConsumerRecord<byte[], byte[]> r, String name) {
        Header h = r.headers().lastHeader(name);
        return h == null ? null : new String(h.value(), StandardCharsets.UTF_8);
    }
}
