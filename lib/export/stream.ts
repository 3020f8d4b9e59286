/**
 * Turns an async (or plain) iterable of text pieces into a web `ReadableStream` of UTF-8
 * bytes for a route handler's `Response`. Pull-based: the iterable is advanced only when the
 * client reads, so an export of millions of rows streams with flat memory; cancelling the
 * response stops the iterable.
 */
export function textToByteStream(
  pieces: AsyncIterable<string> | Iterable<string>,
): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder();
  const it =
    Symbol.asyncIterator in pieces
      ? (pieces as AsyncIterable<string>)[Symbol.asyncIterator]()
      : (pieces as Iterable<string>)[Symbol.iterator]();
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      const r = await it.next();
      if (r.done) controller.close();
      else controller.enqueue(encoder.encode(r.value));
    },
    async cancel() {
      await it.return?.();
    },
  });
}
