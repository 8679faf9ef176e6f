// A tiny seeded generator (mulberry32) so the organic irregularity of a plate is
// a pure function of its seed: the same parameters give the same plate in the
// browser, on the server and in a saved revision years later. Math.random would
// not, and no library is needed for 32 bits of state.

export type Random = () => number

/** Uniform numbers in [0, 1) from a 32-bit seed. */
export function mulberry32(seed: number): Random {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** Uniform in [-1, 1). */
export function signed(random: Random): number {
  return random() * 2 - 1
}
