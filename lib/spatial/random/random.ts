/**
 * Seeded randomness for the engine. The generator is pure-rand's xoroshiro128+ (Blackman & Vigna 2018,
 * "Scrambled linear pseudorandom number generators"). Every simulation s of a run draws from its own
 * stream, derived from (seed, s) alone, so a run gives the same numbers whether it is computed on one
 * thread or split over several, in any order.
 */
import { xoroshiro128plusFromState } from "pure-rand/generator/xoroshiro128plus";
import { SpatialInputError } from "../errors";

/** A source of uniform doubles in [0, 1). */
export interface Random {
  /** Uniform double in [0, 1) with 53 random bits. */
  next(): number;
  /** Uniform integer in 0 .. n-1 (n ≥ 1), without modulo bias. */
  int(n: number): number;
}

/** MurmurHash3's 32-bit finaliser (Appleby 2011): a bijective avalanche mix. */
function fmix32(h: number): number {
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h | 0;
}

const TWO_POW_53 = 9007199254740992;

/** Throw unless `seed` is an integer the engine can record and replay exactly. */
export function assertSeed(seed: unknown): asserts seed is number {
  if (typeof seed !== "number" || !Number.isSafeInteger(seed) || seed < 0 || seed > 0xffffffff) {
    throw new SpatialInputError(`The seed must be an integer from 0 to 4294967295; got ${String(seed)}.`);
  }
}

/** The 128-bit generator state of stream `stream` of run `seed`: four words hashed from (seed, stream, word index). */
function streamState(seed: number, stream: number): number[] {
  const lo = stream % 0x100000000;
  const hi = Math.floor(stream / 0x100000000);
  const words = [0, 1, 2, 3].map((k) => fmix32(fmix32(fmix32(seed ^ Math.imul(k + 1, 0x9e3779b9)) ^ lo) ^ hi));
  if (!words.some((w) => w !== 0)) words[0] = 1; // the all-zero state is a fixed point of xoroshiro
  return words;
}

/**
 * Raw 32-bit outputs of stream `stream` of run `seed` (the same generator and streams as createRandom), for
 * hot loops that draw many small integers: see uniformIndex in lattice/conditional.ts.
 */
export function createUint32Stream(seed: number, stream = 0): () => number {
  assertSeed(seed);
  if (!Number.isSafeInteger(stream) || stream < 0) {
    throw new SpatialInputError(`The random stream index must be a non-negative integer; got ${stream}.`);
  }
  const rng = xoroshiro128plusFromState(streamState(seed, stream));
  return () => rng.next() >>> 0;
}

/**
 * The random stream number `stream` of run `seed`. The 128-bit generator state is four words hashed from
 * (seed, stream, word index), which keeps streams of neighbouring indices unrelated.
 */
export function createRandom(seed: number, stream = 0): Random {
  assertSeed(seed);
  if (!Number.isSafeInteger(stream) || stream < 0) {
    throw new SpatialInputError(`The random stream index must be a non-negative integer; got ${stream}.`);
  }
  const rng = xoroshiro128plusFromState(streamState(seed, stream));
  const next = (): number => {
    // 26 + 27 high bits of two outputs (as pure-rand's uniformFloat64, which takes low bits; the high
    // bits of xoroshiro128+ are the stronger ones).
    const a = (rng.next() >>> 6) & 0x3ffffff;
    const b = (rng.next() >>> 5) & 0x7ffffff;
    return (a * 134217728 + b) / TWO_POW_53;
  };
  const int = (n: number): number => {
    if (!Number.isInteger(n) || n < 1) throw new SpatialInputError(`Cannot draw an integer below ${n}.`);
    // Rejection keeps the draw exactly uniform when n does not divide 2^53.
    const limit = TWO_POW_53 - (TWO_POW_53 % n);
    for (;;) {
      const u = next() * TWO_POW_53;
      if (u < limit) return u % n;
    }
  };
  return { next, int };
}
