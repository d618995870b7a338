/**
 * A small seeded random source (mulberry32), so one seed replays the same workload, faults and
 * schedule. Each part of the simulation forks its own stream, so drawing more numbers in one part
 * (say, a device making an extra request) does not shift what every other part draws.
 */
export interface Random {
  /** A number in [0, 1). */
  next(): number;
  /** A whole number in [min, max]. */
  int(min: number, max: number): number;
  chance(probability: number): boolean;
  pick<T>(items: readonly T[]): T;
  /** Picks an index with the given relative weights. */
  weighted(weights: readonly number[]): number;
  /** An independent stream for one part of the run, named by a label. */
  fork(label: string): Random;
}

function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

/** FNV-1a of the label, mixed into the seed: the seed of a forked stream. */
function mix(seed: number, label: string): number {
  let hash = 0x811c9dc5 ^ seed;
  for (let i = 0; i < label.length; i++) hash = Math.imul(hash ^ label.charCodeAt(i), 0x01000193);
  return hash >>> 0;
}

export function seededRandom(seed: number): Random {
  const next = mulberry32(seed);
  const random: Random = {
    next,
    int: (min, max) => min + Math.floor(next() * (max - min + 1)),
    chance: (probability) => next() < probability,
    pick: (items) => {
      if (items.length === 0) throw new Error('Nothing to pick from.');
      return items[Math.floor(next() * items.length)]!;
    },
    weighted: (weights) => {
      const total = weights.reduce((sum, w) => sum + w, 0);
      let point = next() * total;
      for (let i = 0; i < weights.length; i++) {
        point -= weights[i]!;
        if (point < 0) return i;
      }
      return weights.length - 1;
    },
    fork: (label) => seededRandom(mix(seed, label)),
  };
  return random;
}
