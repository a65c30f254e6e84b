package lariat.codec;

import static lariat.codec.CodecFixtures.T0;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import lariat.config.StageConfig;
import lariat.schema.StationReading;
import org.apache.avro.Schema;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericRecord;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The fast path of {@link RecordDecoder#decodeInto} agrees with the general path of
 * {@link RecordDecoder#decode} (Avro's own {@code GenericDatumReader} and {@link FieldMapper}, the oracle)
 * record by record: an accepted record has the same key, layout, and bits of every value, weight and time;
 * anything else has the same outcome class, reason, detail and exception class. Two decoders of one
 * configuration see the same sequence: random valid records, every hostile kind of the poison test (random
 * bytes, wrong marker, truncated and over-long Avro, unknown fingerprint, NaN and infinite values, 1e308,
 * missing and null target or feature, text, boolean and number where they do not belong, bad weights,
 * times and keys) and random byte mutations of valid records. On the valid records the fast path itself
 * must have been taken, so the agreement is not the fallback agreeing with itself.
 */
class DirectAvroReaderTest {

    private static final int CASES = 3000;

    /** Unions admit text, booleans and nulls where numbers belong; unused fields of every Avro type are skipped. */
    private static final String LOOSE = """
            {"type": "record", "name": "LooseWide", "namespace": "lariat.test",
             "fields": [
               {"name": "note", "type": ["null", "string"]},
               {"name": "station", "type": ["string", "double", "null", "long"]},
               {"name": "flags", "type": {"type": "array", "items": "boolean"}},
               {"name": "time", "type": ["long", "string", "int"]},
               {"name": "mode", "type": {"type": "enum", "name": "Mode", "symbols": ["RUN", "IDLE", "TRIP"]}},
               {"name": "channels", "type": {"type": "map", "values": ["double", "string", "boolean", "null", "float", "int", "long"]}},
               {"name": "tag", "type": {"type": "fixed", "name": "Tag", "size": 3}},
               {"name": "weight", "type": ["double", "string", "float", "int"]},
               {"name": "extra", "type": {"type": "record", "name": "Extra", "fields": [
                 {"name": "a", "type": "int"}, {"name": "b", "type": "float"}, {"name": "c", "type": "bytes"},
                 {"name": "m", "type": {"type": "map", "values": "long"}}]}}
             ]}
            """;
    private static final Schema LOOSE_SCHEMA = new Schema.Parser().parse(LOOSE);
    private static final String[] CHANNELS = {"flow", "head", "vib_1x", "temp", "x\u00e9", "motor_current_a"};
    private static final String TARGET = "motor_current_a";
    private static final String[] STATIONS = {"north-01", "s\u00fcd-02", "east-03", "west-04", "k"};

    @TempDir
    Path dir;

    @Test
    void decodeInto_looseSchemaFixedLayout_agreesWithGeneralPath() throws IOException {
        check(looseProps("field.features", "flow,head,vib_1x,temp,x\u00e9"), false);
    }

    @Test
    void decodeInto_looseSchemaDiscoveredLayouts_agreesWithGeneralPath() throws IOException {
        check(looseProps(), false);
    }

    @Test
    void decodeInto_looseSchemaSkipPolicyKafkaKeyAndTimestamp_agreesWithGeneralPath() throws IOException {
        check(looseProps("missing.channel.policy", "skip", "field.key", "", "field.time", "", "field.weight", ""), true);
    }

    @Test
    void decodeInto_looseSchemaBinaryFormatSecondsAndSmallLimit_agreesWithGeneralPath() throws IOException {
        check(looseProps("input.format", "avro-binary", "field.time.unit", "s", "value.max.abs", "50"), false);
    }

    @Test
    void decodeInto_bundledSchemaAsTheBenchConfiguresIt_agreesAndTakesTheFastPath() throws IOException {
        Map<String, String> p = baseProps();
        p.put("field.features", "flow,head,vib_1x,temp,x\u00e9");
        RecordDecoder fast = RecordDecoder.create(StageConfig.of(p), dir);
        RecordDecoder general = RecordDecoder.create(StageConfig.of(p), dir);
        assertTrue(fast.hasDirectPath(), "fast path compiled");
        Random rnd = new Random(91L);
        KeyLayouts lf = KeyLayouts.create();
        KeyLayouts lg = KeyLayouts.create();
        RowBuffer row = RowBuffer.create();
        int accepted = 0;
        for (int i = 0; i < CASES; i++) {
            byte[] v = bundled(STATIONS[rnd.nextInt(STATIONS.length)], rnd);
            if (rnd.nextInt(4) == 0) {
                v = mutate(v, rnd);
            }
            accepted += agree(general.decode(null, v, -1, lg), fast.decodeInto(null, v, -1, lf, row), row) ? 1 : 0;
        }
        assertTrue(accepted > CASES / 2, "most records accepted, got " + accepted);
        assertTrue(fast.directAccepted() > CASES / 2, "fast path taken, got " + fast.directAccepted());
    }

    /**
     * The map template: once a record has taught the fast path its channel map's bytes, every record that
     * differs from the next valid record in one byte (each position of the body, each of several values:
     * name bytes, lengths, block counts, the weight, the value bytes) or in its length (one byte cut off or
     * appended) agrees with the general path, and so does the valid record read by the template after each.
     */
    @Test
    void decodeInto_everyOneByteChangeAfterATemplate_agreesWithGeneralPath() throws IOException {
        Map<String, String> p = baseProps();
        p.put("field.features", "flow,head,vib_1x,temp,x\u00e9");
        RecordDecoder fast = RecordDecoder.create(StageConfig.of(p), dir);
        RecordDecoder general = RecordDecoder.create(StageConfig.of(p), dir);
        Random rnd = new Random(17L);
        KeyLayouts lf = KeyLayouts.create();
        KeyLayouts lg = KeyLayouts.create();
        RowBuffer row = RowBuffer.create();
        byte[] teach = bundled(STATIONS[0], rnd);
        assertTrue(agree(general.decode(null, teach, -1, lg), fast.decodeInto(null, teach, -1, lf, row), row));
        assertTrue(agree(general.decode(null, teach, -1, lg), fast.decodeInto(null, teach, -1, lf, row), row));
        byte[] v = bundled(STATIONS[0], rnd);
        int[] replacements = {0, 1, 2, 0x7F, 0x80, 0xFF};
        int rejected = 0;
        int cases = 0;
        for (int at = 0; at <= v.length; at++) {
            List<byte[]> variants = new ArrayList<>();
            if (at < v.length) {
                for (int x : replacements) {
                    if ((byte) x != v[at]) {
                        byte[] b = v.clone();
                        b[at] = (byte) x;
                        variants.add(b);
                    }
                }
                byte[] flip = v.clone();
                flip[at] ^= 0x20;
                variants.add(flip);
            } else {
                variants.add(Arrays.copyOf(v, v.length - 1));
                variants.add(Arrays.copyOf(v, v.length + 1));
            }
            for (byte[] b : variants) {
                cases++;
                rejected += agree(general.decode(null, b, -1, lg), fast.decodeInto(null, b, -1, lf, row), row) ? 0 : 1;
                long before = fast.directAccepted();
                assertTrue(agree(general.decode(null, v, -1, lg), fast.decodeInto(null, v, -1, lf, row), row),
                        "the valid record after a change at byte " + at);
                assertEquals(before + 1, fast.directAccepted(), "fast path took the valid record after byte " + at);
            }
        }
        assertTrue(rejected > cases / 4, "many changes rejected: " + rejected + " of " + cases);
        assertTrue(rejected < cases, "some changes still valid records: " + rejected + " of " + cases);
    }

    @Test
    void decodeInto_topLevelFieldsWithOlderWriter_agreesWithGeneralPath() {
        Map<String, String> p = CodecFixtures.pumpProps();
        RecordDecoder fast = CodecFixtures.decoder(p);
        RecordDecoder general = CodecFixtures.decoder(p);
        assertTrue(fast.hasDirectPath(), "fast path compiled for the reader's own fingerprint");
        Random rnd = new Random(5L);
        RowBuffer row = RowBuffer.create();
        KeyLayouts lf = KeyLayouts.create();
        KeyLayouts lg = KeyLayouts.create();
        int valid = 0;
        for (int i = 0; i < CASES; i++) {
            boolean old = rnd.nextInt(3) == 0;
            double t = rnd.nextInt(10) == 0 ? Double.NaN : rnd.nextGaussian();
            Double temp = rnd.nextBoolean() ? null : rnd.nextGaussian();
            GenericRecord r = old ? CodecFixtures.pumpV1("p-" + rnd.nextInt(3), T0 + i, rnd.nextGaussian(), t, 3.0)
                    : CodecFixtures.pumpV2("p-" + rnd.nextInt(3), T0 + i, rnd.nextGaussian(), t, 3.0,
                    rnd.nextInt(8) == 0 ? -1.0 : 0.5 + rnd.nextDouble(), temp);
            byte[] v = CodecFixtures.singleObject(r);
            boolean mutated = rnd.nextInt(4) == 0;
            if (mutated) {
                v = mutate(v, rnd);
            }
            boolean ok = agree(general.decode(null, v, -1, lg), fast.decodeInto(null, v, -1, lf, row), row);
            valid += ok && !old && !mutated ? 1 : 0;
        }
        assertTrue(fast.directAccepted() >= valid, "fast path took every valid v2 record: " + fast.directAccepted()
                + " of " + valid);
    }

    /** Runs the random sequence through two decoders of {@code props} and checks every outcome. */
    private void check(Map<String, String> props, boolean kafkaKey) throws IOException {
        RecordDecoder fast = RecordDecoder.create(StageConfig.of(props), dir);
        RecordDecoder general = RecordDecoder.create(StageConfig.of(props), dir);
        assertTrue(fast.hasDirectPath(), "fast path compiled");
        boolean binary = "avro-binary".equals(props.get("input.format"));
        Random rnd = new Random(props.hashCode());
        KeyLayouts lf = KeyLayouts.create();
        KeyLayouts lg = KeyLayouts.create();
        RowBuffer row = RowBuffer.create();
        Map<String, Integer> kinds = new HashMap<>();
        int validAccepted = 0;
        for (int i = 0; i < CASES; i++) {
            String station = STATIONS[rnd.nextInt(STATIONS.length)];
            GenericRecord good = loose(station, i, rnd);
            int kind = rnd.nextInt(3) == 0 ? 1 + rnd.nextInt(Hostile.values().length) : 0;
            byte[] v;
            String label;
            if (kind == 0) {
                v = encode(good, binary);
                label = "valid";
            } else {
                Hostile h = Hostile.values()[kind - 1];
                v = h.make(good, binary, rnd);
                label = h.name();
            }
            byte[] key = kafkaKey ? kafkaKey(station, rnd) : (rnd.nextInt(10) == 0 ? null : utf8(station));
            long ts = rnd.nextInt(20) == 0 ? -1 : T0 + i;
            long before = fast.directAccepted();
            Decoded g = general.decode(key, v, ts, lg);
            boolean ok = agree(g, fast.decodeInto(key, v, ts, lf, row), row);
            assertEquals(lg.count(), lf.count(), "layouts after " + label);
            if (ok && kind == 0 && fast.directAccepted() > before) {
                validAccepted++;
            }
            kinds.merge(label + (g instanceof Rejection ? ":" + ((Rejection) g).reason() : ""), 1, Integer::sum);
        }
        assertTrue(validAccepted > CASES / 4, "fast path took valid records, got " + validAccepted + "; " + kinds);
        assertTrue(kinds.keySet().stream().filter(k -> k.contains(":")).count() >= 8,
                "several rejection reasons seen: " + kinds);
    }

    /** Asserts the two outcomes agree; true when the record was accepted. */
    private static boolean agree(Decoded general, Decoded fast, RowBuffer row) {
        if (general instanceof Reading) {
            Reading r = (Reading) general;
            assertNull(fast, "accepted by the general path, fast path gave " + fast);
            assertEquals(r.key(), row.key(), "key");
            assertEquals(r.layout(), row.layout(), "layout");
            double[] z = r.z();
            assertEquals(z.length, row.z().length, "width");
            for (int j = 0; j < z.length; j++) {
                assertEquals(Double.doubleToRawLongBits(z[j]), Double.doubleToRawLongBits(row.z()[j]), "z[" + j + "]");
            }
            assertEquals(Double.doubleToRawLongBits(r.weight()), Double.doubleToRawLongBits(row.weight()), "weight");
            assertEquals(r.eventTimeMs(), row.eventTimeMs(), "time");
            return true;
        }
        assertNotNull(fast, "not accepted by the general path (" + general + "), accepted by the fast path");
        assertEquals(general.getClass(), fast.getClass(), "outcome class");
        if (general instanceof Rejection) {
            Rejection a = (Rejection) general;
            Rejection b = (Rejection) fast;
            assertEquals(a.reason(), b.reason(), "reason");
            assertEquals(a.detail(), b.detail(), "detail");
            assertEquals(a.exceptionClass(), b.exceptionClass(), "exception class");
        } else {
            Skipped a = assertInstanceOf(Skipped.class, general);
            assertEquals(a.key(), ((Skipped) fast).key(), "skipped key");
            assertEquals(a.detail(), ((Skipped) fast).detail(), "skipped detail");
        }
        return false;
    }

    /** The poison test's kinds of bad input, each breaking one thing of a good loose record. */
    private enum Hostile {
        RANDOM_BYTES, WRONG_MARKER, TRUNCATED, TRAILING, UNKNOWN_FINGERPRINT, NAN_FEATURE, INFINITE_TARGET,
        HUGE_FEATURE, HUGE_TARGET, MISSING_TARGET, MISSING_FEATURE, NULL_FEATURE, NULL_STATION, TEXT_FEATURE,
        BOOLEAN_TARGET, TEXT_WEIGHT, TEXT_TIME, NUMBER_STATION, NEGATIVE_WEIGHT, NAN_WEIGHT, INFINITE_WEIGHT,
        NEGATIVE_TIME, HUGE_TIME, EMPTY_STATION, LONG_STATION, INT_STATION, EXTRA_CHANNEL, MUTATED, MUTATED_TWICE;

        @SuppressWarnings("unchecked")
        byte[] make(GenericRecord good, boolean binary, Random rnd) {
            byte[] ok = encode(good, binary);
            GenericRecord r = copy(good);
            Map<String, Object> ch = (Map<String, Object>) r.get("channels");
            switch (this) {
                case RANDOM_BYTES -> {
                    byte[] b = new byte[rnd.nextInt(64)];
                    rnd.nextBytes(b);
                    return b;
                }
                case WRONG_MARKER -> {
                    ok[binary ? 0 : 1] = 0x02;
                    return ok;
                }
                case TRUNCATED -> {
                    return Arrays.copyOf(ok, rnd.nextInt(ok.length));
                }
                case TRAILING -> {
                    return Arrays.copyOf(ok, ok.length + 1 + rnd.nextInt(8));
                }
                case UNKNOWN_FINGERPRINT -> {
                    return bundled(good.get("station").toString(), rnd);
                }
                case MUTATED -> {
                    return mutate(ok, rnd);
                }
                case MUTATED_TWICE -> {
                    return mutate(mutate(ok, rnd), rnd);
                }
                case NAN_FEATURE -> ch.put("head", Double.NaN);
                case INFINITE_TARGET -> ch.put(TARGET, Double.NEGATIVE_INFINITY);
                case HUGE_FEATURE -> ch.put("flow", 1e308);
                case HUGE_TARGET -> ch.put(TARGET, -1e308);
                case MISSING_TARGET -> ch.remove(TARGET);
                case MISSING_FEATURE -> ch.remove("vib_1x");
                case NULL_FEATURE -> ch.put("temp", null);
                case NULL_STATION -> r.put("station", null);
                case TEXT_FEATURE -> ch.put("flow", "high");
                case BOOLEAN_TARGET -> ch.put(TARGET, Boolean.TRUE);
                case TEXT_WEIGHT -> r.put("weight", "heavy");
                case TEXT_TIME -> r.put("time", "yesterday");
                case NUMBER_STATION -> r.put("station", 7.5);
                case NEGATIVE_WEIGHT -> r.put("weight", -1.0);
                case NAN_WEIGHT -> r.put("weight", Double.NaN);
                case INFINITE_WEIGHT -> r.put("weight", Double.POSITIVE_INFINITY);
                case NEGATIVE_TIME -> r.put("time", -5L);
                case HUGE_TIME -> r.put("time", Long.MAX_VALUE - rnd.nextInt(1000));
                case EMPTY_STATION -> r.put("station", "");
                case LONG_STATION -> r.put("station", "s".repeat(1020 + rnd.nextInt(10)));
                case INT_STATION -> r.put("station", (long) rnd.nextInt(5));
                case EXTRA_CHANNEL -> ch.put("spare_" + rnd.nextInt(3), rnd.nextBoolean() ? "text" : 1.0);
                default -> throw new IllegalStateException(name());
            }
            return encode(r, binary);
        }
    }

    private Map<String, String> baseProps() {
        Map<String, String> p = new HashMap<>();
        p.put("input.topic", "loose-readings");
        p.put("field.target", TARGET);
        p.put("field.features.map", "channels");
        p.put("field.key", "station");
        p.put("field.time", "time");
        p.put("field.weight", "weight");
        return p;
    }

    private Map<String, String> looseProps(String... kv) throws IOException {
        Files.writeString(dir.resolve("loose.avsc"), LOOSE, StandardCharsets.UTF_8);
        Map<String, String> p = baseProps();
        p.put("input.schema.file", "loose.avsc");
        for (int i = 0; i < kv.length; i += 2) {
            p.put(kv[i], kv[i + 1]);
        }
        return p;
    }

    /** A valid loose record: every channel (some as float, int or long), an occasional extra one. */
    private static GenericRecord loose(String station, int i, Random rnd) {
        GenericRecord r = new GenericData.Record(LOOSE_SCHEMA);
        Schema extra = LOOSE_SCHEMA.getField("extra").schema();
        r.put("note", rnd.nextBoolean() ? null : "n" + rnd.nextInt(100));
        r.put("station", station);
        List<Boolean> flags = new ArrayList<>();
        for (int j = rnd.nextInt(4); j > 0; j--) {
            flags.add(rnd.nextBoolean());
        }
        r.put("flags", flags);
        r.put("time", rnd.nextInt(8) == 0 ? (Object) (int) (i + 1) : (Object) (T0 / 1000 + i));
        r.put("mode", new GenericData.EnumSymbol(LOOSE_SCHEMA.getField("mode").schema(), "IDLE"));
        Map<String, Object> ch = new LinkedHashMap<>();
        for (String c : CHANNELS) {
            double x = 10 * rnd.nextGaussian();
            switch (rnd.nextInt(6)) {
                case 0 -> ch.put(c, (float) x);
                case 1 -> ch.put(c, (int) x);
                case 2 -> ch.put(c, (long) x);
                default -> ch.put(c, x);
            }
        }
        if (rnd.nextInt(5) == 0) {
            ch.put("spare", rnd.nextBoolean() ? null : "t");
        }
        List<Map.Entry<String, Object>> order = new ArrayList<>(ch.entrySet());
        java.util.Collections.shuffle(order, rnd);
        Map<String, Object> shuffled = new LinkedHashMap<>();
        order.forEach(e -> shuffled.put(e.getKey(), e.getValue()));
        r.put("channels", shuffled);
        r.put("tag", new GenericData.Fixed(LOOSE_SCHEMA.getField("tag").schema(), new byte[] {1, 2, 3}));
        r.put("weight", rnd.nextInt(5) == 0 ? (Object) (float) 0.5 : (Object) (0.25 + rnd.nextDouble()));
        GenericRecord e = new GenericData.Record(extra);
        e.put("a", rnd.nextInt());
        e.put("b", rnd.nextFloat());
        e.put("c", ByteBuffer.wrap(new byte[rnd.nextInt(4)]));
        e.put("m", Map.of("q", rnd.nextLong()));
        r.put("extra", e);
        return r;
    }

    private static GenericRecord copy(GenericRecord g) {
        GenericRecord r = new GenericData.Record(LOOSE_SCHEMA);
        for (Schema.Field f : LOOSE_SCHEMA.getFields()) {
            r.put(f.name(), g.get(f.name()));
        }
        r.put("channels", new LinkedHashMap<>((Map<?, ?>) g.get("channels")));
        return r;
    }

    /** A reading of the bundled StationReading schema (whose fingerprint a loose configuration does not know). */
    private static byte[] bundled(String station, Random rnd) {
        Map<String, Double> ch = new LinkedHashMap<>();
        for (String c : CHANNELS) {
            ch.put(c, rnd.nextGaussian());
        }
        StationReading r = StationReading.newBuilder().setStation(station)
                .setTime(java.time.Instant.ofEpochMilli(T0 + rnd.nextInt(1000))).setChannels(ch)
                .setWeight(0.5 + rnd.nextDouble()).build();
        try {
            ByteBuffer b = StationReading.getEncoder().encode(r);
            byte[] out = new byte[b.remaining()];
            b.get(out);
            return out;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static byte[] kafkaKey(String station, Random rnd) {
        switch (rnd.nextInt(12)) {
            case 0:
                return null;
            case 1: {
                byte[] b = new byte[1 + rnd.nextInt(6)];
                rnd.nextBytes(b);
                return b;
            }
            case 2:
                return new byte[0];
            default:
                return utf8(station);
        }
    }

    /** Single-object (marker, fingerprint, body) or plain binary body, by Avro's own encoders. */
    private static byte[] encode(GenericRecord r, boolean binary) {
        return binary ? CodecFixtures.binary(r) : CodecFixtures.singleObject(r);
    }

    /** One random change: a byte flipped, set, inserted or removed, or the tail cut. */
    private static byte[] mutate(byte[] v, Random rnd) {
        if (v.length == 0) {
            return new byte[] {(byte) rnd.nextInt()};
        }
        int at = rnd.nextInt(v.length);
        switch (rnd.nextInt(5)) {
            case 0: {
                byte[] b = v.clone();
                b[at] ^= (byte) (1 << rnd.nextInt(8));
                return b;
            }
            case 1: {
                byte[] b = v.clone();
                b[at] = (byte) rnd.nextInt();
                return b;
            }
            case 2: {
                byte[] b = new byte[v.length + 1];
                System.arraycopy(v, 0, b, 0, at);
                b[at] = (byte) rnd.nextInt();
                System.arraycopy(v, at, b, at + 1, v.length - at);
                return b;
            }
            case 3: {
                byte[] b = new byte[v.length - 1];
                System.arraycopy(v, 0, b, 0, at);
                System.arraycopy(v, at + 1, b, at, v.length - at - 1);
                return b;
            }
            default:
                return Arrays.copyOf(v, at);
        }
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}
