package lariat.stage;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * What this instance knows of the claims topic: for each model key, its claims in the topic's order,
 * one per input partition that held the key. The topic has one partition, so every instance reads
 * the claims of a key in the same order, and they all agree on its owner: the partition of its
 * earliest claim. The input must be partitioned by model key, so a key with a claim of a second
 * partition is a routing fault, whichever instances own the two partitions.
 *
 * <p>A claim of a pair already known keeps the pair's first place (a claim is sent only for a pair not
 * known and not already sent, so a repeat means two writers of one partition); a tombstone removes the
 * pair, as compaction will. Besides what the topic says, the bookkeeping remembers the pairs this
 * instance claimed in committed transactions but has not read back yet, so it claims each pair once,
 * and the pairs whose conflict it has reported. Owned by the loop thread; no Kafka or Avro here.
 */
final class KeyClaims implements RecordRouter.Ownership {

    /** One claim read from the claims topic. */
    static final class Claim {
        final String modelKey;
        final int partition;
        final String claimedBy;
        final long position;

        private Claim(String modelKey, int partition, String claimedBy, long position) {
            this.modelKey = modelKey;
            this.partition = partition;
            this.claimedBy = claimedBy;
            this.position = position;
        }

        @Override
        public String toString() {
            return "claim of '" + modelKey + "' on partition " + partition + " by " + claimedBy + " at " + position;
        }
    }

    private record Pair(String modelKey, int partition) {
    }

    private final String topic;
    private final Map<String, List<Claim>> byKey = new HashMap<>();
    private final Set<Pair> sent = new HashSet<>();
    private final Set<Pair> reported = new HashSet<>();
    private long position = -1;
    private int size;

    /** Bookkeeping of the claims read from {@code topic} (named in refusals). */
    KeyClaims(String topic) {
        this.topic = topic;
    }

    /**
     * Applies the claim at offset {@code position} of the claims topic: {@code claimedBy} holds
     * {@code modelKey} on input {@code partition}.
     *
     * @return whether the pair was not known before
     * @throws IllegalArgumentException when {@code position} is not after the last applied one, or
     *                                  {@code partition} is negative
     */
    boolean add(String modelKey, int partition, String claimedBy, long position) {
        advance(position, partition);
        sent.remove(new Pair(modelKey, partition));
        List<Claim> claims = byKey.computeIfAbsent(modelKey, k -> new ArrayList<>(1));
        if (find(claims, partition) >= 0) {
            return false;
        }
        claims.add(new Claim(modelKey, partition, claimedBy, position));
        size++;
        return true;
    }

    /**
     * Applies the tombstone at offset {@code position}: the claim of ({@code modelKey},
     * {@code partition}) is gone, and the key's owner may change.
     *
     * @return whether the pair was known
     * @throws IllegalArgumentException as {@link #add}
     */
    boolean remove(String modelKey, int partition, long position) {
        advance(position, partition);
        List<Claim> claims = byKey.get(modelKey);
        int i = claims == null ? -1 : find(claims, partition);
        if (i < 0) {
            return false;
        }
        claims.remove(i);
        if (claims.isEmpty()) {
            byKey.remove(modelKey);
        }
        size--;
        return true;
    }

    /** The earliest claim of {@code modelKey}, or null when it has none. */
    Claim owner(String modelKey) {
        List<Claim> claims = byKey.get(modelKey);
        return claims == null ? null : claims.get(0);
    }

    /** The claims of {@code modelKey} in the topic's order (a copy; empty when none). */
    List<Claim> claims(String modelKey) {
        return List.copyOf(byKey.getOrDefault(modelKey, List.of()));
    }

    /**
     * Whether ({@code modelKey}, {@code partition}) still needs a claim from this instance: the topic
     * read so far has none, and none was sent in a committed transaction.
     */
    boolean needsClaim(String modelKey, int partition) {
        List<Claim> claims = byKey.get(modelKey);
        return (claims == null || find(claims, partition) < 0) && !sent.contains(new Pair(modelKey, partition));
    }

    /** Records that a claim of ({@code modelKey}, {@code partition}) was committed and is yet to be read back. */
    void sent(String modelKey, int partition) {
        sent.add(new Pair(modelKey, partition));
    }

    /** The states among {@code states} that still need a claim, in their order. */
    List<KeyState> unclaimed(Iterable<KeyState> states) {
        List<KeyState> out = new ArrayList<>();
        for (KeyState k : states) {
            if (needsClaim(k.modelKey(), k.partition())) {
                out.add(k);
            }
        }
        return out;
    }

    /** The states among {@code states} whose key is owned by another partition than theirs, in their order. */
    List<KeyState> ownedElsewhere(Iterable<KeyState> states) {
        List<KeyState> out = new ArrayList<>();
        for (KeyState k : states) {
            Claim c = owner(k.modelKey());
            if (c != null && c.partition != k.partition()) {
                out.add(k);
            }
        }
        return out;
    }

    /** True the first time it is asked about ({@code modelKey}, {@code partition}), false after. */
    boolean firstReport(String modelKey, int partition) {
        return reported.add(new Pair(modelKey, partition));
    }

    @Override
    public String refusal(String modelKey, int partition) {
        Claim c = owner(modelKey);
        if (c == null || c.partition == partition) {
            return null;
        }
        return "key is owned elsewhere: input partition " + c.partition + " claimed it first (instance "
                + c.claimedBy + ", offset " + c.position + " of claims topic '" + topic + "'), not partition "
                + partition;
    }

    /** Offset of the last claims-topic record applied, -1 before the first. */
    long position() {
        return position;
    }

    /** Claims known: one per (model key, input partition) pair. */
    int size() {
        return size;
    }

    /**
     * Forgets the claims and the sent pairs, as before the topic's first record, for a reader that starts
     * again; the reported conflicts are kept, so a conflict is reported once per process.
     */
    void clear() {
        byKey.clear();
        sent.clear();
        position = -1;
        size = 0;
    }

    private void advance(long next, int partition) {
        if (next <= position) {
            throw new IllegalArgumentException("position must follow " + position + " (claims in topic order), was "
                    + next);
        }
        if (partition < 0) {
            throw new IllegalArgumentException("partition must be >= 0, was " + partition);
        }
        position = next;
    }

    private static int find(List<Claim> claims, int partition) {
        for (int i = 0; i < claims.size(); i++) {
            if (claims.get(i).partition == partition) {
                return i;
            }
        }
        return -1;
    }
}
