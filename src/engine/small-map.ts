/**
 * Maps and sets for a handful of entries, kept in plain arrays. A rule attempt binds a few
 * names and is cleared after every attempt; `Map.prototype.clear` allocates a fresh table
 * each time, which made clearing the largest source of garbage in the interpreter. These
 * clear by resetting a length, and look up by a short linear scan.
 */

/** A map for a few entries (insertion order, like `Map`). */
export class SmallMap<K, V> {
  private keyList: K[] = [];
  private valueList: V[] = [];
  size = 0;

  get(key: K): V | undefined {
    for (let i = 0; i < this.size; i++) if (this.keyList[i] === key) return this.valueList[i];
    return undefined;
  }

  has(key: K): boolean {
    for (let i = 0; i < this.size; i++) if (this.keyList[i] === key) return true;
    return false;
  }

  set(key: K, value: V): this {
    for (let i = 0; i < this.size; i++) {
      if (this.keyList[i] === key) {
        this.valueList[i] = value;
        return this;
      }
    }
    this.keyList[this.size] = key;
    this.valueList[this.size] = value;
    this.size++;
    return this;
  }

  delete(key: K): boolean {
    for (let i = 0; i < this.size; i++) {
      if (this.keyList[i] !== key) continue;
      for (let j = i + 1; j < this.size; j++) {
        this.keyList[j - 1] = this.keyList[j];
        this.valueList[j - 1] = this.valueList[j];
      }
      this.size--;
      // drop the references so a cleared binding keeps nothing alive
      this.keyList[this.size] = undefined as K;
      this.valueList[this.size] = undefined as V;
      return true;
    }
    return false;
  }

  clear(): void {
    for (let i = 0; i < this.size; i++) {
      this.keyList[i] = undefined as K;
      this.valueList[i] = undefined as V;
    }
    this.size = 0;
  }

  *keys(): IterableIterator<K> {
    for (let i = 0; i < this.size; i++) yield this.keyList[i];
  }

  *entries(): IterableIterator<[K, V]> {
    for (let i = 0; i < this.size; i++) yield [this.keyList[i], this.valueList[i]];
  }

  [Symbol.iterator](): IterableIterator<[K, V]> {
    return this.entries();
  }
}

/** A set for a few values. */
export class SmallSet<T> {
  private readonly map = new SmallMap<T, true>();

  get size(): number {
    return this.map.size;
  }

  has(value: T): boolean {
    return this.map.has(value);
  }

  add(value: T): this {
    this.map.set(value, true);
    return this;
  }

  delete(value: T): boolean {
    return this.map.delete(value);
  }

  clear(): void {
    this.map.clear();
  }
}
