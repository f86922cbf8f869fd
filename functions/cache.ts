/**
 * A small LRU cache of sheet-function answers keyed by their arguments.
 *
 * Excel recalculates often (on open, on edits elsewhere, on F9); identical calls — the
 * same operation on the same cleaned data with the same options and seed — get the same
 * answer, so it is kept. Results are deterministic (seeded), so a cached answer is the
 * answer a new run would give.
 *
 * The key is the operation name, the number of 32-bit words hashed, and two independent
 * 32-bit hashes (FNV-1a and a MurmurHash3-style mix) over a typed serialization of the
 * job arguments: 64 bits, so two different calls share a key with probability ~2⁻⁶⁴.
 */
export class LruCache<V> {
  private readonly map = new Map<string, V>();
  readonly capacity: number;
  constructor(capacity = 128) {
    this.capacity = Math.max(1, capacity);
  }
  get size(): number {
    return this.map.size;
  }
  get(key: string): V | undefined {
    const v = this.map.get(key);
    if (v !== undefined) {
      this.map.delete(key);
      this.map.set(key, v);
    }
    return v;
  }
  has(key: string): boolean {
    return this.map.has(key);
  }
  set(key: string, value: V): void {
    if (this.map.has(key)) this.map.delete(key);
    this.map.set(key, value);
    while (this.map.size > this.capacity) {
      const oldest = this.map.keys().next().value as string;
      this.map.delete(oldest);
    }
  }
  clear(): void {
    this.map.clear();
  }
}

const f64 = new Float64Array(1);
const u32 = new Uint32Array(f64.buffer);

/** Two 32-bit hashes over a stream of 32-bit words. */
class Hasher {
  private h1 = 0x811c9dc5;
  private h2 = 0x9747b28c;
  words = 0;
  word(w: number): void {
    w >>>= 0;
    // FNV-1a over the word's four bytes.
    let h = this.h1;
    h = Math.imul(h ^ (w & 0xff), 0x01000193);
    h = Math.imul(h ^ ((w >>> 8) & 0xff), 0x01000193);
    h = Math.imul(h ^ ((w >>> 16) & 0xff), 0x01000193);
    h = Math.imul(h ^ (w >>> 24), 0x01000193);
    this.h1 = h;
    // MurmurHash3 x86_32 block step.
    let k = Math.imul(w, 0xcc9e2d51);
    k = (k << 15) | (k >>> 17);
    k = Math.imul(k, 0x1b873593);
    let g = this.h2 ^ k;
    g = (g << 13) | (g >>> 19);
    this.h2 = (Math.imul(g, 5) + 0xe6546b64) | 0;
    this.words++;
  }
  number(x: number): void {
    f64[0] = x === 0 ? 0 : x;
    this.word(u32[0]);
    this.word(u32[1]);
  }
  text(s: string): void {
    this.word(s.length);
    for (let i = 0; i < s.length; i++) this.word(s.charCodeAt(i));
  }
  digest(): string {
    let g = this.h2 ^ this.words;
    g ^= g >>> 16;
    g = Math.imul(g, 0x85ebca6b);
    g ^= g >>> 13;
    g = Math.imul(g, 0xc2b2ae35);
    g ^= g >>> 16;
    return `${(this.h1 >>> 0).toString(16).padStart(8, "0")}${(g >>> 0).toString(16).padStart(8, "0")}`;
  }
}

const TAG = { null: 1, number: 2, string: 3, boolean: 4, array: 5, typed: 6, object: 7, undef: 8 } as const;

function feed(h: Hasher, v: unknown): void {
  if (v === null) return h.word(TAG.null);
  if (v === undefined) return h.word(TAG.undef);
  switch (typeof v) {
    case "number":
      h.word(TAG.number);
      return h.number(v);
    case "string":
      h.word(TAG.string);
      return h.text(v);
    case "boolean":
      return h.word(TAG.boolean + (v ? 16 : 0));
  }
  if (ArrayBuffer.isView(v) && !(v instanceof DataView)) {
    const a = v as unknown as ArrayLike<number>;
    h.word(TAG.typed);
    h.text(Object.prototype.toString.call(v));
    h.word(a.length);
    for (let i = 0; i < a.length; i++) h.number(a[i]);
    return;
  }
  if (Array.isArray(v)) {
    h.word(TAG.array);
    h.word(v.length);
    for (const x of v) feed(h, x);
    return;
  }
  const o = v as Record<string, unknown>;
  const keys = Object.keys(o).sort();
  h.word(TAG.object);
  h.word(keys.length);
  for (const k of keys) {
    h.text(k);
    feed(h, o[k]);
  }
}

/** Cache key of an operation on its arguments. */
export function cacheKey(op: string, args: unknown): string {
  const h = new Hasher();
  feed(h, args);
  return `${op}:${h.words}:${h.digest()}`;
}
