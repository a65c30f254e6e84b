package lariat.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import lariat.audit.ClaimListing;
import lariat.audit.ClusterClients;
import lariat.schema.KeyClaim;
import lariat.stage.ClaimLog;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.clients.producer.RecordMetadata;
import org.apache.kafka.common.KafkaException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import java.io.IOException;
import java.io.PrintWriter;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;

/** The {@code claims} command: list the key claims of the stages, or release one claim. */
@Command(name = "claims", mixinStandardHelpOptions = true,
        description = {
            "Lists the key claims on the claims topic (read_committed): for each (input topic, model key, input "
                + "partition) the instance that claimed it, the input offset of its first record, when it was "
                + "claimed, and whether it owns the key (the earliest claim does). A model key claimed on two or "
                + "more partitions means the input is not partitioned by model key; the stage dead-letters its "
                + "records on every partition but the owner's.",
            "",
            "--release removes one claim with a tombstone, for moving a key to another partition on purpose. Stop "
                + "the stages of that input topic first: a stage that still holds the key on that partition "
                + "claims it again.",
            "",
            "Examples:",
            "  lariat claims --bootstrap-servers localhost:9092",
            "  lariat claims --input-topic pump-readings --key st-07 --json",
            "  lariat claims --release --input-topic pump-readings --key st-07 --partition 3",
            "",
            "Exit status: 0 when every listed key has one partition (or the claim was released), 1 when a listed "
                + "key is claimed on two or more partitions (or the claim to release does not exist), 2 on bad "
                + "options or a failure."
        })
public final class ClaimsCommand implements Callable<Integer> {

    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    @Spec
    CommandSpec spec;

    @Mixin
    ReplayClusterOptions cluster;

    @Option(names = "--claim-topic", paramLabel = "TOPIC", defaultValue = "lariat.claims",
            description = "Claims topic, the stage's claim.topic (default: ${DEFAULT-VALUE}).")
    String claimTopic;

    @Option(names = "--input-topic", paramLabel = "TOPIC", description = "Only claims of this input topic.")
    String inputTopic;

    @Option(names = "--key", paramLabel = "KEY", description = "Only claims of this model key.")
    String key;

    @Option(names = "--partition", paramLabel = "N", description = "Input partition of the claim to release.")
    Integer partition;

    @Option(names = "--release", description = "Remove the claim named by --input-topic, --key and --partition.")
    boolean release;

    @Option(names = "--json", description = "Write JSON instead of a table.")
    boolean json;


    @Override
    public Integer call() throws IOException {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (release && (inputTopic == null || key == null || partition == null)) {
            err.println("claims: --release needs --input-topic, --key and --partition");
            return 2;
        }
        if (!release && partition != null) {
            err.println("claims: --partition is only for --release");
            return 2;
        }
        try {
            ClusterClients clients = ClusterClients.of(cluster.clientProperties(Map.of()), "lariat-claims");
            ClaimListing listing;
            try (Consumer<byte[], byte[]> c = clients.consumer()) {
                listing = ClaimListing.read(c, claimTopic, cluster.timeout());
            }
            if (release) {
                return release(clients, listing, out, err);
            }
            return list(listing, out, err);
        } catch (IllegalArgumentException | IllegalStateException | KafkaException e) {
            err.println("claims: " + e.getMessage());
            return 2;
        }
    }

    private boolean wanted(KeyClaim c) {
        return (inputTopic == null || inputTopic.equals(c.getInputTopic())) && (key == null || key.equals(c.getKey()));
    }

