package lariat.codec;

/**
 * The outcome of decoding one input record: a {@link Reading} to fold into its key's moments, a
 * {@link Rejection} for the dead-letter topic, or a {@link Skipped} record (a missing channel under
 * missing.channel.policy = skip) that is counted and otherwise ignored.
 */
public sealed interface Decoded permits Reading, Rejection, Skipped {
}
