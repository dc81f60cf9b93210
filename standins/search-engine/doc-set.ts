// A set of internal document numbers as a bitmap, so that filter clauses combine with word-wise
// AND/OR instead of per-document work (the engine uses roaring bitmaps for the same reason).

export class DocSet {
  readonly words: Uint32Array

  constructor(
    readonly capacity: number,
    words?: Uint32Array,
  ) {
    this.words = words ?? new Uint32Array(Math.ceil(capacity / 32) || 1)
  }

  static of(capacity: number, ids: Iterable<number>): DocSet {
    const set = new DocSet(capacity)
    for (const id of ids) set.add(id)
    return set
  }

  /** The members as a list, kept once asked for (several facets read the same candidates). */
  private members: number[] | null = null

  add(id: number): void {
    this.words[id >>> 5] |= 1 << (id & 31)
    this.members = null
  }

  has(id: number): boolean {
    return (this.words[id >>> 5] & (1 << (id & 31))) !== 0
  }

  clone(): DocSet {
    return new DocSet(this.capacity, this.words.slice())
  }

  and(other: DocSet): DocSet {
    const words = this.words.slice()
    for (let i = 0; i < words.length; i++) words[i] &= other.words[i] ?? 0
    return new DocSet(this.capacity, words)
  }

  or(other: DocSet): DocSet {
    const words = this.words.slice()
    for (let i = 0; i < words.length; i++) words[i] |= other.words[i] ?? 0
    return new DocSet(this.capacity, words)
  }

  andNot(other: DocSet): DocSet {
    const words = this.words.slice()
    for (let i = 0; i < words.length; i++) words[i] &= ~(other.words[i] ?? 0)
    return new DocSet(this.capacity, words)
  }

  isEmpty(): boolean {
    return this.words.every((word) => word === 0)
  }

  size(): number {
    let count = 0
    for (let word of this.words) {
      while (word !== 0) {
        word &= word - 1
        count++
      }
    }
    return count
  }

  /** Members in ascending order. */
  *[Symbol.iterator](): IterableIterator<number> {
    for (let i = 0; i < this.words.length; i++) {
      let word = this.words[i]
      while (word !== 0) {
        const lowest = word & -word
        yield i * 32 + (31 - Math.clz32(lowest))
        word ^= lowest
      }
    }
  }

  toArray(): number[] {
    if (this.members) return this.members
    const members: number[] = []
    for (let i = 0; i < this.words.length; i++) {
      let word = this.words[i]
      while (word !== 0) {
        const lowest = word & -word
        members.push(i * 32 + (31 - Math.clz32(lowest)))
        word ^= lowest
      }
    }
    this.members = members
    return members
  }
}