    private Integer list(ClaimListing listing, PrintWriter out, PrintWriter err) throws IOException {
        Map<String, List<Integer>> conflicts = listing.conflicts();
        conflicts.keySet().removeIf(k -> {
            String[] topicAndKey = k.split(" ", 2);
            return (inputTopic != null && !inputTopic.equals(topicAndKey[0]))
                    || (key != null && !key.equals(topicAndKey[1]));
        });
        if (json) {
            ObjectNode o = JSON.createObjectNode();
            ArrayNode claims = o.putArray("claims");
            for (ClaimListing.Entry e : listing.entries()) {
                KeyClaim c = e.claim();
                if (!wanted(c)) {
                    continue;
                }
                ObjectNode n = claims.addObject();
                n.put("inputTopic", c.getInputTopic());
                n.put("key", c.getKey());
                n.put("partition", c.getInputPartition());
                n.put("owner", e.owner());
                n.put("claimedBy", c.getClaimedBy());
                if (c.getFirstOffset() == null) {
                    n.putNull("firstOffset");
                } else {
                    n.put("firstOffset", c.getFirstOffset());
                }
                n.put("claimedAt", c.getClaimedAtMs().toString());
                n.put("claimOffset", e.offset());
            }
            ObjectNode k = o.putObject("keysOnTwoOrMorePartitions");
            conflicts.forEach((name, parts) -> {
                ArrayNode a = k.putArray(name);
                parts.forEach(a::add);
            });
            o.put("passedOver", listing.passedOver());
            out.println(JSON.writeValueAsString(o));
        } else {
            out.printf("%-24s %-20s %9s %-6s %-28s %12s %-24s %8s%n", "input topic", "model key", "partition",
                    "owner", "claimed by", "first offset", "claimed at", "offset");
            int shown = 0;
            for (ClaimListing.Entry e : listing.entries()) {
                KeyClaim c = e.claim();
                if (!wanted(c)) {
                    continue;
                }
                shown++;
                out.printf("%-24s %-20s %9d %-6s %-28s %12s %-24s %8d%n", c.getInputTopic(), c.getKey(),
                        c.getInputPartition(), e.owner() ? "yes" : "no", c.getClaimedBy(),
                        c.getFirstOffset() == null ? "restored" : String.valueOf(c.getFirstOffset()),
                        c.getClaimedAtMs(), e.offset());
            }
            out.println(shown + " claim" + (shown == 1 ? "" : "s") + " on " + claimTopic
                    + (listing.passedOver() == 1 ? ", 1 record that is not a claim passed over"
                    : listing.passedOver() > 1 ? ", " + listing.passedOver() + " records that are not claims passed over"
                    : ""));
            conflicts.forEach((name, parts) -> out.println("KEY ON TWO OR MORE PARTITIONS: " + name + " on partitions "
                    + parts + " (owner: partition " + parts.get(0) + ")"));
        }
        if (!conflicts.isEmpty()) {
            err.println("claims: " + conflicts.size() + " model key" + (conflicts.size() == 1 ? " is" : "s are")
                    + " claimed on two or more partitions: the input must be partitioned by model key");
            return 1;
        }
        return 0;
    }

    private Integer release(ClusterClients clients, ClaimListing listing, PrintWriter out, PrintWriter err) {
        ClaimListing.Entry e = listing.find(inputTopic, partition, key);
        if (e == null) {
            err.println("claims: no claim of key '" + key + "' on partition " + partition + " of input topic '"
                    + inputTopic + "' on " + claimTopic);
            return 1;
        }
        byte[] recordKey = ClaimLog.recordKey(inputTopic, partition, key);
        try (Producer<byte[], byte[]> p = clients.producer()) {
            RecordMetadata m = p.send(new ProducerRecord<>(claimTopic, 0, recordKey, null)).get(cluster.timeoutMs,
                    TimeUnit.MILLISECONDS);
            out.println("released the claim of key '" + key + "' on partition " + partition + " of '" + inputTopic
                    + "' (claimed by " + e.claim().getClaimedBy() + " at offset " + e.offset() + "): tombstone at offset "
                    + m.offset() + " of " + claimTopic);
            if (e.owner()) {
                out.println("that claim owned the key; the key's next claim in topic order, if any, owns it now");
            }
            return 0;
        } catch (ExecutionException ex) {
            err.println("claims: writing the tombstone failed: " + ex.getCause());
            return 2;
        } catch (java.util.concurrent.TimeoutException ex) {
            err.println("claims: writing the tombstone took longer than " + cluster.timeoutMs + " ms");
            return 2;
        } catch (InterruptedException ex) {
            Thread.currentThread().interrupt();
            err.println("claims: interrupted");
            return 2;
        }
    }
}
