package lariat.it.faults;

import java.util.LinkedHashMap;
import java.util.Map;

import lariat.moments.MomentStream;
import lariat.schema.StationReading;

/**
 * The offline reference of the exactly-once checks: one {@link MomentStream} per station, fed the
 * same readings in the same order with the block size and half-life of the stage's configuration.
 * Since a stream's bytes are a pure function of its rows in order, its fingerprint must equal the
 * {@code momentsFingerprint} of the stage's last model bit for bit; one record lost, duplicated or
 * reordered changes it.
 */
final class MomentOracle {

    private final int blockSize;
    private final double halfLifeMs;
    private final Map<String, MomentStream> streams = new LinkedHashMap<>();

    private MomentOracle(int blockSize, double halfLifeMs) {
        this.blockSize = blockSize;
        this.halfLifeMs = halfLifeMs;
    }

    /** An empty oracle; {@code halfLifeMs} is {@code Double.POSITIVE_INFINITY} for no forgetting. */
    static MomentOracle of(int blockSize, double halfLifeMs) {
        return new MomentOracle(blockSize, halfLifeMs);
    }

    void add(StationReading r) {
        add(r.getStation().toString(), StationFeed.row(r), r.getWeight(), r.getTime().toEpochMilli());
    }

    /** Adds row {@code z} (features, then target) of {@code station}. */
    void add(String station, double[] z, double weight, long eventTimeMs) {
        streams.computeIfAbsent(station, k -> new MomentStream(z.length, blockSize, halfLifeMs))
                .add(z, weight, eventTimeMs);
    }

    /** Records per station, in first-seen order. */
    Map<String, Long> counts() {
        Map<String, Long> out = new LinkedHashMap<>();
        streams.forEach((k, s) -> out.put(k, s.count()));
        return out;
    }

    /** {@link MomentStream#fingerprint()} of the station's stream. */
    String fingerprint(String station) {
        MomentStream s = streams.get(station);
        if (s == null) {
            throw new IllegalArgumentException("station: no readings for " + station);
        }
        return s.fingerprint();
    }
}
