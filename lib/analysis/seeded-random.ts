/**
 * A small seeded pseudo-random generator (mulberry32, public domain, T. Ettinger) with normal
 * variates by Marsaglia's polar method (no trigonometry, so it is quick on millions of samples).
 * Same seed, same sequence, on every machine.
 */
export interface SeededRandom {
  /** Uniform in [0, 1). */
  nextUniform(): number;
  /** Standard normal (mean 0, standard deviation 1). */
  nextNormal(): number;
}

export function createSeededRandom(seed: number): SeededRandom {
  let state = seed >>> 0;
  let spare = 0;
  let hasSpare = false;
  const nextUniform = () => {
    state = (state + 0x6d2b79f5) | 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 15), z | 1);
    z ^= z + Math.imul(z ^ (z >>> 7), z | 61);
    return ((z ^ (z >>> 14)) >>> 0) / 4294967296;
  };
  const nextNormal = () => {
    if (hasSpare) {
      hasSpare = false;
      return spare;
    }
    let u = 0;
    let v = 0;
    let s = 0;
    do {
      u = 2 * nextUniform() - 1;
      v = 2 * nextUniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const factor = Math.sqrt((-2 * Math.log(s)) / s);
    spare = v * factor;
    hasSpare = true;
    return u * factor;
  };
  return { nextUniform, nextNormal };
}
