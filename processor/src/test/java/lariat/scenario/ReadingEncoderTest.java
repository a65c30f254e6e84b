package lariat.scenario;

import static org.junit.jupiter.api.Assertions.assertEquals;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.InputStream;
import java.io.StringReader;
import java.io.StringWriter;
import java.io.BufferedReader;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import org.apache.avro.Schema;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.message.BinaryMessageDecoder;
import org.junit.jupiter.api.Test;

/**
 * Round trips of the wire formats. The Avro check decodes with a generic reader built from the
 * schema file itself (schemas/StationReading.avsc on the class path), not the generated class, so
 * it certifies the bytes against the Avro 1.12 single-object specification as implemented by the
 * Avro library.
 */
class ReadingEncoderTest {

    private static final Scenario SCENARIO = Scenario.of(ScenarioSpec.defaults().withRecordsPerStation(50));

    @Test
    void avroValue_decodedBySchemaFile_equalsRowBitForBit() throws Exception {
        Schema schema;
        try (InputStream in = getClass().getResourceAsStream("/lariat/schemas/StationReading.avsc")) {
            schema = new Schema.Parser().parse(in);
        }
        BinaryMessageDecoder<GenericRecord> decoder = new BinaryMessageDecoder<>(GenericData.get(), schema);
        ReadingEncoder enc = ReadingEncoder.of(SCENARIO, WireFormat.AVRO);
        List<String> columns = SCENARIO.columns();
        for (StationRow row : rows()) {
            byte[] value = enc.value(row);
            assertEquals((byte) 0xC3, value[0]);
            assertEquals((byte) 0x01, value[1]);
            GenericRecord rec = decoder.decode(value);
            assertEquals(row.station(), rec.get("station").toString());
            assertEquals(row.timeMs(), (Long) rec.get("time"));
            assertEquals(row.weight(), (Double) rec.get("weight"));
            Map<?, ?> channels = (Map<?, ?>) rec.get("channels");
            assertEquals(columns.size(), channels.size());
            for (Map.Entry<?, ?> e : channels.entrySet()) {
                int i = columns.indexOf(e.getKey().toString());
                assertEquals(Double.doubleToRawLongBits(row.value(i)), Double.doubleToRawLongBits((Double) e.getValue()));
            }
            assertEquals(row.station(), new String(enc.key(row), StandardCharsets.UTF_8));
        }
    }

    @Test
    void jsonValue_parsed_equalsRowBitForBit() throws Exception {
        ObjectMapper mapper = new ObjectMapper();
        ReadingEncoder enc = ReadingEncoder.of(SCENARIO, WireFormat.JSON);
        List<String> columns = SCENARIO.columns();
        for (StationRow row : rows()) {
            JsonNode n = mapper.readTree(enc.value(row));
            assertEquals(row.station(), n.get("station").textValue());
            assertEquals(row.timeMs(), n.get("time").longValue());
            assertEquals(row.weight(), n.get("weight").doubleValue());
            for (int i = 0; i < columns.size(); i++) {
                assertEquals(row.value(i), n.get("channels").get(columns.get(i)).doubleValue());
            }
        }
    }

    @Test
    void csvCopy_readBack_equalsRowsInOrder() throws Exception {
        StringWriter text = new StringWriter();
        List<StationRow> rows = rows();
        try (CsvCopy csv = CsvCopy.open(text, SCENARIO)) {
            for (StationRow r : rows) {
                csv.write(r);
            }
        }
        BufferedReader in = new BufferedReader(new StringReader(text.toString()));
        String[] header = in.readLine().split(",", -1);
        assertEquals("station", header[0]);
        assertEquals("time", header[1]);
        assertEquals(SCENARIO.columns(), List.of(header).subList(2, header.length - 1));
        assertEquals("weight", header[header.length - 1]);
        for (StationRow r : rows) {
            String[] f = in.readLine().split(",", -1);
            assertEquals(header.length, f.length);
            assertEquals(r.station(), f[0]);
            assertEquals(r.timeMs(), Long.parseLong(f[1]));
            for (int i = 0; i < r.width(); i++) {
                assertEquals(r.value(i), Double.parseDouble(f[2 + i]));
            }
            assertEquals(r.weight(), Double.parseDouble(f[f.length - 1]));
        }
        assertEquals(null, in.readLine());
    }

    private static List<StationRow> rows() {
        List<StationRow> out = new ArrayList<>();
        Iterator<StationRow> it = SCENARIO.rows();
        while (it.hasNext()) {
            out.add(it.next());
        }
        return out;
    }
}
