package lariat.codec;

/** Turns the bytes of one record value into a {@link RecordView}; one instance per thread. */
interface ValueParser {

    /**
     * @return a view valid until the next call
     * @throws RejectSignal if the bytes are not a record of the format
     */
    RecordView parse(byte[] value);
}
