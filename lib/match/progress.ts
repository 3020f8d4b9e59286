/**
 * Progress and cancellation of long runs. Work runs in chunks; between chunks the run reports
 * progress, checks its `AbortSignal`, and every ~25 ms yields to the event loop so that timers
 * and I/O (which may abort the run) get their turn.
 */
import { MatchCancelledError } from './errors';
import type { ProgressCallback } from './types';

const YIELD_EVERY_MS = 25;

function nextTick(): Promise<void> {
  return new Promise((resolve) => {
    if (typeof setImmediate === 'function') setImmediate(resolve);
    else setTimeout(resolve, 0);
  });
}

/** Throws `MatchCancelledError` if the signal has been aborted. */
export function throwIfCancelled(signal: AbortSignal | undefined): void {
  if (signal?.aborted) throw new MatchCancelledError();
}

/** Tracks one run: maps local progress into [start, start + span] of the caller's callback. */
export class ProgressTracker {
  /** −∞ so the first step yields at once: an abort already scheduled then lands early. */
  private lastYield = -Infinity;

  constructor(
    private readonly onProgress: ProgressCallback | undefined,
    private readonly signal: AbortSignal | undefined,
    private readonly start = 0,
    private readonly span = 1,
  ) {}

  /** A tracker for the part [from, to] (fractions of this run) of the work. */
  sub(from: number, to: number): ProgressTracker {
    return new ProgressTracker(
      this.onProgress,
      this.signal,
      this.start + from * this.span,
      (to - from) * this.span,
    );
  }

  /** Reports this part complete (exactly 1 for a whole run) and checks for cancellation. */
  complete(): void {
    throwIfCancelled(this.signal);
    this.onProgress?.(this.start + this.span);
  }

  /** Reports `fraction` of this part done, then checks for cancellation and yields if due. */
  async step(fraction: number): Promise<void> {
    throwIfCancelled(this.signal);
    this.onProgress?.(this.start + Math.min(1, Math.max(0, fraction)) * this.span);
    throwIfCancelled(this.signal);
    const now = performance.now();
    if (now - this.lastYield >= YIELD_EVERY_MS) {
      await nextTick();
      this.lastYield = performance.now();
      throwIfCancelled(this.signal);
    }
  }
}
