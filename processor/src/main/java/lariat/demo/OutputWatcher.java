package lariat.demo;

import java.nio.ByteBuffer;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Properties;
import java.util.TreeMap;

import lariat.schema.ChangeAlert;
import lariat.schema.ModelVersion;
import org.apache.kafka.clients.consumer.CloseOptions;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.common.IsolationLevel;
import org.apache.kafka.common.PartitionInfo;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.errors.WakeupException;
import org.apache.kafka.common.serialization.ByteArrayDeserializer;

/**
 * Reads the stage's model and alert topics back (read_committed, so only versions of committed
 * transactions), keeps a {@link StationLog} per station and tells the console about each record
 * as it arrives. Runs on its own thread until {@link #finish()} asks it to read to the end of
 * both topics and stop.
 */
final class OutputWatcher implements Runnable {

    private static final Duration POLL = Duration.ofMillis(200);

    private final Consumer<byte[], byte[]> consumer;
    private final List<TopicPartition> partitions = new ArrayList<>();
    private final String modelTopic;
    private final DemoConsole console;
    private final Map<String, StationLog> logs = new TreeMap<>();
    private volatile boolean finishing;
    private volatile RuntimeException failure;

    OutputWatcher(String bootstrapServers, String modelTopic, String alertTopic, DemoConsole console) {
        Properties p = new Properties();
        p.setProperty(ConsumerConfig.BOOTSTRAP_SERVERS_CONFIG, bootstrapServers);
        p.setProperty(ConsumerConfig.ISOLATION_LEVEL_CONFIG, IsolationLevel.READ_COMMITTED.toString());
        p.setProperty(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        p.setProperty(ConsumerConfig.AUTO_OFFSET_RESET_CONFIG, "earliest");
        this.consumer = new KafkaConsumer<>(p, new ByteArrayDeserializer(), new ByteArrayDeserializer());
        this.modelTopic = modelTopic;
        this.console = console;
        for (String t : List.of(modelTopic, alertTopic)) {
            for (PartitionInfo info : consumer.partitionsFor(t, Duration.ofSeconds(30))) {
                partitions.add(new TopicPartition(t, info.partition()));
            }
        }
        consumer.assign(partitions);
        consumer.seekToBeginning(partitions);
    }

    @Override
    public void run() {
        try {
            while (!finishing) {
                take(consumer.poll(POLL));
            }
            drain();
        } catch (WakeupException e) {
            drain();
        } catch (RuntimeException e) {
            failure = e;
        } finally {
            consumer.close(CloseOptions.timeout(Duration.ofSeconds(2)));
        }
    }

    /** Asks the thread to read both topics to their committed end and stop. */
    void finish() {
        finishing = true;
        consumer.wakeup();
    }

    /** The first failure of the reading thread, or null. */
    RuntimeException failure() {
        return failure;
    }

    /** The station logs by station name; read only after the thread has stopped. */
    Map<String, StationLog> logs() {
        return logs;
    }

    private void drain() {
        Map<TopicPartition, Long> end = consumer.endOffsets(partitions, Duration.ofSeconds(10));
        long deadline = System.nanoTime() + Duration.ofSeconds(10).toNanos();
        while (!reached(end) && System.nanoTime() < deadline) {
            take(consumer.poll(POLL));
        }
    }

    private boolean reached(Map<TopicPartition, Long> end) {
        for (TopicPartition tp : partitions) {
            if (consumer.position(tp, Duration.ofSeconds(5)) < end.get(tp)) {
                return false;
            }
        }
        return true;
    }

    private void take(Iterable<ConsumerRecord<byte[], byte[]>> records) {
        for (ConsumerRecord<byte[], byte[]> r : records) {
            try {
                if (r.topic().equals(modelTopic)) {
                    ModelVersion mv = ModelVersion.fromByteBuffer(ByteBuffer.wrap(r.value()));
                    StationLog log = logs.computeIfAbsent(mv.getKey(), StationLog::new);
                    console.version(mv, log.add(mv));
                } else {
                    ChangeAlert a = ChangeAlert.fromByteBuffer(ByteBuffer.wrap(r.value()));
                    if (logs.computeIfAbsent(a.getKey(), StationLog::new).add(a)) {
                        console.alert(a);
                    }
                }
            } catch (java.io.IOException e) {
                throw new IllegalStateException("undecodable record at " + r.topic() + "-" + r.partition() + "@"
                        + r.offset() + ": " + e, e);
            }
        }
    }
}
