package lariat.scenario;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;

import java.util.HashMap;
import java.util.Iterator;
import java.util.List;
import java.util.Map;

import lariat.codec.KeyLayouts;
import lariat.codec.Reading;
import lariat.codec.RecordDecoder;
import lariat.config.StageConfig;
import org.junit.jupiter.api.Test;

/** The stage's own decoder (lariat.codec) accepts every generated record in both formats. */
class StageDecodesScenarioTest {

    @Test
    void decode_everyRowBothFormats_readingEqualsRow() {
        Scenario s = Scenario.of(ScenarioSpec.defaults().withRecordsPerStation(40));
        List<String> columns = s.columns();
        for (WireFormat f : WireFormat.values()) {
            ReadingEncoder enc = ReadingEncoder.of(s, f);
            Map<String, String> props = new HashMap<>(enc.stageInputProperties());
            props.put("input.topic", "station-readings");
            RecordDecoder decoder = RecordDecoder.create(StageConfig.of(props));
            KeyLayouts layouts = KeyLayouts.create();
            Iterator<StationRow> it = s.rows();
            while (it.hasNext()) {
                StationRow row = it.next();
                Reading r = assertInstanceOf(Reading.class, decoder.decode(enc.key(row), enc.value(row), -1, layouts),
                        f.label());
                assertEquals(row.station(), r.key());
                assertEquals(row.timeMs(), r.eventTimeMs());
                assertEquals(row.weight(), r.weight());
                assertEquals(row.value(columns.size() - 1), r.target());
                assertEquals(s.channels().size(), r.channels().size());
                double[] z = r.z();
                for (int i = 0; i < r.channels().size(); i++) {
                    assertEquals(row.value(columns.indexOf(r.channels().get(i))), z[i], r.channels().get(i));
                }
            }
        }
    }
}
