/**
 * Turns an async (or plain) iterable of text pieces (or bytes already encoded) into a web `ReadableStream` of UTF-8
 * bytes for a route handler's `Response`. Pull-based: the iterable is advanced only when the
 * client reads, so an export of millions of rows streams with flat memory; cancelling the
 * response stops the iterable.
 */
type Piece = string | Uint8Array;

export function textToByteStream(
  pieces: AsyncIterable<Piece> | Iterable<Piece>,
): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder();
  const it =
    Symbol.asyncIterator in pieces
      ? (pieces as AsyncIterable<Piece>)[Symbol.asyncIterator]()
      : (pieces as Iterable<Piece>)[Symbol.iterator]();
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      const r = await it.next();
      if (r.done) controller.close();
      else controller.enqueue(typeof r.value === 'string' ? encoder.encode(r.value) : r.value);
    },
    async cancel() {
      await it.return?.();
    },
  });
}
