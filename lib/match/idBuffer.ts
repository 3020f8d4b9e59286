/** A growable list of 32-bit ids: the scratch space of index queries, reused across queries. */
export class IdBuffer {
  ids: Uint32Array;
  count = 0;

  constructor(initialCapacity = 64) {
    this.ids = new Uint32Array(Math.max(1, initialCapacity));
  }

  push(id: number): void {
    if (this.count === this.ids.length) {
      const grown = new Uint32Array(this.ids.length * 2);
      grown.set(this.ids);
      this.ids = grown;
    }
    this.ids[this.count++] = id;
  }
}
