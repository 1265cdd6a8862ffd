/** A seeded pseudo-random source for demo data, benchmarks and tests. */
export interface SeededRandom {
  /** Uniform in [0, 1). */
  uniform(): number;
  /** Standard normal. */
  normal(): number;
  /** Uniform random unit vector in 2D or 3D (z = 0 in 2D). */
  unitVector(dims: 2 | 3): [number, number, number];
}

/**
 * Creates a seeded generator: mulberry32 for uniforms [common practice; a
 * 32-bit generator is enough for synthetic data and keeps the engine free of
 * dependencies], Box–Muller ("A note on the generation of random normal
 * deviates", Annals of Mathematical Statistics 29, 1958) for normals, and
 * normalised Gaussian triples for directions (derived: isotropy of the
 * Gaussian).
 */
export function createSeededRandom(seed: number): SeededRandom {
  let a = seed >>> 0;
  let spare = NaN;
  const uniform = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = () => {
    if (spare === spare) {
      const s = spare;
      spare = NaN;
      return s;
    }
    let u = 0;
    while (u === 0) u = uniform();
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
  return {
    uniform,
    normal,
    unitVector(dims) {
      for (;;) {
        const x = normal(), y = normal(), z = dims === 3 ? normal() : 0;
        const n = Math.sqrt(x * x + y * y + z * z);
        if (n > 1e-12) return [x / n, y / n, z / n];
      }
    },
  };
}
