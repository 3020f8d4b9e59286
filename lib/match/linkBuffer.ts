/**
 * Growable columns of links (doubling typed arrays), so memory stays proportional to the number
 * of links and no object is allocated per link.
 */
import type { LinkSet } from './types';

export class LinkBuffer {
  indexA: Uint32Array;
  indexB: Uint32Array;
  sepArcsec: Float64Array;
  dvKms: Float64Array;
  count = 0;

  constructor(initialCapacity = 1024) {
    const n = Math.max(1, initialCapacity);
    this.indexA = new Uint32Array(n);
    this.indexB = new Uint32Array(n);
    this.sepArcsec = new Float64Array(n);
    this.dvKms = new Float64Array(n);
  }

  push(indexA: number, indexB: number, sepArcsec: number, dvKms: number): void {
    if (this.count === this.indexA.length) this.grow();
    const k = this.count++;
    this.indexA[k] = indexA;
    this.indexB[k] = indexB;
    this.sepArcsec[k] = sepArcsec;
    this.dvKms[k] = dvKms;
  }

  /** Sorts the links from `start` to the end by `indexB` (insertion sort: segments are short). */
  sortTailByIndexB(start: number): void {
    const { indexA, indexB, sepArcsec, dvKms } = this;
    for (let i = start + 1; i < this.count; i++) {
      const a = indexA[i];
      const b = indexB[i];
      const s = sepArcsec[i];
      const d = dvKms[i];
      let j = i - 1;
      while (j >= start && indexB[j] > b) {
        indexA[j + 1] = indexA[j];
        indexB[j + 1] = indexB[j];
        sepArcsec[j + 1] = sepArcsec[j];
        dvKms[j + 1] = dvKms[j];
        j--;
      }
      indexA[j + 1] = a;
      indexB[j + 1] = b;
      sepArcsec[j + 1] = s;
      dvKms[j + 1] = d;
    }
  }

  /**
   * Trimmed copies of the columns plus the given counts, stably sorted by `indexA` (a counting
   * sort over the `countA` sources of A, so links of one source keep their order).
   */
  toLinkSetSortedByA(
    countA: number,
    counts: Omit<LinkSet, 'count' | 'indexA' | 'indexB' | 'sepArcsec' | 'dvKms'>,
  ): LinkSet {
    const n = this.count;
    const next = new Uint32Array(countA + 1);
    for (let k = 0; k < n; k++) next[this.indexA[k] + 1]++;
    for (let i = 0; i < countA; i++) next[i + 1] += next[i];
    const indexA = new Uint32Array(n);
    const indexB = new Uint32Array(n);
    const sepArcsec = new Float64Array(n);
    const dvKms = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      const to = next[this.indexA[k]]++;
      indexA[to] = this.indexA[k];
      indexB[to] = this.indexB[k];
      sepArcsec[to] = this.sepArcsec[k];
      dvKms[to] = this.dvKms[k];
    }
    return { count: n, indexA, indexB, sepArcsec, dvKms, ...counts };
  }

  private grow(): void {
    const n = this.indexA.length * 2;
    const indexA = new Uint32Array(n);
    const indexB = new Uint32Array(n);
    const sepArcsec = new Float64Array(n);
    const dvKms = new Float64Array(n);
    indexA.set(this.indexA);
    indexB.set(this.indexB);
    sepArcsec.set(this.sepArcsec);
    dvKms.set(this.dvKms);
    this.indexA = indexA;
    this.indexB = indexB;
    this.sepArcsec = sepArcsec;
    this.dvKms = dvKms;
  }
}
