package lariat.codec;

import com.fasterxml.jackson.core.json.JsonReadFeature;
import com.fasterxml.jackson.databind.DeserializationFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectReader;
import com.fasterxml.jackson.databind.json.JsonMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;

/**
 * One JSON object per value (RFC 8259), UTF-8. The tokens NaN and Infinity are read as numbers so
 * that they are rejected as non-finite values, not as undecodable text; trailing content after the
 * object is an error.
 */
final class JsonRecordParser implements ValueParser {

    private final ObjectReader reader = JsonMapper.builder()
            .enable(JsonReadFeature.ALLOW_NON_NUMERIC_NUMBERS)
            .enable(DeserializationFeature.FAIL_ON_TRAILING_TOKENS)
            .build()
            .reader();
    private final JsonView view = new JsonView();

    @Override
    public RecordView parse(byte[] value) {
        if (value.length == 0) {
            throw new RejectSignal(RejectReason.UNDECODABLE, "value is empty");
        }
        JsonNode node;
        try {
            node = reader.readTree(value);
        } catch (IOException | RuntimeException e) {
            throw new RejectSignal(RejectReason.UNDECODABLE, "not JSON: " + RejectSignal.message(e), e);
        }
        if (!(node instanceof ObjectNode)) {
            throw new RejectSignal(RejectReason.UNDECODABLE, "JSON value is "
                    + (node == null ? "empty" : "of type " + node.getNodeType().name().toLowerCase(java.util.Locale.ROOT))
                    + ", need an object");
        }
        view.reset((ObjectNode) node);
        return view;
    }
}
