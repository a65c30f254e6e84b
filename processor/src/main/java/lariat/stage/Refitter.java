package lariat.stage;

import org.apache.kafka.clients.producer.ProducerRecord;

import java.util.List;

/**
 * Fits one key's path from its moments, selects a model and returns the records to publish
 * (the model version, and a change alert when the persistence rule announces one). Takes the
 * key's next version and updates its published set and alert state; the loop's abort path
 * restores those from the snapshot.
 */
interface Refitter {

    /** Records to send for {@code key}, whose refit is due; never empty when a version is taken. */
    List<ProducerRecord<byte[], byte[]>> refit(KeyState key);
}
