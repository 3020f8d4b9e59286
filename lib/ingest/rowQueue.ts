import type { RowBatch } from './types';

/**
 * Rows parsed from the current text chunk, waiting to be handed out in batches. Memory is
 * bounded by one text chunk plus one batch.
 */
export class RowQueue {
  private values: string[][] = [];
  private lines: number[] = [];
  private nextRow = 1;

  get length(): number {
    return this.values.length;
  }

  push(values: string[], line: number): void {
    this.values.push(values);
    this.lines.push(line);
  }

  /** Removes and returns the oldest row (used to take the header off the front). */
  shift(): { values: string[]; line: number } | undefined {
    const values = this.values.shift();
    const line = this.lines.shift();
    return values === undefined || line === undefined ? undefined : { values, line };
  }

  /** Puts a row back at the front. */
  unshift(values: string[], line: number): void {
    this.values.unshift(values);
    this.lines.unshift(line);
  }

  /** Removes up to `n` rows from the front as a batch numbered after the previous batches. */
  take(n: number): RowBatch {
    const count = Math.min(n, this.values.length);
    const batch: RowBatch = {
      firstRow: this.nextRow,
      lines: Uint32Array.from(this.lines.splice(0, count)),
      values: this.values.splice(0, count),
    };
    this.nextRow += count;
    return batch;
  }

  /** Number of data rows handed out so far. */
  get rowsTaken(): number {
    return this.nextRow - 1;
  }
}

/**
 * Hands out the queue's rows in batches of `batchSize`, calling `pull` for more text until
 * `ended()`; fails with `whenEmpty()` if no data row came at all. `close` runs however it ends.
 * Both readers (delimited text and VOTable) fill a RowQueue and share this loop.
 */
export async function* rowBatches(
  queue: RowQueue,
  batchSize: number,
  io: {
    pull: () => Promise<void>;
    ended: () => boolean;
    whenEmpty: () => Error;
    close: () => Promise<void>;
  },
): AsyncGenerator<RowBatch> {
  try {
    for (;;) {
      while (queue.length >= batchSize) yield queue.take(batchSize);
      if (io.ended()) break;
      await io.pull();
    }
    if (queue.length > 0) yield queue.take(batchSize);
    if (queue.rowsTaken === 0) throw io.whenEmpty();
  } finally {
    await io.close();
  }
}
