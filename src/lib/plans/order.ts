/**
 * Orders of a plan's grid: as listed (first axis outermost), serpentine (each axis turns back
 * at the end of its row, so consecutive points differ in one axis by one step: the fewest fixture
 * moves), or shuffled with a stored seed (the same seed always gives the same order).
 */

export const ORDER_MODES = ['as_listed', 'serpentine', 'shuffled'] as const;
export type OrderMode = (typeof ORDER_MODES)[number];

/**
 * mulberry32, a small 32-bit seeded generator (Tommy Ettinger's public-domain design, common
 * practice for reproducible shuffles); returns numbers in [0, 1).
 */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Index tuples of the grid with `sizes[0]` values on the outermost axis, in lexicographic order. */
function lexicographic(sizes: number[]): number[][] {
  let tuples: number[][] = [[]];
  for (const size of sizes) tuples = tuples.flatMap((prefix) => Array.from({ length: size }, (_, i) => [...prefix, i]));
  return tuples;
}

/**
 * Boustrophedon order for any number of axes (a reflected mixed-radix Gray code): axis k runs
 * backwards whenever the outer axes together have taken an odd number of steps, i.e. when the
 * lexicographic rank of the outer digits is odd. With two axes: reverse the inner axis on odd rows.
 */
function serpentine(sizes: number[]): number[][] {
  return lexicographic(sizes).map((digits) => {
    let rank = 0;
    return digits.map((digit, k) => {
      const reversed = rank % 2 === 1;
      rank = rank * sizes[k] + digit;
      return reversed ? sizes[k] - 1 - digit : digit;
    });
  });
}

/** Fisher-Yates with mulberry32(seed). */
function shuffled(sizes: number[], seed: number): number[][] {
  const tuples = lexicographic(sizes);
  const random = mulberry32(seed);
  for (let i = tuples.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [tuples[i], tuples[j]] = [tuples[j], tuples[i]];
  }
  return tuples;
}

/** The grid's index tuples (one index per axis) in measurement order. */
export function orderGrid(sizes: number[], mode: OrderMode, seed: number | null): number[][] {
  if (mode === 'serpentine') return serpentine(sizes);
  if (mode === 'shuffled') return shuffled(sizes, seed ?? 0);
  return lexicographic(sizes);
}
